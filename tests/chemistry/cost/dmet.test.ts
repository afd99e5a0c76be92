/**
 * Embedding-aware sizes (server/src/chemistry/cost/dmet.ts).
 * DMET bath from the Schmidt decomposition of the mean-field determinant (Knizia & Chan, Phys. Rev.
 * Lett. 109, 186404 (2012); Wouters, Jiménez-Hoyos, Sun, Chan, J. Chem. Theory Comput. 12, 2706
 * (2016)): bath_σ ≤ min(L, M − L, Nσ, M − Nσ); impurity electrons_σ = bath_σ + max(0, L + Nσ − M).
 * The rule is checked against a numerical Schmidt decomposition of random determinants: the
 * eigenvalues of the fragment block of the density matrix strictly between 0 and 1 give the bath,
 * those equal to 1 the fully occupied fragment orbitals.
 */
import { describe, expect, it } from 'vitest';
import { findBasisSet } from '../../../server/src/chemistry/basis/library';
import { countOrbitalSpace } from '../../../server/src/chemistry/counting';
import { bathSize, dmetSizes, dmetSizesForSpaces, ownOrbitalSizes } from '../../../server/src/chemistry/cost/dmet';
import { elementBySymbol } from '../../../server/src/chemistry/elements';
import { seeded } from './reference';

/** Orthonormal columns (M × N, row-major rows) from random vectors by modified Gram–Schmidt. */
function randomOccupied(M: number, N: number, random: () => number): number[][] {
  const columns: number[][] = [];
  while (columns.length < N) {
    const v = Array.from({ length: M }, () => random() - 0.5);
    for (const c of columns) {
      const overlap = v.reduce((s, x, i) => s + x * (c[i] ?? 0), 0);
      for (let i = 0; i < M; i++) v[i] = (v[i] ?? 0) - overlap * (c[i] ?? 0);
    }
    const norm = Math.sqrt(v.reduce((s, x) => s + x * x, 0));
    if (norm > 1e-6) columns.push(v.map((x) => x / norm));
  }
  return Array.from({ length: M }, (_, i) => columns.map((c) => c[i] ?? 0));
}

/** Eigenvalues of a small symmetric matrix by cyclic Jacobi rotations (Golub & Van Loan, Matrix Computations, §8.5). */
function symmetricEigenvalues(matrix: number[][]): number[] {
  const a = matrix.map((row) => [...row]);
  const n = a.length;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += (a[p]![q] ?? 0) ** 2;
    if (off < 1e-24) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p]![q]!;
        if (Math.abs(apq) < 1e-300) continue;
        const theta = (a[q]![q]! - a[p]![p]!) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k]![p]!;
          const akq = a[k]![q]!;
          a[k]![p] = c * akp - s * akq;
          a[k]![q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p]![k]!;
          const aqk = a[q]![k]!;
          a[p]![k] = c * apk - s * aqk;
          a[q]![k] = s * apk + c * aqk;
        }
      }
    }
  }
  return a.map((row, i) => row[i] ?? 0);
}

/** Bath size and fully occupied fragment orbitals of a determinant, fragment = the first L sites. */
function schmidt(occupied: number[][], L: number): { bath: number; full: number } {
  const rows = occupied.slice(0, L);
  const density = rows.map((ri) => rows.map((rj) => ri.reduce((s, x, k) => s + x * (rj[k] ?? 0), 0)));
  const values = symmetricEigenvalues(density);
  return {
    bath: values.filter((x) => x > 1e-8 && x < 1 - 1e-8).length,
    full: values.filter((x) => x >= 1 - 1e-8).length,
  };
}

