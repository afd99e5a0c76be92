/**
 * Non-negative whole-number magnitudes (determinant counts, bytes) that may exceed 2^53 or even the
 * range of a double. A magnitude carries its exact value as a BigInt when it is known and always
 * its base-10 logarithm; when only the logarithm is known the value is an estimate and says so.
 * Nothing here ever turns into Infinity: log10 is −Infinity for an exact zero and finite otherwise.
 */

export interface Magnitude {
  /** The exact value, when known. */
  readonly exact: bigint | undefined;
  /** log10 of the value; −Infinity only for an exact zero. */
  readonly log10: number;
}

/** Largest value a double holds exactly as an integer, as a BigInt. */
const SAFE = BigInt(Number.MAX_SAFE_INTEGER);
const LOG10_2 = Math.log10(2);

export function exactMagnitude(value: bigint): Magnitude {
  if (value < 0n) throw new RangeError(`A magnitude cannot be negative (${value}).`);
  return { exact: value, log10: log10OfBigInt(value) };
}

/** An estimate known only through its logarithm (a finite number). */
export function estimatedMagnitude(log10: number): Magnitude {
  if (!Number.isFinite(log10)) throw new RangeError(`An estimated magnitude needs a finite logarithm (${log10}).`);
  return { exact: undefined, log10 };
}

/** A non-negative whole number given as a double: exact when it is a safe integer, else an estimate. */
export function magnitudeOfNumber(value: number): Magnitude {
  if (!(value >= 0) || !Number.isFinite(value)) throw new RangeError(`Not a non-negative finite number: ${value}.`);
  if (Number.isSafeInteger(value)) return exactMagnitude(BigInt(value));
  return estimatedMagnitude(Math.log10(value));
}

export function isEstimate(value: Magnitude): boolean {
  return value.exact === undefined;
}

/** value × factor for a whole factor ≥ 0. */
export function scaleMagnitude(value: Magnitude, factor: bigint): Magnitude {
  if (factor < 0n) throw new RangeError(`A scale factor cannot be negative (${factor}).`);
  if (value.exact !== undefined) return exactMagnitude(value.exact * factor);
  if (factor === 0n) return exactMagnitude(0n);
  return estimatedMagnitude(value.log10 + log10OfBigInt(factor));
}

/** The value as a double when that is exact, otherwise undefined. */
export function safeNumber(value: Magnitude): number | undefined {
  return value.exact !== undefined && value.exact <= SAFE ? Number(value.exact) : undefined;
}

/**
 * log10 of a non-negative BigInt, to double precision. Large values are shifted down to their
 * leading 64 bits first, so no conversion ever overflows.
 */
export function log10OfBigInt(value: bigint): number {
  if (value < 0n) throw new RangeError(`log10 of a negative number (${value}).`);
  if (value === 0n) return Number.NEGATIVE_INFINITY;
  const bits = bitLength(value);
  if (bits <= 1000) return Math.log10(Number(value));
  const shift = bits - 64;
  return Math.log10(Number(value >> BigInt(shift))) + shift * LOG10_2;
}

/** Number of binary digits of a positive BigInt (0 for 0). */
export function bitLength(value: bigint): number {
  if (value <= 0n) return 0;
  const hex = value.toString(16);
  const lead = parseInt(hex[0] ?? '0', 16);
  return (hex.length - 1) * 4 + (lead >= 8 ? 4 : lead >= 4 ? 3 : lead >= 2 ? 2 : 1);
}

/**
 * Orders two magnitudes. Exact values compare exactly; otherwise the logarithms are compared and a
 * difference smaller than `tolerance` (in log10 units) counts as equal, since an estimate cannot
 * decide between values that close.
 */
export function compareMagnitudes(a: Magnitude, b: Magnitude, tolerance = 1e-9): -1 | 0 | 1 {
  if (a.exact !== undefined && b.exact !== undefined) return a.exact < b.exact ? -1 : a.exact > b.exact ? 1 : 0;
  if (a.log10 === b.log10) return 0;
  const difference = a.log10 - b.log10;
  if (Math.abs(difference) <= tolerance) return 0;
  return difference < 0 ? -1 : 1;
}
