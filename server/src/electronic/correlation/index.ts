/** Correlation on top of the SCF: MP2 energies, unrelaxed densities and natural orbitals. */
export { DEFAULT_MP2_MEMORY, frozenCoreOrbitals, mp2, Mp2InputError, unrestrictedMp2 } from './mp2';
export type { Mp2Options, Mp2Outcome, Mp2Result, UnrestrictedMp2Result } from './mp2';
export { naturalOrbitalIrreps } from './naturalOrbitals';
