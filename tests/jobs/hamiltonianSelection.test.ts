/**
 * The Hamiltonian of a chosen active space: for the per-irrep form and the suggestions
 * (`active shells …`, `active natural`) the fragment's active-space job is the Hamiltonian's
 * prerequisite, and the integrals are built in the orbitals it chose. Checks: projected and
 * per-irrep orbitals are rotations within the occupied and within the virtual orbitals, so the
 * reference determinant keeps the RHF energy — the active-space Hamiltonian's reference energy
 * (constant + one- and two-body terms over the occupied active orbitals) must equal psi4 1.3.2's
 * RHF energy (tests/fixtures/scf-reference.psi4.json); the counts of orbitals are those of the
 * numpy projection and MP2 natural occupations on psi4 matrices (tests/fixtures/active-space.psi4.json,
 * scripts/data/generate_active_space_fixture.py). The unrelaxed MP2 density has no
 * occupied–virtual block (from memory: its first-order corrections are oo and vv only), so its
 * natural orbitals too are rotations within the occupied and within the virtual orbitals, and the
 * determinant of the most occupied ones keeps the RHF energy. Water cc-pVDZ at Hoy & Bunker's structure.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyzeDocument, HAMILTONIAN_KIND, LateResults, prerequisites, requestKey, type ActiveSpaceOutcome, type ComputeRequest, type HamiltonianOutcome } from '../../server/src/analysis';
import { quartetIndex } from '../../server/src/electronic/hamiltonian/pairs';
import { runRequest } from '../../server/src/jobs/run';
import { hamiltonianSection } from '../../server/src/services/hamiltonian';
import { WATER_ROWS } from '../fixtures/water';
import { referenceCase } from './requests';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const spec = (active: string, extra = '') => `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; ${active} } }\n${extra}`;
const ACTIVE_FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'active-space.psi4.json'), 'utf8')) as {
  cases: { name: string; projections: { label: string; activeOccupied: number; activeVirtual: number }[]; mp2?: { inside: number; above: number } }[];
};
const WATER_FIXTURE = ACTIVE_FIXTURE.cases.find((c) => c.name === 'water')!;
const context = { cancel: { cancelled: false }, onProgress: () => {}, storageLimitBytes: 64 * 2 ** 20 };

function run(request: ComputeRequest, late: LateResults): unknown {
  const key = requestKey(request);
  const there = late.get(request.kind, key);
  if (there.state === 'ready') return there.value;
  const inputs = prerequisites(request).map((requirement) => run(requirement, late));
  const result = runRequest(request, inputs, context);
  late.ready(request.kind, key, result);
  return result;
}

/** ⟨Φ|H|Φ⟩ of the closed-shell determinant filling `occupied` (positions in the active register). */
function referenceEnergy(outcome: HamiltonianOutcome, occupied: readonly number[]): number {
  const { oneBody, twoBody, constant, orbitals: n } = outcome.integrals;
  let energy = constant;
  for (const i of occupied) {
    energy += 2 * oneBody[i * n + i]!;
    for (const j of occupied) energy += 2 * twoBody[quartetIndex(i, i, j, j)]! - twoBody[quartetIndex(i, j, j, i)]!;
  }
  return energy;
}

function computeFor(active: string) {
  const late = new LateResults();
  const text = spec(active);
  const analysis = analyzeDocument(text, {}, late);
  const computation = analysis.computation({ kind: 'fragment', index: 0 });
  const hamiltonian = computation.hamiltonian!;
  const outcome = run(hamiltonian, late) as HamiltonianOutcome;
  const selection = late.get<ActiveSpaceOutcome>('active-space', computation.activeSpaceKey!);
  return { analysis, computation, hamiltonian, outcome, selection: selection.state === 'ready' ? selection.value : undefined };
}

const RHF = referenceCase('water', 'cc-pvdz', 'rhf').energy;

describe('the Hamiltonian of the chosen active space', () => {
  it('active 8e 8o stays the canonical window (no active-space prerequisite)', () => {
    const { hamiltonian, outcome } = computeFor('active 8e 8o');
    expect(hamiltonian.space.kind).toBe('window');
    expect(prerequisites(hamiltonian).map((r) => r.kind)).toEqual(['mean-field']);
    expect(outcome.orbitalKind).toBe('canonical');
    expect(referenceEnergy(outcome, [0, 1, 2, 3])).toBeCloseTo(RHF, 6);
  });

  it('active shells o 2s 2p all h 1s: the Hamiltonian is built in the projected orbitals (counts of the psi4 fixture), reference energy = psi4 RHF', () => {
    const expected = WATER_FIXTURE.projections.find((p) => p.label === 'O 2s 2p, H 1s')!;
    const { hamiltonian, outcome, selection } = computeFor('active shells o 2s 2p all h 1s');
    expect(hamiltonian.selection?.kind).toBe('active-space');
    expect(prerequisites(hamiltonian).map((r) => r.kind)).toEqual(['mean-field', 'active-space']);
    expect(outcome.orbitalKind).toBe('projected');
    expect(outcome.integrals.orbitals).toBe(expected.activeOccupied + expected.activeVirtual);
    expect(outcome.active).toEqual(selection!.active);
    const occupied = selection!.details.flatMap((d, k) => (d.occupation === 2 ? [k] : []));
    expect(occupied).toHaveLength(expected.activeOccupied);
    expect(referenceEnergy(outcome, occupied)).toBeCloseTo(RHF, 6);
  });

  it('active 4e A1=2 B1=1 B2=1: the per-irrep orbitals the selection chose, reference energy = psi4 RHF', () => {
    const { outcome, selection } = computeFor('active 4e A1=2 B1=1 B2=1');
    expect(outcome.active).toEqual(selection!.active);
    const irreps = selection!.details.map((d) => d.irrep).sort();
    expect(irreps).toEqual(['A1', 'A1', 'B1', 'B2']);
    const occupied = selection!.details.flatMap((d, k) => (d.occupation === 2 ? [k] : []));
    expect(referenceEnergy(outcome, occupied)).toBeCloseTo(RHF, 6);
  });

  it('active natural (all electrons): in the MP2 natural orbitals inside the window (the psi4 fixture count); reference energy = psi4 RHF', () => {
    const { outcome, selection, analysis } = computeFor('frozen-core off; active natural');
    expect(outcome.orbitalKind).toBe('natural');
    expect(outcome.integrals.orbitals).toBe(WATER_FIXTURE.mp2!.inside);
    const electrons = outcome.integrals.electrons.alpha;
    const order = selection!.details.map((d, k) => ({ k, n: d.occupation })).sort((a, b) => b.n - a.n);
    const energy = referenceEnergy(outcome, order.slice(0, electrons).map((o) => o.k));
    expect(energy).toBeCloseTo(RHF, 6);
    const hover = hamiltonianSection(analysis, { kind: 'fragment', index: 0 });
    expect(hover).toContain('on MP2 natural orbitals of the RHF mean field');
  });

  it('keys: the selection Hamiltonian is keyed by its active-space request (another choice, another key)', () => {
    const a = analyzeDocument(spec('active shells o 2p'), {}, new LateResults()).computation({ kind: 'fragment', index: 0 });
    const b = analyzeDocument(spec('active shells o 2s 2p'), {}, new LateResults()).computation({ kind: 'fragment', index: 0 });
    expect(a.hamiltonian?.kind).toBe(HAMILTONIAN_KIND);
    expect(a.hamiltonianKey).not.toBe(b.hamiltonianKey);
    expect(a.hamiltonianKey).toContain(a.activeSpaceKey!);
  });
});
