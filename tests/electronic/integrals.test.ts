/**
 * Integrals: published worked examples (Szabo & Ostlund), the direct J/K build against J and K
 * assembled from every shell quartet, permutational symmetry, screening, cancellation and the
 * refusal of effective core potentials. The comparison with psi4 is in integrals.psi4.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { buildMolecularBasis, normalizedCoefficients } from '../../server/src/electronic/basis';
import { CancelledError, type MolecularBasis } from '../../server/src/electronic/contracts';
import {
  coreHamiltonian,
  createTwoElectronIntegrals,
  kineticMatrix,
  nuclearAttractionMatrix,
  nuclearRepulsionEnergy,
  overlapMatrix,
  UnsupportedEcpError,
} from '../../server/src/electronic/integrals';

/**
 * The STO-3G basis of Szabo & Ostlund, Modern Quantum Chemistry (1989), ch. 3: 1s functions of
 * Slater exponent ζ fitted by three Gaussians with exponents 0.109818 ζ², 0.405771 ζ², 2.22766 ζ²
 * and coefficients 0.444635, 0.535328, 0.154329 (their eqs. 3.225 and Table 3.x, from memory).
 */
function szaboBasis(atoms: { symbol: string; zeta: number; charge: number; z: number }[]): MolecularBasis {
  const shells = atoms.map((atom, center) => {
    const exponents = [0.109818, 0.405771, 2.22766].map((a) => a * atom.zeta * atom.zeta);
    return {
      l: 0,
      center,
      x: 0,
      y: 0,
      z: atom.z,
      exponents: Float64Array.from(exponents),
      coefficients: normalizedCoefficients(0, exponents, [0.444635, 0.535328, 0.154329]),
      offset: center,
      size: 1,
      kind: 'spherical' as const,
    };
  });
  return {
    basisNames: atoms.map(() => 'STO-3G (Szabo & Ostlund)'),
    kind: 'spherical',
    centers: atoms.map((a) => ({ symbol: a.symbol, atomicNumber: a.charge, charge: a.charge, x: 0, y: 0, z: a.z })),
    shells,
    functionCount: atoms.length,
    functionCenter: Int32Array.from(atoms.map((_, i) => i)),
    functionL: new Int32Array(atoms.length),
    ecps: [],
  };
}

function eri2(basis: MolecularBasis): (p: number, q: number, r: number, s: number) => number {
  const eri = createTwoElectronIntegrals(basis);
  const out = new Float64Array(1);
  return (p, q, r, s) => {
    eri.shellQuartet(p, q, r, s, out);
    return out[0]!;
  };
}

/** Closed-shell RHF for two electrons in two functions, iterated to self-consistency (S&O §3.5.2). */
function twoFunctionRhf(basis: MolecularBasis): number {
  const s = overlapMatrix(basis);
  const h = coreHamiltonian(basis);
  const g = eri2(basis);
  let c = [1 / Math.sqrt(2 + 2 * s[1]!), 1 / Math.sqrt(2 + 2 * s[1]!)];
  let energy = 0;
  for (let iteration = 0; iteration < 200; iteration++) {
    const p = [0, 1, 2, 3].map((k) => 2 * c[k >> 1]! * c[k & 1]!);
    const f = [0, 1, 2, 3].map((k) => {
      const mu = k >> 1;
      const nu = k & 1;
      let value = h[k]!;
      for (let la = 0; la < 2; la++) for (let si = 0; si < 2; si++) value += p[la * 2 + si]! * (g(mu, nu, si, la) - 0.5 * g(mu, la, si, nu));
      return value;
    });
    energy = 0.5 * [0, 1, 2, 3].reduce((sum, k) => sum + p[k]! * (h[k]! + f[k]!), 0);
    // Lowest root of det(F − εS) = 0 and its eigenvector.
    const a = 1 - s[1]! * s[1]!;
    const b = -(f[0]! + f[3]! - 2 * f[1]! * s[1]!);
    const cc = f[0]! * f[3]! - f[1]! * f[1]!;
    const eps = (-b - Math.sqrt(b * b - 4 * a * cc)) / (2 * a);
    const v = [-(f[1]! - eps * s[1]!), f[0]! - eps];
    const norm = Math.sqrt(v[0]! * v[0]! + v[1]! * v[1]! + 2 * v[0]! * v[1]! * s[1]!);
    c = [v[0]! / norm, v[1]! / norm];
  }
  return energy + nuclearRepulsionEnergy(basis);
}

/** Within one unit of the last digit a table prints (its values are rounded, from 6-digit fits). */
function expectPrinted(value: number, printed: number, digits = 4): void {
  expect(Math.abs(value - printed)).toBeLessThanOrEqual(10 ** -digits);
}

