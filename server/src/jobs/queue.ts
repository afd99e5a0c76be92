/**
 * The job queue: long computations (server/src/analysis/computed.ts lists the kinds) run in worker
 * threads, fed by the demand of their owners (each open document, or the command line), with
 * results kept in a LateResults store under the keys of their inputs.
 *
 * - Demand: `setDemand(owner, entries)` says what one owner wants now; what no owner wants any more
 *   (inputs that changed, a closed document) is cancelled. A request whose result is in the store
 *   (ready or failed) is not computed again.
 * - Prerequisites: a request that builds on another (MP2 on a mean field) waits for that result,
 *   which is queued with it, and receives it as input; when it fails, so does the dependent.
 * - Order: requests asked for explicitly first, then the smaller parts (fewest basis functions),
 *   then first come. A short start delay lets fast typing cancel jobs before they start.
 * - Cancellation: a running job's shared flag is set (the kernels read it every few dozen integral
 *   quartets and every SCF iteration); a worker that has not stopped after the grace period
 *   (150 ms by default) is terminated and replaced. Its result is forgotten at once, so nothing
 *   waits for the worker.
 * - Memory: a mean-field request whose estimated need exceeds the memory limit is refused with the
 *   estimate (analysis/computeCost.ts); within it, the integrals are stored only up to what fits.
 * - Few cores: one worker by default; idle workers end after a while and are started again on demand.
 *
 * Nothing here blocks: the main thread only posts messages and updates the store.
 */
import { existsSync } from 'node:fs';
import * as path from 'node:path';
import { Worker } from 'node:worker_threads';
import {
  computeCost,
  costText,
  DEFAULT_MEMORY_LIMIT_BYTES,
  formatMemory,
  MEAN_FIELD_KIND,
  prerequisites,
  requestKey,
  type ComputeRequest,
  type LateResult,
  type LateResults,
} from '../analysis';
import type { FromWorker, JobFailure, JobProgress, ToWorker } from './protocol';
import { progressText } from './progressText';

export interface JobQueueOptions {
  /** Worker threads (default 1: the machine's cores are shared with the editor). */
  readonly workers?: number;
  /** The bundled worker script (default: worker.js next to this bundle, else dist/worker.js). */
  readonly workerScript?: string;
  /** How long a running job may take to notice its cancel flag before its worker is terminated. */
  readonly cancelGraceMs?: number;
  /** How long a new job waits before it starts (typing replaces it meanwhile). */
  readonly startDelayMs?: number;
  /** Memory one job may use (default 2 GiB). */
  readonly memoryLimitBytes?: number;
  /** Finished results no owner wants any more, kept for when an edit is undone (default 32). */
  readonly keepResults?: number;
  /** An idle worker ends after this long (default 60 s). */
  readonly idleWorkerMs?: number;
}

/** One entry of an owner's demand. */
export interface DemandEntry {
  readonly request: ComputeRequest;
  /** What users call the part (`fragment site`), for progress titles and messages. */
  readonly label: string;
  /** Asked for by the user (a code lens), not by the function-count rule: goes first. */
  readonly explicit?: boolean;
}

export interface JobInfo {
  readonly id: number;
  readonly kind: string;
  readonly key: string;
  readonly label: string;
  readonly request: ComputeRequest;
}

export type JobEvent =
  | { readonly type: 'started'; readonly job: JobInfo }
  | { readonly type: 'progress'; readonly job: JobInfo; readonly progress: JobProgress; readonly text: string }
  | { readonly type: 'done'; readonly job: JobInfo; readonly seconds: number }
  | { readonly type: 'failed'; readonly job: JobInfo; readonly failure: JobFailure }
  | {
      readonly type: 'cancelled';
      readonly job: JobInfo;
      /** flag: the job noticed its flag; terminated: its worker was ended; unstarted: it never ran. */
      readonly how: 'flag' | 'terminated' | 'unstarted';
      /** From setting the flag to the worker being free again (null when it never ran). */
      readonly afterMs: number | null;
      /** Where it stopped. */
      readonly phase: string | null;
    };

