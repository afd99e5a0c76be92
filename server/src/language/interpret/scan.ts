/**
 * `scan distance <atom> <atom> from <d> to <d> step <d>` (or `points <n>` instead of step), and
 * optionally `moving <atom> <atom> …`: the atoms that move with the second one (default: its fragment).
 */
import type { ScanAst } from '../ast';
import type { Statement } from '../syntax';
import { SCAN_KINDS } from '../vocabulary';
import type { AtomRef } from '../ast';
import { joinSpans } from '../text';
import { describeArgument, type StatementReader } from './reader';

const SCAN_SYNTAX = 'scan distance <atom> <atom> from <d> to <d> step <d>';
const SCAN_KEYS = new Set(['from', 'to', 'step', 'points', 'moving']);

export function readScan(reader: StatementReader, statement: Statement): ScanAst | undefined {
  const sink = reader.sink;
  const args = statement.args;
  const kindArg = args[0];
  if (!kindArg) {
    sink.report('missing-value', statement.keyword.span, `Say what to scan: \`${SCAN_SYNTAX}\`.`);
    return undefined;
  }
  const kind = reader.term<'distance'>(kindArg, SCAN_KINDS, 'scan coordinate');
  if (!kind) return undefined;
  const first = reader.atomRef(args[1], kindArg.span);
  const second = first ? reader.atomRef(args[2], args[1]!.span) : undefined;
  const scan: { -readonly [K in keyof ScanAst]: ScanAst[K] } = { statement, kind };
  if (first) scan.first = first;
  if (second) scan.second = second;
  for (let i = 3; i < args.length; i++) {
    const key = args[i]!;
    if (key.kind !== 'word' || !SCAN_KEYS.has(key.text)) {
      sink.report('invalid-value', key.span, `A scan does not take ${describeArgument(key)} here; write \`${SCAN_SYNTAX}\`.`);
      continue;
    }
    if (key.text === 'moving') {
      const atoms: AtomRef[] = [];
      while (i + 1 < args.length && !(args[i + 1]!.kind === 'word' && SCAN_KEYS.has(args[i + 1]!.text))) {
        i++;
        const ref = reader.atomRef(args[i], key.span);
        if (ref) atoms.push(ref);
      }
      if (atoms.length === 0) sink.report('missing-value', key.span, "'moving' needs the atoms that move with the second scanned atom: `moving h2 h3`.");
      else scan.moving = { atoms, span: joinSpans(key.span, atoms[atoms.length - 1]!.span) };
      continue;
    }
    const value = args[i + 1];
    if (!value) {
      sink.report('missing-value', key.span, `'${key.text}' needs a number after it.`);
      break;
    }
    i++;
    const located = key.text === 'points' ? reader.wholeNumber(value, 'The number of points', 1) : reader.number(value, `The '${key.text}' value`);
    if (!located) continue;
    if (key.text === 'from') scan.from = located;
    else if (key.text === 'to') scan.to = located;
    else if (key.text === 'step') scan.step = located;
    else scan.points = located;
  }
  if (!scan.from || !scan.to || (!scan.step && !scan.points)) {
    const missing = [!scan.from && 'from', !scan.to && 'to', !scan.step && !scan.points && 'step'].filter(Boolean).join(', ');
    sink.report('missing-value', statement.keyword.span, `The scan needs ${missing}: \`${SCAN_SYNTAX}\` (or \`points <n>\` instead of step).`);
  }
  return scan;
}
