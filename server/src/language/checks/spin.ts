/**
 * Charge and multiplicity against the electron count, for the whole system and each fragment.
 * electrons = nuclear charges − charge − ECP core electrons; 2S+1 valid when 2S <= N and N − 2S even.
 */
import type { OrbitalSpace } from '../../chemistry/counting';
import { coupledMultiplicities, multiplicityName, nearbyValidMultiplicities } from '../../chemistry/spin';
import type { Span } from '../text';
import { signed, type CheckContext } from './context';

function electronsExplained(space: OrbitalSpace): string {
  const parts = [`nuclear charge ${space.nuclearCharge}`, `charge ${signed(space.charge)}`];
  if (space.ecpCoreElectrons > 0) parts.push(`${space.ecpCoreElectrons} core electrons in effective core potentials`);
  return `${space.electrons} electrons (${parts.join(', ')})`;
}

function checkSpace(context: CheckContext, space: OrbitalSpace, who: string, multiplicitySpan: Span | undefined, chargeSpan: Span | undefined, fallback: Span): void {
  if (space.atomCount === 0) return;
  if (space.electrons < 0) {
    context.sink.report('negative-electrons', chargeSpan ?? fallback, `Charge ${signed(space.charge)} leaves ${who} with ${electronsExplained(space)}: fewer than zero.`);
    return;
  }
  const problem = space.spinProblem;
  if (!problem || !multiplicitySpan) return;
  const suggestions = nearbyValidMultiplicities(space.electrons, space.multiplicity);
  const suggestion = suggestions.join(' or ');
  const fix = { data: { multiplicity: suggestions[0], multiplicities: suggestions } };
  if (problem.kind === 'parity') {
    const needs = space.multiplicity % 2 === 0 ? 'an odd' : 'an even';
    context.sink.report(
      'multiplicity-parity',
      multiplicitySpan,
      `Multiplicity ${space.multiplicity} needs ${needs} number of electrons, but ${who} has ${electronsExplained(space)}. The nearest valid multiplicit${suggestions.length > 1 ? 'ies are' : 'y is'} ${suggestion}.`,
      fix,
    );
  } else if (problem.kind === 'too-high') {
    context.sink.report(
      'multiplicity-too-high',
      multiplicitySpan,
      `Multiplicity ${space.multiplicity} needs ${space.multiplicity - 1} unpaired electrons, but ${who} has only ${electronsExplained(space)}. The highest possible multiplicity is ${suggestion}.`,
      fix,
    );
  }
}

function spinText(multiplicity: number): string {
  const twice = multiplicity - 1;
  return `${multiplicityName(multiplicity)}, S = ${twice % 2 === 0 ? twice / 2 : `${twice}/2`}`;
}

/** `1, 3 or 5`, or `1, 3, …, 21` for a long run. */
function multiplicityList(lowest: number, highest: number): string {
  const values: number[] = [];
  for (let m = lowest; m <= highest; m += 2) values.push(m);
  if (values.length > 6) return `${values.slice(0, 3).join(', ')}, …, ${highest} (every other value)`;
  return values.length === 1 ? String(values[0]) : `${values.slice(0, -1).join(', ')} or ${values[values.length - 1]}`;
}

/**
 * The fragments' spins must couple to the system's: S from |S1 − S2 − …| to S1 + S2 + … in whole
 * steps (angular-momentum addition). Checked once the fragments partition the atoms, their charges
 * add up and every part's charge and multiplicity fit its electrons (otherwise those errors speak).
 */
function checkSpinCoupling(context: CheckContext): void {
  const { ast, model } = context;
  const fragments = model.fragments;
  if (fragments.length === 0 || model.sharedAtoms.size > 0 || model.system.spinProblem || model.system.electrons < 0) return;
  if (model.owner.some((owner) => owner < 0)) return;
  if (fragments.reduce((sum, fragment) => sum + fragment.charge, 0) !== model.charge) return;
  if (fragments.some((fragment) => fragment.atoms.length === 0 || fragment.space.spinProblem || fragment.space.electrons < 0)) return;
  const { lowest, highest } = coupledMultiplicities(fragments.map((fragment) => fragment.multiplicity));
  const wanted = model.multiplicity;
  if (wanted >= lowest && wanted <= highest && (wanted - lowest) % 2 === 0) return;
  const parts = fragments.map((fragment) => `'${fragment.name}' ${spinText(fragment.multiplicity)}${fragment.multiplicityGiven ? '' : ' (default)'}`);
  const possible = multiplicityList(lowest, highest);
  const values: number[] = [];
  for (let m = lowest; m <= highest && values.length < 4; m += 2) values.push(m);
  context.sink.report(
    'spin-coupling',
    ast.multiplicity?.span ?? fragments[0]!.ast.multiplicity?.span ?? fragments[0]!.ast.name?.span ?? fragments[0]!.ast.statement.keyword.span,
    `The fragments' spins (${parts.join('; ')}) couple only to multiplicit${lowest === highest ? 'y' : 'ies'} ${possible}, not to the system's ${wanted}${model.multiplicityGiven ? '' : ' (default)'}: total S runs from |S1 − S2 − …| to S1 + S2 + … in whole steps. Change the system's multiplicity or a fragment's.`,
    {
      related: fragments.filter((fragment) => fragment.ast.multiplicity).map((fragment) => ({ span: fragment.ast.multiplicity!.span, message: `'${fragment.name}' multiplicity ${fragment.multiplicity}` })),
      ...(ast.multiplicity ? { data: { multiplicity: values[0], multiplicities: values } } : {}),
    },
  );
}

export function checkSpin(context: CheckContext): void {
  const { ast, model } = context;
  const fallback = ast.geometry?.statement.keyword.span ?? { start: 0, end: 0 };
  checkSpace(context, model.system, 'the system', ast.multiplicity?.span, ast.charge?.span, fallback);
  for (const fragment of model.fragments) {
    const name = fragment.ast.name?.span ?? fragment.ast.statement.keyword.span;
    checkSpace(context, fragment.space, `fragment '${fragment.name}'`, fragment.ast.multiplicity?.span, fragment.ast.charge?.span, name);
  }
  checkSpinCoupling(context);
}
