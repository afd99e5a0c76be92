/**
 * What the editor shows of computed results (mean field, MP2): the state of each part's
 * computation, the hover section of a fragment, the code lenses that show a result or offer to
 * compute a part, and the data of the orbital-level view. Everything reads the document's analysis
 * (its requests and the late results); whether a part runs by itself is the caller's policy (the
 * server's settings), passed in as plain functions.
 */
import type { CodeLens, Range } from 'vscode-languageserver-types';
import {
  computeCost,
  costText,
  formatMemory,
  MEAN_FIELD_KIND,
  MP2_KIND,
  partAtoms,
  specParts,
  type ComputeCost,
  type DocumentAnalysis,
  type LateResult,
  type MeanFieldOutcome,
  type Mp2Summary,
  type PartComputation,
  type PartRef,
} from '../analysis';
import { hartree } from '../jobs/progressText';
import { levelDiagramSvg } from '../report/levels';
import { toRange } from './positions';
import { onlyIncluded } from './includedFragments';

/** CODATA 2018: 1 hartree = 27.211386245988 eV. */
const HARTREE_IN_EV = 27.211386245988;
/** Orbitals listed either side of the Fermi level in hover cards. */
const AROUND_FERMI = 3;
/** Longest failure message a code lens shows (the hover has all of it). */
const LENS_MESSAGE = 110;

export const COMPUTED_NOTE = "Computed by Tessera's Hartree–Fock engine for this part alone (its own atoms, charge and multiplicity; no embedding): a result, not a planning estimate.";

/** The server's rule for which parts run by itself, and its limits. */
export interface ComputePolicy {
  readonly autoFunctionLimit: number;
  readonly memoryLimitBytes: number;
  runsByItself(computation: PartComputation): boolean;
  asked(computation: PartComputation): boolean;
}

/** Without a server (tests, the command line): nothing runs by itself. */
export const NO_COMPUTE_POLICY: ComputePolicy = { autoFunctionLimit: 0, memoryLimitBytes: 2 * 2 ** 30, runsByItself: () => false, asked: () => false };

export type MeanFieldState =
  | { readonly kind: 'refused'; readonly reason: string }
  | { readonly kind: 'too-large'; readonly cost: ComputeCost }
  | { readonly kind: 'offered'; readonly cost: ComputeCost; readonly stopped: boolean }
  | { readonly kind: 'pending'; readonly detail: string }
  | { readonly kind: 'failed'; readonly message: string }
  | { readonly kind: 'ready'; readonly outcome: MeanFieldOutcome; readonly mp2: LateResult<Mp2Summary> | null };

/** Spec atoms a failure names by their place in the part: `#5 (o2) and #7 (h3)`. */
function specAtomsText(analysis: DocumentAnalysis, part: PartRef, atoms: readonly number[]): string {
  const indices = partAtoms(analysis.model, part);
  const names = atoms
    .map((k) => indices[k])
    .filter((index): index is number => index !== undefined)
    .map((index) => {
      const atom = analysis.model.atoms[index]!;
      return `#${index + 1}${atom.label ? ` (${atom.label})` : ''}`;
    });
  return names.length === 0 ? '' : ` In the spec: atom${names.length > 1 ? 's' : ''} ${names.join(' and ')}.`;
}

function failureMessage(analysis: DocumentAnalysis, part: PartRef, result: { message: string; data?: Readonly<Record<string, unknown>> }): string {
  const atoms = result.data?.['atoms'];
  return Array.isArray(atoms) ? `${result.message}${specAtomsText(analysis, part, atoms as number[])}` : result.message;
}

export function meanFieldState(analysis: DocumentAnalysis, part: PartRef, policy: ComputePolicy = NO_COMPUTE_POLICY): MeanFieldState {
  const computation = analysis.computation(part);
  if (computation.refusal) return { kind: 'refused', reason: computation.refusal };
  const cost = computeCost(computation.functions, policy.memoryLimitBytes);
  if (cost.exceedsLimit) return { kind: 'too-large', cost };
  const result = analysis.late.get<MeanFieldOutcome>(MEAN_FIELD_KIND, computation.meanFieldKey!);
  switch (result.state) {
    case 'ready':
      return { kind: 'ready', outcome: result.value, mp2: computation.mp2Key ? analysis.late.get<Mp2Summary>(MP2_KIND, computation.mp2Key) : null };
    case 'failed':
      return { kind: 'failed', message: failureMessage(analysis, part, result) };
    case 'pending':
      return { kind: 'pending', detail: result.detail ?? 'queued' };
    case 'absent': {
      const runs = policy.runsByItself(computation);
      if (runs || policy.asked(computation)) return { kind: 'pending', detail: 'queued' };
      return { kind: 'offered', cost, stopped: computation.functions <= policy.autoFunctionLimit };
    }
  }
}

