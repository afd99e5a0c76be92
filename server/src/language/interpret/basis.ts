/** `basis <name> { <Element> = <name>; functions spherical|cartesian }` */
import { elementBySymbol } from '../../chemistry/elements';
import type { BasisAst } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans, type Span } from '../text';
import { FUNCTION_TERMS } from '../vocabulary';
import { describeArgument, type StatementReader } from './reader';

export function readBasis(reader: StatementReader, statement: Statement): BasisAst {
  const result: BasisAst = { statement, overrides: [] };
  const args = reader.args(statement, 1, 'basis <name>');
  const name = args?.[0];
  const basis: BasisAst = name ? { ...result, name: { value: name.text, span: name.span } } : result;
  if (name && name.kind !== 'word') {
    reader.sink.report('invalid-value', name.span, `A basis-set name is a word such as cc-pVDZ or def2-SVP, not ${describeArgument(name)}.`);
  }
  const seenElements = new Map<string, Span>();
  for (const inner of statement.block?.statements ?? []) {
    const head = inner.keyword;
    if (head.kind === 'word' && inner.args[0]?.kind === 'equals') {
      readOverride(reader, basis, inner, seenElements);
      continue;
    }
    const keyword = reader.keyword(inner, 'basis');
    if (!keyword) continue;
    reader.noBlock(inner);
    if (keyword.name === 'functions' && reader.once('basis', inner)) {
      const value = reader.args(inner, 1, 'functions spherical|cartesian');
      if (value) basis.functions = reader.term(value[0]!, FUNCTION_TERMS, 'function type');
    }
  }
  return basis;
}

/** `Zn = def2-TZVP` */
function readOverride(reader: StatementReader, basis: BasisAst, statement: Statement, seen: Map<string, Span>): void {
  const sink = reader.sink;
  reader.noBlock(statement);
  const head = statement.keyword;
  const element = elementBySymbol(head.text);
  if (!element) {
    sink.report('unknown-element', head.span, `'${head.text}' is not an element symbol; a per-element basis is written \`Zn = def2-TZVP\`.`);
    return;
  }
  const value = statement.args[1];
  if (!value) {
    sink.report('missing-value', joinSpans(head.span, statement.args[0]!.span), `Name the basis for ${element.symbol} after '=': \`${element.symbol} = def2-TZVP\`.`);
    return;
  }
  if (statement.args.length > 2) {
    sink.report('extra-value', joinSpans(statement.args[2]!.span, statement.args[statement.args.length - 1]!.span), 'A per-element basis takes one name.');
  }
  const previous = seen.get(element.symbol);
  if (previous) {
    sink.report('duplicate-statement', head.span, `${element.symbol} already has a basis override.`, {
      related: [{ span: previous, message: 'first override here' }],
    });
    return;
  }
  seen.set(element.symbol, head.span);
  basis.overrides.push({ element: { value: element.symbol, span: head.span }, basis: { value: value.text, span: value.span }, span: statement.span });
}
