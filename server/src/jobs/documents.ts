/**
 * Which parts of the open documents are computed: the editor's rule over the job queue.
 *
 * - A part (the system or a fragment) with at most `autoFunctionLimit` basis functions (default
 *   150) is computed by itself: its mean field, and MP2 after it for RHF and UHF references, and
 *   for a fragment with an active space its active orbitals (analysis/computed.ts), and for a
 *   quantum fragment its Hamiltonian and, last, the Hamiltonians of its shot series (the cost
 *   panel's plot of shots against active-space size).
 *   150) is computed by itself: its mean field, and MP2 after it for RHF and UHF references.
 * - Under `embedding dmet`, whenever the system's mean field is computed, so is every fragment's
 *   bath after it.
 * - A larger part is computed when asked for (the code lens), as long as its inputs stay the same;
 *   an edit that changes them offers it again.
 * - A part whose computation the user stopped is not started again by itself until its inputs change.
 * - What a document no longer contains (an edit, closing it) is cancelled by the queue.
 *
 * Each document's demand is worked out from its analysis after the analysis has been published,
 * so typing never waits for it; it reads function counts and builds keys only for the parts it asks
 * for, and a part above the limit that nobody asked for costs nothing.
 */
import { specParts, type DocumentAnalysis, type PartComputation, type PartRef } from '../analysis';
import type { DemandEntry, JobQueue } from './queue';

export interface ComputeSettings {
  /** Parts with at most this many basis functions are computed by themselves (0: none). */
  readonly autoFunctionLimit: number;
}

export const DEFAULT_AUTO_FUNCTION_LIMIT = 150;

interface DocumentState {
  /** Mean-field keys the user asked for. */
  readonly asked: Set<string>;
  /** Mean-field keys the user stopped. */
  readonly stopped: Set<string>;
  analysis: DocumentAnalysis | undefined;
}

export class DocumentComputations {
  private readonly documents = new Map<string, DocumentState>();
  private settings: ComputeSettings;

  constructor(
    private readonly queue: JobQueue,
    settings: Partial<ComputeSettings> = {},
  ) {
    this.settings = { autoFunctionLimit: settings.autoFunctionLimit ?? DEFAULT_AUTO_FUNCTION_LIMIT };
  }

  get autoFunctionLimit(): number {
    return this.settings.autoFunctionLimit;
  }

  configure(settings: Partial<ComputeSettings>): void {
    this.settings = { ...this.settings, ...settings };
    for (const [uri, state] of this.documents) if (state.analysis) this.update(uri, state.analysis);
  }

  /** Whether a part is computed without being asked: within the function limit and not stopped. */
  runsByItself(uri: string, computation: PartComputation): boolean {
    if (computation.refusal || computation.functions > this.settings.autoFunctionLimit) return false;
    const stopped = this.documents.get(uri)?.stopped;
    return !stopped?.size || !stopped.has(computation.meanFieldKey!);
  }

  /** Whether the user asked for this part with its current inputs. */
  asked(uri: string, computation: PartComputation): boolean {
    const asked = this.documents.get(uri)?.asked;
    return !!asked?.size && !computation.refusal && asked.has(computation.meanFieldKey!);
  }

  /** A new analysed version of a document: what it wants computed now. */
  update(uri: string, analysis: DocumentAnalysis): void {
    const state = this.stateOf(uri);
    state.analysis = analysis;
    const entries: DemandEntry[] = [];
    const present = new Set<string>();
    const small = new Set<string>();
    let systemWanted: { explicit: boolean } | null = null;
    const model = analysis.model;
    for (const part of specParts(model)) {
      // A part above the limit that nobody asked for, and no bath to queue: nothing to do, and
      // nothing to read (its checks and key are linear in its atoms, every version).
      const space = part.kind === 'system' ? model.system : model.fragments[part.index]!.space;
      if (!systemWanted && state.asked.size === 0 && space.basisFunctions[model.basis.functions] > this.settings.autoFunctionLimit) continue;
      const computation = analysis.computation(part);
      // The bath builds on the system's mean field, not the fragment's own: a fragment that cannot be computed alone still has one.
      if (systemWanted && computation.bath) entries.push({ request: computation.bath, label: computation.label, explicit: systemWanted.explicit });
      if (computation.refusal) continue;
      if (computation.functions <= this.settings.autoFunctionLimit) small.add(computation.meanFieldKey!);
      const explicit = this.asked(uri, computation);
      if (!explicit && !this.runsByItself(uri, computation)) continue;
      if (part.kind === 'system') systemWanted = { explicit };
      present.add(computation.meanFieldKey!);
      entries.push({ request: computation.meanField!, label: computation.label, explicit });
      if (computation.mp2) entries.push({ request: computation.mp2, label: computation.label, explicit });
      if (computation.activeSpace) entries.push({ request: computation.activeSpace, label: computation.label, explicit });
      if (computation.hamiltonian) entries.push({ request: computation.hamiltonian, label: computation.label, explicit });
      // The shot series of the cost panel, after everything the part's own figures need.
      if (part.kind === 'fragment') for (const request of analysis.shotSeriesRequests(part.index)) entries.push({ request, label: computation.label, explicit: false });
    }
    // Requests whose inputs left the document lapse: an edit that restores them offers them again.
    for (const key of state.asked) if (!present.has(key)) state.asked.delete(key);
    for (const key of state.stopped) if (!small.has(key)) state.stopped.delete(key);
    this.queue.setDemand(uri, entries);
  }

  /** The user asks for a part (above the limit, or stopped before). */
  compute(uri: string, analysis: DocumentAnalysis, part: PartRef): PartComputation {
    const computation = analysis.computation(part);
    if (!computation.refusal) {
      const state = this.stateOf(uri);
      state.asked.add(computation.meanFieldKey!);
      state.stopped.delete(computation.meanFieldKey!);
      this.update(uri, analysis);
    }
    return computation;
  }

  /** The user stops a part's computation: it is cancelled and not started again by itself. */
  stop(uri: string, analysis: DocumentAnalysis, part: PartRef): void {
    const computation = analysis.computation(part);
    if (computation.refusal) return;
    const state = this.stateOf(uri);
    state.asked.delete(computation.meanFieldKey!);
    state.stopped.add(computation.meanFieldKey!);
    this.update(uri, analysis);
  }

  /** Stops a part by its mean-field key in every document that asks for it (a cancelled progress). */
  stopKey(meanFieldKey: string): void {
    for (const [uri, state] of this.documents) {
      state.asked.delete(meanFieldKey);
      state.stopped.add(meanFieldKey);
      if (state.analysis) this.update(uri, state.analysis);
    }
  }

  close(uri: string): void {
    this.documents.delete(uri);
    this.queue.release(uri);
  }

  private stateOf(uri: string): DocumentState {
    let state = this.documents.get(uri);
    if (!state) this.documents.set(uri, (state = { asked: new Set(), stopped: new Set(), analysis: undefined }));
    return state;
  }
}
