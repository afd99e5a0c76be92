/**
 * Reads tests/fixtures/ao-integrals.psi4.json (integrals and energies from Debian's psi4 1.3.2,
 * written by scripts/data/generate_ao_integrals_fixture.py) into SCF problems.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { elementBySymbol } from '../../server/src/chemistry/elements';
import type { Center, FunctionKind, MolecularBasis, Shell } from '../../server/src/electronic/contracts';
import type { AtomIntegrals, ScfProblem } from '../../server/src/electronic/scf';
import { TensorIntegrals } from '../../server/src/electronic/scf';

interface FixtureShell {
  center: number;
  l: number;
  exponents: number[];
  coefficients: number[];
}

interface FixtureIntegrals {
  S: string;
  T?: string;
  V?: string;
  eri?: string;
  nbf?: number;
  shells?: FixtureShell[];
}

export interface FixtureReference {
  energy: number;
  alpha: number[];
  beta: number[];
  mp2?: number;
  mp2FrozenCore?: number;
  mulliken: number[];
  lowdin: number[];
}

export interface FixtureCase extends FixtureIntegrals {
  name: string;
  basis: string;
  kind: FunctionKind;
  charge: number;
  multiplicity: number;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  nbf: number;
  shells: FixtureShell[];
  nuclearRepulsion: number;
  elements?: Record<string, FixtureIntegrals & { nbf: number; shells: FixtureShell[] }>;
  references?: Record<string, FixtureReference>;
}

export const PSI4_FIXTURE = JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'ao-integrals.psi4.json'), 'utf8')) as { origin: unknown; cases: FixtureCase[] };

export function decode(base64: string): Float64Array {
  const bytes = Buffer.from(base64, 'base64');
  const copy = new Uint8Array(bytes.length);
  copy.set(bytes);
  return new Float64Array(copy.buffer);
}

export function basisFromFixture(atoms: { symbol: string; x: number; y: number; z: number }[], shells: FixtureShell[], kind: FunctionKind, basisName: string): MolecularBasis {
  const centers: Center[] = atoms.map((atom) => {
    const z = elementBySymbol(atom.symbol)!.z;
    return { symbol: atom.symbol, atomicNumber: z, charge: z, x: atom.x, y: atom.y, z: atom.z };
  });
  let offset = 0;
  const builtShells: Shell[] = shells.map((shell) => {
    const size = kind === 'spherical' ? 2 * shell.l + 1 : ((shell.l + 1) * (shell.l + 2)) / 2;
    const center = centers[shell.center]!;
    const built: Shell = {
      l: shell.l,
      center: shell.center,
      x: center.x,
      y: center.y,
      z: center.z,
      exponents: Float64Array.from(shell.exponents),
      coefficients: Float64Array.from(shell.coefficients),
      offset,
      size,
      kind,
    };
    offset += size;
    return built;
  });
  const functionCenter = new Int32Array(offset);
  const functionL = new Int32Array(offset);
  for (const shell of builtShells) {
    for (let k = 0; k < shell.size; k++) {
      functionCenter[shell.offset + k] = shell.center;
      functionL[shell.offset + k] = shell.l;
    }
  }
  return { basisNames: atoms.map(() => basisName), kind, centers, shells: builtShells, functionCount: offset, functionCenter, functionL, ecps: [] };
}

export interface LoadedCase {
  readonly raw: FixtureCase;
  readonly problem: ScfProblem;
}

function tensorProblem(basis: MolecularBasis, data: FixtureIntegrals): Pick<ScfProblem, 'overlap' | 'coreHamiltonian' | 'eri'> {
  const overlap = decode(data.S);
  const kinetic = decode(data.T!);
  const potential = decode(data.V!);
  return { overlap, coreHamiltonian: kinetic.map((value, k) => value + potential[k]!), eri: new TensorIntegrals(basis, decode(data.eri!)) };
}

export function loadCase(raw: FixtureCase): LoadedCase {
  const basis = basisFromFixture(raw.geometry, raw.shells, raw.kind, raw.basis);
  const atomCache = new Map<string, AtomIntegrals>();
  const atomIntegrals = (center: number): AtomIntegrals => {
    const symbol = raw.geometry[center]!.symbol;
    let atom = atomCache.get(symbol);
    if (!atom) {
      const data = raw.elements![symbol]!;
      const atomBasis = basisFromFixture([{ symbol, x: 0, y: 0, z: 0 }], data.shells, raw.kind, raw.basis);
      atom = { basis: atomBasis, ...tensorProblem(atomBasis, data) };
      atomCache.set(symbol, atom);
    }
    return atom;
  };
  return { raw, problem: { basis, ...tensorProblem(basis, raw), charge: raw.charge, multiplicity: raw.multiplicity, atomIntegrals } };
}

export function fixtureCase(name: string, kind?: FunctionKind): FixtureCase {
  const found = PSI4_FIXTURE.cases.find((entry) => entry.name === name && (!kind || entry.kind === kind));
  if (!found) throw new Error(`no fixture case ${name}`);
  return found;
}
