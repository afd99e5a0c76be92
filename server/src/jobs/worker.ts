/**
 * The worker thread's entry (bundled on its own as dist/worker.js): runs the jobs the queue sends,
 * one at a time, and answers each with progress, then its result, its failure, or that it stopped
 * because its cancel flag was set. Progress is sent at most every PROGRESS_INTERVAL_MS (and at
 * every change of phase), so that a fast SCF does not flood the main thread. The thread runs at a
 * lowered priority (priority.ts), so that the main thread comes first when both want a core.
 */
import { parentPort } from 'node:worker_threads';
import type { CancelToken } from '../electronic/contracts';
import { failureOf, isCancellation } from './failures';
import { lowerThreadPriority } from './priority';
import type { FromWorker, JobProgress, ToWorker } from './protocol';
import { runRequest } from './run';

const PROGRESS_INTERVAL_MS = 100;

/** The typed arrays of a result, moved to the main thread instead of copied (each buffer once). */
function transferables(value: unknown, found = new Set<ArrayBuffer>(), depth = 0): ArrayBuffer[] {
  if (depth > 4 || value === null || typeof value !== 'object') return [...found];
  if (ArrayBuffer.isView(value)) {
    if (value.buffer instanceof ArrayBuffer) found.add(value.buffer);
  } else if (!Array.isArray(value)) {
    for (const item of Object.values(value)) transferables(item, found, depth + 1);
  }
  return [...found];
}

function run(message: ToWorker, post: (answer: FromWorker, transfer?: ArrayBuffer[]) => void): void {
  const flag = new Int32Array(message.cancel);
  const cancel: CancelToken = {
    get cancelled() {
      return Atomics.load(flag, 0) !== 0;
    },
  };
  let phase: JobProgress['phase'] | 'start' = 'start';
  let last = 0;
  const onProgress = (progress: JobProgress) => {
    const now = performance.now();
    if (progress.phase === phase && now - last < PROGRESS_INTERVAL_MS) return;
    phase = progress.phase;
    last = now;
    post({ type: 'progress', id: message.id, progress });
  };
  try {
    const result = runRequest(message.request, message.inputs, { cancel, onProgress, storageLimitBytes: message.settings.storageLimitBytes });
    post({ type: 'done', id: message.id, result }, transferables(result));
  } catch (error) {
    if (isCancellation(error) || cancel.cancelled) post({ type: 'cancelled', id: message.id, phase });
    else post({ type: 'failed', id: message.id, failure: failureOf(error) });
  }
}

const port = parentPort;
if (port) {
  lowerThreadPriority();
  port.on('message', (message: ToWorker) => {
    if (message?.type === 'run') run(message, (answer, transfer) => port.postMessage(answer, transfer ?? []));
  });
}
