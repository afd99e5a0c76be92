/**
 * The language server's side of the jobs layer: one job queue writing into the analysis host's
 * late results, the rule for which parts run by themselves, LSP work-done progress for running
 * jobs (cancellable from the editor), the commands the code lenses run
 * (`tessera.meanField.compute`, `tessera.meanField.stop`) and the data of the orbital-level view
 * (`tessera/levels`). Nothing here waits for a job.
 */
import type { Connection, WorkDoneProgressServerReporter } from 'vscode-languageserver/node';
import { DMET_BATH_KIND, MEAN_FIELD_KIND, MP2_KIND, requestKey, type AnalysisHost, type DocumentAnalysis } from '../analysis';
import { DEFAULT_AUTO_FUNCTION_LIMIT, DocumentComputations, JobQueue, type JobEvent } from '../jobs';
import * as service from '../services';

/** The settings of the computations (`tessera.meanField.*`, `tessera.jobs.*`). */
export interface ComputeEditorSettings {
  readonly autoFunctionLimit: number;
  readonly workers: number;
  readonly memoryLimitMiB: number;
}

export const DEFAULT_COMPUTE_SETTINGS: ComputeEditorSettings = { autoFunctionLimit: DEFAULT_AUTO_FUNCTION_LIMIT, workers: 1, memoryLimitMiB: 2048 };

const MAX_WORKERS = 8;
/** A new job waits this long before it starts, so that typing replaces it without starting it. */
const START_DELAY_MS = 300;
/** Progress messages to the editor at most this often per job. */
const PROGRESS_INTERVAL_MS = 250;

function wholeNumber(value: unknown, min: number, max: number): number | undefined {
  return typeof value === 'number' && Number.isInteger(value) && value >= min && value <= max ? value : undefined;
}

/** Reads the computation settings from the `tessera` section; anything malformed keeps its default. */
export function readComputeSettings(section: Record<string, unknown>): ComputeEditorSettings {
  const meanField = (section['meanField'] ?? {}) as Record<string, unknown>;
  const jobs = (section['jobs'] ?? {}) as Record<string, unknown>;
  return {
    autoFunctionLimit: wholeNumber(meanField['autoFunctionLimit'], 0, 100_000) ?? DEFAULT_COMPUTE_SETTINGS.autoFunctionLimit,
    workers: wholeNumber(jobs['workers'], 1, MAX_WORKERS) ?? DEFAULT_COMPUTE_SETTINGS.workers,
    memoryLimitMiB: wholeNumber(jobs['memoryLimit'], 64, 1 << 20) ?? DEFAULT_COMPUTE_SETTINGS.memoryLimitMiB,
  };
}

export class ServerComputations {
  readonly queue: JobQueue;
  private readonly documents: DocumentComputations;
  private memoryLimitBytes: number;
  private readonly progress = new Map<number, { reporter: Promise<WorkDoneProgressServerReporter>; last: number; closed: boolean }>();

  constructor(
    private readonly connection: Connection,
    private readonly host: AnalysisHost,
    settings: ComputeEditorSettings,
    private readonly report: (what: string, error: unknown) => void,
  ) {
    this.memoryLimitBytes = settings.memoryLimitMiB * 2 ** 20;
    this.queue = new JobQueue(host.late, { workers: settings.workers, memoryLimitBytes: this.memoryLimitBytes, startDelayMs: START_DELAY_MS });
    this.documents = new DocumentComputations(this.queue, { autoFunctionLimit: settings.autoFunctionLimit });
    this.queue.onEvent((event) => this.onJobEvent(event));
  }

  configure(settings: ComputeEditorSettings): void {
    this.memoryLimitBytes = settings.memoryLimitMiB * 2 ** 20;
    this.queue.configure({ workers: settings.workers, memoryLimitBytes: this.memoryLimitBytes });
    this.documents.configure({ autoFunctionLimit: settings.autoFunctionLimit });
  }

