/**
 * `tessera estimate … --mean-field`: the mean field (and MP2 after it for RHF and UHF) of the
 * system and every fragment, computed through the jobs layer exactly as the editor computes it:
 * the same requests (analysis/computed.ts), the same queue and worker thread. Progress goes to
 * standard error for jobs that take a while; an interrupt (Ctrl+C) cancels the running job.
 * With an active space per part (`--active`, or a quantum fragment's `active`), the active-space
 * Hamiltonian after a restricted mean field (RHF; ROHF for open shells) too.
 * Under `embedding dmet` each fragment's bath is computed after the system's mean field.
 */
import {
  HAMILTONIAN_KIND,
  partComputation,
  hamiltonianRequest,
  type HamiltonianSpace,
  type HamiltonianOutcome,
  type HamiltonianRequest,
  type PartComputation,
  specParts,
  type ActiveSpaceOutcome,
  type DocumentAnalysis,
  type LateResult,
  type MeanFieldOutcome,
  type DmetBathRequest,
  type DmetBathSummary,
  type Mp2Summary,
  type RequestOptions,
} from '../../analysis';
import { JobQueue, type DemandEntry, type JobEvent } from '../../jobs';
import type { HamiltonianPart, PartHamiltonian } from '../../report/format/hamiltonian';
import type { PartActiveSpace } from '../../report/format/activeSpace';
import type { PartBath } from '../../report/format/dmetBath';
import type { MeanFieldPart, PartMeanField } from '../../report/format/meanField';
import type { CliIo } from '../io';

/** A part's active space, or why it gets no Hamiltonian (null: none asked for). */
export type ActiveSpaceOf = (computation: PartComputation) => HamiltonianSpace | { readonly refusal: string } | { readonly bound: string } | null;

export interface MeanFieldOptions extends RequestOptions {
  readonly memoryLimitBytes?: number;
  readonly workers?: number;
  /** Which parts get an active-space Hamiltonian, and which orbitals. */
  readonly activeSpaces?: ActiveSpaceOf;
  /** Only these parts are computed (default: all). */
  readonly onlyParts?: (computation: PartComputation) => boolean;
  /** Further canonical windows whose Hamiltonians each part gets (the shots-against-size series). */
  readonly seriesSpaces?: (computation: PartComputation) => readonly HamiltonianSpace[];
}

/** One part's Hamiltonians over a series of active-space sizes, smallest first. */
export interface HamiltonianSeries {
  readonly label: string;
  readonly part: PartComputation['part'];
  readonly points: readonly { readonly space: HamiltonianSpace; readonly result: PartHamiltonian }[];
}

export interface MeanFieldRun {
  readonly parts: MeanFieldPart[];
  /** One per part, in the order of `parts`; empty without `activeSpaces`. */
  readonly hamiltonians: HamiltonianPart[];
  /** One per part that asked for a series (`seriesSpaces`). */
  readonly series: HamiltonianSeries[];
  /** True when an interrupt cancelled what was still running. */
  readonly interrupted: boolean;
}

/** A job must run this long before its progress is printed. */
const QUIET_MS = 2000;
/** Then at most one progress line per job this often. */
const PROGRESS_EVERY_MS = 2000;

function progressPrinter(io: CliIo): (event: JobEvent) => void {
  const started = new Map<number, number>();
  const printed = new Map<number, number>();
  return (event) => {
    const id = event.job.id;
    const now = performance.now();
    const what = `${event.job.kind === 'mp2' ? 'MP2' : event.job.kind === 'dmet-bath' ? 'DMET bath' : event.job.kind === HAMILTONIAN_KIND ? 'Hamiltonian' : event.job.kind === 'active-space' ? 'active orbitals' : 'mean field'} of ${event.job.label}`;
    switch (event.type) {
      case 'started':
        started.set(id, now);
        return;
      case 'progress': {
        const since = now - (started.get(id) ?? now);
        if (since < QUIET_MS || now - (printed.get(id) ?? 0) < PROGRESS_EVERY_MS) return;
        printed.set(id, now);
        io.stderr(`tessera: ${what}: ${event.text} (${(since / 1000).toFixed(0)} s)\n`);
        return;
      }
      case 'done':
        if (printed.has(id)) io.stderr(`tessera: ${what}: done in ${((now - (started.get(id) ?? now)) / 1000).toFixed(1)} s\n`);
        return;
      case 'failed':
      case 'cancelled':
        return;
    }
  };
}

function failed(result: LateResult<unknown>, interrupted: boolean): { code: string; message: string } {
  if (result.state === 'failed') return { code: String(result.data?.['code'] ?? 'failed'), message: result.message };
  return interrupted
    ? { code: 'cancelled', message: 'The computation was interrupted before it finished; nothing was computed for this part.' }
    : { code: 'cancelled', message: 'The computation stopped without a result.' };
}

async function bathOf(queue: JobQueue, request: DmetBathRequest, interrupted: () => boolean): Promise<PartBath> {
  const settled = await queue.whenSettled(request);
  return settled.state === 'ready' ? { state: 'computed', summary: settled.value as DmetBathSummary } : { state: 'failed', ...failed(settled, interrupted()) };
}

