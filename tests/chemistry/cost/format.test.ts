/**
 * Big-number representation and formatting (server/src/chemistry/cost/magnitude.ts, format.ts).
 * Binary prefixes KiB … EiB: IEC 80000-13. Check values are hand-computed powers of two and ten.
 */
import { describe, expect, it } from 'vitest';
import { formatBytes, formatCount } from '../../../server/src/chemistry/cost/format';
import {
  bitLength,
  compareMagnitudes,
  estimatedMagnitude,
  exactMagnitude,
  log10OfBigInt,
  magnitudeOfNumber,
  scaleMagnitude,
} from '../../../server/src/chemistry/cost/magnitude';

describe('magnitudes (by definition: hand-computed powers of two and ten)', () => {
  it('take exact logarithms of huge BigInts (10^500 → 500, 2^5000 → 5000·log10 2)', () => {
    expect(log10OfBigInt(10n ** 500n)).toBeCloseTo(500, 10);
    expect(log10OfBigInt(2n ** 5000n)).toBeCloseTo(5000 * Math.log10(2), 9);
    expect(log10OfBigInt(0n)).toBe(Number.NEGATIVE_INFINITY);
  });

  it('count binary digits', () => {
    expect([0n, 1n, 2n, 255n, 256n, 2n ** 64n].map(bitLength)).toEqual([0, 1, 2, 8, 9, 65]);
  });

  it('compare exactly when both are exact, by logarithm otherwise', () => {
    expect(compareMagnitudes(exactMagnitude(2n ** 60n + 1n), exactMagnitude(2n ** 60n))).toBe(1);
    expect(compareMagnitudes(estimatedMagnitude(3), exactMagnitude(1000n))).toBe(0);
    expect(compareMagnitudes(estimatedMagnitude(3.1), exactMagnitude(1000n))).toBe(1);
  });

  it('scale, keeping exactness, and never produce Infinity', () => {
    expect(scaleMagnitude(exactMagnitude(441n), 8n).exact).toBe(3528n);
    expect(scaleMagnitude(estimatedMagnitude(400), 8n).log10).toBeCloseTo(400 + Math.log10(8), 12);
    expect(magnitudeOfNumber(2 ** 60).exact).toBeUndefined();
    expect(() => estimatedMagnitude(Number.POSITIVE_INFINITY)).toThrow(RangeError);
    expect(() => magnitudeOfNumber(Number.POSITIVE_INFINITY)).toThrow(RangeError);
  });
});

describe('formatCount (by definition of our format: whole below 10^6, else three significant digits)', () => {
  it('prints counts below a million whole and larger ones with three significant digits', () => {
    expect(formatCount(exactMagnitude(999_999n))).toBe('999999');
    expect(formatCount(exactMagnitude(1_000_000n))).toBe('1.00 × 10^6');
    expect(formatCount(exactMagnitude(1_234_567n))).toBe('1.23 × 10^6');
    expect(formatCount(exactMagnitude(9_995_000n))).toBe('1.00 × 10^7');
    expect(formatCount(exactMagnitude(10n ** 45n * 123n))).toBe('1.23 × 10^47');
  });

  it('marks estimates', () => {
    expect(formatCount(estimatedMagnitude(45 + Math.log10(1.234)))).toBe('≈ 1.23 × 10^45');
    expect(formatCount(estimatedMagnitude(Math.log10(9.999) + 7))).toBe('≈ 1.00 × 10^8');
  });
});

describe('formatBytes (binary prefixes of IEC 80000-13 (2008), three significant digits by definition of our format)', () => {
  it('uses B, KiB … EiB with three significant digits', () => {
    expect(formatBytes(exactMagnitude(0n))).toBe('0 B');
    expect(formatBytes(exactMagnitude(1023n))).toBe('1023 B');
    expect(formatBytes(exactMagnitude(1024n))).toBe('1.00 KiB');
    expect(formatBytes(exactMagnitude(1536n))).toBe('1.50 KiB');
    expect(formatBytes(exactMagnitude(2n ** 20n - 1n))).toBe('1.00 MiB');
    expect(formatBytes(exactMagnitude(3n * 2n ** 60n))).toBe('3.00 EiB');
  });

  it('switches to powers of ten from 1024 EiB = 2^70 B ≈ 1.18 × 10^21 B', () => {
    expect(formatBytes(exactMagnitude(2n ** 70n))).toBe('1.18 × 10^21 B');
    expect(formatBytes(estimatedMagnitude(3000))).toBe('≈ 1.00 × 10^3000 B');
    expect(formatBytes(estimatedMagnitude(10))).toBe('≈ 9.31 GiB');
  });
});
