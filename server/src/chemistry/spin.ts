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

/**
 * The valid multiplicities nearest the one given, lowest first: both neighbours of a multiplicity
 * whose parity does not fit (1 and 3 for 54 electrons written as 2), the highest possible one when
 * it asks for more unpaired electrons than there are, else the one given.
 */
export function nearbyValidMultiplicities(electrons: number, multiplicity: number): number[] {
  if (!Number.isFinite(multiplicity) || electrons < 0) return [lowestMultiplicity(electrons)];
  const highest = electrons + 1;
  if (multiplicity >= highest) return [highest];
  if (spinState(electrons, multiplicity).ok) return [multiplicity];
  return [multiplicity - 1, multiplicity + 1].filter((candidate) => candidate >= 1 && candidate <= highest && spinState(electrons, candidate).ok);
}

/**
 * The total spins that spins S1, S2, … can couple to, as multiplicities 2S+1 in steps of 2 (the
 * angular-momentum addition rule: S from |S1 − S2| to S1 + S2 in whole steps, applied one spin at a
 * time). With 2Si = ti: the largest total is Σt; the smallest is 2·max(t) − Σt when one spin
 * outweighs the rest, else 0 or 1/2 by the parity of Σt.
 */
export function coupledMultiplicities(multiplicities: readonly number[]): { lowest: number; highest: number } {
  const twice = multiplicities.map((multiplicity) => multiplicity - 1);
  const sum = twice.reduce((total, t) => total + t, 0);
  const largest = twice.reduce((most, t) => Math.max(most, t), 0);
  return { lowest: Math.max(sum % 2, 2 * largest - sum) + 1, highest: sum + 1 };
}

export function multiplicityName(multiplicity: number): string {
  const names = ['singlet', 'doublet', 'triplet', 'quartet', 'quintet', 'sextet', 'septet', 'octet'];
  return names[multiplicity - 1] ?? `multiplicity ${multiplicity}`;
}
