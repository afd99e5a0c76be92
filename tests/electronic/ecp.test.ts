/**
 * Effective-core-potential integrals (server/src/electronic/integrals/ecp/):
 * - whole ECP matrices against psi4 1.3.2's MintsHelper.ao_ecp() (tests/fixtures/ecp-integrals.psi4.json,
 *   made by scripts/data/generate_ecp_fixture.py; Rb, Ag, I, Xe in def2-SVP/TZVP/QZVP, spherical and
 *   cartesian, the ECP atom at the origin and off it) to 1e-9, and the nuclear attraction psi4 builds
 *   with the ECP cores removed;
 * - the blocks where psi4 1.3.2 is not accurate enough, and a whole 6th-row (Au) matrix, against
 *   independent quadratures (tests/fixtures/ecp-integrals.independent.json, scripts/data/ecp_reference.py);
 * - the building blocks: scaled Bessel functions against mpmath, the Gauss–Kronrod rule, the
 *   unit-sphere harmonics; screening, cancellation, the core Hamiltonian, and the refusals.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildMolecularBasis } from '../../server/src/electronic/basis';
import { cartesianCount, cartesianExponents } from '../../server/src/electronic/basis/cartesian';
import { CancelledError, type FunctionKind, type MolecularBasis } from '../../server/src/electronic/contracts';
import {
  coreHamiltonian,
  createTwoElectronIntegrals,
  ecpMatrix,
  EcpIntegrals,
  kineticMatrix,
  nuclearAttractionMatrix,
  UnsupportedEcpError,
} from '../../server/src/electronic/integrals';
import { scaledBesselI } from '../../server/src/electronic/integrals/ecp/bessel';
import { sphereMonomialIntegral, unitSphereHarmonics } from '../../server/src/electronic/integrals/ecp/angular';
import { AdaptiveQuadrature, GAUSS_WEIGHTS, KRONROD_NODES, KRONROD_WEIGHTS } from '../../server/src/electronic/integrals/ecp/quadrature';

interface Atom {
  symbol: string;
  x: number;
  y: number;
  z: number;
}
interface Psi4Case {
  name: string;
  basis: string;
  kind: FunctionKind;
  geometry: Atom[];
  nbf: number;
  ecpCoreElectrons: number;
  maxL: number;
  ecp: string;
  potential: string;
}
interface IndependentCase {
  name: string;
  basis: string;
  kind: 'cartesian';
  ecpAtom: number;
  geometry: Atom[];
  blocks: { shells: [number, number]; method: string; values: number[][] }[];
  /** Channels [l, powers, exponents, coefficients] added to the ECP atom's potential (beyond def2). */
  extraChannels?: [number, number[], number[], number[]][];
}

const FIXTURES = join(__dirname, '..', 'fixtures');
const PSI4 = (JSON.parse(readFileSync(join(FIXTURES, 'ecp-integrals.psi4.json'), 'utf8')) as { cases: Psi4Case[] }).cases;
const INDEPENDENT = (JSON.parse(readFileSync(join(FIXTURES, 'ecp-integrals.independent.json'), 'utf8')) as { cases: IndependentCase[] }).cases;

function decode(text: string): Float64Array {
  const bytes = Buffer.from(text, 'base64');
  return new Float64Array(bytes.buffer, bytes.byteOffset, bytes.length / 8);
}

const bases = new Map<string, MolecularBasis>();
function basisOf(geometry: Atom[], name: string, kind: FunctionKind): MolecularBasis {
  const key = `${JSON.stringify(geometry)}|${name}|${kind}`;
  let basis = bases.get(key);
  if (!basis) {
    basis = buildMolecularBasis(geometry, name, kind);
    bases.set(key, basis);
  }
  return basis;
}