function signed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return text.startsWith('-') ? `−${text.slice(1)}` : text;
}

function orbitalRows(outcome: MeanFieldOutcome, spin: 'alpha' | 'beta', restricted: boolean): string[] {
  const { orbitalEnergies, occupations, irreps } = outcome.result;
  const energies = orbitalEnergies[spin];
  const occupied = occupations[spin];
  let homo = -1;
  energies.forEach((_, k) => {
    if (occupied[k]! > 0.5) homo = k;
  });
  const lumo = homo + 1;
  const rows: string[] = [];
  for (let k = Math.min(energies.length - 1, lumo + AROUND_FERMI - 1); k >= Math.max(0, homo - AROUND_FERMI + 1); k--) {
    const name = k > homo ? (k === lumo ? 'LUMO' : `LUMO+${k - lumo}`) : k === homo ? 'HOMO' : `HOMO−${homo - k}`;
    const occupation = restricted ? (occupations.alpha[k] ?? 0) + (occupations.beta[k] ?? 0) : occupied[k]!;
    rows.push(`| ${name} | ${signed(energies[k]!, 4)} | ${occupation} | ${irreps[spin][k] ?? '–'} |`);
  }
  return rows;
}

function mp2Row(mp2: LateResult<Mp2Summary> | null): string | null {
  if (!mp2) return null;
  switch (mp2.state) {
    case 'ready': {
      const frozen = mp2.value.frozenOrbitals > 0 ? `${mp2.value.frozenOrbitals} frozen-core orbital${mp2.value.frozenOrbitals === 1 ? '' : 's'}` : 'all electrons';
      return `| MP2 correlation | ${hartree(mp2.value.correlationEnergy)} (${frozen}); total ${hartree(mp2.value.totalEnergy)} |`;
    }
    case 'pending':
      return `| MP2 | computing: ${mp2.detail ?? 'queued'} |`;
    case 'failed':
      return `| MP2 | not computed: ${mp2.message} |`;
    case 'absent':
      return null;
  }
}

/** The hover section of a part's computed results, or of where its computation stands. */
export function meanFieldSection(analysis: DocumentAnalysis, part: PartRef, policy: ComputePolicy = NO_COMPUTE_POLICY): string {
  const state = meanFieldState(analysis, part, policy);
  const computation = analysis.computation(part);
  switch (state.kind) {
    case 'refused':
      return `**Mean field** · cannot be computed: ${state.reason}.`;
    case 'too-large':
      return `**Mean field** · not computed: ${computation.functions} basis functions would need ${costText(state.cost, true)}, more than the memory limit of ${formatMemory(state.cost.memoryLimitBytes)}.`;
    case 'offered':
      return `**Mean field** · not computed ${state.stopped ? '(stopped)' : `by itself (${computation.functions} basis functions, above the limit of ${policy.autoFunctionLimit})`}. The code lens on the fragment computes it: ${costText(state.cost, computation.mp2 !== null)}.`;
    case 'pending':
      return `**Mean field** · computing: ${state.detail}. The figures above are planning estimates until it arrives.`;
    case 'failed':
      return `**Mean field** · not computed: ${state.message}`;
    case 'ready':
      break;
  }
  const { result, seconds } = state.outcome;
  const restricted = result.reference !== 'uhf';
  const rows = [
    `| energy | ${result.converged ? `**${hartree(result.energy)}**, converged in ${result.iterations} iterations` : `**not converged** after ${result.iterations} iterations: last energy ${hartree(result.energy)}${result.convergence.energyChange !== null ? ` (last change ${signed(result.convergence.energyChange, 8)} Ha)` : ''}, not a result`} |`,
    `| nuclear repulsion | ${hartree(result.nuclearRepulsion)} |`,
  ];
  if (result.gap !== null) rows.push(`| HOMO–LUMO gap | ${result.gap.toFixed(4)} Ha (${(result.gap * HARTREE_IN_EV).toFixed(2)} eV) |`);
  const mp2 = result.converged ? mp2Row(state.mp2) : null;
  if (mp2) rows.push(mp2);
  const { dropped, smallestEigenvalue } = result.linearDependencies;
  const droppedText = dropped > 0 ? `: ${dropped} dropped as near-linearly dependent (smallest overlap eigenvalue ${smallestEigenvalue.toExponential(1)})` : '';
  rows.push(`| orbitals | ${result.orbitalCount} from ${result.functionCount} functions${droppedText} |`);
  if (result.reference === 'uhf') rows.push(`| ⟨S²⟩ | ${result.spinSquared.toFixed(4)} |`);
  const table = (spin: 'alpha' | 'beta', heading: string) => [heading, '', '| | energy (Ha) | electrons | irrep |', '| --- | ---: | ---: | --- |', ...orbitalRows(state.outcome, spin, restricted)];
  return [
    `**Mean field (computed)** · ${result.reference.toUpperCase()}, ${result.pointGroup}${seconds > 0 ? ` · ${seconds < 10 ? seconds.toFixed(1) : Math.round(seconds)} s` : ''}`,
    '',
    '| | |',
    '| --- | --- |',
    ...rows,
    '',
    ...(restricted ? table('alpha', 'Orbitals around the Fermi level:') : [...table('alpha', 'α orbitals around the Fermi level:'), '', ...table('beta', 'β orbitals:')]),
    '',
    `_${COMPUTED_NOTE}_`,
  ].join('\n');
}

