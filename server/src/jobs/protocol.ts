/**
 * The messages between the job queue (main thread) and a worker thread. A worker runs one job at a
 * time, synchronously: it cannot read messages while it computes, so cancellation reaches it
 * through a shared flag (one Int32 in a SharedArrayBuffer per job) that the kernels' CancelToken
 * reads; a worker that does not answer a cancellation in time is terminated (queue.ts).
 */
import type { ComputeRequest } from '../analysis/computed';

/** Where a running job is, for progress reports. */
export interface JobProgress {
  readonly phase: 'integrals' | 'guess' | 'scf' | 'mp2' | 'embedding' | 'active-space';
  /** SCF: the Fock build; MP2: occupied orbitals done. */
  readonly iteration?: number;
  readonly energy?: number;
  /** SCF energy change from the previous iteration (null on the first). */
  readonly energyChange?: number | null;
  /** MP2: batches of occupied orbitals done and in all. */
  readonly done?: number;
  readonly total?: number;
}

/** A job that could not give a result: a code a caller can switch on and a message that says what and why. */
export interface JobFailure {
  readonly code: 'basis' | 'ecp' | 'input' | 'memory' | 'worker' | 'prerequisite' | 'internal';
  readonly message: string;
  /** Atoms of the part (zero-based, in the part's order) the failure is about, when it is about atoms. */
  readonly atoms?: readonly number[];
}

export interface WorkerSettings {
  /** Memory for stored two-electron integrals. */
  readonly storageLimitBytes: number;
}

export type ToWorker = {
  readonly type: 'run';
  readonly id: number;
  readonly request: ComputeRequest;
  /** The results of the request's prerequisites, in the order `prerequisites(request)` lists them. */
  readonly inputs: readonly unknown[];
  /** Int32Array(1) over it: non-zero asks the job to stop. */
  readonly cancel: SharedArrayBuffer;
  readonly settings: WorkerSettings;
};

export type FromWorker =
  | { readonly type: 'progress'; readonly id: number; readonly progress: JobProgress }
  | { readonly type: 'done'; readonly id: number; readonly result: unknown }
  | { readonly type: 'failed'; readonly id: number; readonly failure: JobFailure }
  | { readonly type: 'cancelled'; readonly id: number; readonly phase: JobProgress['phase'] | 'start' };
