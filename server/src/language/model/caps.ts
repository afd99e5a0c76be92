/**
 * Hydrogen caps of the bonds a fragment boundary cuts (chemistry/capping.ts has the placement
 * rules and their sources): which rule each fragment follows, which bonds leave it, where each cap
 * sits and which basis it takes.
 *
 * A fragment follows its own `caps` line, else the top-level one, else none. Every bond from one of
 * its atoms to an atom outside it gets a cap on the fragment's side. A cap is a hydrogen: it takes
 * the basis of the most specific override line that would select a hydrogen of this fragment (an
 * `all H` line over a `fragment <name>` line, the later of two equal ones) and else the main basis,
 * the precedence of model/basis.ts without the atom-naming lines (a cap has no label or index).
 */
import type { BasisSet } from '../../chemistry/basis/library';
import { placeCap, CAP_ELEMENT_Z, type CapRule } from '../../chemistry/capping';
import type { AtomPair } from '../../chemistry/geometry';
import type { CapsAst, SpecAst } from '../ast';
import { BASIS_RANK } from './basis';
import type { AtomModel, BasisModel, CapModel, SpecModel } from './types';

/** The rule a fragment follows: its own line, else the spec's, else none (undefined). */
export function capRuleOf(fragmentCaps: CapsAst | undefined, specCaps: CapsAst | undefined): CapRule | undefined {
  const rule = (fragmentCaps ?? specCaps)?.rule.value;
  return rule === undefined || rule === 'none' ? undefined : rule;
}

/** Bonds per atom, built once per model when some fragment caps. */
export class BondNeighbours {
  private readonly start: Int32Array;
  private readonly partners: Int32Array;

  constructor(atomCount: number, bonds: readonly AtomPair[]) {
    const degree = new Int32Array(atomCount + 1);
    for (const bond of bonds) {
      degree[bond.i + 1]!++;
      degree[bond.j + 1]!++;
    }
    for (let k = 0; k < atomCount; k++) degree[k + 1]! += degree[k]!;
    this.start = degree;
    this.partners = new Int32Array(2 * bonds.length);
    const fill = degree.slice(0, atomCount);
    for (const bond of bonds) {
      this.partners[fill[bond.i]!++] = bond.j;
      this.partners[fill[bond.j]!++] = bond.i;
    }
  }

  /** The atoms bonded to `atom`, in the order of the bond list. */
  of(atom: number): Int32Array {
    return this.partners.subarray(this.start[atom]!, this.start[atom + 1]!);
  }
}

/** The basis set of a cap of the fragment `fragmentName` (see the header). */
export function capBasis(ast: SpecAst, basis: BasisModel, fragmentName: string | undefined): BasisSet | undefined {
  let set = basis.main;
  let rank = 0;
  basis.overrides.forEach((line, index) => {
    if (!line.set) return;
    let lineRank = 0;
    for (const target of ast.basisOverrides[index]?.targets ?? []) {
      if (target.kind === 'element' && target.element === 'H') lineRank = Math.max(lineRank, BASIS_RANK.element);
      else if (target.kind === 'fragment' && fragmentName !== undefined && target.name.value === fragmentName) lineRank = Math.max(lineRank, BASIS_RANK.fragment);
    }
    if (lineRank > 0 && lineRank >= rank) {
      rank = lineRank;
      set = line.set;
    }
  });
  return set;
}

/**
 * The caps of one fragment: one per bond from its atoms (sorted, unique) to an atom outside it, in
 * the order of its atoms and then of the bond list. `stamp` is scratch space of one entry per atom.
 */
export function fragmentCaps(
  rule: CapRule,
  fragmentAtoms: readonly number[],
  atoms: readonly AtomModel[],
  coordinates: Float64Array,
  neighbours: BondNeighbours,
  basis: BasisSet | undefined,
  stamp: Int32Array,
  stampValue: number,
): CapModel[] {
  for (const atom of fragmentAtoms) stamp[atom] = stampValue;
  const caps: CapModel[] = [];
  for (const host of fragmentAtoms) {
    for (const partner of neighbours.of(host)) {
      if (stamp[partner] === stampValue) continue;
      const placed = placeCap(rule, atoms[host]!.element.z, coordinates.subarray(3 * host, 3 * host + 3), atoms[partner]!.element.z, coordinates.subarray(3 * partner, 3 * partner + 3));
      if (!placed) continue;
      caps.push({ host, partner, rule, position: placed.position, length: placed.length, basis, z: CAP_ELEMENT_Z });
    }
  }
  return caps;
}

/**
 * The caps of a fragment of a built model at other coordinates of the same atoms (a scan point):
 * the same cut bonds, rule and basis, placed again. Empty for a fragment that caps nothing.
 */
export function fragmentCapsAt(model: SpecModel, index: number, coordinates: Float64Array): CapModel[] {
  const fragment = model.fragments[index]!;
  if (!fragment.capRule || fragment.caps.length === 0) return [];
  const neighbours = new BondNeighbours(model.atoms.length, model.contacts.bonds);
  const stamp = new Int32Array(model.atoms.length).fill(-1);
  return fragmentCaps(fragment.capRule, fragment.atoms, model.atoms, coordinates, neighbours, fragment.caps[0]!.basis, stamp, 0);
}