/** A part as a command argument: `system` or the fragment's index. */
export function partArgument(part: PartRef): string | number {
  return part.kind === 'system' ? 'system' : part.index;
}

/** The part a command argument names, when the spec has it. */
export function partFromArgument(analysis: DocumentAnalysis, value: unknown): PartRef | undefined {
  if (value === 'system') return { kind: 'system' };
  if (Number.isInteger(value) && (value as number) >= 0 && (value as number) < analysis.model.fragments.length) return { kind: 'fragment', index: value as number };
  return undefined;
}

function shorten(text: string): string {
  return text.length <= LENS_MESSAGE ? text : `${text.slice(0, LENS_MESSAGE - 1)}…`;
}

export const COMPUTE_COMMAND = 'tessera.meanField.compute';
export const STOP_COMMAND = 'tessera.meanField.stop';
/** A client command: opens the orbital-level view of a part. */
export const LEVELS_COMMAND = 'tessera.showLevels';

/** Where a part's lenses go: a fragment's header, or the first statement for the system. */
function lensRange(analysis: DocumentAnalysis, part: PartRef): Range | undefined {
  if (part.kind === 'fragment') {
    return toRange(analysis, analysis.model.fragments[part.index]!.ast.statement.keyword.span);
  }
  const first = analysis.tree.statements[0];
  return first ? toRange(analysis, first.keyword.span) : undefined;
}

/** The lenses of one part: its result, its progress, or the offer to compute it with its cost. */
export function partLenses(analysis: DocumentAnalysis, uri: string, part: PartRef, policy: ComputePolicy): CodeLens[] {
  const range = lensRange(analysis, part);
  if (!range) return [];
  const state = meanFieldState(analysis, part, policy);
  const computation = analysis.computation(part);
  const args = [uri, partArgument(part)];
  // Fragments taken from another spec share the `with fragments` line: their lenses say whose they are.
  const included = part.kind === 'fragment' && onlyIncluded(analysis.model.fragments[part.index]!) ? analysis.model.fragments[part.index]!.name : undefined;
  const who = part.kind === 'system' ? 'System mean field' : included ? `Mean field of ${included}` : 'Mean field';
  const lens = (title: string, command = '') => ({ range, command: { title, command, ...(command ? { arguments: args } : {}) } });
  switch (state.kind) {
    case 'refused':
      return [];
    case 'too-large':
      return [lens(`${who}: too large for the memory limit (${formatMemory(state.cost.requiredBytes)} needed, limit ${formatMemory(state.cost.memoryLimitBytes)}; an estimate)`)];
    case 'offered':
      return [lens(`Compute ${part.kind === 'system' ? 'the system\'s' : 'the'} mean field${included ? ` of ${included}` : ''} (${costText(state.cost, computation.mp2 !== null)})`, COMPUTE_COMMAND)];
    case 'pending':
      return [lens(`${who}: computing, ${state.detail}`, LEVELS_COMMAND), lens('Stop', STOP_COMMAND)];
    case 'failed':
      return [lens(`${who} failed: ${shorten(state.message)}`)];
    case 'ready': {
      const { result } = state.outcome;
      if (!result.converged) return [lens(`${who}: not converged after ${result.iterations} iterations (last E = ${hartree(result.energy)}, not a result)`, LEVELS_COMMAND)];
      const gap = result.gap !== null ? ` · gap ${result.gap.toFixed(3)} Ha` : '';
      const mp2 = state.mp2?.state === 'ready' ? ` · MP2 ${hartree(state.mp2.value.correlationEnergy)}` : state.mp2?.state === 'pending' ? ' · MP2 computing' : '';
      return [lens(`${who}: E = ${hartree(result.energy)}${gap}${mp2} (computed)`, LEVELS_COMMAND)];
    }
  }
}

