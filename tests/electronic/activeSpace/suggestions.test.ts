/**
 * The two suggestions against numpy on psi4 1.3.2 matrices (tests/fixtures/active-space.psi4.json,
 * made by scripts/data/generate_active_space_fixture.py): the atomic-valence projection (AVAS,
 * Sayfutyarova et al., J. Chem. Theory Comput. 13, 4063 (2017)) — projection eigenvalues, active
 * counts at the threshold 0.2 and the Fock eigenvalues of the active blocks — and the MP2 natural
 * occupations with the count inside the window 0.02–1.98 (common practice).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ActiveSelectionError, atomicProjectionSelection, naturalOccupationSelection, type ShellTarget } from '../../../server/src/electronic/activeSpace';
import { mp2, naturalOrbitalIrreps } from '../../../server/src/electronic/correlation';
import { fixtureCase, meanFieldOf } from './scfFixture';

interface ProjectionCase {
  label: string;
  shells: [number, number, number | null][];
  functions: number;
  occupiedProjections: number[];
  virtualProjections: number[];
  activeOccupied: number;
  activeVirtual: number;
  singlyOccupied: number;
  activeOccupiedEnergies: number[];
  activeVirtualEnergies: number[];
}
interface ActiveSpaceCase {
  name: string;
  basis: string;
  reference: string;
  threshold: number;
  alpha: number;
  beta: number;
  projections: ProjectionCase[];
  mp2?: { correlationEnergy: number; naturalOccupations: number[]; window: [number, number]; inside: number; above: number };
}

const FIXTURE = (JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'active-space.psi4.json'), 'utf8')) as { cases: ActiveSpaceCase[] }).cases;

const sorted = (values: readonly number[]) => [...values].sort((a, b) => a - b);

describe('atomic-valence projection (AVAS) against numpy on psi4 1.3.2 (fixture)', () => {
  const rows = FIXTURE.flatMap((c) => c.projections.map((p) => ({ title: `${c.name} ${c.basis} ${c.reference.toUpperCase()}: ${p.label}`, c, p })));
  it.each(rows)('$title', ({ c, p }) => {
    const { reference } = meanFieldOf(fixtureCase(c.name, c.basis, c.reference));
    const targets: ShellTarget[] = p.shells.map(([center, l, n]) => ({ center, l, n }));
    const selection = atomicProjectionSelection(reference, targets, { threshold: c.threshold });
    const occupied = selection.details.filter((d) => d.occupation === 2);
    const virtual = selection.details.filter((d) => d.occupation === 0);
    expect(occupied).toHaveLength(p.activeOccupied);
    expect(virtual).toHaveLength(p.activeVirtual);
    expect(selection.details.filter((d) => d.occupation === 1)).toHaveLength(p.singlyOccupied);
    expect(selection.electrons).toEqual({ alpha: p.activeOccupied + p.singlyOccupied, beta: p.activeOccupied });
    // Fock eigenvalues within each active block (invariant to rotations inside it).
    sorted(occupied.map((d) => d.energy!)).forEach((e, k) => expect(Math.abs(e - p.activeOccupiedEnergies[k]!)).toBeLessThan(2e-5));
    sorted(virtual.map((d) => d.energy!)).forEach((e, k) => expect(Math.abs(e - p.activeVirtualEnergies[k]!)).toBeLessThan(2e-5));
    // The projection of each active block's orbitals adds up to the sum of its eigenvalues above the threshold.
    const sum = (values: number[]) => values.reduce((a, b) => a + b, 0);
    expect(Math.abs(sum(occupied.map((d) => d.projection!)) - sum(p.occupiedProjections.filter((s) => s > c.threshold)))).toBeLessThan(1e-6);
    expect(Math.abs(sum(virtual.map((d) => d.projection!)) - sum(p.virtualProjections.filter((s) => s > c.threshold)))).toBeLessThan(1e-6);
    // Core and active orbitals stay orthonormal and the core holds the rest of the electrons.
    expect(selection.core.length * 2 + selection.electrons.alpha + selection.electrons.beta).toBe(c.alpha + c.beta);
  });

  it('the orbitals it hands on are orthonormal (by construction of the rotations; formaldehyde def2-SVP, fixture geometry)', () => {
    const { reference } = meanFieldOf(fixtureCase('formaldehyde', 'def2-svp', 'rhf'));
    const selection = atomicProjectionSelection(reference, [{ center: 0, l: 1, n: 2 }, { center: 1, l: 1, n: 2 }]);
    const { functionCount: N, orbitalCount: M, coefficients: C } = selection.orbitals;
    let worst = 0;
    for (let p = 0; p < M; p += 3) for (let q = 0; q <= p; q++) {
      let sum = 0;
      for (let mu = 0; mu < N; mu++) for (let nu = 0; nu < N; nu++) sum += C[mu * M + p]! * reference.overlap[mu * N + nu]! * C[nu * M + q]!;
      worst = Math.max(worst, Math.abs(sum - (p === q ? 1 : 0)));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('formaldehyde C 2p + O 2p: the π and π* orbitals are active, labelled B1 (from memory: the out-of-plane π system of a C2v carbonyl in the yz plane is b1)', () => {
    const { reference } = meanFieldOf(fixtureCase('formaldehyde', 'def2-svp', 'rhf'));
    const selection = atomicProjectionSelection(reference, [{ center: 0, l: 1, n: 2 }, { center: 1, l: 1, n: 2 }]);
    const b1 = selection.details.filter((d) => d.irrep === 'B1');
    expect(b1.filter((d) => d.occupation === 2).length).toBeGreaterThanOrEqual(1);
    expect(b1.filter((d) => d.occupation === 0).length).toBeGreaterThanOrEqual(1);
  });

  it('fitted to 4 orbitals keeps those with the largest projections (formaldehyde, fixture: 0.993 virtual, 0.982 0.971 0.964 occupied)', () => {
    const { reference } = meanFieldOf(fixtureCase('formaldehyde', 'def2-svp', 'rhf'));
    const p = FIXTURE.find((c) => c.name === 'formaldehyde')!.projections[0]!;
    const selection = atomicProjectionSelection(reference, [{ center: 0, l: 1, n: 2 }, { center: 1, l: 1, n: 2 }], { maxOrbitals: 4 });
    expect(selection.active).toHaveLength(4);
    const expected = sorted([...p.occupiedProjections, ...p.virtualProjections]).reverse().slice(0, 4);
    const occupiedKept = expected.filter((s) => p.occupiedProjections.includes(s)).length;
    expect(selection.electrons.alpha).toBe(occupiedKept);
    expect(selection.notes.join(' ')).toMatch(/Fitted to 4 orbitals/);
  });

  it('names the shells an atom has when a shell is missing (by definition of STO-3G: oxygen has 1s 2s 2p)', () => {
    const { reference } = meanFieldOf(fixtureCase('water', 'cc-pvdz', 'rhf'));
    expect(() => atomicProjectionSelection(reference, [{ center: 0, l: 2, n: 3 }])).toThrow(/O \(atom 1\) has no 3d shell .* it has 1s 2s 2p/);
    expect(() => atomicProjectionSelection(reference, [{ center: 7, l: 1, n: null }])).toThrow(ActiveSelectionError);
  });
});

describe('MP2 natural occupations against numpy on psi4 1.3.2 (fixture)', () => {
  const rows = FIXTURE.filter((c) => c.mp2).map((c) => ({ title: `${c.name} ${c.basis}`, c }));
  it.each(rows)('$title: occupations, and the orbitals inside 0.02–1.98 (common practice) are active', ({ c }) => {
    const entry = fixtureCase(c.name, c.basis, c.reference);
    const { reference, outcome, problem } = meanFieldOf(entry);
    const result = mp2(outcome.wavefunction, problem.eri);
    const reference2 = c.mp2!;
    expect(Math.abs(result.result.correlationEnergy - reference2.correlationEnergy)).toBeLessThan(1e-6);
    result.result.naturalOccupations.forEach((n, k) => expect(Math.abs(n - reference2.naturalOccupations[k]!)).toBeLessThan(1e-6));
    const irreps = naturalOrbitalIrreps(result, problem.basis, problem.overlap);
    const selection = naturalOccupationSelection(reference, result, { irreps });
    expect(selection.active).toHaveLength(reference2.inside);
    expect(selection.core).toHaveLength(reference2.above);
    expect(selection.electrons.alpha).toBe(c.alpha - reference2.above);
    for (const orbital of selection.details) {
      expect(orbital.energy).toBeNull();
      expect(orbital.occupation).toBeGreaterThanOrEqual(0.02);
      expect(orbital.occupation).toBeLessThanOrEqual(1.98);
    }
  });

  it('fitted to a limit, drops the occupations nearest 0 or 2 first (water cc-pVDZ, fixture occupations)', () => {
    const c = FIXTURE.find((x) => x.name === 'water')!;
    const { reference, outcome, problem } = meanFieldOf(fixtureCase('water', 'cc-pvdz', 'rhf'));
    const result = mp2(outcome.wavefunction, problem.eri);
    const selection = naturalOccupationSelection(reference, result, { maxOrbitals: 3 });
    const inside = c.mp2!.naturalOccupations.filter((n) => n >= 0.02 && n <= 1.98);
    const kept = [...inside].sort((a, b) => Math.min(b, 2 - b) - Math.min(a, 2 - a)).slice(0, 3);
    expect(sorted(selection.details.map((d) => d.occupation)).map((n) => n.toFixed(5))).toEqual(sorted(kept).map((n) => n.toFixed(5)));
    expect(selection.core.length * 2 + selection.electrons.alpha + selection.electrons.beta).toBe(10);
  });

  it('a narrow window that holds nothing says so (by construction: water occupations are near 2 or 0)', () => {
    const { reference, outcome, problem } = meanFieldOf(fixtureCase('water', 'cc-pvdz', 'rhf'));
    const result = mp2(outcome.wavefunction, problem.eri);
    expect(() => naturalOccupationSelection(reference, result, { window: { low: 0.9, high: 1.1 } })).toThrow(/No MP2 natural occupation lies between 0.9 and 1.1/);
  });
});
