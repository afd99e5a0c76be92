/**
 * The SCF cases of tests/fixtures/scf-reference.psi4.json (psi4 1.3.2, scripts/data/
 * generate_scf_reference_fixture.py) and their mean fields computed by Tessera, once per case.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { SelectionReference } from '../../../server/src/electronic/activeSpace';
import type { FunctionKind } from '../../../server/src/electronic/contracts';
import { computeMeanField, type ScfOutcome, type ScfProblem, type ScfReference } from '../../../server/src/electronic/scf';

export interface ReferenceCase {
  name: string;
  basis: string;
  reference: ScfReference;
  charge: number;
  multiplicity: number;
  kind: FunctionKind;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  irrepLabels: string[];
  docc: number[];
  socc: number[];
  alpha: { energies: number[]; irreps: string[] };
}

const CASES = (JSON.parse(readFileSync(join(__dirname, '..', '..', 'fixtures', 'scf-reference.psi4.json'), 'utf8')) as { cases: ReferenceCase[] }).cases;

/** psi4 spells A′ and A″ as Ap and App. */
export function psi4Label(label: string): string {
  return label === 'Ap' ? "A'" : label === 'App' ? 'A"' : label;
}

export function fixtureCase(name: string, basis: string, reference: string): ReferenceCase {
  const found = CASES.find((c) => c.name === name && c.basis === basis && c.reference === reference);
  if (!found) throw new Error(`no fixture case ${name} ${basis} ${reference}`);
  return found;
}

const computed = new Map<ReferenceCase, { reference: SelectionReference; outcome: ScfOutcome; problem: ScfProblem }>();

export function meanFieldOf(entry: ReferenceCase): { reference: SelectionReference; outcome: ScfOutcome; problem: ScfProblem } {
  let cached = computed.get(entry);
  if (!cached) {
    const { result, wavefunction, problem } = computeMeanField(
      { atoms: entry.geometry, basis: entry.basis, kind: entry.kind, charge: entry.charge, multiplicity: entry.multiplicity },
      { reference: entry.reference, energyTolerance: 1e-10, gradientTolerance: 1e-7 },
    );
    cached = { reference: { basis: problem.basis, overlap: problem.overlap, wavefunction, pointGroup: result.pointGroup }, outcome: { result, wavefunction }, problem };
    computed.set(entry, cached);
  }
  return cached;
}

export function selectionReference(entry: ReferenceCase): SelectionReference {
  return meanFieldOf(entry).reference;
}