describe('DMET bath and impurity (the rule of Knizia & Chan 2012 and Wouters et al. 2016, in the header)', () => {
  it('the common case L ≤ N ≤ M − L: 2L orbitals and 2L electrons (Wouters et al. 2016, from memory)', () => {
    const sizes = dmetSizes({ fragmentOrbitals: 3, systemOrbitals: 20, alpha: 10, beta: 10 });
    expect(sizes).toMatchObject({ bath: { alpha: 3, beta: 3 }, orbitals: 6, spinOrbitals: 12, electrons: 6 });
    expect(sizes.convention).toMatch(/Knizia & Chan 2012/);
  });

  it('each bound can be the limiting one (hand-derived cases)', () => {
    expect(bathSize(4, 20, 2)).toBe(2); // few occupied orbitals
    expect(bathSize(4, 20, 19)).toBe(1); // few virtual orbitals
    expect(bathSize(8, 10, 5)).toBe(2); // small environment
    expect(bathSize(10, 10, 5)).toBe(0); // the fragment is the whole system
  });

  it('matches a numerical Schmidt decomposition of random determinants (general position), per spin', () => {
    const random = seeded(2012);
    for (const [L, M, N] of [
      [2, 10, 5],
      [3, 8, 2],
      [4, 9, 8],
      [7, 10, 5],
      [5, 10, 7],
      [6, 6, 3],
      [1, 12, 0],
    ] as const) {
      const numeric = schmidt(randomOccupied(M, N, random), L);
      const sizes = dmetSizes({ fragmentOrbitals: L, systemOrbitals: M, alpha: N, beta: N });
      expect(sizes.bath.alpha, `L=${L} M=${M} N=${N}`).toBe(numeric.bath);
      expect(sizes.alpha, `L=${L} M=${M} N=${N}`).toBe(numeric.bath + numeric.full);
    }
  });

  it('is an upper bound: a fragment orbital that is exactly occupied has no bath partner', () => {
    const random = seeded(7);
    const M = 10;
    const L = 3;
    // the first occupied orbital is fragment site 0 itself; the others avoid it
    const others = randomOccupied(M - 1, 3, random);
    const occupied = Array.from({ length: M }, (_, i) => (i === 0 ? [1, 0, 0, 0] : [0, ...(others[i - 1] ?? [])]));
    const numeric = schmidt(occupied, L);
    expect(numeric.bath).toBeLessThan(dmetSizes({ fragmentOrbitals: L, systemOrbitals: M, alpha: 4, beta: 4 }).bath.alpha);
  });

  it('open shell: a bath for each spin', () => {
    const sizes = dmetSizes({ fragmentOrbitals: 4, systemOrbitals: 10, alpha: 3, beta: 1 });
    expect(sizes).toMatchObject({ bath: { alpha: 3, beta: 1 }, orbitals: 7, spinOrbitals: 12, alpha: 3, beta: 1, electrons: 4 });
    expect(sizes.convention).toMatch(/3 α \/ 1 β bath/);
  });

  it('rejects a fragment larger than the system', () => {
    expect(() => dmetSizes({ fragmentOrbitals: 5, systemOrbitals: 4, alpha: 1, beta: 1 })).toThrow(RangeError);
  });
});

// The same rule (Knizia & Chan 2012) on cc-pVDZ counts: O [3s2p1d] = 14, H [2s1p] = 5 (Dunning 1989).
describe('DMET from counted orbital spaces (frozen core outside fragment and bath)', () => {
  const basis = findBasisSet('cc-pvdz')!;
  const atoms = (symbols: string[]) => symbols.map((s) => ({ z: elementBySymbol(s)!.z, shells: basis.shellsFor(s), ecpCoreElectrons: 0 }));
  const space = (symbols: string[], multiplicity: number) =>
    countOrbitalSpace({ atoms: atoms(symbols), charge: 0, multiplicity, functions: 'spherical', frozenCore: true });

  it('water in cc-pVDZ (24 orbitals, O 1s frozen: M = 23, N = 4), fragment = one H (5 orbitals): bath 4, 8 electrons in 9 orbitals (hand count)', () => {
    const sizes = dmetSizesForSpaces(space(['O', 'H', 'H'], 1), space(['H'], 2));
    expect(sizes).toMatchObject({ fragmentOrbitals: 5, bath: { alpha: 4, beta: 4 }, orbitals: 9, electrons: 8 });
  });

  it('fragment = the O atom (14 orbitals, 13 outside its core): bath limited by the 4 occupied valence orbitals (hand count)', () => {
    const sizes = dmetSizesForSpaces(space(['O', 'H', 'H'], 1), space(['O'], 3));
    expect(sizes).toMatchObject({ fragmentOrbitals: 13, bath: { alpha: 4, beta: 4 }, orbitals: 17, electrons: 8 });
  });

  it('an invalid system spin gives no sizes', () => {
    expect(dmetSizesForSpaces(space(['O', 'H', 'H'], 2), space(['H'], 2))).toBeUndefined();
  });
});

describe('projection-based and subtractive embedding use the fragment\'s own orbitals (Manby et al. 2012; Svensson et al. 1996)', () => {
  it('reports the fragment\'s own size and says which convention', () => {
    const projection = ownOrbitalSizes('projection', { orbitals: 13, alpha: 4, beta: 4 });
    expect(projection).toMatchObject({ orbitals: 13, spinOrbitals: 26, electrons: 8, bath: { alpha: 0, beta: 0 } });
    expect(projection.convention).toMatch(/own orbitals/);
    expect(projection.convention).toMatch(/Manby et al\. 2012/);
    expect(ownOrbitalSizes('subtractive', { orbitals: 5, alpha: 1, beta: 0 }).convention).toMatch(/Svensson et al\. 1996/);
  });
});
