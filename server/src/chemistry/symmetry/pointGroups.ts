/**
 * Schoenflies point groups: names, orders, and each group's exact ("ideal") operations built in
 * an orthonormal frame, as a short list of cyclic factors.
 *
 * Every finite group here is a product of cyclic subgroups H1·H2·…·Hk in which each element has
 * exactly one factorisation (|G| = |H1|·…·|Hk|), for example Dnh = Cn·C2′·σh, T = C2(z)·C2(x)·C3,
 * O = T·C4, I = T·C5 (T ∩ C5 = E, 12·5 = 60). Averaging over G is then the product of the
 * averages over each Hi, which symmetrize() uses. Group orders and the element lists follow the
 * character tables in F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., Wiley 1990,
 * Appendix IIA.
 */
import { frameMatrix, improperRotation, inversion, multiply, normalized, reflection, rotation, transpose, type Mat } from './linalg';

export type GroupFamily =
  | 'C1' | 'Cs' | 'Ci'
  | 'Cn' | 'Cnv' | 'Cnh' | 'Dn' | 'Dnh' | 'Dnd' | 'S2n'
  | 'T' | 'Td' | 'Th' | 'O' | 'Oh' | 'I' | 'Ih'
  | 'C∞v' | 'D∞h' | 'Kh';

export interface PointGroupId {
  readonly family: GroupFamily;
  /** Order of the principal proper axis for the axial families (Cn … S2n); 1 otherwise. */
  readonly n: number;
}

export function groupName(id: PointGroupId): string {
  const n = id.n;
  switch (id.family) {
    case 'Cn':
      return `C${n}`;
    case 'Cnv':
      return `C${n}v`;
    case 'Cnh':
      return `C${n}h`;
    case 'Dn':
      return `D${n}`;
    case 'Dnh':
      return `D${n}h`;
    case 'Dnd':
      return `D${n}d`;
    case 'S2n':
      return `S${2 * n}`;
    default:
      return id.family;
  }
}

/** Number of operations; null for the infinite groups (linear molecules, single atoms). */
export function groupOrder(id: PointGroupId): number | null {
  switch (id.family) {
    case 'C1':
      return 1;
    case 'Cs':
    case 'Ci':
      return 2;
    case 'Cn':
      return id.n;
    case 'Cnv':
    case 'Cnh':
    case 'Dn':
    case 'S2n':
      return 2 * id.n;
    case 'Dnh':
    case 'Dnd':
      return 4 * id.n;
    case 'T':
      return 12;
    case 'Td':
    case 'Th':
    case 'O':
      return 24;
    case 'Oh':
      return 48;
    case 'I':
      return 60;
    case 'Ih':
      return 120;
    default:
      return null;
  }
}

/** Ranks groups for "is the near group higher": order, infinite groups above every finite one. */
export function groupRank(id: PointGroupId): number {
  const order = groupOrder(id);
  if (order !== null) return order;
  return id.family === 'C∞v' ? 1e9 : id.family === 'D∞h' ? 2e9 : 3e9;
}

export interface CyclicFactor {
  /** The generator, about the centre of mass, in the input frame. */
  readonly matrix: Mat;
  readonly order: number;
}

export interface IdealGroup {
  readonly id: PointGroupId;
  readonly name: string;
  readonly order: number | null;
  /** Rows: the group's own x, y, z axes (z the principal axis) as unit vectors in the input frame. */
  readonly frame: Mat;
  readonly factors: readonly CyclicFactor[];
}

const GOLDEN = (1 + Math.sqrt(5)) / 2;

/** Factors of T with its three C2 axes along the frame axes and C3 along (1,1,1) (Cotton, App. IIA). */
function tetrahedralRotations(): { matrix: Mat; order: number }[] {
  return [
    { matrix: rotation([0, 0, 1], Math.PI), order: 2 },
    { matrix: rotation([1, 0, 0], Math.PI), order: 2 },
    { matrix: rotation(normalized([1, 1, 1])!, (2 * Math.PI) / 3), order: 3 },
  ];
}

/**
 * The exact operations of a group in frame coordinates. For I and Ih, `fiveFoldAxis` (frame
 * coordinates) is one C5 axis: with the frame axes on three perpendicular C2 axes it lies along
 * (0, ±1, ±φ) or a cyclic permutation, φ the golden ratio (the icosahedron's vertices; H. S. M.
 * Coxeter, Regular Polytopes, 3rd ed., Dover 1973, §3.7 — from memory).
 */
