/** `tier quantum|correlated|mean-field { method; ansatz; mapping; active; frozen-core; taper; layers }` */
import type { ActiveChoiceAst, ActiveIrrepAst, ActiveSpaceAst, Located, ShellGroupAst, ShellNameAst, TierAst } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans } from '../text';
import { ANSATZE, choices, MAPPING_TERMS, METHODS, TIER_LEVELS, type TierLevel } from '../vocabulary';
import { describeArgument, type StatementReader } from './reader';
import { readAtomSelectors } from './selectors';

export function readTier(reader: StatementReader, statement: Statement): TierAst {
  const args = reader.args(statement, 1, `tier ${choices(TIER_LEVELS)} { ... }`);
  const level = args ? reader.term<TierLevel>(args[0]!, TIER_LEVELS, 'tier') : undefined;
  const tier: TierAst = level ? { statement, level } : { statement };
  const scope = `tier@${statement.span.start}`;
  for (const inner of statement.block?.statements ?? []) {
    const keyword = reader.keyword(inner, 'tier');
    if (!keyword) continue;
    reader.noBlock(inner);
    if (!reader.once(scope, inner)) continue;
    switch (keyword.name) {
      case 'method': {
        const value = reader.args(inner, 1, 'method <name>');
        if (value) tier.method = reader.term(value[0]!, METHODS, 'method', 'unknown-method');
        break;
      }
      case 'ansatz': {
        const value = reader.args(inner, 1, `ansatz ${choices(ANSATZE)}`);
        if (value) tier.ansatz = reader.term(value[0]!, ANSATZE, 'ansatz', 'unknown-ansatz');
        break;
      }
      case 'mapping': {
        const value = reader.args(inner, 1, `mapping ${choices(MAPPING_TERMS)}`);
        if (value) tier.mapping = reader.term(value[0]!, MAPPING_TERMS, 'mapping', 'unknown-mapping');
        break;
      }
      case 'active':
        tier.active = readActiveSpace(reader, inner);
        break;
      case 'frozen-core':
        tier.frozenCore = reader.switchValue(inner);
        break;
      case 'taper':
        tier.taper = reader.switchValue(inner);
        break;
      case 'layers': {
        const value = reader.args(inner, 1, 'layers <n>');
        if (value) tier.layers = reader.wholeNumber(value[0]!, 'The number of layers', 1);
        break;
      }
    }
  }
  return tier;
}

/**
 * active 6e 6o, or per irrep of the fragment's point group: active 6e A1=3 B1=1 B2=2, optionally
 * with the reference occupation per irrep: … occupied A1=2 B2=1 (doubly occupied orbitals) and
 * open B1=1 (singly occupied, α); or a suggestion from the mean field: active shells Fe1 3d all
 * O 2p, active natural [0.02 to 1.98].
 */
function readActiveSpace(reader: StatementReader, statement: Statement): ActiveSpaceAst {
  const first = statement.args[0];
  if (first?.kind === 'word' && (first.text === 'shells' || first.text === 'natural')) {
    const choice = first.text === 'shells' ? readShellChoice(reader, statement) : readNaturalChoice(reader, statement);
    return { span: statement.span, irreps: [], ...(choice ? { choice } : {}) };
  }
  const sink = reader.sink;
  let electrons: Located<number> | undefined;
  let orbitals: Located<number> | undefined;
  const irreps: ActiveIrrepAst[] = [];
  const occupied: ActiveIrrepAst[] = [];
  const open: ActiveIrrepAst[] = [];
  let target = irreps;
  const syntax = 'active <n>e <m>o, for example `active 6e 6o`, or per irrep `active 6e A1=3 B1=1 B2=2` (with the reference occupation: `occupied A1=2 B2=1 open B1=1`)';
  const args = statement.args;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.kind === 'electrons' && !electrons) electrons = { value: Number(arg.text.slice(0, -1)), span: arg.span };
    else if (arg.kind === 'orbitals' && !orbitals) orbitals = { value: Number(arg.text.slice(0, -1)), span: arg.span };
    else if (arg.kind === 'word' && (arg.text === 'occupied' || arg.text === 'open') && args[i + 1]?.kind !== 'equals') target = arg.text === 'occupied' ? occupied : open;
    else if (arg.kind === 'word' && args[i + 1]?.kind === 'equals') {
      const count = args[i + 2];
      i += 2;
      const value = count ? reader.wholeNumber(count, `The orbital count of ${arg.text}`, 0) : undefined;
      if (!count) sink.report('missing-value', joinSpans(arg.span, args[i - 1]!.span), `Give the number of ${arg.text} orbitals after '=': \`${arg.text}=2\`.`);
      if (value) target.push({ label: { value: arg.text, span: arg.span }, count: value, span: joinSpans(arg.span, value.span) });
    } else if (arg.kind === 'number') {
      sink.report('invalid-value', arg.span, `Mark what the number counts: '${arg.text}e' for electrons or '${arg.text}o' for orbitals (${syntax}).`);
    } else {
      sink.report('invalid-value', arg.span, `An active space does not take ${describeArgument(arg)}; write ${syntax}.`);
    }
  }
  if (!orbitals && irreps.length > 0) {
    const total = irreps.reduce((sum, irrep) => sum + irrep.count.value, 0);
    orbitals = { value: total, span: joinSpans(irreps[0]!.span, irreps[irreps.length - 1]!.span) };
  }
  if (!electrons || !orbitals) {
    const missing = !electrons && !orbitals ? 'electrons and orbitals' : !electrons ? 'the electron count' : 'the orbital count';
    sink.report('missing-value', statement.span, `The active space needs ${missing}: ${syntax}.`);
  }
  const located: ActiveSpaceAst = { span: statement.span, irreps, ...(occupied.length > 0 ? { occupied } : {}), ...(open.length > 0 ? { open } : {}) };
  return { ...located, ...(electrons ? { electrons } : {}), ...(orbitals ? { orbitals } : {}) };
}

