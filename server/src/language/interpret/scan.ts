/**
 * `scan distance <atom> <atom> from <d> to <d> step <d>`, `scan angle <atom> <vertex> <atom> …` and
 * `scan dihedral <atom> <atom> <atom> <atom> …` (angles in degrees), with `points <n>` instead of
 * step if wished, and optionally `moving <atom> <atom> …`: the atoms that move with the last named
 * one (default: for a distance its fragment, for an angle or dihedral its side of the molecule).
 */
import { SCAN_ATOM_COUNTS } from '../../chemistry/scan';
import type { ScanAst } from '../ast';
import type { Statement } from '../syntax';
import { SCAN_KINDS } from '../vocabulary';
import type { AtomRef } from '../ast';
import { joinSpans } from '../text';
import { describeArgument, type StatementReader } from './reader';

const SCAN_SYNTAX = 'scan distance <atom> <atom> from <d> to <d> step <d>';
const SCAN_SYNTAXES: Readonly<Record<ScanAst['kind']['value'], string>> = {
  distance: SCAN_SYNTAX,
  angle: 'scan angle <atom> <vertex> <atom> from <degrees> to <degrees> step <degrees>',
  dihedral: 'scan dihedral <atom> <atom> <atom> <atom> from <degrees> to <degrees> step <degrees>',
};
const ATOM_WORDS: Readonly<Record<ScanAst['kind']['value'], string>> = { distance: 'two atoms', angle: 'three atoms, the vertex in the middle', dihedral: 'four atoms, bonded in a chain' };
const SCAN_KEYS = new Set(['from', 'to', 'step', 'points', 'moving']);

export function readScan(reader: StatementReader, statement: Statement): ScanAst | undefined {
  const sink = reader.sink;
  const args = statement.args;
  const kindArg = args[0];
  if (!kindArg) {
    sink.report('missing-value', statement.keyword.span, `Say what to scan: \`${SCAN_SYNTAX}\`, or \`scan angle …\` / \`scan dihedral …\` in degrees.`);
    return undefined;
  }
  const kind = reader.term<ScanAst['kind']['value']>(kindArg, SCAN_KINDS, 'scan coordinate');
  if (!kind) return undefined;
  const syntax = SCAN_SYNTAXES[kind.value];
  const count = SCAN_ATOM_COUNTS[kind.value];
  const atoms: AtomRef[] = [];
  let i = 1;
  for (; i <= count; i++) {
    const arg = args[i];
    if (!arg || (arg.kind === 'word' && SCAN_KEYS.has(arg.text))) {
      sink.report('invalid-selector', (args[i - 1] ?? kindArg).span, `A ${kind.value} scan names ${ATOM_WORDS[kind.value]}: \`${syntax}\`; ${atoms.length === 0 ? 'none is' : `only ${atoms.length} ${atoms.length === 1 ? 'is' : 'are'}`} given.`);
      break;
    }
    const ref = reader.atomRef(arg, args[i - 1]!.span);
    if (ref) atoms.push(ref);
  }
  const scan: { -readonly [K in keyof ScanAst]: ScanAst[K] } = { statement, kind, atoms };
  if (atoms.length === count) {
    scan.first = atoms[0]!;
    scan.second = atoms[count - 1]!;
  }
  for (; i < args.length; i++) {
    const key = args[i]!;
    if (key.kind !== 'word' || !SCAN_KEYS.has(key.text)) {
      sink.report('invalid-value', key.span, `A scan does not take ${describeArgument(key)} here; write \`${syntax}\`.`);
      continue;
    }
    if (key.text === 'moving') {
      const atoms: AtomRef[] = [];
      while (i + 1 < args.length && !(args[i + 1]!.kind === 'word' && SCAN_KEYS.has(args[i + 1]!.text))) {
        i++;
        const ref = reader.atomRef(args[i], key.span);
        if (ref) atoms.push(ref);
      }
      if (atoms.length === 0) sink.report('missing-value', key.span, "'moving' needs the atoms that move with the last scanned atom: `moving h2 h3`.");
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
    sink.report('missing-value', statement.keyword.span, `The scan needs ${missing}: \`${syntax}\` (or \`points <n>\` instead of step).`);
  }
  return scan;
}
