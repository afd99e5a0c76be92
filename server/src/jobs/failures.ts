/**
 * Every way a job can end without a result, as a JobFailure with a message that says what, where
 * and what to do. The engine's refusals are typed errors (electronic/scf/meanField.ts lists them);
 * anything else is a bug in Tessera and says so. Cancellation is not a failure: the queue forgets a
 * cancelled job's result instead.
 */
import { BasisDataUnavailableError, InvalidAtomError, MissingBasisDataError, UnknownBasisError } from '../electronic/basis';
import { CancelledError } from '../electronic/contracts';
import { ActiveSelectionError } from '../electronic/activeSpace';
import { Mp2InputError } from '../electronic/correlation';
import { UnsupportedEcpError } from '../electronic/integrals';
import { ScfInputError } from '../electronic/scf';
import type { JobFailure } from './protocol';
import { JobInputError } from './run';

/** Whether an error is the engine noticing the cancel flag. */
export function isCancellation(error: unknown): boolean {
  return error instanceof CancelledError;
}

/** Allocation failures of typed arrays and of V8's heap, as Node reports them. */
function isOutOfMemory(error: unknown): boolean {
  if (!(error instanceof RangeError)) return false;
  return /allocation failed|Invalid typed array length|Array buffer allocation|Invalid array length/i.test(error.message);
}

export function failureOf(error: unknown): JobFailure {
  if (error instanceof JobInputError) return error.failure;
  if (error instanceof UnsupportedEcpError) return { code: 'ecp', message: error.message };
  if (error instanceof MissingBasisDataError) return { code: 'basis', message: `${error.message} Choose a basis set that defines ${error.symbols.length > 1 ? 'them' : 'it'}.`, atoms: error.atomIndices };
  if (error instanceof UnknownBasisError || error instanceof BasisDataUnavailableError) return { code: 'basis', message: error.message };
  if (error instanceof InvalidAtomError) return { code: 'input', message: error.message, atoms: [error.atomIndex] };
  if (error instanceof ScfInputError) return { code: 'input', message: error.message };
  if (error instanceof Mp2InputError) return { code: 'input', message: error.message };
  if (error instanceof ActiveSelectionError) return { code: 'input', message: error.message };
  if (isOutOfMemory(error)) {
    return { code: 'memory', message: `The computation ran out of memory (${(error as Error).message}). Lower the part's size, or raise the memory available to Tessera.` };
  }
  const detail = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
  return { code: 'internal', message: `Tessera failed inside the computation (a bug, not a problem of the spec): ${detail}` };
}
