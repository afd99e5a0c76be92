/**
 * Electrons, charge and multiplicity. Conventions: N electrons and multiplicity 2S+1 are
 * consistent when 2S <= N and N - 2S is even; then alpha = (N + 2S)/2 and beta = (N - 2S)/2
 * (standard definition, e.g. Szabo & Ostlund, Modern Quantum Chemistry, 1989, §2.4).
 */

export interface SpinState {
  readonly alpha: number;
  readonly beta: number;
  /** 2S: the number of unpaired electrons. */
  readonly unpaired: number;
}

export type SpinProblem =
  | { readonly kind: 'no-electrons'; readonly electrons: number }
  | { readonly kind: 'multiplicity-not-positive-integer'; readonly multiplicity: number }
  | { readonly kind: 'parity'; readonly electrons: number; readonly multiplicity: number }
  | { readonly kind: 'too-high'; readonly electrons: number; readonly multiplicity: number };

export type SpinResult = { ok: true; state: SpinState } | { ok: false; problem: SpinProblem };

export function spinState(electrons: number, multiplicity: number): SpinResult {
  if (!Number.isInteger(multiplicity) || multiplicity < 1) {
    return { ok: false, problem: { kind: 'multiplicity-not-positive-integer', multiplicity } };
  }
  if (electrons < 0) return { ok: false, problem: { kind: 'no-electrons', electrons } };
  const unpaired = multiplicity - 1;
  if (unpaired > electrons) return { ok: false, problem: { kind: 'too-high', electrons, multiplicity } };
  if ((electrons - unpaired) % 2 !== 0) return { ok: false, problem: { kind: 'parity', electrons, multiplicity } };
  return { ok: true, state: { alpha: (electrons + unpaired) / 2, beta: (electrons - unpaired) / 2, unpaired } };
}

/** Singlet for an even electron count, doublet for an odd one. */
export function lowestMultiplicity(electrons: number): number {
  return Math.abs(electrons) % 2 === 0 ? 1 : 2;
}

/** The valid multiplicity closest to the one given (ties go to the lower spin). */
export function nearestValidMultiplicity(electrons: number, multiplicity: number): number {
  const lowest = lowestMultiplicity(electrons);
  const highest = Math.max(electrons, 0) + 1;
  if (!Number.isFinite(multiplicity)) return lowest;
  const steps = Math.ceil((multiplicity - lowest) / 2 - 0.5);
  return Math.min(highest, Math.max(lowest, lowest + 2 * steps));
}

export function multiplicityName(multiplicity: number): string {
  const names = ['singlet', 'doublet', 'triplet', 'quartet', 'quintet', 'sextet', 'septet', 'octet'];
  return names[multiplicity - 1] ?? `multiplicity ${multiplicity}`;
}
