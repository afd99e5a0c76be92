/**
 * SCF against Debian's psi4 1.3.2 on psi4's own AO integrals (tests/fixtures/ao-integrals.psi4.json,
 * made by scripts/data/generate_ao_integrals_fixture.py: scf_type pk, convergence 1e-10), so that
 * these checks do not depend on Tessera's integral code; and Szabo & Ostlund's worked example.
 */
import { describe, expect, it } from 'vitest';
import { CancelledError } from '../../server/src/electronic/contracts';
import { unblockedSpace } from '../../server/src/electronic/scf/space';
import { adaptBasis, labelOrbitals, runScf, ScfInputError, solveScf, sumPerFragment, type ScfProblem, type ScfReference } from '../../server/src/electronic/scf';
import { basisFromFixture, decode, fixtureCase, loadCase, PSI4_FIXTURE } from './aoIntegralsFixture';

const TIGHT = { energyTolerance: 1e-10, gradientTolerance: 1e-8 };

describe('SCF energies against psi4 1.3.2 (same AO integrals)', () => {
  for (const raw of PSI4_FIXTURE.cases) {
    for (const [reference, expected] of Object.entries(raw.references ?? {})) {
      it(`${raw.name}, ${raw.basis} (${raw.kind}), ${reference.toUpperCase()}`, () => {
        const { problem } = loadCase(raw);
        const { result } = runScf(problem, { reference: reference as ScfReference, ...TIGHT });
        expect(result.converged).toBe(true);
        expect(Math.abs(result.energy - expected.energy)).toBeLessThan(1e-8);
        expect(result.nuclearRepulsion).toBeCloseTo(raw.nuclearRepulsion, 10);
        // Orbital energies (for ROHF in the canonicalisation with diagonal blocks ½(Fα + Fβ), which
        // psi4 uses too).
        result.orbitalEnergies.alpha.forEach((energy, k) => expect(Math.abs(energy - expected.alpha[k]!)).toBeLessThan(1e-6));
        result.orbitalEnergies.beta.forEach((energy, k) => expect(Math.abs(energy - expected.beta[k]!)).toBeLessThan(1e-6));
        result.charges.mulliken.forEach((charge, a) => expect(charge).toBeCloseTo(expected.mulliken[a]!, 6));
        // Löwdin charges depend on the scale of each function: psi4's cartesian d components are
        // not of unit norm (ours are), so only spherical and s/p-only bases compare.
        if (raw.kind === 'spherical' || !raw.shells.some((shell) => shell.l > 1)) result.charges.lowdin.forEach((charge, a) => expect(charge).toBeCloseTo(expected.lowdin[a]!, 6));
      });
    }
  }

  it('H2 in STO-3G at R = 1.4 bohr: E = −1.1167 hartree (Szabo & Ostlund, Modern Quantum Chemistry, §3.5.2)', () => {
    const { result } = runScf(loadCase(fixtureCase('H2 R=1.4 bohr')).problem);
    expect(result.energy).toBeCloseTo(-1.1167, 4);
    // Same source: ε1 = −0.578, ε2 = +0.670 hartree.
    expect(result.orbitalEnergies.alpha[0]).toBeCloseTo(-0.578, 3);
    expect(result.orbitalEnergies.alpha[1]).toBeCloseTo(0.670, 3);
    expect(result.irreps.alpha).toEqual(['Ag', 'B1u']);
  });
});