/** `3d`, `2p`, `d`: a shell name (principal quantum number optional, l one of s p d f g). */
export const SHELL_NAME = /^([1-9])?([spdfg])$/i;

export function parseShellName(text: string): { n: number | null; l: number } | undefined {
  const match = SHELL_NAME.exec(text);
  if (!match) return undefined;
  const l = 'spdfg'.indexOf(match[2]!.toLowerCase());
  const n = match[1] ? Number(match[1]) : null;
  return n !== null && n <= l ? undefined : { n, l };
}

/** active shells <atoms> <shell>… [<atoms> <shell>…]… */
function readShellChoice(reader: StatementReader, statement: Statement): ActiveChoiceAst | undefined {
  const args = statement.args.slice(1);
  const keyword = statement.args[0]!.span;
  const example = '`active shells Fe1 3d all O 2p` (atoms, then the shells of their minimal basis: 3d, 2p, or d for the valence d shell)';
  const groups: ShellGroupAst[] = [];
  let i = 0;
  while (i < args.length) {
    const start = i;
    while (i < args.length && !(args[i]!.kind === 'word' && parseShellName(args[i]!.text))) i++;
    const atomArgs = args.slice(start, i);
    const shells: ShellNameAst[] = [];
    while (i < args.length && args[i]!.kind === 'word' && parseShellName(args[i]!.text)) {
      const shell = parseShellName(args[i]!.text)!;
      shells.push({ ...shell, span: args[i]!.span });
      i++;
    }
    if (atomArgs.length === 0) {
      reader.sink.report('invalid-value', shells[0]!.span, `Name the atoms before their shells: ${example}.`);
      continue;
    }
    const selectors = readAtomSelectors(reader, atomArgs);
    if (shells.length === 0) {
      reader.sink.report('missing-value', joinSpans(atomArgs[0]!.span, atomArgs[atomArgs.length - 1]!.span), `Name the shells of these atoms: ${example}.`);
      continue;
    }
    if (selectors.length > 0) groups.push({ selectors, shells, span: joinSpans(atomArgs[0]!.span, shells[shells.length - 1]!.span) });
  }
  if (args.length === 0) reader.sink.report('missing-value', statement.span, `Name atoms and shells: ${example}.`);
  if (groups.length === 0) return undefined;
  return { kind: 'shells', keyword, groups, span: joinSpans(keyword, groups[groups.length - 1]!.span) };
}

/** active natural [<low> to <high>] */
function readNaturalChoice(reader: StatementReader, statement: Statement): ActiveChoiceAst | undefined {
  const keyword = statement.args[0]!.span;
  const args = statement.args.slice(1);
  const syntax = '`active natural` or with the occupation window `active natural 0.02 to 1.98`';
  if (args.length === 0) return { kind: 'natural', keyword, span: keyword };
  const [low, dots, high, ...extra] = args;
  if (low?.kind !== 'number' || dots?.kind !== 'word' || dots.text !== 'to' || high?.kind !== 'number') {
    reader.sink.report('invalid-value', joinSpans(args[0]!.span, args[args.length - 1]!.span), `The natural-occupation window is two numbers between 0 and 2: ${syntax}.`);
    return { kind: 'natural', keyword, span: keyword };
  }
  if (extra.length > 0) reader.sink.report('extra-value', joinSpans(extra[0]!.span, extra[extra.length - 1]!.span), `An active space from natural occupations takes only its window: ${syntax}.`);
  const lowValue = Number(low.text);
  const highValue = Number(high.text);
  if (!(lowValue >= 0 && lowValue < highValue && highValue <= 2)) {
    reader.sink.report('invalid-value', joinSpans(low.span, high.span), `The window ${low.text} to ${high.text} must satisfy 0 ≤ low < high ≤ 2 (natural occupations lie between 0 and 2).`);
    return { kind: 'natural', keyword, span: keyword };
  }
  return { kind: 'natural', keyword, window: { low: { value: lowValue, span: low.span }, high: { value: highValue, span: high.span } }, span: joinSpans(keyword, high.span) };
}
