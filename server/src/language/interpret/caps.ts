/** `caps hydrogen fixed|scaled` or `caps none`: capping of covalent bonds cut by a fragment boundary. */
import type { CapsAst } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans } from '../text';
import { CAP_KINDS, CAP_RULES } from '../vocabulary';
import type { StatementReader } from './reader';

const SYNTAX = 'caps hydrogen fixed|scaled, or caps none';

export function readCaps(reader: StatementReader, statement: Statement): CapsAst | undefined {
  const args = statement.args;
  if (args.length === 0) {
    reader.sink.report('missing-value', statement.keyword.span, `'caps' needs a value: write \`${SYNTAX}\`.`);
    return undefined;
  }
  const kind = reader.term<'hydrogen' | 'none'>(args[0]!, CAP_KINDS, 'cap');
  if (!kind) return undefined;
  if (kind.value === 'none') {
    if (args.length > 1) reader.sink.report('extra-value', joinSpans(args[1]!.span, args[args.length - 1]!.span), `'caps none' takes nothing more; remove the rest (\`${SYNTAX}\`).`);
    return { statement, rule: { value: 'none', span: kind.span } };
  }
  const ruleArg = args[1];
  if (!ruleArg) {
    reader.sink.report('missing-value', joinSpans(statement.keyword.span, kind.span), `Say where the hydrogen caps sit: \`caps hydrogen fixed\` (the typical X–H length) or \`caps hydrogen scaled\` (the cut bond's length scaled by covalent radii).`);
    return undefined;
  }
  if (args.length > 2) reader.sink.report('extra-value', joinSpans(args[2]!.span, args[args.length - 1]!.span), `'caps' takes two values; remove the rest (\`${SYNTAX}\`).`);
  const rule = reader.term<'fixed' | 'scaled'>(ruleArg, CAP_RULES, 'cap placement rule');
  return rule ? { statement, rule } : undefined;
}