describe('Szabo & Ostlund, Modern Quantum Chemistry, ch. 3 (table values from memory, 4 decimals as printed)', () => {
  it('H2 in STO-3G at R = 1.4 bohr: the one- and two-electron integrals and E(RHF) = −1.1167 Ha', () => {
    const basis = szaboBasis([
      { symbol: 'H', zeta: 1.24, charge: 1, z: 0 },
      { symbol: 'H', zeta: 1.24, charge: 1, z: 1.4 },
    ]);
    const s = overlapMatrix(basis);
    const t = kineticMatrix(basis);
    const h = coreHamiltonian(basis);
    expectPrinted(s[1]!, 0.6593);
    expectPrinted(t[0]!, 0.76);
    expectPrinted(t[1]!, 0.2365);
    expectPrinted(h[0]!, -1.1204);
    expectPrinted(h[1]!, -0.9584);
    const g = eri2(basis);
    expectPrinted(g(0, 0, 0, 0), 0.7746);
    expectPrinted(g(0, 0, 1, 1), 0.5697);
    expectPrinted(g(1, 0, 0, 0), 0.4441);
    expectPrinted(g(1, 0, 1, 0), 0.297);
    expectPrinted(twoFunctionRhf(basis), -1.1167);
  });

  it('HeH+ in STO-3G (ζ_He = 2.0925, ζ_H = 1.24) at R = 1.4632 bohr: integrals and E = −2.860662 Ha', () => {
    const basis = szaboBasis([
      { symbol: 'He', zeta: 2.0925, charge: 2, z: 0 },
      { symbol: 'H', zeta: 1.24, charge: 1, z: 1.4632 },
    ]);
    const s = overlapMatrix(basis);
    const h = coreHamiltonian(basis);
    expectPrinted(s[1]!, 0.4508);
    expectPrinted(h[0]!, -2.6527);
    expectPrinted(h[1]!, -1.3472);
    expectPrinted(h[3]!, -1.7318);
    const g = eri2(basis);
    expectPrinted(g(0, 0, 0, 0), 1.3072);
    expectPrinted(g(0, 0, 1, 1), 0.6057);
    expectPrinted(g(1, 0, 0, 0), 0.4373);
    expectPrinted(g(1, 1, 1, 0), 0.3118);
    expectPrinted(g(1, 0, 1, 0), 0.1773);
    expectPrinted(g(1, 1, 1, 1), 0.7746);
    expectPrinted(twoFunctionRhf(basis), -2.860662, 5);
  });
});

/** A seeded generator so that the random densities are the same on every run. */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

function symmetricMatrix(n: number, next: () => number): Float64Array {
  const m = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const v = next();
      m[i * n + j] = v;
      m[j * n + i] = v;
    }
  }
  return m;
}

/** Every (μν|λσ) from shellQuartet, n⁴ values. */
function fullTensor(basis: MolecularBasis): Float64Array {
  const eri = createTwoElectronIntegrals(basis);
  const n = basis.functionCount;
  const t = new Float64Array(n ** 4);
  const block = new Float64Array(15 ** 4);
  const shells = basis.shells;
  for (let p = 0; p < shells.length; p++) {
    for (let q = 0; q < shells.length; q++) {
      for (let r = 0; r < shells.length; r++) {
        for (let s = 0; s < shells.length; s++) {
          eri.shellQuartet(p, q, r, s, block);
          const [a, b, c, d] = [shells[p]!, shells[q]!, shells[r]!, shells[s]!];
          let k = 0;
          for (let i = 0; i < a.size; i++)
            for (let j = 0; j < b.size; j++)
              for (let x = 0; x < c.size; x++)
                for (let y = 0; y < d.size; y++) t[(((a.offset + i) * n + b.offset + j) * n + c.offset + x) * n + d.offset + y] = block[k++]!;
        }
      }
    }
  }
  return t;
}

const water = [
  { symbol: 'O', x: 0, y: 0.1, z: -0.12 },
  { symbol: 'H', x: 0.05, y: 1.43, z: 0.98 },
  { symbol: 'H', x: -0.02, y: -1.45, z: 1.01 },
];

