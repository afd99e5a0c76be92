/** `tier quantum|correlated|mean-field { method; ansatz; mapping; active; frozen-core; taper; layers }` */
import type { ActiveIrrepAst, ActiveSpaceAst, Located, TierAst } from '../ast';
import type { Statement } from '../syntax';
import { joinSpans } from '../text';
import { ANSATZE, choices, MAPPING_TERMS, METHODS, TIER_LEVELS, type TierLevel } from '../vocabulary';
import { describeArgument, type StatementReader } from './reader';

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

/** active 6e 6o, or per irrep of the fragment's point group: active 6e A1=3 B1=1 B2=2 */
function readActiveSpace(reader: StatementReader, statement: Statement): ActiveSpaceAst {
  const sink = reader.sink;
  let electrons: Located<number> | undefined;
  let orbitals: Located<number> | undefined;
  const irreps: ActiveIrrepAst[] = [];
  const syntax = 'active <n>e <m>o, for example `active 6e 6o`, or per irrep `active 6e A1=3 B1=1 B2=2`';
  const args = statement.args;
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.kind === 'electrons' && !electrons) electrons = { value: Number(arg.text.slice(0, -1)), span: arg.span };
    else if (arg.kind === 'orbitals' && !orbitals) orbitals = { value: Number(arg.text.slice(0, -1)), span: arg.span };
    else if (arg.kind === 'word' && args[i + 1]?.kind === 'equals') {
      const count = args[i + 2];
      i += 2;
      const value = count ? reader.wholeNumber(count, `The orbital count of ${arg.text}`, 0) : undefined;
      if (!count) sink.report('missing-value', joinSpans(arg.span, args[i - 1]!.span), `Give the number of ${arg.text} orbitals after '=': \`${arg.text}=2\`.`);
      if (value) irreps.push({ label: { value: arg.text, span: arg.span }, count: value, span: joinSpans(arg.span, value.span) });
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
  const located: ActiveSpaceAst = { span: statement.span, irreps };
  return { ...located, ...(electrons ? { electrons } : {}), ...(orbitals ? { orbitals } : {}) };
}
