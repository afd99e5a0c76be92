/**
 * The symmetry of a set of atoms as the estimates use it: the detected point group, the abelian
 * subgroup counted in, the orbitals per irrep, and the orbitals per irrep left outside the frozen
 * core (the noble-gas core shells of each atom, reduced the same way).
 */
import type { FunctionType, ShellCounts } from '../basis/shells';
import type { AbelianGroupName } from './characterTables';
import { detectSymmetry, type SymmetryOptions, type SymmetryResult } from './detect';
import { massesOf } from './inertia';
import { orbitalIrreps, type IrrepCount, type OrbitalIrreps } from './orbitalIrreps';

export interface OrbitalSymmetry {
  readonly symmetry: SymmetryResult;
  readonly group: AbelianGroupName;
  readonly orbitals: OrbitalIrreps;
  /** Orbitals per irrep outside the frozen core. */
  readonly available: readonly IrrepCount[];
}

export interface SymmetryAtoms {
  readonly numbers: ArrayLike<number>;
  /** x, y, z per atom (Å). */
  readonly positions: ArrayLike<number>;
  /** Contracted shells per atom. */
  readonly shells: readonly (ShellCounts | undefined)[];
  /** Frozen-core shells per atom (spherical), or undefined when the core is not frozen. */
  readonly coreShells: readonly ShellCounts[] | undefined;
  readonly functions: FunctionType;
}

function sameShells(a: ShellCounts | undefined, b: ShellCounts | undefined): boolean {
  if (a === b) return true;
  if (!a || !b) return false;
  const length = Math.max(a.length, b.length);
  for (let l = 0; l < length; l++) if ((a[l] ?? 0) !== (b[l] ?? 0)) return false;
  return true;
}

/**
 * Whether every operation maps each atom onto one with the same shells (and frozen-core shells):
 * with per-atom basis sets, two atoms the geometry makes equivalent can carry different functions,
 * and then the basis is not symmetric under the operations that exchange them.
 */
function basisRespectsSymmetry(symmetry: SymmetryResult, atoms: SymmetryAtoms): boolean {
  for (const operation of symmetry.abelianOperations) {
    const permutation = operation.permutation;
    for (let i = 0; i < permutation.length; i++) {
      const j = permutation[i]!;
      if (!sameShells(atoms.shells[i], atoms.shells[j])) return false;
      if (atoms.coreShells && !sameShells(atoms.coreShells[i], atoms.coreShells[j])) return false;
    }
  }
  return true;
}

/**
 * Undefined when the atoms cannot be counted per irrep: an atom without basis functions, or
 * symmetry-equivalent atoms with different basis functions (then the counts fall back to C1).
 */
export function orbitalSymmetry(atoms: SymmetryAtoms, options: SymmetryOptions = {}): OrbitalSymmetry | undefined {
  if (atoms.shells.length === 0 || atoms.shells.some((shells) => shells === undefined)) return undefined;
  const symmetry = detectSymmetry(atoms.numbers, atoms.positions, options);
  if (!basisRespectsSymmetry(symmetry, atoms)) return undefined;
  try {
    const orbitals = orbitalIrreps(symmetry, atoms.shells, atoms.functions);
    const core = atoms.coreShells ? orbitalIrreps(symmetry, atoms.coreShells, 'spherical') : undefined;
    const available = orbitals.irreps.map((irrep, i) => ({ label: irrep.label, mask: irrep.mask, count: irrep.count - (core?.irreps[i]?.count ?? 0) }));
    return { symmetry, group: symmetry.abelianGroup, orbitals, available };
  } catch {
    return undefined;
  }
}

/** Species labels of a subset's atoms are their atomic numbers plus this, so no operation mixes them with the rest. */
const SUBSET_LABEL = 1000;

/**
 * The symmetry a subset of atoms keeps inside the whole set: the stabiliser of the subset in the
 * whole set's point group, i.e. the operations of the whole set (its atoms and its basis) that map
 * the subset onto itself (set-wise; its atoms may be permuted among themselves). That is a
 * subgroup of the whole set's group and of the subset's own group (an operation that maps the
 * subset onto itself is a symmetry of the subset alone), found here by detecting the group of the
 * whole set with the subset's atoms labelled apart (group theory: the stabiliser of a set under a
 * group action, the "site symmetry" of F. A. Cotton, Chemical Applications of Group Theory, 3rd
 * ed., Wiley 1990, from memory). The subset's atoms are also given twice their mass, so that the
 * principal axes the search starts from are those of the labelled set (every operation that keeps
 * the labels fixes the centre of any such mass distribution). Orbitals are counted for the
 * subset's shells only; the whole set's basis must respect the operations too.
 *
 * @param atoms the whole set (every atom with its shells and frozen-core shells)
 * @param members indices into `atoms` of the subset
 */
export function embeddedOrbitalSymmetry(atoms: SymmetryAtoms, members: readonly number[], options: SymmetryOptions = {}): OrbitalSymmetry | undefined {
  if (members.length === 0 || atoms.shells.length === 0 || atoms.shells.some((shells) => shells === undefined)) return undefined;
  const count = atoms.numbers.length;
  const inSubset = new Uint8Array(count);
  for (const member of members) inSubset[member] = 1;
  const species = Int32Array.from({ length: count }, (_, i) => atoms.numbers[i]! + (inSubset[i] ? SUBSET_LABEL : 0));
  const masses = massesOf(atoms.numbers).map((mass, i) => (inSubset[i] ? 2 * mass : mass));
  const symmetry = detectSymmetry(atoms.numbers, atoms.positions, { nearTolerance: 0, ...options, species, masses });
  if (!basisRespectsSymmetry(symmetry, atoms)) return undefined;
  const none: ShellCounts = [];
  const counted = atoms.shells.map((shells, i) => (inSubset[i] ? shells : none));
  const countedCore = atoms.coreShells?.map((shells, i) => (inSubset[i] ? shells : none));
  try {
    const orbitals = orbitalIrreps(symmetry, counted, atoms.functions);
    const core = countedCore ? orbitalIrreps(symmetry, countedCore, 'spherical') : undefined;
    const available = orbitals.irreps.map((irrep, i) => ({ label: irrep.label, mask: irrep.mask, count: irrep.count - (core?.irreps[i]?.count ?? 0) }));
    return { symmetry, group: symmetry.abelianGroup, orbitals, available };
  } catch {
    return undefined;
  }
}