type JobState = 'waiting' | 'queued' | 'running' | 'cancelling';

interface Job extends JobInfo {
  readonly storeId: string;
  readonly owners: Set<string>;
  readonly dependents: Set<Job>;
  readonly requires: readonly ComputeRequest[];
  explicit: boolean;
  state: JobState;
  eligibleAt: number;
  slot: Slot | null;
  flag: Int32Array | null;
  cancelledAt: number;
  storageBytes: number;
}

interface Slot {
  worker: Worker | null;
  job: Job | null;
  graceTimer: ReturnType<typeof setTimeout> | null;
  idleTimer: ReturnType<typeof setTimeout> | null;
  /** Set when this slot should go once it is free (the worker count was lowered). */
  retired: boolean;
}

const DEFAULTS = { workers: 1, cancelGraceMs: 150, startDelayMs: 0, keepResults: 32, idleWorkerMs: 60_000 };

function storeIdOf(kind: string, key: string): string {
  return `${kind}\u0000${key}`;
}

/** worker.js beside the running bundle (dist/), or dist/worker.js when running from the sources. */
export function defaultWorkerScript(): string {
  const here = typeof __dirname === 'string' ? __dirname : process.cwd();
  const candidates = [path.join(here, 'worker.js'), path.resolve(here, '..', '..', '..', 'dist', 'worker.js')];
  return candidates.find((file) => existsSync(file)) ?? candidates[0]!;
}

export class JobQueue {
  private readonly jobs = new Map<string, Job>();
  private readonly demands = new Map<string, Map<string, DemandEntry>>();
  private readonly slots: Slot[] = [];
  private readonly listeners = new Set<(event: JobEvent) => void>();
  /** Finished results this queue wrote, by store id, with when they were last wanted. */
  private readonly finished = new Map<string, { kind: string; key: string; wantedAt: number }>();
  /** Requests refused for the memory limit: forgotten when the limit changes. */
  private readonly refused = new Map<string, { kind: string; key: string }>();
  private nextId = 1;
  private clock = 0;
  private pumpTimer: ReturnType<typeof setTimeout> | null = null;
  private disposed = false;
  private memoryLimitBytes: number;
  private readonly script: string;
  private readonly cancelGraceMs: number;
  private readonly startDelayMs: number;
  private readonly keepResults: number;
  private readonly idleWorkerMs: number;

  constructor(
    readonly store: LateResults,
    options: JobQueueOptions = {},
  ) {
    this.script = options.workerScript ?? defaultWorkerScript();
    this.cancelGraceMs = options.cancelGraceMs ?? DEFAULTS.cancelGraceMs;
    this.startDelayMs = options.startDelayMs ?? DEFAULTS.startDelayMs;
    this.keepResults = options.keepResults ?? DEFAULTS.keepResults;
    this.idleWorkerMs = options.idleWorkerMs ?? DEFAULTS.idleWorkerMs;
    this.memoryLimitBytes = options.memoryLimitBytes ?? DEFAULT_MEMORY_LIMIT_BYTES;
    this.resize(options.workers ?? DEFAULTS.workers);
  }

  onEvent(listener: (event: JobEvent) => void): { dispose(): void } {
    this.listeners.add(listener);
    return { dispose: () => this.listeners.delete(listener) };
  }

  /** Changes the worker count or the memory limit; what the limit refused is asked for again. */
  configure(options: { workers?: number; memoryLimitBytes?: number }): void {
    if (options.workers !== undefined) this.resize(options.workers);
    if (options.memoryLimitBytes !== undefined && options.memoryLimitBytes !== this.memoryLimitBytes) {
      this.memoryLimitBytes = options.memoryLimitBytes;
      for (const { kind, key } of this.refused.values()) this.store.forget(kind, key);
      this.refused.clear();
      for (const [owner, entries] of this.demands) this.setDemand(owner, [...entries.values()]);
    }
    this.pump();
  }

