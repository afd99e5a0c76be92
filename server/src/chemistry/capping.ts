/**
 * Hydrogen link atoms ("caps") for covalent bonds cut by a fragment boundary.
 *
 * A fragment that keeps atom X of a bond X–Y whose partner Y lies outside it gets a hydrogen H on
 * the line from X towards Y, so that X keeps its valence and the fragment its closed shell: the
 * link-atom scheme of M. J. Field, P. A. Bash, M. Karplus, J. Comput. Chem. 11, 700 (1990). Where
 * on that line the hydrogen sits is a choice; Tessera offers two rules:
 *
 * - `fixed`: X–H is the typical X–H bond length of X's element (CAP_BOND_LENGTHS below), whatever
 *   the X–Y distance. Elements without an entry take the sum of covalent radii r_X + r_H (Cordero
 *   et al. 2008, the radii the bond test uses).
 * - `scaled`: X–H = g · d(X–Y) with g = (r_X + r_H) / (r_X + r_Y), the ratio of the covalent-radius
 *   sums of the two bonds (Cordero radii): a constant scale factor per element pair, the placement
 *   of the scaled link atoms of S. Dapprich, I. Komáromi, K. S. Byun, K. Morokuma, M. J. Frisch,
 *   J. Mol. Struct. THEOCHEM 461–462, 1 (1999), with g taken from covalent radii (common practice).
 *   A stretched X–Y bond (a scan) stretches X–H in proportion.
 *
 * Pure functions over plain numbers; positions in ångström.
 */
import { covalentRadius, elementByNumber, FALLBACK_COVALENT_RADIUS } from './elements';

export type CapRule = 'fixed' | 'scaled';

/** Atomic number of the cap atom. */
export const CAP_ELEMENT_Z = 1;

/**
 * Typical X–H bond lengths in ångström for the `fixed` rule (common practice; the values are those
 * of the parent hydrides, from memory unless a source is named): C–H 1.09 (sp3 C–H in organic
 * groups, neutron diffraction: 1.090 Å for CH3, CH2 and CH), N–H 1.01 (NH3), O–H 0.96 (water,
 * 0.9572 Å, Hoy & Bunker 1979), F–H 0.92, Cl–H 1.27, Br–H 1.41 (the hydrogen halides, Huber &
 * Herzberg 1979), S–H 1.34 (H2S), P–H 1.42 (PH3), Si–H 1.48 (SiH4), B–H 1.19 (BH3), H–H 0.74 (H2).
 */
export const CAP_BOND_LENGTHS: Readonly<Record<number, number>> = {
  1: 0.74,
  5: 1.19,
  6: 1.09,
  7: 1.01,
  8: 0.96,
  9: 0.92,
  14: 1.48,
  15: 1.42,
  16: 1.34,
  17: 1.27,
  35: 1.41,
};

export const CAP_RULE_TEXT: Readonly<Record<CapRule, string>> = {
  fixed:
    'hydrogen on the cut bond at the typical X–H length of the kept atom X (C–H 1.09, N–H 1.01, O–H 0.96, S–H 1.34 Å, …; common practice), else r_X + r_H (Cordero radii); link atoms after Field, Bash & Karplus 1990',
  scaled:
    'hydrogen on the cut bond at g · d(X–Y), g = (r_X + r_H)/(r_X + r_Y) with Cordero covalent radii (scaled link atoms, Dapprich et al. 1999; g from radii: common practice); link atoms after Field, Bash & Karplus 1990',
};

function radius(z: number): number {
  const element = elementByNumber(z);
  return element ? covalentRadius(element) : FALLBACK_COVALENT_RADIUS;
}

/** The X–H length the `fixed` rule uses for a kept atom of atomic number z. */
export function fixedCapLength(z: number): number {
  return CAP_BOND_LENGTHS[z] ?? radius(z) + radius(CAP_ELEMENT_Z);
}

/** The scale factor g of the `scaled` rule for a bond from a kept atom (z) to a partner (partnerZ). */
export function capScaleFactor(z: number, partnerZ: number): number {
  return (radius(z) + radius(CAP_ELEMENT_Z)) / (radius(z) + radius(partnerZ));
}

export interface CapPlacement {
  /** x, y, z in ångström. */
  readonly position: readonly [number, number, number];
  /** The X–H distance, ångström. */
  readonly length: number;
}

/**
 * Where the cap of the bond from the kept atom (z, at `host`) to its partner (partnerZ, at
 * `partner`) goes. Undefined when the two atoms coincide (no direction to place it along).
 */
export function placeCap(rule: CapRule, z: number, host: ArrayLike<number>, partnerZ: number, partner: ArrayLike<number>): CapPlacement | undefined {
  const dx = partner[0]! - host[0]!;
  const dy = partner[1]! - host[1]!;
  const dz = partner[2]! - host[2]!;
  const bond = Math.hypot(dx, dy, dz);
  if (!(bond > 1e-9) || !Number.isFinite(bond)) return undefined;
  const length = rule === 'fixed' ? fixedCapLength(z) : capScaleFactor(z, partnerZ) * bond;
  const t = length / bond;
  return { position: [host[0]! + t * dx, host[1]! + t * dy, host[2]! + t * dz], length };
}
