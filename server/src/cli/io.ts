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
}

export class UsageError extends Error {}