  /** What one owner wants now; whatever no owner wants any more is cancelled. */
  setDemand(owner: string, entries: readonly DemandEntry[]): void {
    if (this.disposed) return;
    const next = new Map<string, DemandEntry>();
    for (const entry of entries) next.set(storeIdOf(entry.request.kind, requestKey(entry.request)), entry);
    const previous = this.demands.get(owner);
    this.demands.set(owner, next);
    for (const entry of next.values()) this.want(entry, owner);
    if (previous) {
      for (const id of previous.keys()) if (!next.has(id)) this.jobs.get(id)?.owners.delete(owner);
    }
    this.collect();
    this.pump();
  }

  /** The owner wants nothing any more (a document was closed). */
  release(owner: string): void {
    this.setDemand(owner, []);
    this.demands.delete(owner);
  }

  /** The state of a request's result, settled (ready, failed) or not. */
  resultOf(request: ComputeRequest): LateResult<unknown> {
    return this.store.get(request.kind, requestKey(request));
  }

  /** Resolves once the request's result is ready or failed, or it is no longer being computed. */
  whenSettled(request: ComputeRequest): Promise<LateResult<unknown>> {
    const kind = request.kind;
    const key = requestKey(request);
    const settled = () => {
      const result = this.store.get(kind, key);
      return result.state === 'ready' || result.state === 'failed' || (result.state === 'absent' && !this.jobs.has(storeIdOf(kind, key))) ? result : undefined;
    };
    const now = settled();
    if (now) return Promise.resolve(now);
    return new Promise((resolve) => {
      const subscription = this.store.onDidChange((change) => {
        if (change.kind !== kind || change.key !== key || change.state === 'pending') return;
        const result = settled();
        if (result) {
          subscription.dispose();
          resolve(result);
        }
      });
    });
  }

  /** Jobs queued, waiting for a prerequisite or running (cancelling ones not counted). */
  get active(): JobInfo[] {
    return [...this.jobs.values()];
  }

  /** Cancels every job and ends the workers. */
  async dispose(): Promise<void> {
    this.disposed = true;
    if (this.pumpTimer) clearTimeout(this.pumpTimer);
    for (const job of [...this.jobs.values()]) this.cancel(job);
    this.demands.clear();
    await Promise.all(this.slots.map((slot) => this.endWorker(slot)));
  }

  // --- demand --------------------------------------------------------------------------------

  private want(entry: DemandEntry, owner: string | null, dependent?: Job): Job | null {
    const kind = entry.request.kind;
    const key = requestKey(entry.request);
    const id = storeIdOf(kind, key);
    const finished = this.finished.get(id);
    if (finished) finished.wantedAt = ++this.clock;
    const existing = this.jobs.get(id);
    if (existing) {
      if (owner !== null) existing.owners.add(owner);
      if (dependent) existing.dependents.add(dependent);
      if (entry.explicit) existing.explicit = true;
      return existing;
    }
    const state = this.store.get(kind, key).state;
    if (state === 'ready' || state === 'failed') return null;
    if (entry.request.kind === MEAN_FIELD_KIND) {
      const cost = computeCost(entry.request.functions, this.memoryLimitBytes);
      if (cost.exceedsLimit) {
        this.refused.set(id, { kind, key });
        this.store.failed(
          kind,
          key,
          `The mean field of ${entry.label} (${cost.functions} basis functions) would need ${costText(cost, false)}: more than the memory limit of ${formatMemory(this.memoryLimitBytes)}. Nothing was computed; raise the limit or choose a smaller part.`,
          { code: 'memory' },
        );
        return null;
      }
    }
    const job: Job = {
      id: this.nextId++,
      kind,
      key,
      label: entry.label,
      request: entry.request,
      storeId: id,
      owners: new Set(owner !== null ? [owner] : []),
      dependents: new Set(dependent ? [dependent] : []),
      requires: prerequisites(entry.request),
      explicit: entry.explicit ?? false,
      state: 'queued',
      eligibleAt: Date.now() + this.startDelayMs,
      slot: null,
      flag: null,
      cancelledAt: 0,
      storageBytes: entry.request.kind === MEAN_FIELD_KIND ? computeCost(entry.request.functions, this.memoryLimitBytes).storageBytes : 0,
    };
    this.jobs.set(id, job);
    for (const requirement of job.requires) {
      const before = this.store.get(requirement.kind, requestKey(requirement));
      if (before.state === 'ready') continue;
      const prerequisite = this.want({ request: requirement, label: entry.label, ...(entry.explicit ? { explicit: true } : {}) }, null, job);
      const after = this.store.get(requirement.kind, requestKey(requirement));
      if (after.state === 'failed') {
        this.fail(job, { code: 'prerequisite', message: this.prerequisiteMessage(requirement, after.message) });
        return null;
      }
      if (prerequisite) job.state = 'waiting';
    }
    this.store.pending(kind, key, null, job.state === 'waiting' ? 'waiting for the mean field' : 'queued');
    return job;
  }

