/**
 * The symmetry of a set of atoms as the estimates use it: the detected point group, the abelian
 * subgroup counted in, the orbitals per irrep, and the orbitals per irrep left outside the frozen
 * core (the noble-gas core shells of each atom, reduced the same way).
 */
import type { FunctionType, ShellCounts } from '../basis/shells';
import type { AbelianGroupName } from './characterTables';
import { detectSymmetry, type SymmetryOptions, type SymmetryResult } from './detect';
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
