/**
 * Checks on the nuclei before any integral is used, and the nuclear repulsion energy
 * E_nn = Σ_{A<B} Z_A Z_B / R_AB with Z the charge the electrons feel (less ECP core electrons).
 */
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import type { Center } from '../contracts';
import { ScfInputError } from './errors';

/**
 * Nuclei closer than this (bohr) are refused: no chemical bond is shorter than about 1.4 bohr
 * (H2, 0.74 Å), and below 0.2 bohr (about 0.1 Å) the nuclear repulsion alone exceeds 5 Z_A Z_B
 * hartree and the basis becomes linearly dependent (common practice, no source).
 */
export const MINIMUM_NUCLEAR_DISTANCE = 0.2;

/** Throws `atoms-coincide` for the first pair of nuclei closer than MINIMUM_NUCLEAR_DISTANCE. */
export function checkNuclei(centers: readonly Center[]): void {
  for (let a = 0; a < centers.length; a++) {
    for (let b = 0; b < a; b++) {
      const distance = Math.hypot(centers[a]!.x - centers[b]!.x, centers[a]!.y - centers[b]!.y, centers[a]!.z - centers[b]!.z);
      if (!(distance >= MINIMUM_NUCLEAR_DISTANCE)) {
        throw new ScfInputError(
          'atoms-coincide',
          `Atoms ${b + 1} (${centers[b]!.symbol}) and ${a + 1} (${centers[a]!.symbol}) are ${(distance * BOHR_IN_ANGSTROM).toFixed(3)} Å apart; ` +
            `a mean-field calculation needs every pair at least ${(MINIMUM_NUCLEAR_DISTANCE * BOHR_IN_ANGSTROM).toFixed(2)} Å apart.`,
        );
      }
    }
  }
}

export function nuclearRepulsion(centers: readonly Center[]): number {
  let energy = 0;
  for (let a = 0; a < centers.length; a++) {
    for (let b = 0; b < a; b++) {
      const distance = Math.hypot(centers[a]!.x - centers[b]!.x, centers[a]!.y - centers[b]!.y, centers[a]!.z - centers[b]!.z);
      energy += (centers[a]!.charge * centers[b]!.charge) / distance;
    }
  }
  return energy;
}

/** Electrons of the neutral system: Σ charge (ECP core electrons already removed). */
export function neutralElectrons(centers: readonly Center[]): number {
  let total = 0;
  for (const center of centers) total += center.charge;
  return total;
}
