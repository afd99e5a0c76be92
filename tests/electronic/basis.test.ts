/**
 * The molecular basis: normalisation, the real solid harmonics, the cartesian order and errors
 * (lazy loading: lazyBasis.test.ts). Shell order and normalised coefficients are also compared
 * with psi4 1.3.2 in integrals.psi4.test.ts.
 */
import { describe, expect, it } from 'vitest';
import {
  buildMolecularBasis,
  cartesianExponents,
  cartesianIndex,
  InvalidAtomError,
  MissingBasisDataError,
  normalizedCoefficients,
  sphericalTransform,
  UnknownBasisError,
} from '../../server/src/electronic/basis';
import { overlapMatrix } from '../../server/src/electronic/integrals';

/** (2n−1)!! for n ≥ 0 written out independently of the code under test. */
function oddDoubleFactorial(n: number): number {
  let value = 1;
  for (let k = 1; k < 2 * n; k += 2) value *= k;
  return value;
}

/**
 * Overlap of x^a y^b z^c and x^a' y^b' z^c' sharing one radial part, relative to that of x^l with
 * itself: Π (a+a'−1)!! / (2l−1)!! when every sum is even, else 0 (Gaussian moments
 * ∫ x^(2n) e^(−2αx²) dx ∝ (2n−1)!!/(4α)^n).
 */
function metric(l: number, i: number, j: number): number {
  const e = cartesianExponents(l);
  let value = 1;
  for (let d = 0; d < 3; d++) {
    const sum = e[3 * i + d]! + e[3 * j + d]!;
    if (sum % 2 !== 0) return 0;
    value *= oddDoubleFactorial(sum / 2);
  }
  return value / oddDoubleFactorial(l);
}

describe('cartesian order', () => {
  it('is a descending, then b descending: d = xx xy xz yy yz zz (contracts.ts)', () => {
    expect(Array.from(cartesianExponents(2))).toEqual([2, 0, 0, 1, 1, 0, 1, 0, 1, 0, 2, 0, 0, 1, 1, 0, 0, 2]);
    const f = cartesianExponents(3);
    for (let k = 0; k < 10; k++) expect(cartesianIndex(f[3 * k]!, f[3 * k + 1]!, f[3 * k + 2]!)).toBe(k);
  });
});

describe('real solid harmonics from the closed form', () => {
  it.each([2, 3, 4, 5, 6])('l = %i: 2l+1 orthonormal functions under the one-centre metric', (l) => {
    const t = sphericalTransform(l);
    const nc = ((l + 1) * (l + 2)) / 2;
    for (let m1 = 0; m1 < 2 * l + 1; m1++) {
      for (let m2 = 0; m2 < 2 * l + 1; m2++) {
        let s = 0;
        for (let i = 0; i < nc; i++) for (let j = 0; j < nc; j++) s += t[m1 * nc + i]! * t[m2 * nc + j]! * metric(l, i, j);
        expect(s, `<${m1 - l}|${m2 - l}>`).toBeCloseTo(m1 === m2 ? 1 : 0, 13);
      }
    }
  });

  it('gives the textbook d functions: m = 0 is (2z² − x² − y²)/2, m = +2 is √3/2 (x² − y²), m = −2 is √3 xy', () => {
    // Helgaker, Jørgensen, Olsen, Molecular Electronic-Structure Theory, Table 6.3 (from memory).
    const t = sphericalTransform(2);
    const row = (m: number): number[] => Array.from(t.slice((m + 2) * 6, (m + 3) * 6));
    const close = (a: number[], b: number[]): void => a.forEach((v, i) => expect(v).toBeCloseTo(b[i]!, 14));
    close(row(0), [-0.5, 0, 0, -0.5, 0, 1]);
    close(row(2), [Math.sqrt(3) / 2, 0, 0, -Math.sqrt(3) / 2, 0, 0]);
    close(row(-2), [0, Math.sqrt(3), 0, 0, 0, 0]);
    close(row(1), [0, 0, Math.sqrt(3), 0, 0, 0]);
    close(row(-1), [0, 0, 0, 0, Math.sqrt(3), 0]);
  });
});