describe.each([
  ['water cc-pVDZ spherical', 'cc-pVDZ', 'spherical'],
  ['water 6-31G* cartesian', '6-31G*', 'cartesian'],
] as const)('two-electron integrals, %s', (_name, basisName, kind) => {
  const basis = buildMolecularBasis(water, basisName, kind);
  const n = basis.functionCount;
  const tensor = fullTensor(basis);
  const at = (i: number, j: number, k: number, l: number): number => tensor[((i * n + j) * n + k) * n + l]!;

  it('has the eightfold permutational symmetry in every shell quartet', () => {
    let worst = 0;
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++)
        for (let k = 0; k < n; k += 3)
          for (let l = 0; l < n; l += 2) {
            const v = at(i, j, k, l);
            for (const w of [at(j, i, k, l), at(i, j, l, k), at(k, l, i, j), at(l, k, j, i)]) worst = Math.max(worst, Math.abs(v - w));
          }
    expect(worst).toBeLessThan(1e-13);
  });

  it('builds J and K of two densities at once equal to the sums over all integrals (threshold 0)', () => {
    const next = random(7);
    const densities = [symmetricMatrix(n, next), symmetricMatrix(n, next)];
    const J = [new Float64Array(n * n), new Float64Array(n * n)];
    const K = [new Float64Array(n * n), new Float64Array(n * n)];
    const eri = createTwoElectronIntegrals(basis);
    eri.buildJK(densities, J, K, { threshold: 0 });
    for (let x = 0; x < 2; x++) {
      const d = densities[x]!;
      let worst = 0;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          let jij = 0;
          let kij = 0;
          for (let k = 0; k < n; k++) {
            for (let l = 0; l < n; l++) {
              jij += at(i, j, k, l) * d[k * n + l]!;
              kij += at(i, k, j, l) * d[k * n + l]!;
            }
          }
          worst = Math.max(worst, Math.abs(J[x]![i * n + j]! - jij), Math.abs(K[x]![i * n + j]! - kij));
        }
      }
      expect(worst).toBeLessThan(1e-12);
    }
    expect(eri.lastStatistics.quartetsSkipped).toBe(0);
  });

  it('screens by Schwarz bound times density: a far density skips quartets and stays within the threshold', () => {
    const eri = createTwoElectronIntegrals(basis);
    // A density only on the last hydrogen's functions, tiny elsewhere.
    const d = new Float64Array(n * n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) d[i * n + j] = basis.functionCenter[i] === 2 && basis.functionCenter[j] === 2 ? 0.3 : 1e-9;
    const exact = [new Float64Array(n * n)];
    const screened = [new Float64Array(n * n)];
    eri.buildJK([d], exact, null, { threshold: 0 });
    eri.buildJK([d], screened, null, { threshold: 1e-8 });
    expect(eri.lastStatistics.quartetsSkipped).toBeGreaterThan(0);
    let worst = 0;
    for (let k = 0; k < n * n; k++) worst = Math.max(worst, Math.abs(exact[0]![k]! - screened[0]![k]!));
    expect(worst).toBeLessThan(1e-6);
    for (let p = 0; p < basis.shells.length; p++) expect(eri.schwarz(p, 0)).toBe(eri.schwarz(0, p));
  });

  it('stops with CancelledError when the token turns, also part-way through', () => {
    const eri = createTwoElectronIntegrals(basis);
    const d = [symmetricMatrix(n, random(3))];
    expect(() => eri.buildJK(d, [new Float64Array(n * n)], null, { cancel: { cancelled: true } })).toThrow(CancelledError);
    let looks = 0;
    const token = {
      get cancelled() {
        looks++;
        return looks > 3;
      },
    };
    expect(() => eri.buildJK(d, [new Float64Array(n * n)], [new Float64Array(n * n)], { cancel: token, threshold: 0 })).toThrow(CancelledError);
    expect(looks).toBe(4);
  });
});

describe('effective core potentials', () => {
  const hi = [
    { symbol: 'I', x: 0, y: 0, z: 0 },
    { symbol: 'H', x: 0, y: 0, z: 3.04 },
  ];

  it('enter the core Hamiltonian (H − T − V is the ECP matrix, non-zero); the electron repulsion is unaffected', () => {
    const basis = buildMolecularBasis(hi, 'def2-SVP', 'spherical');
    expect(() => createTwoElectronIntegrals(basis)).not.toThrow();
    const h = coreHamiltonian(basis);
    const t = kineticMatrix(basis);
    const v = nuclearAttractionMatrix(basis);
    // The s-channel potential of I is strongly repulsive at the nucleus (def2 data): ⟨1s|U|1s⟩ > 0.
    expect(h[0]! - t[0]! - v[0]!).toBeGreaterThan(1);
    expect(overlapMatrix(basis)[0]).toBeCloseTo(1, 12); // unit norm, by construction
  });

  it('are refused, naming the element, when the potential has a channel the integrals do not handle', () => {
    const basis = buildMolecularBasis(hi, 'def2-SVP', 'spherical');
    const unsupported = { ...basis, ecps: basis.ecps.map((ecp) => ({ ...ecp, channels: [...ecp.channels, { l: 6, powers: Int32Array.of(2), exponents: Float64Array.of(1), coefficients: Float64Array.of(1) }] })) };
    expect(() => coreHamiltonian(unsupported)).toThrow(UnsupportedEcpError);
    expect(() => coreHamiltonian(unsupported)).toThrow(/I carries an effective core potential in def2-SVP/);
  });

  it('do not stop an all-electron basis of the same molecule', () => {
    const basis = buildMolecularBasis(hi, 'sto-3g', 'spherical');
    expect(basis.ecps).toEqual([]);
    expect(() => createTwoElectronIntegrals(basis)).not.toThrow();
  });
});