/** The computed-result lenses of every part of a spec. */
export function computeLenses(analysis: DocumentAnalysis, uri: string, policy: ComputePolicy): CodeLens[] {
  return specParts(analysis.model).flatMap((part) => partLenses(analysis, uri, part, policy));
}

// --- the orbital-level view ------------------------------------------------------------------

export interface LevelsView {
  spec: string | null;
  /** Every part that has a computed mean field, or is computing one. */
  parts: { id: string | number; label: string; state: string }[];
  /** The part shown, or null when none can be. */
  selected: string | number | null;
  /** The level picture of the selected part (standalone SVG), or null with `message` saying why. */
  svg: string | null;
  message: string | null;
  note: string;
}

function activeWindow(analysis: DocumentAnalysis, part: PartRef, outcome: MeanFieldOutcome): { first: number; count: number; label: string } | null {
  const space = part.kind === 'system' ? analysis.model.system : analysis.model.fragments[part.index]!.space;
  const active = space.active;
  const { electrons, orbitalCount } = outcome.result;
  const core = electrons.alpha + electrons.beta - active.electrons;
  if (core < 0 || core % 2 !== 0 || active.orbitals < 1 || core / 2 + active.orbitals > orbitalCount) return null;
  return { first: core / 2, count: active.orbitals, label: `active ${active.electrons}e ${active.orbitals}o (${active.source === 'given' ? 'as given' : 'outside the frozen core'})` };
}

function stateLabel(state: MeanFieldState): string {
  if (state.kind === 'ready') return state.outcome.result.converged ? 'computed' : 'not converged';
  return state.kind;
}

/** The data of the orbital-level view for a spec, showing `part` when it has a result (else the first that has). */
export function levelsView(analysis: DocumentAnalysis, part: PartRef | undefined, policy: ComputePolicy = NO_COMPUTE_POLICY): LevelsView {
  const states = specParts(analysis.model).map((candidate) => ({ part: candidate, state: meanFieldState(analysis, candidate, policy) }));
  const listed = states.filter((entry) => entry.state.kind === 'ready' || entry.state.kind === 'pending' || entry.state.kind === 'failed');
  const chosen =
    (part && states.find((entry) => entry.part.kind === part.kind && (part.kind === 'system' || (entry.part as { index: number }).index === part.index))) ??
    listed.find((entry) => entry.state.kind === 'ready') ??
    listed[0];
  const base = {
    spec: analysis.model.name ?? null,
    parts: listed.map((entry) => ({ id: partArgument(entry.part), label: analysis.computation(entry.part).label, state: stateLabel(entry.state) })),
    selected: chosen ? partArgument(chosen.part) : null,
    note: COMPUTED_NOTE,
  };
  if (!chosen) return { ...base, svg: null, message: 'No part of this spec has a computed mean field yet.' };
  const label = analysis.computation(chosen.part).label;
  const state = chosen.state;
  if (state.kind !== 'ready') {
    const why =
      state.kind === 'pending' ? `computing (${state.detail})` : state.kind === 'failed' ? `not computed: ${state.message}` : state.kind === 'refused' ? `cannot be computed: ${state.reason}` : 'not computed yet';
    return { ...base, svg: null, message: `The mean field of ${label} is ${why}.` };
  }
  const { result } = state.outcome;
  const svg = levelDiagramSvg({
    title: `${label}: orbital energies (computed)`,
    subtitle: `${result.reference.toUpperCase()} · ${result.functionCount} basis functions · ${result.pointGroup} · E = ${hartree(result.energy)}${result.converged ? '' : ` · NOT CONVERGED after ${result.iterations} iterations (last energy)`}`,
    reference: result.reference,
    pointGroup: result.pointGroup,
    energies: result.orbitalEnergies,
    occupations: result.occupations,
    irreps: result.irreps,
    active: activeWindow(analysis, chosen.part, state.outcome),
    note: 'Computed Hartree–Fock orbitals of this part alone; the active window is the plan\'s active space placed on them in energy order.',
  });
  return { ...base, svg, message: null };
}