describe('normalisation', () => {
  it('a single primitive of momentum l gets the textbook norm (2α/π)^(3/4) (4α)^(l/2) / √((2l−1)!!)', () => {
    // Szabo & Ostlund eq. 3.203 for l = 0 (from memory); the general form e.g. Helgaker eq. 6.6.15.
    expect(normalizedCoefficients(0, [0.5], [1])[0]).toBeCloseTo((1 / Math.PI) ** 0.75, 15);
    expect(normalizedCoefficients(2, [1.3], [7])[0]).toBeCloseTo((2.6 / Math.PI) ** 0.75 * 5.2 / Math.sqrt(3), 13);
  });

  it.each(['spherical', 'cartesian'] as const)('every %s function has unit norm, up to g shells (cc-pVQZ)', (kind) => {
    const basis = buildMolecularBasis(
      [
        { symbol: 'F', x: 0, y: 0, z: 0 },
        { symbol: 'H', x: 0.3, y: -0.2, z: 1.7 },
      ],
      'cc-pVQZ',
      kind,
    );
    expect(Math.max(...basis.shells.map((s) => s.l))).toBe(4);
    const s = overlapMatrix(basis);
    const n = basis.functionCount;
    for (let i = 0; i < n; i++) expect(s[i * n + i]).toBeCloseTo(1, 13);
  });
});

describe('buildMolecularBasis', () => {
  const water = [
    { symbol: 'O', x: 0, y: 0, z: 0 },
    { symbol: 'H', x: 0, y: 1.43, z: 1.1 },
    { symbol: 'H', x: 0, y: -1.43, z: 1.1 },
  ];

  it('counts 24 spherical and 25 cartesian cc-pVDZ functions for water (table counts of the family)', () => {
    expect(buildMolecularBasis(water, 'cc-pVDZ', 'spherical').functionCount).toBe(24);
    expect(buildMolecularBasis(water, 'cc-pVDZ', 'cartesian').functionCount).toBe(25);
  });

  it('takes one basis per atom, keeps atom order, and records centre, momentum and offsets of every function', () => {
    const basis = buildMolecularBasis(water, ['cc-pVDZ', 'sto-3g', 'sto-3g'], 'spherical');
    expect(basis.functionCount).toBe(14 + 1 + 1);
    expect(basis.basisNames).toEqual(['cc-pVDZ', 'sto-3g', 'sto-3g']);
    expect(Array.from(basis.functionCenter.slice(13))).toEqual([0, 1, 2]);
    expect(Array.from(basis.functionL.slice(0, 9))).toEqual([0, 0, 0, 1, 1, 1, 1, 1, 1]);
    let offset = 0;
    for (const shell of basis.shells) {
      expect(shell.offset).toBe(offset);
      offset += shell.size;
    }
  });

  it('puts the def2 effective core potential on iodine and lowers the charge the electrons feel by 28', () => {
    const basis = buildMolecularBasis(
      [
        { symbol: 'I', x: 0, y: 0, z: 0 },
        { symbol: 'H', x: 0, y: 0, z: 3.04 },
      ],
      'def2-SVP',
      'spherical',
    );
    expect(basis.centers[0]!.charge).toBe(53 - 28);
    expect(basis.centers[1]!.charge).toBe(1);
    expect(basis.ecps.map((e) => [e.center, e.coreElectrons])).toEqual([[0, 28]]);
    expect(basis.ecps[0]!.channels[0]!.powers).toBeInstanceOf(Int32Array);
  });

  it('names every element and atom a basis does not define', () => {
    const atoms = [
      { symbol: 'H', x: 0, y: 0, z: 0 },
      { symbol: 'Xe', x: 0, y: 0, z: 3 },
      { symbol: 'Xe', x: 0, y: 0, z: 6 },
    ];
    expect(() => buildMolecularBasis(atoms, 'cc-pVDZ', 'spherical')).toThrow(MissingBasisDataError);
    expect(() => buildMolecularBasis(atoms, 'cc-pVDZ', 'spherical')).toThrow("Basis set 'cc-pVDZ' has no functions for Xe (atoms 2, 3).");
    expect(() => buildMolecularBasis(atoms, 'def2-svpx', 'spherical')).toThrow(UnknownBasisError);
    expect(() => buildMolecularBasis([{ symbol: 'Qq', x: 0, y: 0, z: 0 }], 'sto-3g', 'spherical')).toThrow(InvalidAtomError);
    expect(() => buildMolecularBasis([{ symbol: 'H', x: Number.NaN, y: 0, z: 0 }], 'sto-3g', 'spherical')).toThrow(/Atom 1: a coordinate/);
  });
});
