/**
 * Makes coordinates exactly symmetric in a detected group (the near group when there is one):
 * each atom becomes the average over the group of the images of its partners,
 *   r′_i = (1/|G|) Σ_g g⁻¹ r_{π_g(i)},
 * which is invariant (h r′_i = r′_{π_h(i)} for every h in G) and moves the atoms by the least
 * squares amount: it is the orthogonal projection onto symmetric configurations (the group-average
 * projection operator; Cotton, Chemical Applications of Group Theory, 3rd ed., §6.2 — section
 * from memory). With G = H1·…·Hk factored into cyclic subgroups the average is the product of the
 * factors' averages. For a linear group the rotation average puts each atom on the axis; a single
 * atom stays where it is. Atom order is kept; the centre of mass does not move.
 */
import type { GroupDescription, SymmetryResult } from './detect';
import { fromMatrix3, transpose } from './linalg';

function averageOverFactor(positions: Float64Array, matrix: Float64Array, order: number, permutation: readonly number[]): Float64Array {
  const count = positions.length / 3;
  const sum = new Float64Array(positions.length);
  // power holds g^k and its permutation π^k; g^k is applied as its inverse, (g^k)ᵀ.
  let power = Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 1);
  let mapping = Int32Array.from({ length: count }, (_, i) => i);
  for (let k = 0; k < order; k++) {
    const inverse = transpose(power);
    for (let i = 0; i < count; i++) {
      const j = mapping[i]!;
      const x = positions[3 * j]!;
      const y = positions[3 * j + 1]!;
      const z = positions[3 * j + 2]!;
      sum[3 * i]! += inverse[0]! * x + inverse[1]! * y + inverse[2]! * z;
      sum[3 * i + 1]! += inverse[3]! * x + inverse[4]! * y + inverse[5]! * z;
      sum[3 * i + 2]! += inverse[6]! * x + inverse[7]! * y + inverse[8]! * z;
    }
    const next = new Float64Array(9);
    for (let r = 0; r < 3; r++) for (let c = 0; c < 3; c++) next[3 * r + c] = matrix[3 * r]! * power[c]! + matrix[3 * r + 1]! * power[3 + c]! + matrix[3 * r + 2]! * power[6 + c]!;
    power = next;
    mapping = Int32Array.from(mapping, (j) => permutation[j]!);
  }
  for (let k = 0; k < sum.length; k++) sum[k]! /= order;
  return sum;
}

/** Symmetric copy of `coordinates` (flat x, y, z per atom, Å) in the given group description. */
export function symmetrizeIn(coordinates: ArrayLike<number>, origin: ArrayLike<number>, group: GroupDescription): Float64Array {
  const count = coordinates.length / 3;
  let positions: Float64Array = Float64Array.from({ length: 3 * count }, (_, k) => coordinates[k]! - origin[k % 3]!);
  if (group.linear) {
    const axis = group.axes[2];
    for (let i = 0; i < count; i++) {
      const h = positions[3 * i]! * axis[0] + positions[3 * i + 1]! * axis[1] + positions[3 * i + 2]! * axis[2];
      for (let c = 0; c < 3; c++) positions[3 * i + c] = h * axis[c]!;
    }
  }
  for (let f = group.generators.length - 1; f >= 0; f--) {
    const generator = group.generators[f]!;
    positions = averageOverFactor(positions, fromMatrix3(generator.matrix), generator.order, generator.permutation);
  }
  for (let k = 0; k < positions.length; k++) positions[k]! += origin[k % 3]!;
  return positions;
}

/**
 * Coordinates made exactly symmetric in `result.nearGroup` when there is one, else in the detected
 * group. `coordinates` are the ones `result` was detected from.
 */
export function symmetrize(coordinates: ArrayLike<number>, result: SymmetryResult): Float64Array {
  return symmetrizeIn(coordinates, result.frame.origin, result.nearGroup?.description ?? result.description);
}