describe('scaled modified spherical Bessel functions K_λ(z) = exp(−z) i_λ(z)', () => {
  // mpmath 1.2.1 (Debian) at 40 digits: besseli(λ + 1/2, z) · √(π/(2z)) · exp(−z), for λ = 0, 1, 4, 8, 12.
  const table: [number, number[]][] = [
    [0.001, [0.99900066633346662, 0.00033300019991114285, 1.0571434341190365e-15, 2.8990632493805748e-32, 1.2636213258257789e-49]],
    [0.5, [0.63212055882855768, 0.10363832351432696, 4.057250544293858e-5, 6.9208760843996691e-11, 1.8817171627822844e-17]],
    [3, [0.16625354130388894, 0.11166194492814808, 0.0063477107823875771, 1.1981424798747193e-5, 3.9499820212277059e-9]],
    [15.9, [0.031446540880502658, 0.029468771013805351, 0.0164965359282537, 0.0032147733038210802, 0.00025474991986336405]],
    [16.1, [0.03105590062111769, 0.029126962694340838, 0.016425126637073276, 0.0032645266260591335, 0.0002661335357377874]],
    [40, [0.0125, 0.0121875, 0.0097065673828125, 0.0050418876228809357, 0.001763527461861472]],
    [300, [0.0016666666666666667, 0.0016611111111111111, 0.0016119379845679012, 0.0014779160667768879, 0.0012845760650077504]],
  ];
  const orders = [0, 1, 4, 8, 12];
  it.each(table)('z = %s agrees with mpmath to 1e-13 relative, for λ up to 12', (z, expected) => {
    const out = new Float64Array(13);
    scaledBesselI(z, 12, out);
    orders.forEach((l, k) => expect(Math.abs(out[l]! - expected[k]!) / expected[k]!, `λ = ${l}`).toBeLessThan(1e-13));
  });

  it('gives K_0(0) = 1 and K_λ(0) = 0 for λ > 0 (by definition)', () => {
    const out = new Float64Array(5);
    scaledBesselI(0, 4, out);
    expect(Array.from(out)).toEqual([1, 0, 0, 0, 0]);
  });
});

describe('Gauss–Kronrod 7–15 rule (QUADPACK QK15)', () => {
  it('integrates x^k over [−1, 1] exactly up to degree 22 (K15) and 13 (G7), by construction', () => {
    for (let k = 0; k <= 22; k++) {
      const exact = k % 2 === 1 ? 0 : 2 / (k + 1);
      let kronrod = 0;
      let gauss = 0;
      for (let i = 0; i < 15; i++) {
        kronrod += KRONROD_WEIGHTS[i]! * KRONROD_NODES[i]! ** k;
        gauss += GAUSS_WEIGHTS[i]! * KRONROD_NODES[i]! ** k;
      }
      expect(Math.abs(kronrod - exact), `K15, degree ${k}`).toBeLessThan(1e-15);
      if (k <= 13) expect(Math.abs(gauss - exact), `G7, degree ${k}`).toBeLessThan(1e-15);
    }
  });

  it('integrates a narrow Gaussian whose peak and flanks are seeded in short panels to 1e-16 (∫ exp(−10⁴(x−1)²) = √π/100, by definition)', () => {
    const quadrature = new AdaptiveQuadrature();
    const result = new Float64Array(1);
    const breakpoints = Float64Array.of(0, 0.92, 0.96, 1, 1.04, 1.08, 4);
    quadrature.integrate({ evaluate: (x, out, offset) => void (out[offset] = Math.exp(-1e4 * (x - 1) ** 2)) }, 1, breakpoints, 7, 1e-14, result);
    expect(Math.abs(result[0]! - Math.sqrt(Math.PI) / 100)).toBeLessThan(1e-16);
  });
});

describe('real spherical harmonics on the unit sphere', () => {
  it('are orthonormal up to l = 8 (by definition)', () => {
    for (let l = 0; l <= 8; l++) {
      const y = unitSphereHarmonics(l);
      const nc = cartesianCount(l);
      const exps = cartesianExponents(l);
      for (let m = 0; m < 2 * l + 1; m++) {
        for (let n = 0; n <= m; n++) {
          let overlap = 0;
          for (let p = 0; p < nc; p++) {
            for (let q = 0; q < nc; q++) {
              overlap += y[m * nc + p]! * y[n * nc + q]! * sphereMonomialIntegral(exps[3 * p]! + exps[3 * q]!, exps[3 * p + 1]! + exps[3 * q + 1]!, exps[3 * p + 2]! + exps[3 * q + 2]!);
            }
          }
          expect(Math.abs(overlap - (m === n ? 1 : 0)), `l = ${l}, ${m}, ${n}`).toBeLessThan(1e-13);
        }
      }
    }
  });
});

/**
 * Tolerances against psi4: 1e-9 wherever a function sits on an ECP atom; 5e-8 between two functions
 * of other atoms, where psi4 1.3.2's own radial quadrature is off by up to 3e-8 for tight or
 * high-l functions (IF/def2-QZVP, XeF2/def2-SVP; those blocks are checked to 1e-10 against the
 * independent quadrature below).
 */
const ON_ECP_ATOM = 1e-9;
const BETWEEN_OTHER_ATOMS = 5e-8;

