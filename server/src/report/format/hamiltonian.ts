/**
 * Computed active-space Hamiltonians as the command line prints them: the JSON object under
 * `hamiltonian` for the system and each fragment, and one table (text or Markdown) of every part.
 * String counts, λ, the constant and the groups are computed from the explicit strings; the shot
 * budgets and the phase-estimation cost are estimates built on them, and the output says which.
 */
import { hamiltonianFigures, type HamiltonianOutcome } from '../../analysis';
import type { ActiveSpaceFigures, MappingFigures } from '../../electronic/measurement/figures';
import { markdownText, plainText } from './escape';
import { renderMarkdownTable, renderTextTable, type Table } from './table';

/** What became of one part's Hamiltonian. */
export type PartHamiltonian =
  | { readonly state: 'computed'; readonly outcome: HamiltonianOutcome }
  | { readonly state: 'failed'; readonly code: string; readonly message: string }
  | { readonly state: 'not-asked'; readonly reason: string }
  /** Too large to build explicitly: the counted figures (the combinatorial bound) stand. */
  | { readonly state: 'bound'; readonly note: string };

export interface HamiltonianPart {
  /** `system` or `fragment <name>`. */
  readonly label: string;
  readonly result: PartHamiltonian;
}

export const HAMILTONIAN_NOTE =
  "Hamiltonian figures are computed by Tessera from the part's own restricted mean field (RHF; ROHF for open shells): strings with |c| > 1e-8 Ha counted from the explicit qubit Hamiltonian, λ and the constant summed from it. Shot budgets and the phase-estimation cost are estimates built on these figures.";

function mappingJson(m: MappingFigures): Record<string, unknown> {
  return {
    qubits: m.qubits,
    terms: m.terms,
    oneNorm: m.oneNorm,
    identity: m.identity,
    groups: m.groups,
    largest: m.largest.map((term) => ({ label: term.label, coefficient: term.coefficient })),
    shots: { separateBound: m.shots.separateBound, groupedEstimate: m.shots.groupedEstimate, silentGroups: m.shots.silentGroups },
  };
}

/** The `hamiltonian` object of one part in the JSON estimate, at target accuracy ε (hartree). */
export function hamiltonianJson(result: PartHamiltonian, epsilon: number): Record<string, unknown> | null {
  if (result.state === 'not-asked') return null;
  if (result.state === 'failed') return { computed: false, error: { code: result.code, message: result.message } };
  if (result.state === 'bound') return { computed: false, source: 'counted', note: result.note };
  const outcome = result.outcome;
  const space = {
    electrons: outcome.integrals.electrons.alpha + outcome.integrals.electrons.beta,
    orbitals: outcome.integrals.orbitals,
    alpha: outcome.integrals.electrons.alpha,
    beta: outcome.integrals.electrons.beta,
    reference: outcome.reference,
    core: outcome.core.map((p) => p + 1),
    active: outcome.active.map((p) => p + 1),
    orbitalEnergies: outcome.activeOrbitalEnergies,
    source: outcome.source,
    orbitalNumbering: 'one-based, energy order of the mean field',
  };
  const energies = { nuclearRepulsion: outcome.integrals.nuclearRepulsion, coreEnergy: outcome.integrals.coreEnergy };
  if (outcome.figures.status === 'too-large') {
    return { computed: false, source: 'counted', activeSpace: space, ...energies, note: outcome.figures.note };
  }
  const f = hamiltonianFigures(outcome, epsilon) as ActiveSpaceFigures;
  const jw = f.mappings.jordanWigner;
  return {
    computed: true,
    source: 'computed',
    activeSpace: space,
    pauliTerms: { jordanWigner: jw.terms, bravyiKitaev: f.mappings.bravyiKitaev.terms, parity: f.mappings.parity.terms, identityIncluded: true },
    oneNorm: jw.oneNorm,
    constant: f.constant,
    ...energies,
    threshold: f.threshold,
    largest: jw.largest.map((term) => ({ label: term.label, coefficient: term.coefficient })),
    groups: { jordanWigner: jw.groups, bravyiKitaev: f.mappings.bravyiKitaev.groups, parity: f.mappings.parity.groups, method: f.conventions.groups },
    shots: {
      source: 'estimate',
      epsilon: f.epsilon,
      separateBound: jw.shots.separateBound,
      groupedEstimate: jw.shots.groupedEstimate,
      mapping: 'jordan-wigner',
      convention: jw.shots.convention,
    },
    faultTolerant: { ...f.faultTolerant, references: [...f.faultTolerant.references], source: 'estimate' },
    mappings: { jordanWigner: mappingJson(jw), bravyiKitaev: mappingJson(f.mappings.bravyiKitaev), parity: mappingJson(f.mappings.parity) },
    conventions: f.conventions,
    seconds: outcome.seconds,
  };
}