  private prerequisiteMessage(requirement: ComputeRequest, message: string): string {
    return `It builds on the ${requirement.kind === MEAN_FIELD_KIND ? 'mean field' : requirement.kind}, which could not be computed: ${message}`;
  }

  /** Whether anyone still wants a job: an owner, or a wanted job that builds on it. */
  private wanted(job: Job, seen = new Set<Job>()): boolean {
    if (job.owners.size > 0) return true;
    if (seen.has(job)) return false;
    seen.add(job);
    for (const dependent of job.dependents) if (this.jobs.get(dependent.storeId) === dependent && this.wanted(dependent, seen)) return true;
    return false;
  }

  /** Cancels what nobody wants, and forgets the oldest finished results nobody wants. */
  private collect(): void {
    for (const job of [...this.jobs.values()]) if (!this.wanted(job)) this.cancel(job);
    const wantedIds = new Set<string>();
    const add = (request: ComputeRequest) => {
      wantedIds.add(storeIdOf(request.kind, requestKey(request)));
      for (const requirement of prerequisites(request)) add(requirement);
    };
    for (const entries of this.demands.values()) for (const entry of entries.values()) add(entry.request);
    const unwanted = [...this.finished.entries()].filter(([id]) => !wantedIds.has(id)).sort((a, b) => b[1].wantedAt - a[1].wantedAt);
    for (const [id, { kind, key }] of unwanted.slice(this.keepResults)) {
      this.finished.delete(id);
      this.store.forget(kind, key);
    }
  }

  private cancel(job: Job): void {
    if (this.jobs.get(job.storeId) === job) this.jobs.delete(job.storeId);
    for (const dependent of job.dependents) if (this.jobs.get(dependent.storeId) === dependent) this.cancel(dependent);
    this.store.forget(job.kind, job.key);
    if (job.state === 'running' && job.slot) {
      job.state = 'cancelling';
      job.cancelledAt = performance.now();
      if (job.flag) Atomics.store(job.flag, 0, 1);
      const slot = job.slot;
      slot.graceTimer = setTimeout(() => this.terminate(slot, job), this.cancelGraceMs);
    } else if (job.state !== 'cancelling') {
      this.emit({ type: 'cancelled', job, how: 'unstarted', afterMs: null, phase: null });
    }
  }

  // --- workers -------------------------------------------------------------------------------

  private resize(count: number): void {
    const wanted = Math.max(1, Math.floor(count));
    const live = this.slots.filter((slot) => !slot.retired);
    for (let k = live.length; k < wanted; k++) this.slots.push({ worker: null, job: null, graceTimer: null, idleTimer: null, retired: false });
    for (const slot of live.slice(wanted)) {
      slot.retired = true;
      if (!slot.job) void this.endWorker(slot).then(() => this.removeSlot(slot));
    }
  }

  private removeSlot(slot: Slot): void {
    const index = this.slots.indexOf(slot);
    if (index >= 0) this.slots.splice(index, 1);
  }

