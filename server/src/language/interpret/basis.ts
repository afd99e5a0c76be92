/**
 * `basis <name>` (the main basis, once) and `basis <name> on <atoms>` (overrides, any number);
 * and the retired braced block `basis <name> { <Element> = <name>; functions … }`, read as the main
 * line, one `on all <Element>` override per assignment and a `functions` statement.
 */
import { elementBySymbol } from '../../chemistry/elements';
import type { BasisAst, Located, SpecAst } from '../ast';
import type { Argument, Statement } from '../syntax';
import { joinSpans } from '../text';
import { choices, FUNCTION_TERMS } from '../vocabulary';
import { describeArgument, type StatementReader } from './reader';
import { readBasisTargets } from './selectors';

const SYNTAX = 'basis <name>  or  basis <name> on <atoms>';

function basisName(reader: StatementReader, arg: Argument | undefined, statement: Statement): Located<string> | undefined {
  if (!arg) {
    reader.sink.report('missing-value', statement.keyword.span, `Name the basis set: \`basis cc-pVDZ\`, or \`basis def2-TZVP on all Zn\` for some atoms.`);
    return undefined;
  }
  if (arg.kind !== 'word') {
    reader.sink.report('invalid-value', arg.span, `A basis-set name is a word such as cc-pVDZ or def2-SVP, not ${describeArgument(arg)}.`);
  }
  return { value: arg.text, span: arg.span };
}

export function readBasis(reader: StatementReader, ast: SpecAst, statement: Statement): void {
  const sink = reader.sink;
  const [nameArg, onArg, ...targets] = statement.args;
  const name = basisName(reader, nameArg, statement);
  const line: BasisAst = name ? { statement, name } : { statement };
  if (!onArg) {
    if (reader.onceAs('basis-main', statement, 'basis (the main line)')) ast.basis = line;
    return;
  }
  if (onArg.kind !== 'word' || onArg.text !== 'on') {
    sink.report('extra-value', joinSpans(onArg.span, statement.args[statement.args.length - 1]!.span), `A basis line names one basis set; for some atoms only, write \`basis ${nameArg?.text ?? '<name>'} on <atoms>\` (\`${SYNTAX}\`).`);
    if (reader.onceAs('basis-main', statement, 'basis (the main line)')) ast.basis = line;
    return;
  }
  if (targets.length === 0) {
    sink.report('missing-value', onArg.span, `Say which atoms take ${name?.value ?? 'this basis'}: \`on all Zn\`, \`on zn n1..n4\`, \`on #3\` or \`on fragment guest\`.`);
    return;
  }
  ast.basisOverrides.push({ ...line, targets: readBasisTargets(reader, targets), onSpan: joinSpans(onArg.span, targets[targets.length - 1]!.span) });
}

/** The retired block, read with its old meaning (migrate.ts reports it and offers the rewrite). */
export function readRetiredBasisBlock(reader: StatementReader, ast: SpecAst, statement: Statement): void {
  const sink = reader.sink;
  const nameArg = statement.args[0];
  const name = basisName(reader, nameArg, statement);
  if (statement.args.length > 1) sink.report('extra-value', joinSpans(statement.args[1]!.span, statement.args[statement.args.length - 1]!.span), `A basis line names one basis set (\`${SYNTAX}\`).`);
  if (reader.onceAs('basis-main', statement, 'basis (the main line)')) ast.basis = name ? { statement, name } : { statement };
  const seenElements = new Set<string>();
  for (const inner of statement.block?.statements ?? []) {
    const head = inner.keyword;
    reader.noBlock(inner);
    if (head.kind === 'word' && head.text === 'functions') {
      if (!reader.onceAs('top:functions', inner, 'functions')) continue;
      const value = reader.args(inner, 1, `functions ${choices(FUNCTION_TERMS)}`);
      const functions = value ? reader.term<'spherical' | 'cartesian'>(value[0]!, FUNCTION_TERMS, 'function type') : undefined;
      if (functions) ast.functions = functions;
      continue;
    }
    const element = head.kind === 'word' ? elementBySymbol(head.text) : undefined;
    const value = inner.args[1];
    if (!element || inner.args[0]?.kind !== 'equals' || !value || inner.args.length > 2) {
      sink.report('invalid-value', inner.span, `In the old basis block each line reads \`Zn = def2-TZVP\` or \`functions cartesian\`; today that is \`basis def2-TZVP on all Zn\` on its own line.`);
      continue;
    }
    if (seenElements.has(element.symbol)) {
      sink.report('duplicate-statement', head.span, `${element.symbol} already has a basis override.`);
      continue;
    }
    seenElements.add(element.symbol);
    ast.basisOverrides.push({
      statement: inner,
      name: { value: value.text, span: value.span },
      targets: [{ kind: 'element', element: element.symbol, span: head.span }],
      onSpan: head.span,
    });
  }
}
