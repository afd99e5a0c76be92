/**
 * Open documents and their analyses: one analysis per document version, computed on demand or
 * after a short pause in typing, never recomputed for the same version, and never published
 * once a newer version has arrived.
 */
import * as path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Mapping } from '../chemistry/qubits';
import { analyze, type Analysis } from '../language/analyze';
import { diskFileHost, type FileHost } from '../language/files';

export interface AnalysisSettings {
  defaultMapping?: Mapping;
  defaultQubitLimit?: number;
}

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

interface Entry {
  version: number;
  analysis: Analysis;
}

export class AnalysisCache {
  private readonly entries = new Map<string, Entry>();
  private settings: AnalysisSettings = {};

  constructor(private readonly openDocument: (uri: string) => TextDocument | undefined) {}

  /** Reads included files from open editor buffers first, then from disk. */
  private readonly files: FileHost = {
    readFile: (absolutePath) => {
      const open = this.openDocument(pathToUri(absolutePath));
      return open ? { ok: true, text: open.getText() } : diskFileHost.readFile(absolutePath);
    },
    realPath: (absolutePath) => diskFileHost.realPath(absolutePath),
  };

  configure(settings: AnalysisSettings): void {
    this.settings = settings;
    this.entries.clear();
  }

  /** The analysis of the document's current version, computed now if needed. */
  get(document: TextDocument): Analysis {
    const cached = this.entries.get(document.uri);
    if (cached && cached.version === document.version) return cached.analysis;
    const file = uriToPath(document.uri);
    const analysis = analyze(document.getText(), {
      ...(file ? { path: file } : {}),
      files: this.files,
      ...(this.settings.defaultMapping ? { defaultMapping: this.settings.defaultMapping } : {}),
      ...(this.settings.defaultQubitLimit ? { defaultQubitLimit: this.settings.defaultQubitLimit } : {}),
    });
    this.entries.set(document.uri, { version: document.version, analysis });
    return analysis;
  }

  /** The cached analysis, whatever its version (for workspace-wide features). */
  peek(uri: string): Analysis | undefined {
    return this.entries.get(uri)?.analysis;
  }

  /** Forgets an analysis so that it is recomputed (an included file changed). */
  invalidate(uri: string): void {
    this.entries.delete(uri);
  }

  remove(uri: string): void {
    this.entries.delete(uri);
  }

  /** Open documents whose analysis read the given file. */
  dependents(file: string): string[] {
    const normalized = path.resolve(file);
    return [...this.entries.entries()].filter(([, entry]) => entry.analysis.model.includes.includes(normalized)).map(([uri]) => uri);
  }

  uris(): string[] {
    return [...this.entries.keys()];
  }
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
