/**
 * Which molecular integrals the Pauli-term estimates treat as nonzero.
 *
 * Orbitals are real spatial orbitals, numbered 0..n−1 in register order. Each carries an irreducible
 * representation of an abelian point group (D2h or one of its subgroups), written as a bit mask over
 * the group's k generators: bit g is set when the character under generator g is −1. The totally
 * symmetric irrep is 0, and the irrep of a product is the XOR of the masks, because every irrep of
 * these groups is one-dimensional with characters ±1 (F. A. Cotton, Chemical Applications of Group
 * Theory, 3rd ed., Wiley 1990, character tables of D2h and its subgroups).
 *
 * Selection rule: an integral is nonzero only when its integrand is totally symmetric, so
 * h_ij needs Γi ⊕ Γj = 0 and (ij|kl) needs Γi ⊕ Γj ⊕ Γk ⊕ Γl = 0 (Cotton 1990, the direct-product
 * rule for vanishing integrals). The estimates take every integral the rule allows as nonzero
 * ("generic" integrals). A caller with real integrals can pass its own predicates instead.
 */

import { ABELIAN_GROUPS, irrepByLabel, type AbelianGroupName } from '../symmetry/characterTables';

/**
 * The integral sparsity read by the counters. Integrals are real, so (ij|kl) is invariant under the
 * eight index permutations (ij|kl) = (ji|kl) = (ij|lk) = (kl|ij) = …; `allowed` must give the same
 * answer for all eight, and `allowedOneBody(i, j)` the same as `allowedOneBody(j, i)`. The counters
 * call each predicate on one representative only.
 */
export interface IntegralPattern {
  /** Number of spatial orbitals n (the register has 2n spin orbitals). */
  readonly orbitals: number;
  /** Irrep masks when the pattern is the point-group selection rule; absent for explicit predicates. */
  readonly irreps?: Uint8Array;
  /** h_ij may be nonzero. */
  allowedOneBody(i: number, j: number): boolean;
  /** (ij|kl) in chemists' notation, ∫∫ φi(1)φj(1) r12⁻¹ φk(2)φl(2), may be nonzero. */
  allowed(i: number, j: number, k: number, l: number): boolean;
}

/** The default pattern: the point-group selection rule on the given irrep masks. */
export function symmetryPattern(irreps: ArrayLike<number>): IntegralPattern {
  const masks = Uint8Array.from(irreps as ArrayLike<number>);
  for (let i = 0; i < masks.length; i++) {
    const value = (irreps as ArrayLike<number>)[i]!;
    if (!Number.isInteger(value) || value < 0 || value > 7) throw new RangeError(`irrep mask ${value} of orbital ${i} is not a whole number 0–7 (D2h or a subgroup)`);
  }
  return {
    orbitals: masks.length,
    irreps: masks,
    allowedOneBody: (i, j) => (masks[i]! ^ masks[j]!) === 0,
    allowed: (i, j, k, l) => (masks[i]! ^ masks[j]! ^ masks[k]! ^ masks[l]!) === 0,
  };
}

/** A pattern from explicit predicates, for example thresholded integrals from a mean-field run. */
export function explicitPattern(
  orbitals: number,
  allowedOneBody: (i: number, j: number) => boolean,
  allowed: (i: number, j: number, k: number, l: number) => boolean,
): IntegralPattern {
  if (!Number.isInteger(orbitals) || orbitals < 0) throw new RangeError(`orbital count ${orbitals} is not a non-negative integer`);
  return { orbitals, allowedOneBody, allowed };
}

/** C1: every integral allowed. */
export function noSymmetryPattern(orbitals: number): IntegralPattern {
  return symmetryPattern(new Uint8Array(Math.max(0, orbitals)));
}

/**
 * Irrep masks for a list of Mulliken labels of one group (D2h or a subgroup), read from the
 * character tables in symmetry/characterTables.ts; throws on an unknown group or label.
 */
export function irrepMasks(group: string, labels: readonly string[]): Uint8Array {
  if (!(ABELIAN_GROUPS as readonly string[]).includes(group)) throw new RangeError(`unknown point group ${group}`);
  return Uint8Array.from(labels, (label) => {
    const irrep = irrepByLabel(group as AbelianGroupName, label.replace(/''$/, '"'));
    if (irrep === undefined) throw new RangeError(`${label} is not an irrep of ${group}`);
    return irrep.mask;
  });
}
