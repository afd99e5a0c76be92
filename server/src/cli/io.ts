/** Output streams and exit codes of the command line, injectable for tests. */

export const EXIT_OK = 0;
/** The analysis found errors in a spec. */
export const EXIT_ERRORS = 1;
/** Bad usage, or a file that cannot be read. */
export const EXIT_USAGE = 2;

export interface CliIo {
  stdout(text: string): void;
  stderr(text: string): void;
  cwd: string;
}

export class UsageError extends Error {}