describe('stored integrals', () => {
  const basis = buildMolecularBasis(water, 'cc-pVDZ', 'spherical');
  const n = basis.functionCount;

  it('are kept by the first build when they fit, and later builds read them with the same J and K', () => {
    const direct = createTwoElectronIntegrals(basis, { storageLimitBytes: 0 });
    const stored = createTwoElectronIntegrals(basis);
    expect(direct.stored).toBe(false);
    expect(stored.storageBytes).toBeGreaterThan(8 * (n ** 4 / 8));
    const next = random(11);
    for (let build = 0; build < 3; build++) {
      const d = [symmetricMatrix(n, next), symmetricMatrix(n, next)];
      const [j1, k1, j2, k2] = [0, 1, 2, 3].map(() => [new Float64Array(n * n), new Float64Array(n * n)]);
      direct.buildJK(d, j1!, k1!);
      stored.buildJK(d, j2!, k2!);
      expect(stored.stored).toBe(true);
      if (build > 0) {
        expect(stored.lastStatistics.quartetsComputed).toBe(0);
        expect(stored.lastStatistics.quartetsRead).toBeGreaterThan(0);
      }
      for (let x = 0; x < 2; x++) {
        for (let k = 0; k < n * n; k++) {
          expect(Math.abs(j1![x]![k]! - j2![x]![k]!)).toBeLessThan(1e-11);
          expect(Math.abs(k1![x]![k]! - k2![x]![k]!)).toBeLessThan(1e-11);
        }
      }
    }
    expect(direct.lastStatistics.quartetsComputed).toBeGreaterThan(0);
    expect(direct.stored).toBe(false);
  });

  it('keep the dearest share when not all fit (semi-direct), with the same J and K and fewer quartets computed later', () => {
    const direct = createTwoElectronIntegrals(basis, { storageLimitBytes: 0 });
    const partial = createTwoElectronIntegrals(basis, { storageLimitBytes: 200_000 });
    expect(partial.storedFraction).toBeGreaterThan(0);
    expect(partial.storedFraction).toBeLessThan(1);
    expect(partial.storageBytes).toBeLessThanOrEqual(200_000);
    const next = random(13);
    for (let build = 0; build < 3; build++) {
      const d = [symmetricMatrix(n, next)];
      const [j1, k1, j2, k2] = [0, 1, 2, 3].map(() => [new Float64Array(n * n)]);
      direct.buildJK(d, j1!, k1!);
      partial.buildJK(d, j2!, k2!);
      if (build > 0) {
        expect(partial.lastStatistics.quartetsRead).toBeGreaterThan(0);
        expect(partial.lastStatistics.quartetsComputed).toBeGreaterThan(0);
        expect(partial.lastStatistics.quartetsComputed).toBeLessThan(direct.lastStatistics.quartetsComputed);
      }
      for (let k = 0; k < n * n; k++) {
        expect(Math.abs(j1![0]![k]! - j2![0]![k]!)).toBeLessThan(1e-11);
        expect(Math.abs(k1![0]![k]! - k2![0]![k]!)).toBeLessThan(1e-11);
      }
    }
  });

  it('are not used by a build whose threshold asks for more than they hold, nor kept half-way when cancelled', () => {
    const eri = createTwoElectronIntegrals(basis);
    const d = [symmetricMatrix(n, random(5))];
    let looks = 0;
    const token = {
      get cancelled() {
        return ++looks > 2;
      },
    };
    expect(() => eri.buildJK(d, [new Float64Array(n * n)], null, { cancel: token })).toThrow(CancelledError);
    expect(eri.stored).toBe(false);
    eri.buildJK(d, [new Float64Array(n * n)], null);
    expect(eri.stored).toBe(true);
    eri.buildJK(d, [new Float64Array(n * n)], null, { threshold: 0 });
    expect(eri.lastStatistics.quartetsComputed).toBeGreaterThan(0);
  });
});
