/**
 * Long computations in worker threads: the queue (queue.ts) fed by its owners' demand, the worker's
 * entry (worker.ts, its own bundle), what a job runs (run.ts), failures as messages (failures.ts),
 * progress as text (progressText.ts) and the editor's rule for what runs by itself (documents.ts).
 */
export { defaultWorkerScript, JobQueue, type DemandEntry, type JobEvent, type JobInfo, type JobQueueOptions } from './queue';
export type { JobFailure, JobProgress } from './protocol';
export { hartree, progressText } from './progressText';
export { failureOf } from './failures';
export { DEFAULT_AUTO_FUNCTION_LIMIT, DocumentComputations, type ComputeSettings } from './documents';