  private spawn(slot: Slot): Worker {
    const worker = new Worker(this.script);
    worker.on('message', (message: FromWorker) => this.receive(slot, worker, message));
    worker.on('error', (error: Error) => this.workerFailed(slot, worker, error));
    worker.on('exit', (code) => this.workerExited(slot, worker, code));
    slot.worker = worker;
    return worker;
  }

  private async endWorker(slot: Slot): Promise<void> {
    if (slot.idleTimer) clearTimeout(slot.idleTimer);
    if (slot.graceTimer) clearTimeout(slot.graceTimer);
    slot.idleTimer = null;
    slot.graceTimer = null;
    const worker = slot.worker;
    slot.worker = null;
    if (worker) await worker.terminate();
  }

  /** The running job did not notice its flag in time: end its worker. */
  private terminate(slot: Slot, job: Job): void {
    if (slot.job !== job) return;
    const worker = slot.worker;
    slot.worker = null;
    slot.graceTimer = null;
    void worker?.terminate();
    this.free(slot);
    this.emit({ type: 'cancelled', job, how: 'terminated', afterMs: performance.now() - job.cancelledAt, phase: null });
    this.pump();
  }

  private free(slot: Slot): void {
    if (slot.graceTimer) clearTimeout(slot.graceTimer);
    slot.graceTimer = null;
    const job = slot.job;
    if (job) job.slot = null;
    slot.job = null;
    if (slot.retired) {
      void this.endWorker(slot).then(() => this.removeSlot(slot));
      return;
    }
    if (slot.idleTimer) clearTimeout(slot.idleTimer);
    slot.idleTimer = setTimeout(() => {
      if (!slot.job) void this.endWorker(slot);
    }, this.idleWorkerMs);
    slot.idleTimer.unref?.();
  }

  private receive(slot: Slot, worker: Worker, message: FromWorker): void {
    const job = slot.job;
    if (slot.worker !== worker || !job || job.id !== message.id) return;
    switch (message.type) {
      case 'progress': {
        if (job.state !== 'running') return;
        const text = progressText(message.progress);
        this.store.pending(job.kind, job.key, null, text);
        this.emit({ type: 'progress', job, progress: message.progress, text });
        return;
      }
      case 'done': {
        this.free(slot);
        if (job.state === 'cancelling') {
          this.emit({ type: 'cancelled', job, how: 'flag', afterMs: performance.now() - job.cancelledAt, phase: 'done' });
        } else {
          this.jobs.delete(job.storeId);
          this.finished.set(job.storeId, { kind: job.kind, key: job.key, wantedAt: ++this.clock });
          this.store.ready(job.kind, job.key, message.result);
          this.emit({ type: 'done', job, seconds: (message.result as { seconds?: number }).seconds ?? 0 });
          this.wake(job);
        }
        this.pump();
        return;
      }
      case 'failed': {
        this.free(slot);
        if (job.state === 'cancelling') this.emit({ type: 'cancelled', job, how: 'flag', afterMs: performance.now() - job.cancelledAt, phase: 'failed' });
        else this.fail(job, message.failure);
        this.pump();
        return;
      }
      case 'cancelled': {
        this.free(slot);
        this.emit({ type: 'cancelled', job, how: 'flag', afterMs: job.cancelledAt ? performance.now() - job.cancelledAt : null, phase: message.phase });
        this.pump();
        return;
      }
    }
  }

  /** Dependents whose prerequisites are now all ready may be queued. */
  private wake(job: Job): void {
    for (const dependent of job.dependents) {
      if (this.jobs.get(dependent.storeId) !== dependent || dependent.state !== 'waiting') continue;
      if (dependent.requires.every((requirement) => this.store.get(requirement.kind, requestKey(requirement)).state === 'ready')) {
        dependent.state = 'queued';
        dependent.eligibleAt = 0;
        this.store.pending(dependent.kind, dependent.key, null, 'queued');
      }
    }
  }

