/**
 * The largest subgroup of the full point group that is D2h or one of its subgroups (the group in
 * which orbitals are labelled in practice), and its standard frame.
 *
 * Which subgroup (common practice, no source; where two of the same order exist, the one with
 * more two-fold axes is taken, so D2d → D2 and Td → D2 rather than C2v):
 *   C1, Cn (n odd) → C1; Cs, Cnh (n odd), Cnv (n odd) → Cs; Ci, S2n (n odd, e.g. S6) → Ci;
 *   Cn (n even), S2n (n even, e.g. S4, S8), Dn (n odd) → C2; Cnv (n even), Dnh (n odd), C∞v → C2v;
 *   Cnh (n even), Dnd (n odd) → C2h; Dn, Dnd (n even), T, Td, O, I → D2;
 *   Dnh (n even), Th, Oh, Ih, D∞h, Kh → D2h.
 *
 * Orientation (R. S. Mulliken, "Report on notation for the spectra of polyatomic molecules",
 * J. Chem. Phys. 23, 1997 (1955), as usually summarised: z is the principal axis; if several axes
 * have the highest order, z is the one through the most atoms; a planar molecule with z in its
 * plane lies in the yz plane, x ⊥ it; with z ⊥ the plane, x passes through the most atoms):
 * - z is the two-fold axis of C2, C2v and C2h; for Cs it is the normal of the mirror (the mirror is
 *   σ(xy), as in Cotton's Cs table); for D2 and D2h with a principal axis of order ≥ 3 (or a
 *   linear molecule) z is that axis and x the perpendicular two-fold axis through the most atoms;
 * - for D2 and D2h without one (full group D2, D2h, T, Td, Th, O, Oh, I, Ih): a planar molecule
 *   has x ⊥ its plane; then z is the axis through the most atoms, then x;
 * - for C2v the mirror plane holding more atoms is yz (for a planar molecule its own plane: water
 *   lies in yz, its out-of-plane p orbital is b1);
 * - remaining ties, and axes no rule fixes (x in C2, C2h, Cs; all axes of C1, Ci and single
 *   atoms), follow the input axes: z as close as possible to the input z, then x to the input x;
 *   each axis points to the positive side of its largest input component.
 * Equal counts use exact integer comparison; atoms count as on an axis or in a plane within the
 * tolerance.
 */
import { type AbelianGroupName, CHARACTER_TABLES, OPERATION_SIGNS, type OperationName } from './characterTables';
import type { ImageFinder, OperationMatch } from './images';
import { apply, cross, diagonalInFrame, distanceFromAxis, dot, frameMatrix, identity, perpendicularTowards, row, type Mat } from './linalg';
import { COARSE_FACTOR } from './search';
import type { IdealGroup } from './pointGroups';

export interface AbelianOperationMatch {
  readonly name: OperationName;
  readonly matrix: Mat;
  readonly match: OperationMatch;
}

export interface AbelianSubgroup {
  readonly group: AbelianGroupName;
  /** Rows: standard x, y, z in the input frame. */
  readonly frame: Mat;
  readonly operations: AbelianOperationMatch[];
}

interface Candidate {
  readonly x: Float64Array;
  readonly z: Float64Array;
  readonly score: readonly number[];
}

const INPUT_X = Float64Array.of(1, 0, 0);
const INPUT_Z = Float64Array.of(0, 0, 1);

function better(a: readonly number[], b: readonly number[]): boolean {
  for (let k = 0; k < a.length; k++) {
    if (Math.abs(a[k]! - b[k]!) > 1e-9) return a[k]! > b[k]!;
  }
  return false;
}

/** Points `v` to the positive side of its largest component. */
function signed(v: Float64Array): Float64Array {
  let k = 0;
  for (let c = 1; c < 3; c++) if (Math.abs(v[c]!) > Math.abs(v[k]!) + 1e-9) k = c;
  return v[k]! < 0 ? v.map((value) => -value) : v;
}

class Counter {
  constructor(
    private readonly coordinates: Float64Array,
    private readonly tolerance: number,
  ) {}

  get atoms(): number {
    return this.coordinates.length / 3;
  }

