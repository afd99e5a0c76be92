/**
 * The Boys function against values computed here independently in exact integer arithmetic, and
 * against closed forms with published constants.
 *
 * Reference: F_m(T) = e^(−T) Σ_k (2T)^k / ((2m+1)(2m+3)…(2m+2k+1)) (the series of
 * Helgaker, Jørgensen, Olsen, Molecular Electronic-Structure Theory, eq. 9.8.13, from memory),
 * summed with T a rational number in BigInt fixed point with 300 digits, divided by e^T summed the
 * same way; no floating point until the final rounding.
 */
import { describe, expect, it } from 'vitest';
import { boys, BOYS_MAX_ORDER } from '../../server/src/electronic/integrals';

const DIGITS = 300n;
const ONE = 10n ** DIGITS;

/** F_m(num/den) to about 300 digits, rounded to the nearest double via its decimal string. */
function boysExact(m: number, num: bigint, den: bigint): number {
  // e^T = Σ T^k / k!
  let term = ONE;
  let expT = 0n;
  for (let k = 1n; term !== 0n; k++) {
    expT += term;
    term = (term * num) / (den * k);
  }
  // S = Σ (2T)^k / Π (2m+2j+1)
  term = ONE / BigInt(2 * m + 1);
  let series = 0n;
  for (let k = 1n; term !== 0n; k++) {
    series += term;
    term = (term * 2n * num) / (den * (BigInt(2 * m + 1) + 2n * k));
  }
  const scaled = (series * ONE) / expT; // F · 10^300
  const text = scaled.toString().padStart(Number(DIGITS) + 1, '0');
  return Number(`${text.slice(0, text.length - Number(DIGITS))}.${text.slice(text.length - Number(DIGITS))}`);
}

const out = new Float64Array(BOYS_MAX_ORDER + 1);

describe('Boys function', () => {
  // Arguments across every regime: near zero, inside the table, at grid midpoints, near the switch
  // to the asymptotic form at 40, and far beyond it.
  const args: [bigint, bigint][] = [
    [0n, 1n], [1n, 10n ** 9n], [1n, 1000n], [3n, 100n], [1n, 32n], [1n, 2n], [7n, 10n], [1n, 1n], [2n, 1n],
    [1234567n, 1000000n], [5n, 1n], [33n, 4n], [10n, 1n], [27n, 2n], [17n, 1n], [2201n, 100n], [30n, 1n],
    [3999n, 100n], [40n, 1n], [4001n, 100n], [45n, 1n], [60n, 1n], [100n, 1n], [250n, 1n], [1000n, 1n],
  ];

  it.each(args.map(([n, d]) => [`${n}/${d}`, n, d] as const))('F_0 … F_32 at T = %s agree with exact arithmetic to 1e-14 relative', (_label, n, d) => {
    const t = Number(n) / Number(d);
    boys(BOYS_MAX_ORDER, t, out);
    for (let m = 0; m <= BOYS_MAX_ORDER; m++) {
      const exact = boysExact(m, n, d);
      expect(Math.abs(out[m]! - exact) / exact, `m = ${m}`).toBeLessThan(1e-14);
    }
  });

  it('gives each lower order the same value when fewer orders are asked for', () => {
    const all = new Float64Array(BOYS_MAX_ORDER + 1);
    const few = new Float64Array(BOYS_MAX_ORDER + 1);
    for (const t of [0.013, 3.3, 17.77, 39.99, 55]) {
      boys(BOYS_MAX_ORDER, t, all);
      for (const top of [0, 1, 4, 16]) {
        boys(top, t, few);
        for (let m = 0; m <= top; m++) expect(Math.abs(few[m]! - all[m]!) / all[m]!).toBeLessThan(1e-14);
      }
    }
  });

  it('matches closed forms: F_m(0) = 1/(2m+1), F_0(T) = √π erf(√T)/(2√T) with published erf values', () => {
    boys(BOYS_MAX_ORDER, 0, out);
    for (let m = 0; m <= BOYS_MAX_ORDER; m++) expect(out[m]).toBe(1 / (2 * m + 1));
    // erf(1) = 0.842700792949714869 and erf(2) = 0.995322265018952734: Abramowitz & Stegun,
    // Handbook of Mathematical Functions, Table 7.1 (from memory, to the digits the table prints).
    boys(0, 1, out);
    expect(out[0]).toBeCloseTo((Math.sqrt(Math.PI) / 2) * 0.842700792949714869, 15);
    boys(0, 4, out);
    expect(out[0]).toBeCloseTo((Math.sqrt(Math.PI) / 4) * 0.995322265018952734, 15);
  });
});