  /** The policy the services show a document's computations by. */
  policy(uri: string): service.ComputePolicy {
    return {
      autoFunctionLimit: this.documents.autoFunctionLimit,
      memoryLimitBytes: this.memoryLimitBytes,
      runsByItself: (computation) => this.documents.runsByItself(uri, computation),
      asked: (computation) => this.documents.asked(uri, computation),
    };
  }

  /** A document version was analysed and its diagnostics sent: queue what it wants computed. */
  analysed(uri: string, analysis: DocumentAnalysis): void {
    try {
      this.documents.update(uri, analysis);
    } catch (error) {
      this.report('queuing computations', error);
    }
  }

  closed(uri: string): void {
    this.documents.close(uri);
  }

  /** `workspace/executeCommand` for the lens commands: [uri, part]. */
  execute(command: string, args: readonly unknown[]): { ok: boolean; message: string } {
    const [uri, partArgument] = args;
    const analysis = typeof uri === 'string' ? this.host.get(uri) : undefined;
    const part = analysis ? service.partFromArgument(analysis, partArgument) : undefined;
    if (typeof uri !== 'string' || !analysis || !part) return { ok: false, message: 'The spec or its part is not open any more.' };
    if (command === service.COMPUTE_COMMAND) {
      const computation = this.documents.compute(uri, analysis, part);
      return computation.refusal ? { ok: false, message: `The mean field of ${computation.label} cannot be computed: ${computation.refusal}.` } : { ok: true, message: `Computing the mean field of ${computation.label}.` };
    }
    if (command === service.STOP_COMMAND) {
      this.documents.stop(uri, analysis, part);
      return { ok: true, message: `Stopped the mean field of ${analysis.computation(part).label}.` };
    }
    return { ok: false, message: `Unknown command ${command}.` };
  }

  levels(uri: string, partArgument: unknown): service.LevelsView | null {
    const analysis = this.host.get(uri);
    if (!analysis) return null;
    return service.levelsView(analysis, service.partFromArgument(analysis, partArgument), this.policy(uri));
  }

  async dispose(): Promise<void> {
    await this.queue.dispose();
  }

  /** Work-done progress: begun when a job starts, reported as it goes, ended however it ends. */
  private onJobEvent(event: JobEvent): void {
    const id = event.job.id;
    try {
      switch (event.type) {
        case 'started': {
          const what = event.job.kind === MP2_KIND ? 'MP2' : event.job.kind === DMET_BATH_KIND ? 'DMET bath' : 'mean field';
          const reporter = this.connection.window.createWorkDoneProgress().then((created) => {
            created.begin(`Tessera: ${what} of ${event.job.label}`, undefined, 'starting', true);
            created.token.onCancellationRequested(() => this.stopFromEditor(event.job.request));
            return created;
          });
          reporter.catch((error: unknown) => this.report('progress', error));
          this.progress.set(id, { reporter, last: 0, closed: false });
          return;
        }
        case 'progress': {
          const entry = this.progress.get(id);
          const now = performance.now();
          if (!entry || now - entry.last < PROGRESS_INTERVAL_MS) return;
          entry.last = now;
          void entry.reporter.then((reporter) => {
            if (!entry.closed) reporter.report(event.text);
          });
          return;
        }
        case 'done':
        case 'failed':
        case 'cancelled': {
          const entry = this.progress.get(id);
          if (!entry) return;
          this.progress.delete(id);
          entry.closed = true;
          void entry.reporter.then((reporter) => reporter.done());
          return;
        }
      }
    } catch (error) {
      this.report('progress', error);
    }
  }

  /** The user cancelled a job's progress in the editor: stop that part wherever it is asked for. */
  private stopFromEditor(request: JobEvent['job']['request']): void {
    const meanField = request.kind === MEAN_FIELD_KIND ? request : request.meanField;
    this.documents.stopKey(requestKey(meanField));
  }
}