function count(value: number): string {
  return value.toLocaleString('en-US');
}

function computedFigures(result: PartHamiltonian, epsilon: number): ActiveSpaceFigures | null {
  if (result.state !== 'computed') return null;
  const figures = hamiltonianFigures(result.outcome, epsilon);
  return figures.status === 'computed' ? figures : null;
}

/** One row per part that asked for a Hamiltonian. */
export function hamiltonianTable(parts: readonly HamiltonianPart[], epsilon: number): Table {
  return {
    title: `Active-space Hamiltonian (computed; shots at ε = ${(epsilon * 1000).toPrecision(3)} mHa, estimates)`,
    headers: ['part', 'space', 'strings JW/BK/parity', 'λ (Ha)', 'constant (Ha)', 'QWC groups JW', 'shots (λ/ε)²', 'shots grouped', 'QPE Toffolis'],
    numeric: [false, false, true, true, true, true, true, true, true],
    rows: parts
      .filter((part) => part.result.state !== 'not-asked')
      .map(({ label, result }) => {
        if (result.state === 'failed') return [label, '–', 'not computed', '–', '–', '–', '–', '–', '–'];
        if (result.state === 'bound') return [label, '–', 'too large (bound)', '–', '–', '–', '–', '–', '–'];
        if (result.state !== 'computed') return [label, '–', '–', '–', '–', '–', '–', '–', '–'];
        const o = result.outcome;
        const space = `${o.integrals.electrons.alpha + o.integrals.electrons.beta}e${o.integrals.orbitals}o ${o.reference.toUpperCase()}`;
        const f = computedFigures(result, epsilon);
        if (!f) return [label, space, 'too large (bound)', '–', '–', '–', '–', '–', '–'];
        const jw = f.mappings.jordanWigner;
        return [
          label,
          space,
          `${count(jw.terms)}/${count(f.mappings.bravyiKitaev.terms)}/${count(f.mappings.parity.terms)}`,
          jw.oneNorm.toFixed(6),
          f.constant.toFixed(6),
          count(jw.groups),
          count(jw.shots.separateBound),
          count(jw.shots.groupedEstimate),
          f.faultTolerant.toffolis.toExponential(2),
        ];
      }),
  };
}

/** Failures, too-large spaces and the active orbitals, to read beside the table. */
export function hamiltonianNotes(parts: readonly HamiltonianPart[]): string[] {
  const notes: string[] = [];
  for (const { label, result } of parts) {
    if (result.state === 'failed') notes.push(`${label}: Hamiltonian not computed: ${result.message}`);
    else if (result.state === 'bound') notes.push(`${label}: ${result.note}.`);
    else if (result.state === 'computed') {
      notes.push(`${label}: ${result.outcome.source}.`);
      if (result.outcome.figures.status === 'too-large') notes.push(`${label}: ${result.outcome.figures.note}.`);
    }
  }
  return notes;
}

export function renderHamiltonianText(parts: readonly HamiltonianPart[], epsilon: number): string {
  return [renderTextTable(hamiltonianTable(parts, epsilon)), ...hamiltonianNotes(parts).map(plainText), HAMILTONIAN_NOTE, ''].join('\n');
}

export function renderHamiltonianMarkdown(parts: readonly HamiltonianPart[], epsilon: number, heading = '###'): string {
  return [
    renderMarkdownTable(hamiltonianTable(parts, epsilon), heading),
    '',
    ...hamiltonianNotes(parts).map((note) => `- ${markdownText(note)}`),
    '',
    `_${markdownText(HAMILTONIAN_NOTE)}_`,
    '',
  ].join('\n');
}