async function activeSpaceOf(queue: JobQueue, analysis: DocumentAnalysis, computation: PartComputation, interrupted: () => boolean): Promise<PartActiveSpace> {
  const settled = await queue.whenSettled(computation.activeSpace!);
  if (settled.state !== 'ready') return { state: 'failed', ...failed(settled, interrupted()) };
  const tier = computation.part.kind === 'fragment' ? analysis.model.fragments[computation.part.index]!.tier : undefined;
  const source = tier?.activeSource === 'estimated' && tier.activeChoice ? `estimated-${tier.activeChoice.kind}` : 'given';
  return { state: 'computed', outcome: settled.value as ActiveSpaceOutcome, counted: { electrons: tier?.active?.electrons ?? 0, orbitals: tier?.active?.orbitals ?? 0, source } };
}

export async function computeMeanFields(analysis: DocumentAnalysis, options: MeanFieldOptions, io: CliIo): Promise<MeanFieldRun> {
  // The results go where the analysis reads them: the figures built on computed active orbitals
  // (DocumentAnalysis.fragmentFigures) find them under the keys of the spec's own requests.
  const store = analysis.late;
  const queue = new JobQueue(store, { workers: options.workers ?? 1, ...(options.memoryLimitBytes !== undefined ? { memoryLimitBytes: options.memoryLimitBytes } : {}) });
  queue.onEvent(progressPrinter(io));
  const computations = specParts(analysis.model)
    .map((part) => partComputation(analysis.model, part, options))
    .filter((computation) => options.onlyParts?.(computation) ?? true);
  const entries: DemandEntry[] = [];
  const hamiltonianRequests = new Map<PartComputation, HamiltonianRequest | { refusal: string } | { bound: string } | null>();
  const seriesRequests = new Map<PartComputation, HamiltonianRequest[]>();
  for (const computation of computations) {
    if (computation.refusal) continue;
    entries.push({ request: computation.meanField!, label: computation.label, explicit: true });
    if (computation.mp2) entries.push({ request: computation.mp2, label: computation.label, explicit: true });
    const space = options.activeSpaces?.(computation) ?? null;
    const request = space === null || 'refusal' in space || 'bound' in space ? space : hamiltonianRequest(computation.meanField!, space, computation.activeSpace);
    hamiltonianRequests.set(computation, request);
    if (request && 'kind' in request) entries.push({ request, label: computation.label, explicit: true });
    if (computation.activeSpace) entries.push({ request: computation.activeSpace, label: computation.label, explicit: true });
    const series = (options.seriesSpaces?.(computation) ?? []).map((window) => hamiltonianRequest(computation.meanField!, window, null));
    seriesRequests.set(computation, series);
    for (const request of series) entries.push({ request, label: computation.label, explicit: true });
  }
  for (const computation of computations) if (computation.bath) entries.push({ request: computation.bath, label: computation.label, explicit: true });
  let interrupted = false;
  const stopListening = io.onInterrupt?.(() => {
    interrupted = true;
    void queue.dispose();
  });
  try {
    queue.setDemand('cli', entries);
    const parts: MeanFieldPart[] = [];
    const hamiltonians: HamiltonianPart[] = [];
    for (const computation of computations) {
      if (options.activeSpaces) hamiltonians.push({ label: computation.label, result: await hamiltonianOf(queue, computation, hamiltonianRequests.get(computation) ?? null, interrupted) });
      const bath = computation.bath ? await bathOf(queue, computation.bath, () => interrupted) : undefined;
      if (computation.refusal) {
        parts.push({ label: computation.label, result: { state: 'failed', reference: null, code: 'refused', message: `${computation.refusal}.` }, ...(bath ? { bath } : {}) });
        continue;
      }
      const request = computation.meanField!;
      const settled = await queue.whenSettled(request);
      let result: PartMeanField;
      if (settled.state === 'ready') {
        const outcome = settled.value as MeanFieldOutcome;
        let mp2: Mp2Summary | { error: string } | null = null;
        if (computation.mp2 && outcome.result.converged) {
          const after = await queue.whenSettled(computation.mp2);
          mp2 = after.state === 'ready' ? (after.value as Mp2Summary) : { error: failed(after, interrupted).message };
        }
        result = { state: 'computed', outcome, mp2 };
      } else {
        result = { state: 'failed', reference: request.reference, ...failed(settled, interrupted) };
      }
      const activeSpace = computation.activeSpace ? await activeSpaceOf(queue, analysis, computation, () => interrupted) : undefined;
      parts.push({ label: computation.label, result, ...(activeSpace ? { activeSpace } : {}), ...(bath ? { bath } : {}) });
    }
    const series: HamiltonianSeries[] = [];
    for (const computation of computations) {
      const requests = seriesRequests.get(computation) ?? [];
      if (requests.length === 0) continue;
      const points = [];
      for (const request of requests) points.push({ space: request.space, result: await hamiltonianOf(queue, computation, request, interrupted) });
      series.push({ label: computation.label, part: computation.part, points });
    }
    return { parts, hamiltonians, series, interrupted };
  } finally {
    stopListening?.();
    await queue.dispose();
  }
}

async function hamiltonianOf(queue: JobQueue, computation: PartComputation, request: HamiltonianRequest | { refusal: string } | { bound: string } | null, interrupted: boolean): Promise<PartHamiltonian> {
  if (request === null) return { state: 'not-asked', reason: 'no active space' };
  if ('bound' in request) return { state: 'bound', note: request.bound };
  if (computation.refusal) return { state: 'failed', code: 'refused', message: `${computation.refusal}.` };
  if ('refusal' in request) return { state: 'failed', code: 'refused', message: request.refusal };
  const settled = await queue.whenSettled(request);
  if (settled.state === 'ready') return { state: 'computed', outcome: settled.value as HamiltonianOutcome };
  return { state: 'failed', ...failed(settled, interrupted) };
}