describe('ECP matrices against psi4 1.3.2 (tests/fixtures/ecp-integrals.psi4.json)', () => {
  it('cover Rb, Ag, I and Xe, the ECP atom at the origin and off it, spherical and cartesian, basis l up to 4', () => {
    const symbols = new Set(PSI4.flatMap((c) => c.geometry.map((atom) => atom.symbol)));
    for (const symbol of ['Rb', 'Ag', 'I', 'Xe']) expect(symbols.has(symbol), symbol).toBe(true);
    expect(PSI4.some((c) => c.name.includes('at the origin'))).toBe(true);
    expect(PSI4.some((c) => c.name.includes('off the origin'))).toBe(true);
    expect(new Set(PSI4.map((c) => c.kind)).size).toBe(2);
    expect(Math.max(...PSI4.map((c) => c.maxL))).toBe(4); // g functions of def2-QZVP (psi4 fixture)
  });

  describe.each(PSI4.map((c) => [`${c.name}, ${c.basis} (${c.kind})`, c] as const))('%s', (_title, c) => {
    it('agrees to 1e-9 in every block with a function on an ECP atom, to 5e-8 elsewhere', () => {
      const basis = basisOf(c.geometry, c.basis, c.kind);
      expect(basis.functionCount).toBe(c.nbf);
      const ours = ecpMatrix(basis);
      const theirs = decode(c.ecp);
      const ecpAtoms = new Set(basis.ecps.map((ecp) => ecp.center));
      const n = basis.functionCount;
      const worst = { [ON_ECP_ATOM]: { value: 0, where: '' }, [BETWEEN_OTHER_ATOMS]: { value: 0, where: '' } };
      basis.shells.forEach((a, p) => {
        basis.shells.forEach((b, q) => {
          const tolerance = ecpAtoms.has(a.center) || ecpAtoms.has(b.center) ? ON_ECP_ATOM : BETWEEN_OTHER_ATOMS;
          for (let i = 0; i < a.size; i++) {
            for (let j = 0; j < b.size; j++) {
              const k = (a.offset + i) * n + b.offset + j;
              const difference = Math.abs(ours[k]! - theirs[k]!);
              if (difference > worst[tolerance].value) worst[tolerance] = { value: difference, where: `shells ${p}, ${q}` };
            }
          }
        });
      });
      expect(worst[ON_ECP_ATOM].value, worst[ON_ECP_ATOM].where).toBeLessThan(ON_ECP_ATOM);
      expect(worst[BETWEEN_OTHER_ATOMS].value, worst[BETWEEN_OTHER_ATOMS].where).toBeLessThan(BETWEEN_OTHER_ATOMS);
    });

    it('has the nuclear attraction of the charges less the ECP cores to 1e-10', () => {
      const basis = basisOf(c.geometry, c.basis, c.kind);
      expect(basis.ecps.reduce((sum, ecp) => sum + ecp.coreElectrons, 0)).toBe(c.ecpCoreElectrons);
      const ours = nuclearAttractionMatrix(basis);
      const theirs = decode(c.potential);
      let worst = 0;
      for (let k = 0; k < ours.length; k++) worst = Math.max(worst, Math.abs(ours[k]! - theirs[k]!));
      expect(worst).toBeLessThan(1e-10);
    });
  });
});

describe('ECP blocks against independent quadrature (tests/fixtures/ecp-integrals.independent.json)', () => {
  it('include a whole 6th-row (Au) matrix', () => {
    // AuH in def2-SVP has 12 + 3 shells: 120 shell pairs (fixture, by construction)
    expect(INDEPENDENT.some((c) => c.geometry.some((atom) => atom.symbol === 'Au') && c.blocks.length === 120)).toBe(true);
  });

  it('include semi-local f and g projectors and powers r^-2, r^-1 that def2 data never has', () => {
    const extra = INDEPENDENT.flatMap((c) => c.extraChannels ?? []);
    expect(extra.map((channel) => channel[0]).sort()).toEqual([3, 4]); // fixture: EXTRA_CHANNELS of the generator
    expect(new Set(extra.flatMap((channel) => channel[1]))).toEqual(new Set([0, 1, 2])); // fixture
  });

  describe.each(INDEPENDENT.map((c) => [`${c.name}, ${c.basis}`, c] as const))('%s', (_title, c) => {
    it('agrees to 1e-10 in every listed cartesian block', () => {
      const plain = basisOf(c.geometry, c.basis, 'cartesian');
      const basis: MolecularBasis = !c.extraChannels
        ? plain
        : {
            ...plain,
            ecps: plain.ecps.map((ecp) =>
              ecp.center !== c.ecpAtom
                ? ecp
                : {
                    ...ecp,
                    channels: [
                      ...ecp.channels,
                      ...c.extraChannels!.map(([l, powers, exponents, coefficients]) => ({ l, powers: Int32Array.from(powers), exponents: Float64Array.from(exponents), coefficients: Float64Array.from(coefficients) })),
                    ],
                  },
            ),
          };
      const engine = new EcpIntegrals(basis);
      let worst = 0;
      let where = '';
      for (const block of c.blocks) {
        const [p, q] = block.shells;
        const a = basis.shells[p]!;
        const b = basis.shells[q]!;
        const out = new Float64Array(a.size * b.size);
        engine.block(p, q, out);
        for (let i = 0; i < a.size; i++) {
          for (let j = 0; j < b.size; j++) {
            const difference = Math.abs(out[i * b.size + j]! - block.values[i]![j]!);
            if (difference > worst) {
              worst = difference;
              where = `shells ${p}, ${q} (${block.method})`;
            }
          }
        }
      }
      expect(worst, where).toBeLessThan(1e-10);
    });
  });
});

