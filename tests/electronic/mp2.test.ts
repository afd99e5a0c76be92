/**
 * MP2 against Debian's psi4 1.3.2 on psi4's AO integrals (tests/fixtures/ao-integrals.psi4.json:
 * mp2_type conv, all electrons and frozen core), and the unrelaxed density against the
 * spin-orbital expressions evaluated here directly (Helgaker, Jørgensen & Olsen §14.7).
 */
import { describe, expect, it } from 'vitest';
import { frozenCoreOrbitals, mp2, Mp2InputError, naturalOrbitalIrreps } from '../../server/src/electronic/correlation';
import { runScf, type ScfReference } from '../../server/src/electronic/scf';
import { fixtureCase, loadCase, PSI4_FIXTURE } from './aoIntegralsFixture';

const TIGHT = { energyTolerance: 1e-10, gradientTolerance: 1e-9 };

describe('MP2 correlation energies against psi4 1.3.2 (same AO integrals)', () => {
  for (const raw of PSI4_FIXTURE.cases) {
    const expected = raw.references?.rhf;
    if (!expected?.mp2) continue;
    it(`${raw.name}, ${raw.basis} (${raw.kind})`, () => {
      const { problem } = loadCase(raw);
      const { wavefunction } = runScf(problem, TIGHT);
      const all = mp2(wavefunction, problem.eri);
      expect(Math.abs(all.result.correlationEnergy - expected.mp2!)).toBeLessThan(1e-8);
      const frozen = mp2(wavefunction, problem.eri, { frozenCore: true });
      expect(frozen.result.frozenCore).toBe(frozenCoreOrbitals(problem.basis));
      expect(Math.abs(frozen.result.correlationEnergy - expected.mp2FrozenCore!)).toBeLessThan(1e-8);
      // Natural occupations add up to the electrons, lie in [0, 2] and descend.
      const occupations = all.result.naturalOccupations;
      expect(occupations.reduce((sum, value) => sum + value, 0)).toBeCloseTo(wavefunction.electrons.alpha * 2, 10);
      occupations.forEach((value, k) => {
        expect(value).toBeGreaterThan(-1e-12);
        expect(value).toBeLessThan(2 + 1e-12);
        if (k > 0) expect(value).toBeLessThanOrEqual(occupations[k - 1]! + 1e-14);
      });
    });
  }
});