  onAxis(u: ArrayLike<number>): number {
    let count = 0;
    for (let i = 0; i < this.atoms; i++) {
      if (distanceFromAxis(this.coordinates.subarray(3 * i, 3 * i + 3), u) <= this.tolerance) count++;
    }
    return count;
  }

  inPlane(normal: ArrayLike<number>): number {
    let count = 0;
    for (let i = 0; i < this.atoms; i++) if (Math.abs(dot(this.coordinates.subarray(3 * i, 3 * i + 3), normal)) <= this.tolerance) count++;
    return count;
  }
}

const align = (v: ArrayLike<number>, axis: ArrayLike<number>) => Math.abs(dot(v, axis));

/** Directions at k·π/n from x in the x–y plane of the group frame, k = 0 … count − 1. */
function inPlaneDirections(frame: Mat, n: number, count: number): Float64Array[] {
  const x = row(frame, 0);
  const y = row(frame, 1);
  return Array.from({ length: count }, (_, k) => {
    const angle = (k * Math.PI) / n;
    return Float64Array.from([0, 1, 2], (c) => Math.cos(angle) * x[c]! + Math.sin(angle) * y[c]!);
  });
}

function pick(candidates: readonly Candidate[]): { x: Float64Array; z: Float64Array } {
  let best = candidates[0]!;
  for (const candidate of candidates) if (better(candidate.score, best.score)) best = candidate;
  return best;
}

function frameOf(choice: { x: Float64Array; z: Float64Array }): Mat {
  const z = signed(choice.z);
  const x = signed(choice.x);
  return frameMatrix(x, cross(z, x), z);
}

/** Three equivalent-rank perpendicular axes (one or more triples): Mulliken's rules as above. */
function fromTriples(triples: readonly (readonly Float64Array[])[], counter: Counter): Mat {
  const candidates: Candidate[] = [];
  for (const triple of triples) {
    for (let zi = 0; zi < 3; zi++) {
      for (let xi = 0; xi < 3; xi++) {
        if (xi === zi) continue;
        const z = triple[zi]!;
        const x = triple[xi]!;
        const planar = counter.inPlane(x) === counter.atoms ? 1 : 0;
        candidates.push({ x, z, score: [planar, counter.onAxis(z), counter.onAxis(x), align(z, INPUT_Z), align(x, INPUT_X)] });
      }
    }
  }
  return frameOf(pick(candidates));
}

/** z fixed, x ⊥ z chosen by the input axes. */
function alongInput(z: Float64Array): Mat {
  return frameOf({ z, x: perpendicularTowards(z, INPUT_X) });
}

/** A C2 (or C2h) axis among the perpendicular two-fold axes at k·π/n: through most atoms, then the input z. */
function perpendicularTwoFold(frame: Mat, n: number, counter: Counter): Float64Array {
  const candidates = inPlaneDirections(frame, n, n).map((z) => ({ z, x: perpendicularTowards(z, INPUT_X), score: [counter.onAxis(z), align(z, INPUT_Z)] }));
  return pick(candidates).z;
}

