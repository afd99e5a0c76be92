/**
 * The webview side of the message channel: the editor's API object (acquired once), posting, and
 * receiving with a check. Messages that fail their check are dropped and logged to the console.
 */
import type { Checked } from '../src/views/protocol';

interface EditorApi {
  postMessage(message: unknown): void;
}

declare function acquireVsCodeApi(): EditorApi;

const api = acquireVsCodeApi();

export function post<T>(message: T): void {
  api.postMessage(message);
}

/** Calls `handle` with every message from the extension that passes `check`. */
export function receive<T>(check: (raw: unknown) => Checked<T>, handle: (message: T) => void): void {
  window.addEventListener('message', (event: MessageEvent) => {
    const checked = check(event.data);
    if (!checked.ok) {
      console.warn(`[tessera view] message ignored: ${checked.reason}`);
      return;
    }
    handle(checked.value);
  });
}

export function element<T extends HTMLElement>(id: string): T {
  const found = document.getElementById(id);
  if (!found) throw new Error(`the page has no #${id}`);
  return found as T;
}