describe('MP2 density and batching', () => {
  const water = () => loadCase(fixtureCase('water (invented geometry)'));

  it('matches the spin-orbital unrelaxed density D_ij = δ_ij − ½Σ t_ik^ab t_jk^ab, D_ab = ½Σ t_ij^ac t_ij^bc', () => {
    const { problem } = water();
    const { wavefunction } = runScf(problem, TIGHT);
    const outcome = mp2(wavefunction, problem.eri);
    const n = problem.basis.functionCount;
    const m = wavefunction.orbitalEnergies.alpha.length;
    const c = wavefunction.coefficients.alpha;
    const tensor = (problem.eri as unknown as { tensor: Float64Array }).tensor;
    // Full MO integrals (pq|rs) by four quarter transformations.
    let current = tensor;
    for (let step = 0; step < 4; step++) {
      const next = new Float64Array(m ** 4);
      // Transform the first index and rotate it to the back: (pqrs) → (qrs p').
      const rest = m ** step * n ** (3 - step);
      for (let p = 0; p < m; p++) for (let x = 0; x < rest; x++) {
        let sum = 0;
        for (let mu = 0; mu < n; mu++) sum += c[mu * m + p]! * current[mu * rest + x]!;
        next[x * m + p] = sum;
      }
      current = next;
    }
    const mo = (p: number, q: number, r: number, s: number) => current[((p * m + q) * m + r) * m + s]!;
    const occ = wavefunction.electrons.alpha;
    const eps = wavefunction.orbitalEnergies.alpha;
    // Spin orbitals: 2p (α), 2p+1 (β).
    const spatial = (k: number) => k >> 1;
    const spin = (k: number) => k & 1;
    const antisym = (p: number, q: number, r: number, s: number) =>
      (spin(p) === spin(r) && spin(q) === spin(s) ? mo(spatial(p), spatial(r), spatial(q), spatial(s)) : 0) -
      (spin(p) === spin(s) && spin(q) === spin(r) ? mo(spatial(p), spatial(s), spatial(q), spatial(r)) : 0);
    const o2 = 2 * occ;
    const m2 = 2 * m;
    const amp = (i: number, j: number, a: number, b: number) => antisym(i, j, a, b) / (eps[spatial(i)]! + eps[spatial(j)]! - eps[spatial(a)]! - eps[spatial(b)]!);
    for (let i = 0; i < o2; i += 2) for (let j = 0; j < o2; j += 2) {
      let sum = 0;
      for (let k = 0; k < o2; k++) for (let a = o2; a < m2; a++) for (let b = o2; b < m2; b++) sum += amp(i, k, a, b) * amp(j, k, a, b);
      const expected = 2 * ((i === j ? 1 : 0) - 0.5 * sum);
      expect(outcome.density[spatial(i) * m + spatial(j)]).toBeCloseTo(expected, 12);
    }
    for (let a = o2; a < m2; a += 2) for (let b = o2; b < m2; b += 2) {
      let sum = 0;
      for (let i = 0; i < o2; i++) for (let j = 0; j < o2; j++) for (let cc = o2; cc < m2; cc++) sum += amp(i, j, a, cc) * amp(i, j, b, cc);
      expect(outcome.density[spatial(a) * m + spatial(b)]).toBeCloseTo(2 * 0.5 * sum, 12);
    }
  });

  it('gives the same energy and density with one occupied orbital per batch', () => {
    const { problem } = water();
    const { wavefunction } = runScf(problem, TIGHT);
    const whole = mp2(wavefunction, problem.eri);
    const batches: number[] = [];
    const small = mp2(wavefunction, problem.eri, { memoryBytes: 3000, onProgress: (progress) => batches.push(progress.done) });
    expect(whole.result.batches).toBe(1);
    expect(small.result.batchSize).toBe(1);
    expect(batches).toEqual([1, 2, 3, 4, 5]);
    expect(small.result.correlationEnergy).toBeCloseTo(whole.result.correlationEnergy, 13);
    small.density.forEach((value, k) => expect(value).toBeCloseTo(whole.density[k]!, 12));
    expect(() => mp2(wavefunction, problem.eri, { memoryBytes: 1000 })).toThrow(Mp2InputError);
  });

  it('labels the natural orbitals of water: as many per irrep as basis functions (A1 4, B1 1, B2 2 in STO-3G)', () => {
    const { problem } = water();
    const { wavefunction } = runScf(problem, TIGHT);
    const labels = naturalOrbitalIrreps(mp2(wavefunction, problem.eri), problem.basis, problem.overlap);
    // Functions per irrep of water in STO-3G, C2v, yz plane: psi4 1.3.2, tests/fixtures/irreps.psi4.json.
    expect({ A1: labels.filter((l) => l === 'A1').length, B1: labels.filter((l) => l === 'B1').length, B2: labels.filter((l) => l === 'B2').length }).toEqual({ A1: 4, B1: 1, B2: 2 });
  });

  it('refuses an open-shell reference and an impossible frozen core', () => {
    const raw = fixtureCase('hydroxyl radical (invented geometry)');
    const { problem } = loadCase(raw);
    const { wavefunction } = runScf(problem, { reference: 'uhf' as ScfReference });
    expect(() => mp2(wavefunction, problem.eri)).toThrow(Mp2InputError);
    const closed = water();
    const scf = runScf(closed.problem).wavefunction;
    expect(() => mp2(scf, closed.problem.eri, { frozenCore: 6 })).toThrow(Mp2InputError);
  });
});
