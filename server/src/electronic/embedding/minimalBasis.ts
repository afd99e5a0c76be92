/**
 * The overlaps the intrinsic atomic orbitals need (iao.ts): of a minimal basis on the same atoms
 * as a molecular basis, and between the two. Both bases are put on one list of centres (the atoms
 * twice) so that one overlap matrix holds every block; the overlap does not see nuclear charges or
 * core potentials, so the doubled atoms change nothing.
 */
import { buildMolecularBasis } from '../basis';
import type { MolecularBasis } from '../contracts';
import { overlapMatrix } from '../integrals';

export interface MinimalBasisOverlaps {
  /** Functions of the minimal basis. */
  readonly functions: number;
  /** Minimal basis overlap (n2×n2). */
  readonly overlap: Float64Array;
  /** Main × minimal (n1×n2). */
  readonly mixedOverlap: Float64Array;
  /** The atom of each minimal-basis function. */
  readonly functionCenter: Int32Array;
}

/** The minimal basis `name` on the atoms of `basis`, with its overlaps. */
export function minimalBasisOverlaps(basis: MolecularBasis, name: string): MinimalBasisOverlaps {
  const atoms = basis.centers.map(({ symbol, x, y, z }) => ({ symbol, x, y, z }));
  const count = atoms.length;
  const combined = buildMolecularBasis([...atoms, ...atoms], [...basis.basisNames, ...atoms.map(() => name)], basis.kind);
  const n1 = basis.functionCount;
  const total = combined.functionCount;
  const n2 = total - n1;
  const s = overlapMatrix(combined);
  const overlap = new Float64Array(n2 * n2);
  const mixedOverlap = new Float64Array(n1 * n2);
  for (let i = 0; i < n2; i++) for (let j = 0; j < n2; j++) overlap[i * n2 + j] = s[(n1 + i) * total + n1 + j]!;
  for (let i = 0; i < n1; i++) for (let j = 0; j < n2; j++) mixedOverlap[i * n2 + j] = s[i * total + n1 + j]!;
  const functionCenter = new Int32Array(n2);
  for (let j = 0; j < n2; j++) functionCenter[j] = combined.functionCenter[n1 + j]! - count;
  return { functions: n2, overlap, mixedOverlap, functionCenter };
}
