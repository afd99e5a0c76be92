/**
 * Charge and multiplicity against the electron count, for the whole system and each fragment.
 * electrons = nuclear charges − charge − ECP core electrons; 2S+1 valid when 2S <= N and N − 2S even.
 */
import type { OrbitalSpace } from '../../chemistry/counting';
import { nearestValidMultiplicity } from '../../chemistry/spin';
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
  const suggestion = nearestValidMultiplicity(space.electrons, space.multiplicity);
  const fix = { data: { multiplicity: suggestion } };
  if (problem.kind === 'parity') {
    const needs = space.multiplicity % 2 === 0 ? 'an odd' : 'an even';
    context.sink.report(
      'multiplicity-parity',
      multiplicitySpan,
      `Multiplicity ${space.multiplicity} needs ${needs} number of electrons, but ${who} has ${electronsExplained(space)}. The nearest valid multiplicity is ${suggestion}.`,
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

export function checkSpin(context: CheckContext): void {
  const { ast, model } = context;
  const fallback = ast.geometry?.statement.keyword.span ?? { start: 0, end: 0 };
  checkSpace(context, model.system, 'the system', ast.multiplicity?.span, ast.charge?.span, fallback);
  for (const fragment of model.fragments) {
    const name = fragment.ast.name?.span ?? fragment.ast.statement.keyword.span;
    checkSpace(context, fragment.space, `fragment '${fragment.name}'`, fragment.ast.multiplicity?.span, fragment.ast.charge?.span, name);
  }
}
