/**
 * Keeps one analysis per open document version: computed when first asked for, never recomputed
 * for the same version, forgotten when a newer version, a change of settings or a change in an
 * included file makes it stale. Included files are read from open buffers first, then from disk.
 * Knows nothing of the editor protocol: documents come in as URIs, versions and texts.
 */
import * as path from 'node:path';
import type { Mapping } from '../chemistry/qubits';
import type { BathOrbitals } from './computed';
import { diskFileHost, type FileHost } from '../language/files';
import { analyzeDocument, type DocumentAnalysis } from './document';
import { LateResults } from './late';

export interface AnalysisSettings {
  readonly defaultMapping?: Mapping;
  readonly defaultQubitLimit?: number;
  readonly bathThreshold?: number;
  readonly bathOrbitals?: BathOrbitals;
}

export interface OpenDocument {
  readonly version: number;
  getText(): string;
}

export interface DocumentSource {
  /** The open document of a URI, if any. */
  open(uri: string): OpenDocument | undefined;
  /** The file system path of a URI, for `file:` URIs. */
  pathOf(uri: string): string | undefined;
  /** The URI of a file system path. */
  uriOf(file: string): string;
}

interface Entry {
  readonly version: number;
  readonly analysis: DocumentAnalysis;
}

export class AnalysisHost {
  /** Results that arrive later, shared by every document (keyed by their inputs). */
  readonly late = new LateResults();
  private readonly entries = new Map<string, Entry>();
  private settings: AnalysisSettings = {};

  constructor(private readonly source: DocumentSource) {}

  private readonly files: FileHost = {
    readFile: (absolutePath) => {
      const open = this.source.open(this.source.uriOf(absolutePath));
      return open ? { ok: true, text: open.getText() } : diskFileHost.readFile(absolutePath);
    },
    realPath: (absolutePath) => diskFileHost.realPath(absolutePath),
  };

  configure(settings: AnalysisSettings): void {
    this.settings = settings;
    this.entries.clear();
  }

  /** The analysis of the document's current version, computed now if needed; undefined when it is not open. */
  get(uri: string): DocumentAnalysis | undefined {
    const document = this.source.open(uri);
    if (!document) return undefined;
    const cached = this.entries.get(uri);
    if (cached && cached.version === document.version) return cached.analysis;
    const file = this.source.pathOf(uri);
    const analysis = analyzeDocument(
      document.getText(),
      {
        ...(file ? { path: file } : {}),
        files: this.files,
        // The parser reads again only what changed since the version analysed last.
        ...(cached ? { previous: cached.analysis } : {}),
        ...(this.settings.defaultMapping ? { defaultMapping: this.settings.defaultMapping } : {}),
        ...(this.settings.defaultQubitLimit ? { defaultQubitLimit: this.settings.defaultQubitLimit } : {}),
        ...(this.settings.bathThreshold !== undefined ? { bathThreshold: this.settings.bathThreshold } : {}),
        ...(this.settings.bathOrbitals !== undefined ? { bathOrbitals: this.settings.bathOrbitals } : {}),
      },
      this.late,
    );
    this.entries.set(uri, { version: document.version, analysis });
    return analysis;
  }

  /** Whether the document's current version is analysed already. */
  isCurrent(uri: string): boolean {
    const document = this.source.open(uri);
    return document !== undefined && this.entries.get(uri)?.version === document.version;
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
