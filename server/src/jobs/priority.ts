/**
 * Lowers the scheduling priority of the calling thread, so that a long computation in a worker
 * gives way to the language server's own thread (typing, hovers, diagnostics) whenever both want
 * a core. On Linux each thread has its own nice value, and setpriority() given a thread id changes
 * that thread alone (setpriority(2), "Bugs": the POSIX per-process semantics are not followed);
 * the id of the calling thread is the last part of /proc/thread-self. Elsewhere nothing changes.
 */
import { readlinkSync } from 'node:fs';
import { setPriority } from 'node:os';

/** Nice value of a job's thread: below the editor's, not starved (common practice for background work). */
export const JOB_THREAD_NICE = 10;

/** True when the thread's priority was lowered. */
export function lowerThreadPriority(nice = JOB_THREAD_NICE): boolean {
  if (process.platform !== 'linux') return false;
  try {
    const threadId = Number(readlinkSync('/proc/thread-self').split('/').pop());
    if (!Number.isInteger(threadId) || threadId <= 0) return false;
    setPriority(threadId, nice);
    return true;
  } catch {
    // No /proc, or not allowed: the job runs at the usual priority.
    return false;
  }
}