describe('symmetry', () => {
  it('basis functions up to g transform so that UᵀSU = S (psi4 overlaps, N2 in general orientation, cc-pVQZ)', () => {
    for (const kind of ['spherical', 'cartesian'] as const) {
      const raw = fixtureCase('dinitrogen, tilted (invented geometry)', kind);
      const basis = basisFromFixture(raw.geometry, raw.shells, raw.kind, raw.basis);
      const s = decode(raw.S);
      const n = basis.functionCount;
      const adaptation = adaptBasis(basis);
      expect(adaptation.group).toBe('D2h');
      for (const operation of adaptation.operations) {
        const u = operation.dense();
        const su = new Float64Array(n * n);
        for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) {
          const value = s[i * n + k]!;
          if (value === 0) continue;
          for (let j = 0; j < n; j++) su[i * n + j]! += value * u[k * n + j]!;
        }
        let deviation = 0;
        for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
          let sum = 0;
          for (let k = 0; k < n; k++) sum += u[k * n + i]! * su[k * n + j]!;
          deviation = Math.max(deviation, Math.abs(sum - s[i * n + j]!));
        }
        expect(deviation, `${kind} ${operation.name}`).toBeLessThan(1e-10);
      }
    }
  });

  it('water in STO-3G: occupied 1a1 2a1 1b2 3a1 1b1 (Szabo & Ostlund §3.6.2, water in the yz plane)', () => {
    const { result } = runScf(loadCase(fixtureCase('water (invented geometry)')).problem);
    expect(result.pointGroup).toBe('C2v');
    expect(result.symmetryBlocked).toBe(true);
    expect(result.irreps.alpha.slice(0, 5)).toEqual(['A1', 'A1', 'B2', 'A1', 'B1']);
    expect(result.homo).toBe(result.orbitalEnergies.alpha[4]);
    expect(result.lumo).toBe(result.orbitalEnergies.alpha[5]);
    expect(result.gap).toBeCloseTo(result.lumo! - result.homo!, 14);
  });

  it('labels the degenerate 2p set of neon computed without symmetry blocks: one each of b1u, b2u, b3u', () => {
    const { problem } = loadCase(fixtureCase('neon atom'));
    const space = unblockedSpace(problem.overlap, problem.basis.functionCount);
    const wavefunction = solveScf(problem, space, TIGHT);
    const adaptation = adaptBasis(problem.basis);
    const labels = labelOrbitals(adaptation, problem.overlap, wavefunction.coefficients.alpha, wavefunction.orbitalEnergies.alpha, wavefunction.occupations.alpha);
    expect(labels.slice(0, 2)).toEqual(['Ag', 'Ag']);
    expect([...labels.slice(2, 5)].sort()).toEqual(['B1u', 'B2u', 'B3u']);
    // Blocked and unblocked runs agree on every label (as multisets per energy level).
    const { result } = runScf(problem, TIGHT);
    expect(result.symmetryBlocked).toBe(true);
    expect([...result.irreps.alpha].sort()).toEqual([...labels].sort());
  });

  it('integrals 1e-6 away from C2v run without symmetry blocks and still label every orbital', () => {
    const raw = fixtureCase('water, tilted (invented geometry)', 'cartesian');
    const { problem } = loadCase(raw);
    const broken = problem.coreHamiltonian.slice();
    const n = problem.basis.functionCount;
    broken[n * n - 1] = broken[n * n - 1]! + 1e-6; // the last function of one H atom only: the two H differ
    const { result } = runScf({ ...problem, coreHamiltonian: broken }, TIGHT);
    expect(result.symmetryBlocked).toBe(false);
    expect(result.pointGroup).toBe('C2v');
    const symmetric = runScf(problem, TIGHT).result;
    expect(result.irreps.alpha.slice(0, 5)).toEqual(symmetric.irreps.alpha.slice(0, 5));
    expect(result.energy).toBeCloseTo(symmetric.energy, 5);
  });
});