function chooseFrame(ideal: IdealGroup, counter: Counter): { group: AbelianGroupName; frame: Mat } {
  const { family, n } = ideal.id;
  const frame = ideal.frame;
  const X = row(frame, 0);
  const Y = row(frame, 1);
  const Z = row(frame, 2);
  const even = n % 2 === 0;
  const d2FromPrincipal = (): Mat => {
    // x: a perpendicular two-fold axis (at k·π/n) through the most atoms; y is then ⊥ both.
    const candidates = inPlaneDirections(frame, n, n).map((x) => ({ x, z: Z, score: [counter.onAxis(x), align(x, INPUT_X)] }));
    return frameOf(pick(candidates));
  };
  switch (family) {
    case 'C1':
      return { group: 'C1', frame: identity() };
    case 'Ci':
      return { group: 'Ci', frame: identity() };
    case 'Kh':
      return { group: 'D2h', frame: identity() };
    case 'Cs':
      return { group: 'Cs', frame: alongInput(Z) };
    case 'Cn':
      return even ? { group: 'C2', frame: alongInput(Z) } : { group: 'C1', frame: identity() };
    case 'S2n':
      return even ? { group: 'C2', frame: alongInput(Z) } : { group: 'Ci', frame: identity() };
    case 'Cnh':
      return { group: even ? 'C2h' : 'Cs', frame: alongInput(Z) };
    case 'Cnv': {
      if (!even) {
        const candidates = inPlaneDirections(frame, n, n).map((p) => {
          const normal = cross(Z, p);
          return { z: normal, x: perpendicularTowards(normal, INPUT_X), score: [counter.inPlane(normal), align(normal, INPUT_Z)] };
        });
        return { group: 'Cs', frame: frameOf(pick(candidates)) };
      }
      const candidates: Candidate[] = [];
      for (const p of inPlaneDirections(frame, n, n)) {
        // x is the normal of the yz plane; the mirror planes hold z and p.
        const x = cross(Z, p);
        candidates.push({ x, z: Z, score: [counter.inPlane(x), align(Z, INPUT_Z), align(x, INPUT_X)] });
      }
      return { group: 'C2v', frame: frameOf(pick(candidates)) };
    }
    case 'Dn':
      if (n === 2) return { group: 'D2', frame: fromTriples([[X, Y, Z]], counter) };
      return even ? { group: 'D2', frame: d2FromPrincipal() } : { group: 'C2', frame: alongInput(perpendicularTwoFold(frame, n, counter)) };
    case 'Dnd':
      return even ? { group: 'D2', frame: d2FromPrincipal() } : { group: 'C2h', frame: alongInput(perpendicularTwoFold(frame, n, counter)) };
    case 'Dnh': {
      if (n === 2) return { group: 'D2h', frame: fromTriples([[X, Y, Z]], counter) };
      if (even) return { group: 'D2h', frame: d2FromPrincipal() };
      // C2v: z a perpendicular two-fold axis; its mirrors are σh (normal Z) and the σv holding it.
      const candidates: Candidate[] = [];
      for (const z of inPlaneDirections(frame, n, n)) {
        for (const x of [Z, cross(Z, z)]) candidates.push({ x, z, score: [counter.onAxis(z), counter.inPlane(x), align(z, INPUT_Z), align(x, INPUT_X)] });
      }
      return { group: 'C2v', frame: frameOf(pick(candidates)) };
    }
    case 'T':
    case 'Td':
    case 'O':
      return { group: 'D2', frame: fromTriples([[X, Y, Z]], counter) };
    case 'Th':
    case 'Oh':
      return { group: 'D2h', frame: fromTriples([[X, Y, Z]], counter) };
    case 'I':
    case 'Ih': {
      // The five sets of three perpendicular C2 axes are carried into one another by a C5.
      const five = ideal.factors[3]!.matrix;
      const triples: Float64Array[][] = [];
      let current = [X, Y, Z];
      for (let k = 0; k < 5; k++) {
        triples.push(current);
        current = current.map((v) => apply(five, v));
      }
      return { group: family === 'I' ? 'D2' : 'D2h', frame: fromTriples(triples, counter) };
    }
    case 'C∞v':
      return { group: 'C2v', frame: alongInput(Z) };
    case 'D∞h':
      return { group: 'D2h', frame: alongInput(Z) };
  }
}

/**
 * Chooses the subgroup and frame, builds each operation as Aᵀ·D·A (A the frame, D its diagonal
 * signs) and finds the atom permutation it induces. Undefined if an operation does not map the
 * atoms onto themselves even at the coarse radius (which a consistent detection never produces).
 */
export function abelianSubgroup(ideal: IdealGroup, finder: ImageFinder, tolerance: number): AbelianSubgroup | undefined {
  const counter = new Counter(finder.coordinates, tolerance);
  const { group, frame } = chooseFrame(ideal, counter);
  const operations: AbelianOperationMatch[] = [];
  for (const name of CHARACTER_TABLES[group].operations) {
    const matrix = diagonalInFrame(frame, OPERATION_SIGNS[name]);
    const match = finder.match(matrix, tolerance) ?? finder.match(matrix, COARSE_FACTOR * tolerance);
    if (!match) return undefined;
    operations.push({ name, matrix, match });
  }
  return { group, frame, operations };
}