describe('ECP matrix assembly', () => {
  const iodide = [
    { symbol: 'I', x: 0.3, y: -0.2, z: 0.5 },
    { symbol: 'H', x: 0.7, y: -0.9, z: 3.5 },
  ];

  it('is symmetric, and the screened matrix equals the unscreened one to 1e-13', () => {
    const basis = buildMolecularBasis(iodide, 'def2-svp', 'spherical');
    const engine = new EcpIntegrals(basis);
    const screened = engine.matrix();
    const full = engine.matrix({ threshold: 0 });
    const n = basis.functionCount;
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) expect(screened[i * n + j]).toBe(screened[j * n + i]);
    let worst = 0;
    for (let k = 0; k < full.length; k++) worst = Math.max(worst, Math.abs(full[k]! - screened[k]!));
    expect(worst).toBeLessThan(1e-13);
  });

  it('screens the shell pairs of atoms far from the ECP centre, and they are zero to 1e-14 unscreened', () => {
    const far = [...iodide, { symbol: 'H', x: 0, y: 0, z: 30 }, { symbol: 'H', x: 0, y: 1.4, z: 30 }];
    const basis = buildMolecularBasis(far, 'def2-svp', 'spherical');
    const engine = new EcpIntegrals(basis);
    const screened = engine.matrix();
    expect(engine.lastStatistics.pairsScreened).toBeGreaterThan(0);
    const full = engine.matrix({ threshold: 0 });
    let worst = 0;
    for (let k = 0; k < full.length; k++) worst = Math.max(worst, Math.abs(full[k]! - screened[k]!));
    expect(worst).toBeLessThan(1e-14);
  });

  it('is zero for a basis without ECP centres and part of the core Hamiltonian otherwise', () => {
    const water = buildMolecularBasis([{ symbol: 'O', x: 0, y: 0, z: 0 }, { symbol: 'H', x: 0, y: 1.43, z: 1.1 }], 'def2-svp', 'spherical');
    expect(ecpMatrix(water).every((value) => value === 0)).toBe(true);
    const basis = buildMolecularBasis(iodide, 'def2-svp', 'spherical');
    const h = coreHamiltonian(basis);
    const t = kineticMatrix(basis);
    const v = nuclearAttractionMatrix(basis);
    const u = ecpMatrix(basis);
    let worst = 0;
    for (let k = 0; k < h.length; k++) worst = Math.max(worst, Math.abs(h[k]! - (t[k]! + v[k]! + u[k]!)));
    expect(worst).toBeLessThan(1e-12);
    expect(() => createTwoElectronIntegrals(basis)).not.toThrow();
  });

  it('stops with CancelledError when cancelled', () => {
    const basis = buildMolecularBasis(iodide, 'def2-svp', 'spherical');
    expect(() => ecpMatrix(basis, { cancel: { cancelled: true } })).toThrow(CancelledError);
  });
});

describe('potentials the ECP integrals refuse', () => {
  const basis = buildMolecularBasis([{ symbol: 'I', x: 0, y: 0, z: 0 }, { symbol: 'H', x: 0, y: 0, z: 3 }], 'def2-svp', 'spherical');
  const withChannel = (channel: { l: number; powers: number[]; exponents: number[]; coefficients: number[] }): MolecularBasis => ({
    ...basis,
    ecps: basis.ecps.map((ecp) => ({
      ...ecp,
      channels: [...ecp.channels, { l: channel.l, powers: Int32Array.from(channel.powers), exponents: Float64Array.from(channel.exponents), coefficients: Float64Array.from(channel.coefficients) }],
    })),
  });

  it('refuses a semi-local channel above g, naming the element, the basis and the channel', () => {
    const high = withChannel({ l: 5, powers: [2], exponents: [1], coefficients: [1] });
    expect(() => ecpMatrix(high)).toThrow(UnsupportedEcpError);
    expect(() => coreHamiltonian(high)).toThrow(/^I carries an effective core potential in def2-svp .*l = 5/);
  });

  it('refuses a local term other than a Gaussian (r^(n−2) with n ≠ 2)', () => {
    expect(() => ecpMatrix(withChannel({ l: -1, powers: [1], exponents: [1], coefficients: [1] }))).toThrow(/I carries .*local term r\^-1/);
  });
});
