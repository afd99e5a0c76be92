/**
 * Computed active-space Hamiltonians as the command line prints them: the JSON object under
 * `hamiltonian` for the system and each fragment, and one table (text or Markdown) of every part.
 * String counts, λ, the constant and the groups are computed from the explicit strings; the shot
 * budgets and the phase-estimation cost are estimates built on them, and the output says which.
 */
import { hamiltonianFigures, type HamiltonianOutcome } from '../../analysis';
import { vqeRun } from '../../electronic/measurement/shots';
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

/** What the spec says about measuring a part: its target accuracy, and its variational run when it has one. */
export interface MeasurementSettings {
  /** Target accuracy ε (hartree). */
  readonly epsilon: number;
  /** `vqe`, `qpe`, or null without a quantum tier (--xyz). */
  readonly method: string | null;
  readonly vqe: { readonly parameters: number; readonly steps: number; readonly stepsGiven: boolean; readonly scanPoints: number; readonly shotRate: number | null } | null;
}

export const HAMILTONIAN_NOTE =
  "Hamiltonian figures are computed by Tessera from the part's own restricted mean field (RHF; ROHF for open shells): strings with |c| > 1e-8 Ha counted from the explicit qubit Hamiltonian, λ and the constant summed from it. Shot budgets and the phase-estimation cost are estimates built on these figures.";

export const BUDGET_NOTE =
  'Shots: (λ/ε)² measures every string on its own with optimal allocation, an upper bound for any state (Wecker, Hastings & Troyer, PRA 92, 042303 (2015); Rubin, Babbush & McClean, NJP 20, 053020 (2018)); grouped: QWC groups with variances of the mean-field reference determinant, an estimate, low for correlated states. ε is one standard deviation of the energy. VQE run: (2 × parameters + 1) evaluations per step (parameter shift) × steps × scan points × grouped shots; time at the shot rate of `limits`, device overheads not included. QPE: qubitized phase estimation of the Pauli LCU, ⌈πλ/2ε⌉ walk steps (Babbush et al., PRX 8, 041015 (2018); Lee et al., PRX Quantum 2, 030305 (2021)), an estimate.';

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

/** A variational run's evaluations, shots and time, with the bound and with the grouped estimate per evaluation. */
function vqeJson(settings: MeasurementSettings, shots: { separateBound: number; groupedEstimate: number }): Record<string, unknown> | null {
  const vqe = settings.vqe;
  if (!vqe) return null;
  const base = { parameters: vqe.parameters, steps: vqe.steps, scanPoints: vqe.scanPoints, ...(vqe.shotRate !== null ? { shotRate: vqe.shotRate } : {}) };
  const bound = vqeRun({ ...base, shotsPerEvaluation: shots.separateBound });
  const grouped = vqeRun({ ...base, shotsPerEvaluation: shots.groupedEstimate });
  return {
    source: 'estimate',
    parameters: vqe.parameters,
    steps: vqe.steps,
    stepsSource: vqe.stepsGiven ? 'spec' : 'default (an assumption)',
    scanPoints: vqe.scanPoints,
    evaluationsPerStep: bound.evaluationsPerStep,
    evaluations: bound.evaluations,
    shots: { separateBound: bound.shots, groupedEstimate: grouped.shots },
    shotRate: vqe.shotRate,
    seconds: vqe.shotRate === null ? null : { separateBound: bound.seconds, groupedEstimate: grouped.seconds },
    convention: bound.convention,
  };
}

