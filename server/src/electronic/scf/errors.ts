/**
 * Input the mean-field code refuses, as one typed error with a code a caller can switch on and a
 * message that names what and where. Cancellation is `CancelledError` (contracts.ts); a run that
 * does not converge is not an error: its result says `converged: false`.
 */

export type ScfInputErrorCode =
  | 'atoms-coincide'
  | 'no-basis-functions'
  | 'invalid-electron-count'
  | 'invalid-multiplicity'
  | 'too-many-electrons'
  | 'reference-mismatch'
  | 'shape-mismatch'
  | 'non-finite-integrals';

export class ScfInputError extends Error {
  constructor(
    readonly code: ScfInputErrorCode,
    message: string,
  ) {
    super(message);
    this.name = 'ScfInputError';
  }
}
