/**
 * End to end through Tessera's own engine: basis, integrals (Head-Gordon–Pople shell quartets) and
 * SCF from server/src/electronic/, then the active space and the qubit Hamiltonians, against psi4
 * 1.3.2 on the same molecules (tests/fixtures/hamiltonian.psi4.json): the lowest eigenvalue in the
 * (Nα, Nβ) sector against psi4's CASCI energy, and the orbital-phase-invariant figures (constant,
 * number of strings, λ) against the same figures built from psi4's integrals.
 */
import { describe, expect, it } from 'vitest';
import { buildMolecularBasis } from '../../../server/src/electronic/basis';
import { coreHamiltonian, createTwoElectronIntegrals, nuclearRepulsionEnergy, overlapMatrix } from '../../../server/src/electronic/integrals';
import { activeSpaceIntegrals } from '../../../server/src/electronic/hamiltonian/activeSpace';
import { applyBinary, encodingMatrix } from '../../../server/src/electronic/hamiltonian/encodings';
import { qubitHamiltonians } from '../../../server/src/electronic/hamiltonian/qubitHamiltonian';
import { oneNorm } from '../../../server/src/electronic/hamiltonian/summary';
import { runScf, type ScfReference } from '../../../server/src/electronic/scf';
import { pauliMatrix, sectorStates, symmetricEigenvalues } from '../fockSpace';
import { psi4Case, referenceIntegrals } from '../psi4Fixture';

/** psi4 1.3.2 converts ångström with CODATA 2014: 1 bohr = 0.52917721067 Å. */
const PSI4_BOHR = 0.52917721067;

const CASES: Array<[string, number, number]> = [
  ['h2-631g', 0, 4],
  ['lih-sto3g', 1, 5],
  ['h2o-631g', 1, 6],
  ['ch2-triplet-631g', 1, 6],
];

describe('engine integrals and SCF → active space → qubit Hamiltonian, against psi4 CASCI', () => {
  it.each(CASES)('%s, core %i, active %i', (name, core, active) => {
    const c = psi4Case(name) as ReturnType<typeof psi4Case> & { symbols: string[]; coordinates: number[]; basis: string; charge: number };
    const atoms = c.symbols.map((symbol, a) => ({ symbol, x: c.coordinates[3 * a]! / PSI4_BOHR, y: c.coordinates[3 * a + 1]! / PSI4_BOHR, z: c.coordinates[3 * a + 2]! / PSI4_BOHR }));
    const basis = buildMolecularBasis(atoms, c.basis, 'cartesian');
    const overlap = overlapMatrix(basis);
    const hCore = coreHamiltonian(basis);
    const eri = createTwoElectronIntegrals(basis);
    const { wavefunction, result } = runScf(
      { basis, overlap, coreHamiltonian: hCore, eri, charge: c.charge, multiplicity: c.multiplicity },
      { reference: c.reference as ScfReference, energyTolerance: 1e-12, gradientTolerance: 1e-9, symmetry: null },
    );
    expect(result.converged).toBe(true);
    expect(Math.abs(result.energy - c.scfEnergy)).toBeLessThan(1e-8);
    const nuclear = nuclearRepulsionEnergy(basis);
    expect(Math.abs(nuclear - c.nuclearRepulsion)).toBeLessThan(1e-9);

    const integrals = activeSpaceIntegrals({
      hCore,
      twoElectron: eri,
      orbitals: { functionCount: basis.functionCount, orbitalCount: result.orbitalCount, coefficients: wavefunction.coefficients.alpha },
      nuclearRepulsion: nuclear,
      core: Array.from({ length: core }, (_, i) => i),
      active: Array.from({ length: active }, (_, i) => core + i),
      electrons: wavefunction.electrons,
    });
    const space = c.spaces.find((s) => s.core === core && s.active === active)!;
    expect(Math.abs(integrals.constant - space.constant)).toBeLessThan(1e-8);

    const ours = qubitHamiltonians(integrals);
    const theirs = qubitHamiltonians(referenceIntegrals(space, c.nuclearRepulsion));
    expect(ours.jordanWigner.length).toBe(theirs.jordanWigner.length);
    expect(Math.abs(oneNorm(ours.jordanWigner) - oneNorm(theirs.jordanWigner))).toBeLessThan(1e-7);

    const states = sectorStates(active, integrals.electrons.alpha, integrals.electrons.beta);
    const beta = encodingMatrix('bravyi-kitaev', 2 * active);
    const { matrix } = pauliMatrix(ours.bravyiKitaev, states.map((f) => applyBinary(beta, f)));
    const lowest = symmetricEigenvalues(matrix, states.length)[0]!;
    expect(Math.abs(lowest - space.casciEnergy!)).toBeLessThan(1e-8);
  });
});