/** The `hamiltonian` object of one part in the JSON estimate, at the part's target accuracy. */
export function hamiltonianJson(result: PartHamiltonian, settings: MeasurementSettings): Record<string, unknown> | null {
  const epsilon = settings.epsilon;
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
    orbitalKind: outcome.orbitalKind,
    orbitalNumbering: outcome.orbitalKind === 'canonical' ? 'one-based, energy order of the mean field' : `one-based, the order of the ${outcome.orbitalKind} orbitals the active space was chosen in`,
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
    vqe: vqeJson(settings, jw.shots),
    faultTolerant: { ...f.faultTolerant, references: [...f.faultTolerant.references], source: 'estimate', shown: settings.method === 'qpe' ? 'the tier\'s method' : 'for comparison' },
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

function duration(seconds: number | undefined): string {
  if (seconds === undefined) return '–';
  if (seconds < 120) return `${seconds.toPrecision(3)} s`;
  if (seconds < 2 * 3600) return `${(seconds / 60).toPrecision(3)} min`;
  if (seconds < 2 * 86400) return `${(seconds / 3600).toPrecision(3)} h`;
  return `${(seconds / 86400).toPrecision(3)} days`;
}

/** One row per part that asked for a Hamiltonian (`settings` in the same order as `parts`). */
export function hamiltonianTable(parts: readonly HamiltonianPart[], settings: readonly MeasurementSettings[]): Table {
  const dash = ['–', '–', '–', '–', '–', '–', '–', '–', '–'];
  return {
    title: 'Active-space Hamiltonian (computed) and its measurement budget (estimates)',
    headers: ['part', 'space', 'strings JW/BK/parity', 'λ (Ha)', 'constant (Ha)', 'QWC groups JW (sorted insertion, block order)', 'ε (mHa)', 'shots (λ/ε)²', 'shots grouped', 'VQE run shots (grouped)', 'VQE time', 'QPE Toffolis', 'QPE logical qubits (system + ancillas)'],
    numeric: [false, false, true, true, true, true, true, true, true, true, true, true, true],
    rows: parts
      .map((part, k) => ({ ...part, settings: settings[k]! }))
      .filter((part) => part.result.state !== 'not-asked')
      .map(({ label, result, settings: setting }) => {
        if (result.state === 'failed') return [label, '–', 'not computed', ...dash.slice(0, 10)];
        if (result.state === 'bound') return [label, '–', 'too large (bound)', ...dash.slice(0, 10)];
        if (result.state !== 'computed') return [label, ...dash, '–', '–', '–'];
        const epsilon = setting.epsilon;
        const o = result.outcome;
        const space = `${o.integrals.electrons.alpha + o.integrals.electrons.beta}e${o.integrals.orbitals}o ${o.reference.toUpperCase()}`;
        const f = computedFigures(result, epsilon);
        if (!f) return [label, space, 'too large (bound)', ...dash.slice(0, 10)];
        const jw = f.mappings.jordanWigner;
        const vqe = setting.vqe ? vqeRun({ parameters: setting.vqe.parameters, steps: setting.vqe.steps, scanPoints: setting.vqe.scanPoints, shotsPerEvaluation: jw.shots.groupedEstimate, ...(setting.vqe.shotRate !== null ? { shotRate: setting.vqe.shotRate } : {}) }) : null;
        return [
          label,
          space,
          `${count(jw.terms)}/${count(f.mappings.bravyiKitaev.terms)}/${count(f.mappings.parity.terms)}`,
          jw.oneNorm.toFixed(6),
          f.constant.toFixed(6),
          count(jw.groups),
          (epsilon * 1000).toPrecision(3),
          count(jw.shots.separateBound),
          count(jw.shots.groupedEstimate),
          vqe ? vqe.shots.toExponential(2) : '–',
          vqe ? duration(vqe.seconds) : '–',
          f.faultTolerant.toffolis.toExponential(2),
          String(f.faultTolerant.logicalQubits),
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

export function renderHamiltonianText(parts: readonly HamiltonianPart[], settings: readonly MeasurementSettings[]): string {
  return [renderTextTable(hamiltonianTable(parts, settings)), ...hamiltonianNotes(parts).map(plainText), HAMILTONIAN_NOTE, BUDGET_NOTE, ''].join('\n');
}

export function renderHamiltonianMarkdown(parts: readonly HamiltonianPart[], settings: readonly MeasurementSettings[], heading = '###'): string {
  return [
    renderMarkdownTable(hamiltonianTable(parts, settings), heading),
    '',
    ...hamiltonianNotes(parts).map((note) => `- ${markdownText(note)}`),
    '',
    `_${markdownText(HAMILTONIAN_NOTE)}_`,
    '',
    `_${markdownText(BUDGET_NOTE)}_`,
    '',
  ].join('\n');
}
