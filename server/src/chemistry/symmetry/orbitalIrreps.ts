/**
 * Number of basis functions (orbitals) per irreducible representation of the abelian subgroup, by
 * the reduction formula (F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., Wiley 1990,
 * §4.3, eq. 4.3-11 — equation number from memory):
 *   n(Γ) = (1/h) Σ_R χ_Γ(R) χ_basis(R),
 * where χ_basis(R) = Σ over atoms R leaves in place (permutation[i] = i) Σ over their shells χ_l(R);
 * an atom R moves contributes nothing to the trace.
 *
 * Characters of one shell of angular momentum l:
 * - spherical functions span the (2l+1)-dimensional representation of the rotation group, whose
 *   character for a rotation by θ is χ_l(θ) = sin((2l+1)θ/2) / sin(θ/2), 2l+1 at θ = 0
 *   (Cotton §9.2; M. Tinkham, Group Theory and Quantum Mechanics, McGraw-Hill 1964, eq. 5-11 —
 *   section and equation from memory); the inversion multiplies it by the parity (−1)^l. So
 *   χ(E) = 2l+1, χ(C2) = χ_l(π) = (−1)^l, χ(i) = (−1)^l (2l+1), χ(σ) = χ(i·C2) = (−1)^l (−1)^l = 1;
 * - the (l+1)(l+2)/2 cartesian functions of degree l span spherical l, l−2, … down to 0 or 1
 *   (x² + y² + z² = r² times the degree l−2 functions; T. Helgaker, P. Jørgensen, J. Olsen,
 *   Molecular Electronic-Structure Theory, Wiley 2000, §6.4.2 — section from memory), so their
 *   character is the sum of those.
 */
import type { FunctionType, ShellCounts } from '../basis/shells';
import { functionCount } from '../basis/shells';
import { CHARACTER_TABLES, type AbelianGroupName, type OperationName } from './characterTables';
import { detectSymmetry, type SymmetryOptions, type SymmetryResult } from './detect';

/** Character of the rotation by `theta` in the spherical representation of angular momentum l. */
export function rotationCharacter(l: number, theta: number): number {
  const half = theta / 2;
  if (Math.abs(Math.sin(half)) < 1e-12) {
    // θ = 0 (mod 2π): the limit 2l+1, with sign cos((2l+1)θ/2)/cos(θ/2) at θ = 2π.
    return (2 * l + 1) * Math.round(Math.cos((2 * l + 1) * half) / Math.cos(half));
  }
  return Math.round(Math.sin((2 * l + 1) * half) / Math.sin(half));
}

/** Each D2h-type operation as (rotation angle, followed by inversion?): σ = i·C2, i = i·E. */
const AS_ROTATION: Readonly<Record<OperationName, { angle: number; inverts: boolean }>> = {
  E: { angle: 0, inverts: false },
  'C2(z)': { angle: Math.PI, inverts: false },
  'C2(y)': { angle: Math.PI, inverts: false },
  'C2(x)': { angle: Math.PI, inverts: false },
  i: { angle: 0, inverts: true },
  'σ(xy)': { angle: Math.PI, inverts: true },
  'σ(xz)': { angle: Math.PI, inverts: true },
  'σ(yz)': { angle: Math.PI, inverts: true },
};

/** χ_l(R) for one spherical shell. */
export function sphericalShellCharacter(l: number, operation: OperationName): number {
  const { angle, inverts } = AS_ROTATION[operation];
  return rotationCharacter(l, angle) * (inverts && l % 2 === 1 ? -1 : 1);
}

/** χ(R) for one shell of either function type (cartesian degree l = spherical l ⊕ l−2 ⊕ …). */
export function shellCharacter(l: number, type: FunctionType, operation: OperationName): number {
  if (type === 'spherical') return sphericalShellCharacter(l, operation);
  let sum = 0;
  for (let k = l; k >= 0; k -= 2) sum += sphericalShellCharacter(k, operation);
  return sum;
}

export interface IrrepCount {
  readonly label: string;
  readonly mask: number;
  readonly count: number;
}

