/**
 * Figures that read the irreps and reference occupation of the active orbitals (tapering, Pauli
 * terms, screened UCCSD parameters) are built on the computed orbitals once the fragment's active
 * space is computed, and say which source they used. Water cc-pVDZ with `active 8e 8o`: the
 * counted rule apportions the eight orbitals as A1 4, A2 1, B1 1, B2 2, while the canonical RHF
 * orbitals 2–9 are 2a1, 1b2, 3a1, 1b1 (occupied) and 4a1, 2b2, 3b2, 5a1 (virtual): A1 4, B1 1,
 * B2 3 — psi4 1.3.2 orbital irreps in tests/fixtures/scf-reference.psi4.json
 * (scripts/data/generate_scf_reference_fixture.py).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, LateResults, prerequisites, requestKey, type ActiveSpaceOutcome, type ComputeRequest, type HamiltonianOutcome } from '../../server/src/analysis';
import { runRequest } from '../../server/src/jobs/run';
import { fragmentCard } from '../../server/src/services/cards';
import { WATER_ROWS } from '../fixtures/water';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const TIER = 'method vqe; ansatz uccsd; mapping jordan-wigner; taper on';
const spec = (active: string) => `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { ${TIER}; ${active} } }\n`;
const context = { cancel: { cancelled: false }, onProgress: () => {}, storageLimitBytes: 64 * 2 ** 20 };

interface ScfCase {
  name: string;
  basis: string;
  reference: string;
  alpha: { energies: number[]; irreps: string[] };
}
const PSI4 = JSON.parse(readFileSync(new URL('../fixtures/scf-reference.psi4.json', import.meta.url), 'utf8')) as { cases: ScfCase[] };
const PSI4_WATER = PSI4.cases.find((c) => c.name === 'water' && c.basis === 'cc-pvdz' && c.reference === 'rhf')!;

function run(request: ComputeRequest, late: LateResults): unknown {
  const inputs = prerequisites(request).map((requirement) => run(requirement, late));
  const result = runRequest(request, inputs, context);
  late.ready(request.kind, requestKey(request), result);
  return result;
}

function computeActive(text: string) {
  const late = new LateResults();
  const analysis = analyzeDocument(text, {}, late);
  const counted = analysis.fragmentFigures(0);
  const outcome = run(analysis.computation({ kind: 'fragment', index: 0 }).activeSpace!, late) as ActiveSpaceOutcome;
  return { analysis, late, counted, outcome };
}

/**
 * Spin-conserving singles and doubles from the occupied to the virtual spin orbitals whose irrep
 * product is totally symmetric (the screening of Romero et al., Quantum Sci. Technol. 4, 014008
 * (2019)), enumerated one by one: an independent count of the screened UCCSD parameters.
 */
function screenedUccsd(irreps: readonly string[], doubly: number): number {
  const spinOrbitals = irreps.flatMap((irrep, k) => [
    { irrep, spin: 0, occupied: k < doubly },
    { irrep, spin: 1, occupied: k < doubly },
  ]);
  const occupied = spinOrbitals.filter((s) => s.occupied);
  const virtual = spinOrbitals.filter((s) => !s.occupied);
  // C2v irreps as characters on (C2, σv(xz)): the product is symmetric when both characters multiply to +1.
  const chars: Record<string, [number, number]> = { A1: [1, 1], A2: [1, -1], B1: [-1, 1], B2: [-1, -1] };
  const symmetric = (...labels: string[]) => [0, 1].every((g) => labels.reduce((p, l) => p * chars[l]![g]!, 1) === 1);
  let count = 0;
  for (const i of occupied) for (const a of virtual) if (i.spin === a.spin && symmetric(i.irrep, a.irrep)) count++;
  for (let i = 0; i < occupied.length; i++)
    for (let j = i + 1; j < occupied.length; j++)
      for (let a = 0; a < virtual.length; a++)
        for (let b = a + 1; b < virtual.length; b++) {
          const [oi, oj, va, vb] = [occupied[i]!, occupied[j]!, virtual[a]!, virtual[b]!];
          if (oi.spin + oj.spin === va.spin + vb.spin && symmetric(oi.irrep, oj.irrep, va.irrep, vb.irrep)) count++;
        }
  return count;
}