function factorsInFrame(id: PointGroupId, fiveFoldAxis?: ArrayLike<number>): { matrix: Mat; order: number }[] {
  const n = id.n;
  const z = [0, 0, 1];
  const principal = () => ({ matrix: rotation(z, (2 * Math.PI) / n), order: n });
  switch (id.family) {
    case 'C1':
    case 'C∞v':
    case 'Kh':
      return [];
    case 'Cs':
      return [{ matrix: reflection(z), order: 2 }];
    case 'Ci':
    case 'D∞h':
      return [{ matrix: inversion(), order: 2 }];
    case 'Cn':
      return [principal()];
    case 'Cnv':
      return [principal(), { matrix: reflection([0, 1, 0]), order: 2 }];
    case 'Cnh':
      return [principal(), { matrix: reflection(z), order: 2 }];
    case 'S2n':
      return [{ matrix: improperRotation(z, Math.PI / n), order: 2 * n }];
    case 'Dn':
      return [principal(), { matrix: rotation([1, 0, 0], Math.PI), order: 2 }];
    case 'Dnh':
      return [principal(), { matrix: rotation([1, 0, 0], Math.PI), order: 2 }, { matrix: reflection(z), order: 2 }];
    case 'Dnd': {
      // σd bisects neighbouring C2′ axes: its plane holds z and the direction at π/(2n) from x.
      const angle = Math.PI / (2 * n);
      return [principal(), { matrix: rotation([1, 0, 0], Math.PI), order: 2 }, { matrix: reflection([-Math.sin(angle), Math.cos(angle), 0]), order: 2 }];
    }
    case 'T':
      return tetrahedralRotations();
    case 'Td':
      return [...tetrahedralRotations(), { matrix: reflection(normalized([1, -1, 0])!), order: 2 }];
    case 'Th':
      return [...tetrahedralRotations(), { matrix: inversion(), order: 2 }];
    case 'O':
      return [...tetrahedralRotations(), { matrix: rotation(z, Math.PI / 2), order: 4 }];
    case 'Oh':
      return [...tetrahedralRotations(), { matrix: rotation(z, Math.PI / 2), order: 4 }, { matrix: inversion(), order: 2 }];
    case 'I':
    case 'Ih': {
      const axis = normalized(fiveFoldAxis ?? [0, 1, GOLDEN])!;
      const factors = [...tetrahedralRotations(), { matrix: rotation(axis, (2 * Math.PI) / 5), order: 5 }];
      return id.family === 'Ih' ? [...factors, { matrix: inversion(), order: 2 }] : factors;
    }
  }
}

/**
 * Snaps a measured C5 direction (frame coordinates) onto the nearest ideal one: components
 * 0, ±1 and ±φ over √(1 + φ²), arranged cyclically.
 */
export function idealFiveFoldAxis(measured: ArrayLike<number>): Float64Array {
  const scale = Math.sqrt(1 + GOLDEN * GOLDEN);
  let best = Float64Array.of(0, 1 / scale, GOLDEN / scale);
  let bestDot = -Infinity;
  for (let shift = 0; shift < 3; shift++) {
    for (const orientation of [
      [0, 1, GOLDEN],
      [0, GOLDEN, 1],
    ]) {
      for (const signs of [
        [1, 1],
        [1, -1],
        [-1, 1],
        [-1, -1],
      ]) {
        const v = new Float64Array(3);
        v[shift] = 0;
        v[(shift + 1) % 3] = (signs[0]! * orientation[1]!) / scale;
        v[(shift + 2) % 3] = (signs[1]! * orientation[2]!) / scale;
        const d = Math.abs(v[0]! * measured[0]! + v[1]! * measured[1]! + v[2]! * measured[2]!);
        if (d > bestDot) {
          bestDot = d;
          best = v;
        }
      }
    }
  }
  return best;
}

/**
 * The group's cyclic factors in input coordinates: M_input = Aᵀ·M_frame·A for the frame A whose
 * rows are the group's axes.
 */
export function idealGroup(id: PointGroupId, frame: Mat, fiveFoldAxis?: ArrayLike<number>): IdealGroup {
  const frameT = transpose(frame);
  const factors = factorsInFrame(id, fiveFoldAxis).map(({ matrix, order }) => ({ matrix: multiply(frameT, multiply(matrix, frame)), order }));
  return { id, name: groupName(id), order: groupOrder(id), frame, factors };
}

/** Orthonormal right-handed frame with z along `z` and x as close as possible to `x`. */
export function frameFrom(z: ArrayLike<number>, x: ArrayLike<number>): Mat {
  const zu = normalized(z)!;
  const projection = x[0]! * zu[0]! + x[1]! * zu[1]! + x[2]! * zu[2]!;
  let xu = normalized([x[0]! - projection * zu[0]!, x[1]! - projection * zu[1]!, x[2]! - projection * zu[2]!], 1e-8);
  if (!xu) {
    const helper = Math.abs(zu[0]!) < 0.9 ? [1, 0, 0] : [0, 1, 0];
    const p = helper[0]! * zu[0]! + helper[1]! * zu[1]! + helper[2]! * zu[2]!;
    xu = normalized([helper[0]! - p * zu[0]!, helper[1]! - p * zu[1]!, helper[2]! - p * zu[2]!])!;
  }
  const yu = Float64Array.of(zu[1]! * xu[2]! - zu[2]! * xu[1]!, zu[2]! * xu[0]! - zu[0]! * xu[2]!, zu[0]! * xu[1]! - zu[1]! * xu[0]!);
  return frameMatrix(xu, yu, zu);
}