export interface OrbitalIrreps {
  readonly group: AbelianGroupName;
  /** In the character table's order (Cotton's). */
  readonly irreps: readonly IrrepCount[];
  /** Sum over irreps; equals the number of basis functions of the atoms with a basis. */
  readonly total: number;
  readonly functions: FunctionType;
  /** Atoms whose element the basis does not define: no functions counted for them. */
  readonly atomsWithoutBasis: number;
}

/** Symmetry data the count needs: the subgroup and, per operation, which atom goes where. */
export type IrrepSymmetry = Pick<SymmetryResult, 'abelianGroup' | 'abelianOperations'>;

/**
 * Orbitals per irrep for atoms with the given shells (one entry per atom of the geometry the
 * symmetry was detected from, undefined for an atom without a basis). Throws if the reduction
 * gives a non-integer count, which only inconsistent input (shells that differ between
 * symmetry-equivalent atoms) can cause.
 */
export function orbitalIrreps(symmetry: IrrepSymmetry, shells: readonly (ShellCounts | undefined)[], functions: FunctionType): OrbitalIrreps {
  const table = CHARACTER_TABLES[symmetry.abelianGroup];
  const order = table.operations.length;
  const basisCharacter = table.operations.map((name) => {
    const operation = symmetry.abelianOperations.find((candidate) => candidate.name === name);
    if (!operation) throw new Error(`symmetry data lacks ${name} of ${symmetry.abelianGroup}`);
    let chi = 0;
    shells.forEach((counts, atom) => {
      if (!counts || operation.permutation[atom] !== atom) return;
      counts.forEach((shellCount, l) => (chi += shellCount * shellCharacter(l, functions, name)));
    });
    return chi;
  });
  const irreps = table.irreps.map((irrep) => {
    let sum = 0;
    for (let k = 0; k < order; k++) sum += irrep.characters[k]! * basisCharacter[k]!;
    const count = sum / order;
    if (!Number.isInteger(count) || count < 0) throw new Error(`reduction gave ${count} functions of ${irrep.label}: shells differ between equivalent atoms`);
    return { label: irrep.label, mask: irrep.mask, count };
  });
  let atomsWithoutBasis = 0;
  let expected = 0;
  for (const counts of shells) {
    if (counts) expected += functionCount(counts, functions);
    else atomsWithoutBasis++;
  }
  const total = irreps.reduce((sum, irrep) => sum + irrep.count, 0);
  if (total !== expected) throw new Error(`irrep counts add up to ${total}, not ${expected}`);
  return { group: symmetry.abelianGroup, irreps, total, functions, atomsWithoutBasis };
}

export interface FragmentIrreps {
  /** The fragment's own symmetry, from its atoms alone. */
  readonly symmetry: SymmetryResult;
  readonly orbitals: OrbitalIrreps;
}

/**
 * Orbitals per irrep of a fragment. The fragment's group is detected from the fragment's atoms
 * alone (its own centre of mass and frame): a fragment cut out of a symmetric molecule is often
 * less symmetric than the molecule, and a fragment may even be more symmetric (a water molecule
 * in a C1 cluster is C2v), and only the fragment's own operations map its basis onto itself.
 *
 * @param atomicNumbers, coordinates the whole geometry (flat x, y, z per atom, Å)
 * @param atoms indices of the fragment's atoms
 * @param shells contracted shells per atom of the whole geometry (undefined: no basis)
 */
export function fragmentOrbitalIrreps(
  atomicNumbers: ArrayLike<number>,
  coordinates: ArrayLike<number>,
  atoms: readonly number[],
  shells: readonly (ShellCounts | undefined)[],
  functions: FunctionType,
  options: SymmetryOptions = {},
): FragmentIrreps {
  const numbers = atoms.map((atom) => atomicNumbers[atom]!);
  const positions = new Float64Array(3 * atoms.length);
  atoms.forEach((atom, k) => {
    for (let c = 0; c < 3; c++) positions[3 * k + c] = coordinates[3 * atom + c]!;
  });
  const symmetry = detectSymmetry(numbers, positions, { nearTolerance: 0, ...options });
  return { symmetry, orbitals: orbitalIrreps(symmetry, atoms.map((atom) => shells[atom]), functions) };
}
