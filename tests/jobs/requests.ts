/**
 * Requests for the job tests: the psi4 reference cases (tests/fixtures/scf-reference.psi4.json,
 * made by scripts/data/generate_scf_reference_fixture.py with Debian's psi4 1.3.2; geometries in
 * bohr, given to the requests in ångström as a spec would hold them), the cases with effective core
 * potentials (tests/fixtures/ecp-energies.psi4.json), and a benzene large enough to be still
 * computing when a test cancels it.
 */
import { MEAN_FIELD_KIND, MP2_KIND, type MeanFieldRequest, type Mp2Request, type ScfReference } from '../../server/src/analysis';
import { BOHR_IN_ANGSTROM } from '../../server/src/chemistry/units';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';

export interface ReferenceCase {
  name: string;
  basis: string;
  reference: ScfReference;
  charge: number;
  multiplicity: number;
  kind: 'spherical' | 'cartesian';
  geometry: { symbol: string; x: number; y: number; z: number }[];
  energy: number;
  nuclearRepulsion: number;
  nbf: number;
  alpha: { energies: number[]; irreps: string[] };
  beta: { energies: number[]; irreps: string[] };
  mp2?: number;
  mp2FrozenCore?: number;
}

/** Cases with effective core potentials (tests/fixtures/ecp-energies.psi4.json, scripts/data/generate_ecp_fixture.py, psi4 1.3.2). */
export interface EcpCase {
  name: string;
  basis: string;
  kind: 'spherical' | 'cartesian';
  charge: number;
  multiplicity: number;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  references: Partial<Record<ScfReference, { energy: number; nbf: number; mp2?: number; mp2FrozenCore?: number }>>;
}

export const ECP_CASES = (JSON.parse(readFileSync(path.join(__dirname, '..', 'fixtures', 'ecp-energies.psi4.json'), 'utf8')) as { cases: EcpCase[] }).cases;

export const REFERENCE_CASES = (JSON.parse(readFileSync(path.join(__dirname, '..', 'fixtures', 'scf-reference.psi4.json'), 'utf8')) as { cases: ReferenceCase[] }).cases;

export function referenceCase(name: string, basis: string, reference: ScfReference): ReferenceCase {
  const found = REFERENCE_CASES.find((c) => c.name === name && c.basis === basis && c.reference === reference);
  if (!found) throw new Error(`no psi4 case ${name}/${basis}/${reference}`);
  return found;
}

export function requestFor(c: ReferenceCase, options: { maxIterations?: number } = {}): MeanFieldRequest {
  const displayName = c.basis.replace('cc-pv', 'cc-pV').replace('def2-svp', 'def2-SVP').replace('sto-3g', 'STO-3G').replace('6-31g*', '6-31G*');
  return {
    kind: MEAN_FIELD_KIND,
    inputs: {
      atoms: c.geometry.map((atom) => ({ symbol: atom.symbol, x: atom.x * BOHR_IN_ANGSTROM, y: atom.y * BOHR_IN_ANGSTROM, z: atom.z * BOHR_IN_ANGSTROM })),
      basis: c.geometry.map(() => displayName),
      functions: c.kind,
      charge: c.charge,
      multiplicity: c.multiplicity,
    },
    reference: c.reference,
    maxIterations: options.maxIterations ?? null,
    functions: c.nbf,
  };
}

export function mp2For(meanField: MeanFieldRequest, frozenCore = false): Mp2Request {
  return { kind: MP2_KIND, meanField, frozenCore };
}

/** Benzene, idealised and invented (C–C 1.39 Å, C–H 1.09 Å, D6h), in cc-pVDZ: 114 functions, several seconds. */
export function slowRequest(shift = 0): MeanFieldRequest {
  const atoms: { symbol: string; x: number; y: number; z: number }[] = [];
  for (const [symbol, radius] of [['C', 1.39], ['H', 2.48]] as const) {
    for (let k = 0; k < 6; k++) atoms.push({ symbol, x: radius * Math.cos((k * Math.PI) / 3) + shift, y: radius * Math.sin((k * Math.PI) / 3), z: 0 });
  }
  return { kind: MEAN_FIELD_KIND, inputs: { atoms, basis: atoms.map(() => 'cc-pVDZ'), functions: 'spherical', charge: 0, multiplicity: 1 }, reference: 'rhf', maxIterations: null, functions: 114 };
}