  private fail(job: Job, failure: JobFailure): void {
    this.jobs.delete(job.storeId);
    this.finished.set(job.storeId, { kind: job.kind, key: job.key, wantedAt: ++this.clock });
    this.store.failed(job.kind, job.key, failure.message, { code: failure.code, ...(failure.atoms ? { atoms: [...failure.atoms] } : {}) });
    this.emit({ type: 'failed', job, failure });
    for (const dependent of job.dependents) {
      if (this.jobs.get(dependent.storeId) === dependent) this.fail(dependent, { code: 'prerequisite', message: this.prerequisiteMessage(job.request, failure.message) });
    }
  }

  private workerFailed(slot: Slot, worker: Worker, error: Error): void {
    if (slot.worker !== worker) return;
    slot.worker = null;
    const job = slot.job;
    if (!job) return;
    this.free(slot);
    const code = (error as { code?: string }).code;
    if (job.state === 'cancelling') this.emit({ type: 'cancelled', job, how: 'terminated', afterMs: performance.now() - job.cancelledAt, phase: null });
    else if (code === 'ERR_WORKER_OUT_OF_MEMORY') this.fail(job, { code: 'memory', message: `The computation ran out of memory in its worker thread (${error.message}).` });
    else this.fail(job, { code: 'worker', message: `The worker thread failed (${error.message}); the computation was not finished.` });
    this.pump();
  }

  private workerExited(slot: Slot, worker: Worker, code: number): void {
    if (slot.worker !== worker) return;
    slot.worker = null;
    const job = slot.job;
    if (!job) return;
    this.free(slot);
    if (job.state === 'cancelling') this.emit({ type: 'cancelled', job, how: 'terminated', afterMs: performance.now() - job.cancelledAt, phase: null });
    else this.fail(job, { code: 'worker', message: `The worker thread stopped (exit code ${code}); the computation was not finished.` });
    this.pump();
  }

  // --- scheduling ----------------------------------------------------------------------------

  private pump(): void {
    if (this.disposed) return;
    if (this.pumpTimer) {
      clearTimeout(this.pumpTimer);
      this.pumpTimer = null;
    }
    const now = Date.now();
    const queued = [...this.jobs.values()]
      .filter((job) => job.state === 'queued')
      .sort((a, b) => Number(b.explicit) - Number(a.explicit) || functionsOf(a) - functionsOf(b) || a.id - b.id);
    let earliest = Infinity;
    for (const slot of this.slots) {
      if (slot.job || slot.retired) continue;
      const index = queued.findIndex((job) => job.eligibleAt <= now);
      if (index < 0) break;
      this.start(slot, queued.splice(index, 1)[0]!);
    }
    for (const job of queued) earliest = Math.min(earliest, job.eligibleAt);
    if (earliest < Infinity && this.slots.some((slot) => !slot.job && !slot.retired)) {
      this.pumpTimer = setTimeout(() => this.pump(), Math.max(1, earliest - now));
    }
  }

  private start(slot: Slot, job: Job): void {
    if (slot.idleTimer) clearTimeout(slot.idleTimer);
    slot.idleTimer = null;
    const worker = slot.worker ?? this.spawn(slot);
    const flag = new Int32Array(new SharedArrayBuffer(4));
    job.state = 'running';
    job.slot = slot;
    job.flag = flag;
    slot.job = job;
    const inputs = job.requires.map((requirement) => (this.store.get(requirement.kind, requestKey(requirement)) as { value: unknown }).value);
    const message: ToWorker = { type: 'run', id: job.id, request: job.request, inputs, cancel: flag.buffer as SharedArrayBuffer, settings: { storageLimitBytes: job.storageBytes } };
    worker.postMessage(message);
    this.store.pending(job.kind, job.key, null, 'starting');
    this.emit({ type: 'started', job });
  }

  private emit(event: JobEvent): void {
    for (const listener of [...this.listeners]) {
      try {
        listener(event);
      } catch {
        // A listener's failure must not stop the queue; listeners report their own errors.
      }
    }
  }
}

function functionsOf(job: Job): number {
  return job.request.kind === MEAN_FIELD_KIND ? job.request.functions : job.request.meanField.functions;
}
