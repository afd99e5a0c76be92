/**
 * Computed mean-field results as the command line prints them: the JSON object under `meanField`
 * for the system and each fragment, and one table (text or Markdown) of every part. These are
 * results of a calculation, not planning estimates, and the output says so.
 */
import type { PartActiveSpace } from './activeSpace';
import type { MeanFieldOutcome, Mp2Summary, ScfReference } from '../../analysis';
import type { PartBath } from './dmetBath';
import { markdownText, plainText } from './escape';
import { renderMarkdownTable, renderTextTable, type Table } from './table';

/** What became of one part's computation. */
export type PartMeanField =
  | { readonly state: 'computed'; readonly outcome: MeanFieldOutcome; readonly mp2: Mp2Summary | { readonly error: string } | null }
  | { readonly state: 'failed'; readonly reference: ScfReference | null; readonly code: string; readonly message: string };

export interface MeanFieldPart {
  /** `system` or `fragment <name>`. */
  readonly label: string;
  readonly result: PartMeanField;
  /** A fragment's active orbitals chosen from its own restricted mean field (fragments with an active space). */
  readonly activeSpace?: PartActiveSpace;
  /** A fragment's DMET bath from the system's mean field (only under `embedding dmet`). */
  readonly bath?: PartBath;
}

export const COMPUTED_RESULTS_NOTE =
  "Mean-field results are computed by Tessera's Hartree–Fock engine for each part alone (its own atoms, charge and multiplicity; no embedding), not planning estimates.";

/** The `meanField` object of one part in the JSON estimate. */
export function meanFieldJson(result: PartMeanField): Record<string, unknown> {
  if (result.state === 'failed') return { reference: result.reference, computed: false, error: { code: result.code, message: result.message } };
  const r = result.outcome.result;
  const mp2 = result.mp2;
  return {
    reference: r.reference,
    computed: true,
    energy: r.energy,
    nuclearRepulsion: r.nuclearRepulsion,
    converged: r.converged,
    iterations: r.iterations,
    ...(r.converged ? {} : { note: `not converged after ${r.iterations} iterations: energy and orbitals are the last iteration's, not a result` }),
    energyChange: r.convergence.energyChange,
    functions: r.functionCount,
    orbitals: r.orbitalCount,
    linearDependencies: r.linearDependencies,
    pointGroup: r.pointGroup,
    electrons: r.electrons,
    orbitalEnergies: r.orbitalEnergies,
    occupations: r.occupations,
    homo: r.homo,
    lumo: r.lumo,
    gap: r.gap,
    irreps: r.irreps,
    charges: r.charges,
    spinSquared: r.spinSquared,
    mp2:
      mp2 === null
        ? null
        : 'error' in mp2
          ? { error: mp2.error }
          : { correlationEnergy: mp2.correlationEnergy, totalEnergy: mp2.totalEnergy, frozenOrbitals: mp2.frozenOrbitals, naturalOccupations: mp2.naturalOccupations },
    seconds: result.outcome.seconds,
  };
}

function energy(value: number | null): string {
  return value === null ? '–' : value.toFixed(6);
}

/** "all electrons", "1 frozen-core orbital", "2 frozen-core orbitals": which MP2 the figure is. */
function frozenText(frozen: number): string {
  return frozen === 0 ? 'all electrons' : `${frozen} frozen-core orbital${frozen === 1 ? '' : 's'}`;
}

/** One row per part: reference, energy, convergence, frontier orbitals, MP2. */
export function meanFieldTable(parts: readonly MeanFieldPart[]): Table {
  return {
    title: 'Mean field (computed, hartree)',
    headers: ['part', 'reference', 'functions', 'energy', 'converged', 'HOMO', 'LUMO', 'gap', 'MP2 correlation'],
    numeric: [false, false, true, true, false, true, true, true, true],
    rows: parts.map(({ label, result }) => {
      if (result.state === 'failed') return [label, result.reference?.toUpperCase() ?? '–', '–', 'not computed', '–', '–', '–', '–', '–'];
      const r = result.outcome.result;
      const mp2 = result.mp2 === null ? '–' : 'error' in result.mp2 ? 'not computed' : `${energy(result.mp2.correlationEnergy)} (${frozenText(result.mp2.frozenOrbitals)})`;
      return [
        label,
        r.reference.toUpperCase(),
        String(r.functionCount),
        energy(r.energy),
        r.converged ? `yes (${r.iterations})` : `NO (stopped after ${r.iterations})`,
        energy(r.homo),
        energy(r.lumo),
        energy(r.gap),
        r.converged ? mp2 : '–',
      ];
    }),
  };
}

/** The messages to read beside the table: failures, non-convergence, dropped functions. */
export function meanFieldNotes(parts: readonly MeanFieldPart[]): string[] {
  const notes: string[] = [];
  for (const { label, result } of parts) {
    if (result.state === 'failed') {
      notes.push(`${label}: not computed: ${result.message}`);
      continue;
    }
    const r = result.outcome.result;
    if (!r.converged) notes.push(`${label}: the SCF did not converge in ${r.iterations} iterations; the energy shown is the last iteration's, not a result.`);
    if (r.linearDependencies.dropped > 0) {
      notes.push(`${label}: ${r.linearDependencies.dropped} of ${r.functionCount} functions dropped as near-linearly dependent (overlap eigenvalues below ${r.linearDependencies.threshold}, smallest ${r.linearDependencies.smallestEigenvalue.toExponential(2)}).`);
    }
    if (result.mp2 && 'error' in result.mp2) notes.push(`${label}: MP2 not computed: ${result.mp2.error}`);
  }
  return notes;
}

export function renderMeanFieldText(parts: readonly MeanFieldPart[]): string {
  return [renderTextTable(meanFieldTable(parts)), ...meanFieldNotes(parts).map(plainText), COMPUTED_RESULTS_NOTE, ''].join('\n');
}

export function renderMeanFieldMarkdown(parts: readonly MeanFieldPart[], heading = '###'): string {
  return [renderMarkdownTable(meanFieldTable(parts), heading), '', ...meanFieldNotes(parts).map((note) => `- ${markdownText(note)}`), '', `_${markdownText(COMPUTED_RESULTS_NOTE)}_`, ''].join('\n');
}
