/** File URIs and the debouncer of the language server. */
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

/** Runs a task per key after a quiet period; a newer request for the same key replaces the older. */
export class Debouncer {
  private readonly timers = new Map<string, NodeJS.Timeout>();

  constructor(private readonly delayMs: number) {}

  schedule(key: string, task: () => void): void {
    this.cancel(key);
    this.timers.set(
      key,
      setTimeout(() => {
        this.timers.delete(key);
        task();
      }, this.delayMs),
    );
  }

  cancel(key: string): void {
    const timer = this.timers.get(key);
    if (timer) clearTimeout(timer);
    this.timers.delete(key);
  }
}
