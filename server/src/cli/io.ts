/** Output streams and exit codes of the command line, injectable for tests. */

export const EXIT_OK = 0;
/** The analysis found errors in a spec. */
export const EXIT_ERRORS = 1;
/** Bad usage, or a file that cannot be read or written. */
export const EXIT_USAGE = 2;
/**
 * Tessera itself failed on at least one file (an `internal-error` diagnostic, or a command that
 * could not finish); in a batch the other files were still checked.
 */
export const EXIT_INTERNAL = 3;
/**
 * Standard output was closed before everything was written (a pipe into `head`, for example): the
 * command stops quietly, with the code a shell gives a process ended by SIGPIPE (128 + 13).
 */
export const EXIT_BROKEN_PIPE = 141;
/** An interrupt (Ctrl+C) cancelled a computation before it finished (128 + SIGINT, as shells report it). */
export const EXIT_INTERRUPTED = 130;

/** One exit code for a run: the most serious of what happened (3, then 2, then 1, else 0). */
export function exitCode(outcome: { internal?: boolean; usage?: boolean; errors?: boolean }): number {
  if (outcome.internal) return EXIT_INTERNAL;
  if (outcome.usage) return EXIT_USAGE;
  return outcome.errors ? EXIT_ERRORS : EXIT_OK;
}

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  cwd: string;
  /**
   * Calls `handler` on an interrupt (Ctrl+C) while a long computation runs; returns what removes
   * it again. Only computations ask for it, so that an interrupt ends every other command as usual.
   */
  onInterrupt?(handler: () => void): () => void;
  /** Resolves when standard output has taken what was written so far (streamed exports wait on it). */
  drained?(): Promise<void>;
}

export class UsageError extends Error {}
