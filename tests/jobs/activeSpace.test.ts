/**
 * The active-space job end to end: a spec's fragment asks for its active orbitals
 * (analysis/computed.ts), the job runs on the mean field (and MP2) it builds on (jobs/run.ts), and
 * the orbitals it picks agree with psi4 1.3.2: orbital energies of tests/fixtures/scf-reference.psi4.json
 * and the counts of tests/fixtures/active-space.psi4.json (numpy on psi4 matrices,
 * scripts/data/generate_active_space_fixture.py). Water at Hoy & Bunker's structure, the placement
 * both fixtures use (tests/fixtures/water.ts).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ACTIVE_SPACE_KIND, prerequisites, requestKey, type ActiveSpaceOutcome, type ComputeRequest, type PartRef } from '../../server/src/analysis';
import { runRequest } from '../../server/src/jobs/run';
import { WATER_ROWS } from '../fixtures/water';
import { analyzeMarked } from '../language/fixture';
import { referenceCase } from './requests';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const spec = (tier: string, extra = '') => `basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier quantum { ${tier} } }\n${extra}`;
const FRAGMENT: PartRef = { kind: 'fragment', index: 0 };
const ACTIVE_FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'active-space.psi4.json'), 'utf8')) as {
  cases: { name: string; basis: string; projections: { label: string; activeOccupied: number; activeVirtual: number }[]; mp2?: { inside: number; above: number } }[];
};

const context = { cancel: { cancelled: false }, onProgress: () => {}, storageLimitBytes: 64 * 2 ** 20 };

/** Runs a request after its prerequisites, as the queue does, each once. */
function run(request: ComputeRequest, done = new Map<string, unknown>()): unknown {
  const id = `${request.kind}:${requestKey(request)}`;
  if (done.has(id)) return done.get(id);
  const inputs = prerequisites(request).map((requirement) => run(requirement, done));
  const result = runRequest(request, inputs, context);
  done.set(id, result);
  return result;
}

function activeOutcome(text: string): ActiveSpaceOutcome {
  const analysis = analyzeMarked(text);
  const request = analysis.computation(FRAGMENT).activeSpace;
  expect(request?.kind).toBe(ACTIVE_SPACE_KIND);
  return run(request!) as ActiveSpaceOutcome;
}

describe('the active-space job', () => {
  it('active 4e 4o: the orbitals of the canonical window with psi4 1.3.2 energies and irreps (fixture)', () => {
    const psi4 = referenceCase('water', 'cc-pvdz', 'rhf');
    const outcome = activeOutcome(spec('active 4e 4o'));
    expect(outcome.source).toBe('canonical-window');
    outcome.details.forEach((orbital, k) => {
      expect(Math.abs(orbital.energy! - psi4.alpha.energies[3 + k]!)).toBeLessThan(1e-5);
      expect(orbital.irrep).toBe(psi4.alpha.irreps[3 + k]);
    });
  });

  it('active shells o p: the counts of the numpy projection on psi4 matrices (fixture)', () => {
    const expected = ACTIVE_FIXTURE.cases.find((c) => c.name === 'water')!.projections.find((p) => p.label === 'O p')!;
    const outcome = activeOutcome(spec('active shells o p'));
    expect(outcome.source).toBe('atomic-projection');
    expect(outcome.details.filter((d) => d.occupation === 2)).toHaveLength(expected.activeOccupied);
    expect(outcome.details.filter((d) => d.occupation === 0)).toHaveLength(expected.activeVirtual);
  });

  it('active natural with all electrons correlated: the orbitals inside 0.02 to 1.98 (common practice) as counted on psi4 matrices (fixture)', () => {
    const expected = ACTIVE_FIXTURE.cases.find((c) => c.name === 'water')!.mp2!;
    const outcome = activeOutcome(spec('frozen-core off; active natural'));
    expect(outcome.source).toBe('natural-occupations');
    expect(outcome.active).toHaveLength(expected.inside);
    expect(outcome.core).toHaveLength(expected.above);
  });

  it('fits a suggestion to the qubit limit: 8 qubits hold 4 orbitals (two qubits per orbital, by construction)', () => {
    const outcome = activeOutcome(spec('active shells o 2s 2p all H 1s', 'limits { qubits 8 }'));
    expect(outcome.active).toHaveLength(4);
  });

  it('asks nothing for a mean-field tier or a fragment without an active space (by construction)', () => {
    expect(analyzeMarked(`basis cc-pvdz\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier mean-field { } }\n`).computation(FRAGMENT).activeSpace).toBeNull();
    expect(analyzeMarked(spec('method vqe')).computation(FRAGMENT).activeSpace).toBeNull();
  });

  it('chooses an open shell from ROHF orbitals even where the part itself runs UHF (by definition of the restricted choice)', () => {
    const analysis = analyzeMarked(`basis cc-pvdz\ncharge 1\nmultiplicity 2\nstructure {\n${WATER}\n}\nfragment w { atoms rest; charge 1; multiplicity 2; tier quantum { active 3e 3o } }\n`);
    const computation = analysis.computation(FRAGMENT);
    expect(computation.meanField?.reference).toBe('uhf');
    expect(computation.activeSpace?.meanField.reference).toBe('rohf');
    const outcome = run(computation.activeSpace!) as ActiveSpaceOutcome;
    expect(outcome.electrons).toEqual({ alpha: 2, beta: 1 });
  });
});
