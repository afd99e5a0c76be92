/**
 * Classical cost figures (server/src/chemistry/cost/classical.ts).
 * Full-CI size C(n, nα)·C(n, nβ) (Sherrill & Schaefer, Adv. Quantum Chem. 34, 143 (1999)); ln n!
 * from Stirling's series (DLMF 5.11.1); closed-shell CCSD amplitudes (Scuseria et al., J. Chem.
 * Phys. 86, 2881 (1987)); statevector of 2^q complex doubles (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import {
  binomial,
  ccsdAmplitudeCount,
  ciVectorBytes,
  compareWithMemoryLimit,
  EXACT_ORBITAL_LIMIT,
  fciDeterminantCount,
  lnFactorial,
  log10Binomial,
  statevectorBytes,
} from '../../../server/src/chemistry/cost/classical';
import { formatBytes, formatCount } from '../../../server/src/chemistry/cost/format';
import { estimatedMagnitude, exactMagnitude } from '../../../server/src/chemistry/cost/magnitude';

/** C(n, k) by Pascal's rule, a different algorithm from the one under test. */
function pascal(n: number, k: number): bigint {
  let row = [1n];
  for (let i = 1; i <= n; i++) {
    const next = [1n];
    for (let j = 1; j < i; j++) next.push((row[j - 1] ?? 0n) + (row[j] ?? 0n));
    next.push(1n);
    row = next;
  }
  return row[k] ?? 0n;
}

describe('full-CI determinant count, C(n, nα)·C(n, nβ) (Sherrill & Schaefer 1999)', () => {
  it('water in STO-3G: n = 7, nα = nβ = 5 → C(7,5)² = 21 × 21 = 441', () => {
    const count = fciDeterminantCount(7, 5, 5);
    expect(count.determinants.exact).toBe(441n);
    expect(count.method).toBe('exact');
    expect(formatCount(count.determinants)).toBe('441');
  });

  it('N2 in cc-pVDZ with a frozen 1s core: 26 orbitals, 5 + 5 electrons → C(26,5)² = 4 327 008 400 (by Pascal\'s rule in this test)', () => {
    const count = fciDeterminantCount(26, 5, 5);
    expect(count.determinants.exact).toBe(pascal(26, 5) ** 2n);
    expect(count.determinants.exact).toBe(4_327_008_400n); // Python 3 math.comb(26, 5)**2
    expect(formatCount(count.determinants)).toBe('4.33 × 10^9');
  });

  it('binomials agree with Pascal\'s rule up to n = 60', () => {
    for (let n = 0; n <= 60; n++) for (let k = 0; k <= n; k++) expect(binomial(n, k)).toBe(pascal(n, k));
    expect(binomial(3, 4)).toBe(0n);
  });

  it('electrons that do not fit give zero determinants, not an error', () => {
    expect(fciDeterminantCount(3, 4, 0).determinants.exact).toBe(0n);
  });

  it('Stirling\'s series matches exact values: log10 C(10000, 5000) = 3008.2018858… (Python 3 math.comb)', () => {
    expect(log10Binomial(10000, 5000)).toBeCloseTo(3008.201885843935, 8);
    for (const n of [0, 1, 5, 31, 32, 33, 100, 170]) {
      let exact = 0;
      for (let k = 2; k <= n; k++) exact += Math.log(k);
      expect(lnFactorial(n)).toBeCloseTo(exact, 9);
    }
  });

  it(`above ${EXACT_ORBITAL_LIMIT} orbitals the count is an estimate that says so (2·log10 C(5000,2500) = 3006.40482…, Python 3 math.comb)`, () => {
    const count = fciDeterminantCount(5000, 2500, 2500);
    expect(count.method).toBe('estimate');
    expect(count.determinants.exact).toBeUndefined();
    expect(count.determinants.log10).toBeCloseTo(3006.4048233289977, 7);
    expect(count.description).toMatch(/estimated/);
    expect(formatCount(count.determinants)).toBe('≈ 2.54 × 10^3006');
  });

  it('a huge space returns a finite estimate', () => {
    const count = fciDeterminantCount(10_000_000, 5_000_000, 5_000_000);
    expect(Number.isFinite(count.determinants.log10)).toBe(true);
    expect(count.determinants.log10).toBeGreaterThan(6e6);
  });
});

describe('memory', () => {
  it('CI vector of water in STO-3G: 441 × 8 bytes = 3528 B = 3.45 KiB (one double per coefficient, common practice)', () => {
    const bytes = ciVectorBytes(fciDeterminantCount(7, 5, 5).determinants);
    expect(bytes.exact).toBe(3528n);
    expect(formatBytes(bytes)).toBe('3.45 KiB');
  });

  it('45-qubit statevector: 2^45 × 16 B = 0.5 PiB (Häner & Steiger, "0.5 Petabyte Simulation of a 45-Qubit Quantum Circuit", SC17 (2017))', () => {
    const bytes = statevectorBytes(45);
    expect(bytes.exact).toBe(2n ** 49n);
    expect(formatBytes(bytes)).toBe('512 TiB');
  });

  it('30 qubits need 16 GiB (2^34 bytes; common practice, no source) and fit a 16 GiB limit exactly', () => {
    const bytes = statevectorBytes(30);
    expect(formatBytes(bytes)).toBe('16.0 GiB');
    expect(compareWithMemoryLimit(bytes, 16 * 2 ** 30)).toEqual({ fits: true, certain: true, ratioLog10: 0 });
    expect(compareWithMemoryLimit(bytes, 16n * 2n ** 30n - 1n).fits).toBe(false);
  });

  it('beyond 2^53 bytes the exact size is kept: 100 qubits = 2^100 × 16 = 2^104 bytes, far over any limit (16 bytes per amplitude, common practice)', () => {
    const bytes = statevectorBytes(100);
    expect(bytes.exact).toBe(2n ** 104n);
    const verdict = compareWithMemoryLimit(bytes, 2 ** 40);
    expect(verdict.fits).toBe(false);
    expect(verdict.ratioLog10).toBeCloseTo(64 * Math.log10(2), 9);
    expect(formatBytes(bytes)).toBe('2.03 × 10^31 B');
  });

  it('an estimate too close to the limit is reported as uncertain', () => {
    const verdict = compareWithMemoryLimit(estimatedMagnitude(12), 1e12);
    expect(verdict).toMatchObject({ fits: true, certain: false });
    expect(compareWithMemoryLimit(statevectorBytes(10_000), 1e15)).toMatchObject({ fits: false, certain: true });
  });

  it('rejects a negative limit', () => {
    expect(() => compareWithMemoryLimit(exactMagnitude(1n), -1)).toThrow(RangeError);
  });
});

describe('CCSD amplitudes', () => {
  it('water in STO-3G, closed shell: 10 + 55 = 65 amplitudes, 520 B (hand count)', () => {
    const count = ccsdAmplitudeCount(7, 5, 5);
    expect(count.convention).toBe('closed-shell');
    expect(count.amplitudes.exact).toBe(65n);
    expect(count.bytes.exact).toBe(520n);
  });

  it('water in spin orbitals: 20 + 120 = 140 amplitudes (hand count)', () => {
    expect(ccsdAmplitudeCount(7, 5, 5, 'spin-orbital').amplitudes.exact).toBe(140n);
  });

  it('open shells default to spin orbitals and refuse the closed-shell convention', () => {
    expect(ccsdAmplitudeCount(28, 9, 7).convention).toBe('spin-orbital');
    expect(() => ccsdAmplitudeCount(28, 9, 7, 'closed-shell')).toThrow(RangeError);
  });
});
