/** File URIs and the scheduling of the language server's diagnostics. */
import { fileURLToPath, pathToFileURL } from 'node:url';

export function uriToPath(uri: string): string | undefined {
  if (!uri.startsWith('file:')) return undefined;
  try {
    return fileURLToPath(uri);
  } catch {
    return undefined;
  }
}

export function pathToUri(file: string): string {
  return pathToFileURL(file).toString();
}

/**
 * Runs one task per key as soon as the server is free, coalescing requests that arrive before it
 * runs: whatever was scheduled, the task runs once and sees the latest state. The wait adapts to
 * what the task cost last time: a cheap task runs on the next turn of the event loop, so a small
 * document's diagnostics follow each keystroke at once; an expensive one waits a fraction of its
 * cost, so that a burst of keystrokes on a large document is analysed once, at its end.
 */
export class CoalescingScheduler {
  private readonly pending = new Map<string, { cancel(): void }>();
  private readonly costs = new Map<string, number>();

  /** `immediateBelowMs`: tasks that last cost less run at once; `maxDelayMs` bounds the wait. */
  constructor(
    private readonly immediateBelowMs = 15,
    private readonly maxDelayMs = 50,
  ) {}

  /** Schedules the task unless one is pending for the key; `estimateMs` stands in for a cost not yet measured. */
  schedule(key: string, task: () => void, estimateMs = 0): void {
    if (this.pending.has(key)) return;
    const cost = this.costs.get(key) ?? estimateMs;
    const run = () => {
      this.pending.delete(key);
      const start = performance.now();
      try {
        task();
      } finally {
        this.costs.set(key, performance.now() - start);
      }
    };
    if (cost < this.immediateBelowMs) {
      const handle = setImmediate(run);
      this.pending.set(key, { cancel: () => clearImmediate(handle) });
    } else {
      const handle = setTimeout(run, Math.min(this.maxDelayMs, cost / 2));
      this.pending.set(key, { cancel: () => clearTimeout(handle) });
    }
  }

  cancel(key: string): void {
    this.pending.get(key)?.cancel();
    this.pending.delete(key);
  }

  forget(key: string): void {
    this.cancel(key);
    this.costs.delete(key);
  }
}