describe('figures on computed active orbitals (water cc-pVDZ, active 8e 8o)', () => {
  const { analysis, counted, outcome } = computeActive(spec('active 8e 8o'));
  const figures = analysis.fragmentFigures(0);

  const PSI4_ACTIVE = PSI4_WATER.alpha.irreps.slice(1, 9);

  it('the computed orbitals are psi4\'s orbitals 2–9 with psi4\'s irreps', () => {
    expect(outcome.active).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(outcome.details.map((d) => d.irrep)).toEqual(PSI4_ACTIVE);
    expect(outcome.details.map((d) => d.occupation)).toEqual([2, 2, 2, 2, 0, 0, 0, 0]);
  });

  it('before the result the irreps are counted (apportioned) and differ from the computed ones', () => {
    expect(counted.activeIrreps?.source).toBe('proportional');
    expect(counted.orbitalSources?.figures['pauliTerms']).toBe('counted');
    const psi4 = Object.fromEntries(['A1', 'B1', 'B2'].map((label) => [label, PSI4_ACTIVE.filter((irrep) => irrep === label).length]));
    expect(psi4).toEqual({ A1: 4, B1: 1, B2: 3 });
    expect(counted.activeIrreps?.perIrrep).not.toEqual(psi4);
  });

  it('after it every orbital-dependent figure reads the computed irreps and occupation, and says so', () => {
    expect(figures.activeIrreps).toEqual({ perIrrep: { A1: 4, B2: 3, B1: 1 }, source: 'computed', occupation: 'computed' });
    expect(Object.values(figures.orbitalSources!.figures).every((source) => source === 'computed')).toBe(true);
    expect(figures.orbitalSources!.computedFrom).toContain('C2v');
  });

  it('screened UCCSD parameters match an enumeration of the symmetry-allowed excitations on psi4\'s irreps', () => {
    const enumerated = screenedUccsd(PSI4_ACTIVE, 4);
    expect(figures.ansatzCost?.parameters).toBe(enumerated);
    // The counted figure, on apportioned irreps and an assumed occupation, is another number.
    expect(counted.ansatzCost?.parameters).not.toBe(enumerated);
  });

  it('the Pauli count on the computed irreps bounds the computed Hamiltonian\'s strings; the counted one does not', () => {
    const late = new LateResults();
    const text = spec('active 8e 8o');
    const fresh = analyzeDocument(text, {}, late);
    const hamiltonian = run(fresh.computation({ kind: 'fragment', index: 0 }).hamiltonian!, late) as HamiltonianOutcome;
    const strings = hamiltonian.figures.status === 'computed' ? hamiltonian.figures.mappings.jordanWigner.terms : NaN;
    const onComputed = figures.pauliTerms!.jordanWigner as number;
    const onCounted = counted.pauliTerms!.jordanWigner as number;
    // Real integrals leave every symmetry-allowed string above the threshold here: the bound is met.
    expect(strings).toBe(onComputed);
    expect(strings).toBeGreaterThan(onCounted);
  });

  it('the same figures as the spec that writes the computed irreps and occupation itself (one rule for both)', () => {
    const written = analyzeDocument(spec('active 8e A1=4 B1=1 B2=3 occupied A1=2 B1=1 B2=1'), {}, new LateResults()).fragmentFigures(0);
    expect(written.activeIrreps).toMatchObject({ source: 'given', occupation: 'given' });
    for (const key of ['qubits', 'qubitsRequired', 'pauliTerms', 'measurement', 'ansatzCost', 'circuit', 'taperingSymmetries'] as const) expect(figures[key]).toEqual(written[key]);
  });

  it('the card says which source each figure used', () => {
    const card = fragmentCard(analysis, 0);
    expect(card).toContain('(**computed**: the 8 active orbitals');
    expect(card).toContain('irreps computed');
    expect(card).not.toMatch(/; irreps counted\)/);
  });

  it('a result for other inputs is never read: an edit of the geometry falls back to counted', () => {
    const moved = spec('active 8e 8o').replace(/0\.756950/g, '0.760000');
    const late = new LateResults();
    const first = analyzeDocument(spec('active 8e 8o'), {}, late);
    run(first.computation({ kind: 'fragment', index: 0 }).activeSpace!, late);
    expect(first.fragmentFigures(0).activeIrreps?.source).toBe('computed');
    const edited = analyzeDocument(moved, {}, late);
    expect(edited.fragmentFigures(0).activeIrreps?.source).toBe('proportional');
  });
});

describe('figures on computed MP2 natural orbitals (water cc-pVDZ, active natural, all electrons)', () => {
  it('the reference fills the most occupied natural orbitals in pairs, and the figures read their irreps', () => {
    const { analysis, outcome } = computeActive(spec('frozen-core off; active natural'));
    const figures = analysis.fragmentFigures(0);
    expect(outcome.orbitalKind).toBe('natural');
    // Natural orbitals of a closed shell carry irreps (their density is totally symmetric).
    expect(outcome.details.every((d) => d.irrep !== null)).toBe(true);
    expect(figures.activeIrreps?.source).toBe('computed');
    expect(figures.active).toMatchObject({ orbitals: outcome.active.length, source: 'computed' });
    const electrons = outcome.electrons.alpha;
    const doubly = outcome.details.map((d) => ({ irrep: d.irrep!, n: d.occupation })).sort((a, b) => b.n - a.n).slice(0, electrons);
    const occupiedIrreps = doubly.map((d) => d.irrep).sort();
    const allIrreps = outcome.details.map((d) => d.irrep!).sort();
    expect(figures.ansatzCost?.parameters).toBe(screenedUccsdOrdered(allIrreps, occupiedIrreps));
  });
});

/** screenedUccsd with the occupied irreps named (the register's order does not matter to the count). */
function screenedUccsdOrdered(all: readonly string[], occupied: readonly string[]): number {
  const rest = [...all];
  for (const irrep of occupied) rest.splice(rest.indexOf(irrep), 1);
  return screenedUccsd([...occupied, ...rest], occupied.length);
}

describe('a correlated fragment with a suggested active space', () => {
  it('its solver cost follows the computed space, as its active-space row does (counts of the psi4 AVAS fixture)', () => {
    const text = `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier correlated { method ccsd; active shells o 2s 2p all h 1s } }\n`;
    const { analysis, counted, outcome } = computeActive(text);
    const figures = analysis.fragmentFigures(0);
    // tests/fixtures/active-space.psi4.json, water 'O 2s 2p, H 1s': 4 occupied and 2 virtual orbitals.
    expect(outcome.active).toHaveLength(6);
    expect(figures.active).toMatchObject({ orbitals: 6, source: 'computed' });
    expect(figures.solverCost).toMatchObject({ orbitals: 6, occupied: 4, virtual: 2, on: 'active-space' });
    expect(counted.active?.source).toBe('estimated-shells');
    expect(figures.orbitalSources?.figures).toEqual({ activeIrreps: 'computed', referenceOccupation: 'computed' });
  });
});
