/**
 * SCF and MP2 in def2 bases with effective core potentials, end to end (Tessera's basis, integrals
 * with the ECP in the core Hamiltonian, SCF, MP2) against Debian's psi4 1.3.2
 * (tests/fixtures/ecp-energies.psi4.json, made by scripts/data/generate_ecp_fixture.py: scf_type pk,
 * mp2_type conv, convergence 1e-10, invented geometries in bohr): total energies and MP2 correlation
 * energies to 1e-6 hartree, and the frozen core psi4 chose (freeze_core true).
 *
 * Frozen core with an ECP: the noble-gas core of the element less the orbitals the ECP replaces
 * (chemistry/elements.ts, common practice): iodine and xenon [Kr] = 18 orbitals less 14 (ECP28) = 4
 * (4s 4p), and the same for Rb and Ag; psi4 freezes the same orbitals (its count is in the fixture).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { FunctionKind } from '../../server/src/electronic/contracts';
import { frozenCoreOrbitals, mp2 } from '../../server/src/electronic/correlation/mp2';
import { computeMeanField, type ScfReference } from '../../server/src/electronic/scf';

interface EnergyCase {
  name: string;
  basis: string;
  kind: FunctionKind;
  charge: number;
  multiplicity: number;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  nuclearRepulsion: number;
  references: Partial<Record<ScfReference, { energy: number; nbf: number; nalpha: number; nbeta: number; mp2?: number; mp2FrozenCore?: number; frozenOrbitals?: number }>>;
}

const CASES = (JSON.parse(readFileSync(join(__dirname, '..', 'fixtures', 'ecp-energies.psi4.json'), 'utf8')) as { cases: EnergyCase[] }).cases;

const runs = CASES.flatMap((c) => Object.entries(c.references).map(([reference, expected]) => [`${c.name}, ${c.basis} (${c.kind}), ${reference.toUpperCase()}`, c, reference as ScfReference, expected!] as const));

describe('SCF and MP2 with ECPs against psi4 1.3.2 (tests/fixtures/ecp-energies.psi4.json)', () => {
  it('cover RHF and UHF, I, Xe, Ag and Rb, a halogen pair, spherical and cartesian', () => {
    const symbols = new Set(CASES.flatMap((c) => c.geometry.map((atom) => atom.symbol)));
    for (const symbol of ['I', 'Xe', 'Ag', 'Rb', 'Cl']) expect(symbols.has(symbol), symbol).toBe(true);
    expect(runs.some(([, , reference]) => reference === 'uhf')).toBe(true);
    expect(CASES.some((c) => c.kind === 'cartesian')).toBe(true);
  });

  it.each(runs)('%s: total energy to 1e-6 Ha, MP2 with all electrons and frozen core to 1e-6 Ha', (_title, c, reference, expected) => {
    const { result, wavefunction, problem } = computeMeanField(
      { atoms: c.geometry, basis: c.basis, kind: c.kind, charge: c.charge, multiplicity: c.multiplicity },
      { reference, energyTolerance: 1e-10, gradientTolerance: 1e-7 },
    );
    expect(result.converged).toBe(true);
    expect(result.functionCount).toBe(expected.nbf);
    expect(result.nuclearRepulsion).toBeCloseTo(c.nuclearRepulsion, 9);
    expect(Math.abs(result.energy - expected.energy)).toBeLessThan(1e-6);
    if (expected.mp2 !== undefined) {
      expect(Math.abs(mp2(wavefunction, problem.eri).result.correlationEnergy - expected.mp2)).toBeLessThan(1e-6);
      expect(frozenCoreOrbitals(problem.basis)).toBe(expected.frozenOrbitals);
      const frozen = mp2(wavefunction, problem.eri, { frozenCore: true }).result;
      expect(frozen.frozenCore).toBe(expected.frozenOrbitals);
      expect(Math.abs(frozen.correlationEnergy - expected.mp2FrozenCore!)).toBeLessThan(1e-6);
    }
  }, 300_000);
});