describe('convergence, progress and bad input', () => {
  const water = () => loadCase(fixtureCase('water, tilted (invented geometry)', 'cartesian')).problem;

  it('reports progress every iteration and stops with converged: false at the iteration cap', () => {
    const seen: number[] = [];
    const { result } = runScf(water(), { maxIterations: 3, onProgress: (progress) => seen.push(progress.iteration) });
    expect(seen).toEqual([1, 2, 3]);
    expect(result.converged).toBe(false);
    expect(result.iterations).toBe(3);
    expect(Number.isFinite(result.energy)).toBe(true);
    expect(result.convergence.gradient).toBeGreaterThan(result.convergence.gradientTolerance);
    expect(Math.abs(result.convergence.energyChange!)).toBeGreaterThan(0);
    const converged = runScf(water()).result;
    expect(Math.abs(converged.convergence.energyChange!)).toBeLessThan(converged.convergence.energyTolerance);
    expect(runScf(water(), { maxIterations: 1 }).result.convergence.energyChange).toBeNull();
  });

  it('throws CancelledError when cancelled mid-run', () => {
    const token = { cancelled: false };
    expect(() => runScf(water(), { cancel: token, onProgress: (progress) => (token.cancelled = progress.iteration >= 2) })).toThrow(CancelledError);
  });

  it('refuses atoms on top of each other, impossible multiplicities and RHF for open shells', () => {
    const problem = water();
    const centers = problem.basis.centers.map((center, k) => (k === 2 ? { ...problem.basis.centers[1]!, x: problem.basis.centers[1]!.x + 0.01 } : center));
    const clash: ScfProblem = { ...problem, basis: { ...problem.basis, centers } };
    expect(() => runScf(clash)).toThrow(expect.objectContaining({ code: 'atoms-coincide' }) as Error);
    expect(() => runScf({ ...problem, multiplicity: 2 })).toThrow(expect.objectContaining({ code: 'invalid-multiplicity' }) as Error);
    expect(() => runScf({ ...problem, multiplicity: 0 })).toThrow(ScfInputError);
    expect(() => runScf({ ...problem, charge: 1, multiplicity: 2 }, { reference: 'rhf' })).toThrow(expect.objectContaining({ code: 'reference-mismatch' }) as Error);
    expect(() => runScf({ ...problem, charge: 0.5 })).toThrow(expect.objectContaining({ code: 'invalid-electron-count' }) as Error);
  });

  it('drops an exact linear dependency (a duplicated function) and reports it; the energy is unchanged', () => {
    const problem = loadCase(fixtureCase('water (invented geometry)')).problem;
    const n = problem.basis.functionCount;
    const map = [...Array(n).keys(), 0]; // function n is a copy of function 0 (O 1s)
    const m = n + 1;
    const pick = (a: Float64Array) => Float64Array.from({ length: m * m }, (_, k) => a[map[Math.floor(k / m)]! * n + map[k % m]!]!);
    const tensor = (problem.eri as unknown as { tensor: Float64Array }).tensor;
    const shells = [...problem.basis.shells, { ...problem.basis.shells[0]!, offset: n }];
    const basis = { ...problem.basis, shells, functionCount: m, functionCenter: Int32Array.from(map, (f) => problem.basis.functionCenter[f]!), functionL: Int32Array.from(map, (f) => problem.basis.functionL[f]!) };
    const big = new Float64Array(m ** 4);
    for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) for (let k = 0; k < m; k++) for (let l = 0; l < m; l++) big[((i * m + j) * m + k) * m + l] = tensor[((map[i]! * n + map[j]!) * n + map[k]!) * n + map[l]!]!;
    const eri = { basis, tensor: big, buildJK: (problem.eri as unknown as { buildJK: Function }).buildJK, shellQuartet: () => undefined, schwarz: () => 1 } as unknown as ScfProblem['eri'];
    const duplicated: ScfProblem = { basis, overlap: pick(problem.overlap), coreHamiltonian: pick(problem.coreHamiltonian), eri, charge: 0, multiplicity: 1 };
    const { result } = runScf(duplicated, { symmetry: null, ...TIGHT });
    expect(result.linearDependencies.dropped).toBe(1);
    expect(result.orbitalCount).toBe(n);
    expect(result.energy).toBeCloseTo(runScf(problem, TIGHT).result.energy, 9);
  });

  it('sums atomic charges per fragment', () => {
    const { result } = runScf(water());
    const [oxygen, hydrogens] = sumPerFragment(result.charges.mulliken, [[0], [1, 2]]);
    expect(oxygen! + hydrogens!).toBeCloseTo(0, 10);
    expect(() => sumPerFragment(result.charges.mulliken, [[5]])).toThrow(RangeError);
  });
});
