/**
 * Point-group detection for a geometry: the full Schoenflies group, the sets of symmetry-equivalent
 * atoms, the largest D2h-type subgroup with its operations in a standard frame, and near symmetry.
 *
 * Tolerance: an operation is a symmetry when every atom's image lies within `tolerance` of an atom
 * of the same element. The default, 0.01 Å, passes coordinates printed with three or four decimals
 * and geometries converged by an optimiser that kept the symmetry, and refuses real distortions of
 * a few hundredths of an ångström (common practice, no source). Near symmetry is looked for up to
 * `nearTolerance` (default 0.1 Å).
 *
 * Conventions:
 * - centre of mass and inertia from standard atomic weights (elements.ts);
 * - linear molecules (every atom within tolerance/2 of one line, so that a half-turn about it moves
 *   no atom more than the tolerance) are C∞v or D∞h, with abelian subgroups C2v and D2h, z along
 *   the molecular axis;
 * - a single atom is reported as Kh, the full rotation–reflection group O(3) (order null, like the
 *   linear groups), with abelian subgroup D2h in the input axes;
 * - no atoms: C1.
 *
 * The reported group's operations are built exactly (pointGroups.ts) in a frame fitted to the
 * elements found, then matched against the atoms again; should that fail even at three times the
 * tolerance (possible only for a geometry right at the edge of the tolerance), the result falls
 * back to C1 rather than report operations that do not map the atoms onto themselves.
 */
import { coordinatesInRange } from '../geometry';
import { abelianSubgroup, type AbelianSubgroup } from './abelian';
import type { AbelianGroupName, OperationName } from './characterTables';
import { classifyElements } from './classify';
import { ImageFinder, type OperationMatch } from './images';
import { centreOfMass, centred, massesOf, principalAxes } from './inertia';
import { distanceFromAxis, dot, identity, perpendicularTowards, row, toMatrix3, toVec3, type Mat, type Matrix3, type Vec3 } from './linalg';
import { frameFrom, groupRank, idealGroup, type GroupFamily, type IdealGroup, type PointGroupId } from './pointGroups';
import { COARSE_FACTOR, searchElements } from './search';

/** Default tolerance, Å (see the file header). */
export const DEFAULT_TOLERANCE = 0.01;
/** Default loosest tolerance for near symmetry, Å. */
export const DEFAULT_NEAR_TOLERANCE = 0.1;

export interface SymmetryOperation {
  readonly name: OperationName;
  /** Acts on coordinates relative to frame.origin, in the input axes: r′ = origin + M·(r − origin). */
  readonly matrix: Matrix3;
  /** permutation[i] = j: the operation moves atom i onto the place of atom j. */
  readonly permutation: readonly number[];
}

export interface SymmetryFrame {
  /** Centre of mass, Å, input frame. */
  readonly origin: Vec3;
  /** Rows: the standard x, y, z axes as unit vectors in the input frame. */
  readonly axes: Matrix3;
}

/** One cyclic factor of the full group: every element is a product of powers of the factors. */
export interface GroupGenerator {
  readonly matrix: Matrix3;
  readonly order: number;
  readonly permutation: readonly number[];
}

/** The full group's exact operations, for symmetrize(). */
export interface GroupDescription {
  readonly name: string;
  readonly family: GroupFamily;
  readonly n: number;
  readonly order: number | null;
  /** Rows: the group's own axes (z principal); for linear molecules z is the molecular axis. */
  readonly axes: Matrix3;
  readonly generators: readonly GroupGenerator[];
  readonly linear: boolean;
}

export interface NearSymmetry {
  readonly group: string;
  /** Largest distance between an atom's image and its partner in that group, Å. */
  readonly within: number;
  /** The tolerance at which it was found. */
  readonly tolerance: number;
  readonly description: GroupDescription;
}

export interface SymmetryResult {
  readonly fullGroup: string;
  /** Number of operations of the full group; null for C∞v, D∞h and Kh. */
  readonly order: number | null;
  readonly abelianGroup: AbelianGroupName;
  readonly abelianOperations: readonly SymmetryOperation[];
  readonly frame: SymmetryFrame;
  /** Orbits of the full group: sorted lists of atom indices, ordered by their first atom. */
  readonly equivalentSets: number[][];
  readonly tolerance: number;
  /** Largest distance between an atom's image and its partner over the operations checked, Å. */
  readonly maxDeviation: number;
  /** A higher group within nearTolerance, when there is one. */
  readonly nearGroup?: NearSymmetry;
  readonly description: GroupDescription;
}

export interface SymmetryOptions {
  /** Å; default 0.01. */
  readonly tolerance?: number;
  /** Å; default 0.1; 0 (or anything ≤ tolerance) turns the near-symmetry search off. */
  readonly nearTolerance?: number;
  /**
   * Labels that must be preserved, one per atom (default: the atomic numbers): an operation counts
   * only when it maps every atom onto one with the same label. Labelling the atoms of a subset
   * apart from the rest gives the operations that map the subset onto itself (its stabiliser).
   */
  readonly species?: ArrayLike<number>;
  /** Masses for the centre and the inertia tensor, one per atom (default: standard atomic weights). */
  readonly masses?: ArrayLike<number>;
}

interface Detection {
  readonly ideal: IdealGroup;
  readonly linear: boolean;
  readonly factorMatches: OperationMatch[];
  readonly abelian: AbelianSubgroup;
  readonly maxDeviation: number;
}

function unionFind(count: number): { union: (a: number, b: number) => void; find: (a: number) => number } {
  const parent = Int32Array.from({ length: count }, (_, i) => i);
  const find = (a: number): number => {
    while (parent[a] !== a) {
      parent[a] = parent[parent[a]!]!;
      a = parent[a]!;
    }
    return a;
  };
  return { union: (a, b) => void (parent[find(a)] = find(b)), find };
}

/** The group at one tolerance; coordinates relative to the centre of mass. */
function detectAt(coordinates: Float64Array, atomicNumbers: Int32Array, masses: Float64Array, tolerance: number): Detection {
  const count = atomicNumbers.length;
  const finder = new ImageFinder(coordinates, atomicNumbers, COARSE_FACTOR * tolerance);
  const fallback = (id: PointGroupId, frame: Mat, linear: boolean, extraDeviation: number, fiveFold?: Float64Array): Detection | undefined => {
    const ideal = idealGroup(id, frame, fiveFold);
    const factorMatches: OperationMatch[] = [];
    for (const factor of ideal.factors) {
      const match = finder.match(factor.matrix, tolerance) ?? finder.match(factor.matrix, COARSE_FACTOR * tolerance);
      if (!match) return undefined;
      factorMatches.push(match);
    }
    const abelian = abelianSubgroup(ideal, finder, tolerance);
    if (!abelian) return undefined;
    let maxDeviation = extraDeviation;
    for (const match of factorMatches) maxDeviation = Math.max(maxDeviation, match.deviation);
    for (const operation of abelian.operations) maxDeviation = Math.max(maxDeviation, operation.match.deviation);
    return { ideal, linear, factorMatches, abelian, maxDeviation };
  };
  const trivial = () => fallback({ family: 'C1', n: 1 }, identity(), false, 0)!;

  if (count === 0) return trivial();
  if (count === 1) return fallback({ family: 'Kh', n: 1 }, identity(), false, 0) ?? trivial();

  const principal = principalAxes(coordinates, masses, tolerance);
  // Linear: every atom near the axis of the smallest moment.
  const line = lineThroughCentre(coordinates, masses, row(principal.axes, 0));
  let farthest = 0;
  for (let i = 0; i < count; i++) {
    farthest = Math.max(farthest, distanceFromAxis(coordinates.subarray(3 * i, 3 * i + 3), line));
  }
  if (2 * farthest <= tolerance) {
    const inverted = finder.match(Float64Array.of(-1, 0, 0, 0, -1, 0, 0, 0, -1), tolerance);
    const frame = frameFrom(line, perpendicularTowards(line, [1, 0, 0]));
    const detection = fallback({ family: inverted ? 'D∞h' : 'C∞v', n: 1 }, frame, true, 2 * farthest);
    if (detection) return detection;
  }

  const context = { coordinates, atomicNumbers, tolerance, finder, principal };
  const found = searchElements(context);
  const classification = classifyElements(found, context);
  return fallback(classification.id, classification.frame, false, 0, classification.fiveFoldAxis) ?? trivial();
}

/**
 * The axis of least moment, polished by two steps of power iteration on Σ m r rᵀ (whose top
 * eigenvector it is): for a linear molecule that matrix has rank one, so one step gives the axis
 * to rounding error, while the eigen-solver's vector of a degenerate pair may be less precise.
 */
function lineThroughCentre(coordinates: Float64Array, masses: Float64Array, guess: Float64Array): Float64Array {
  let u = guess;
  for (let step = 0; step < 2; step++) {
    const next = new Float64Array(3);
    for (let i = 0; i < masses.length; i++) {
      const r = coordinates.subarray(3 * i, 3 * i + 3);
      const weight = masses[i]! * dot(r, u);
      for (let c = 0; c < 3; c++) next[c]! += weight * r[c]!;
    }
    const length = Math.hypot(next[0]!, next[1]!, next[2]!);
    if (!(length > 0)) return u;
    u = next.map((value) => value / length);
  }
  return u;
}

function describe(detection: Detection): GroupDescription {
  const { ideal } = detection;
  return {
    name: ideal.name,
    family: ideal.id.family,
    n: ideal.id.n,
    order: ideal.order,
    axes: toMatrix3(ideal.frame),
    generators: ideal.factors.map((factor, k) => ({ matrix: toMatrix3(factor.matrix), order: factor.order, permutation: Array.from(detection.factorMatches[k]!.permutation) })),
    linear: detection.linear,
  };
}

/**
 * C1 without a search: what detectSymmetry answers for coordinates it cannot work with (not finite,
 * or beyond ±COORDINATE_LIMIT, where squared distances overflow or lose all precision).
 */
function withoutSymmetry(count: number, coordinates: ArrayLike<number>, masses: Float64Array, tolerance: number): SymmetryResult {
  const axes = toMatrix3(identity());
  const permutation = Array.from({ length: count }, (_, i) => i);
  const centre = centreOfMass(coordinates, masses);
  const origin: Vec3 = centre.every((value) => Number.isFinite(value)) ? toVec3(centre) : [0, 0, 0];
  return {
    fullGroup: 'C1',
    order: 1,
    abelianGroup: 'C1',
    abelianOperations: [{ name: 'E', matrix: axes, permutation }],
    frame: { origin, axes },
    equivalentSets: permutation.map((i) => [i]),
    tolerance,
    maxDeviation: 0,
    description: { name: 'C1', family: 'C1', n: 1, order: 1, axes, generators: [], linear: false },
  };
}

/**
 * Detects the point group of atoms given by atomic number and coordinates (flat x, y, z per atom,
 * Å). Total: coordinates that are not finite or lie beyond ±COORDINATE_LIMIT give C1 without a
 * search (the checks report them), and so does any failure of the search itself.
 */
export function detectSymmetry(atomicNumbers: ArrayLike<number>, coordinates: ArrayLike<number>, options: SymmetryOptions = {}): SymmetryResult {
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  const count = atomicNumbers.length;
  const masses = options.masses ? Float64Array.from(options.masses) : massesOf(Int32Array.from(atomicNumbers));
  for (let i = 0; i < count; i++) {
    if (!coordinatesInRange(coordinates, i)) return withoutSymmetry(count, coordinates, masses, tolerance);
  }
  try {
    return searchSymmetry(atomicNumbers, coordinates, options);
  } catch {
    return withoutSymmetry(count, coordinates, masses, tolerance);
  }
}

function searchSymmetry(atomicNumbers: ArrayLike<number>, coordinates: ArrayLike<number>, options: SymmetryOptions): SymmetryResult {
  const tolerance = options.tolerance ?? DEFAULT_TOLERANCE;
  const nearTolerance = options.nearTolerance ?? DEFAULT_NEAR_TOLERANCE;
  const count = atomicNumbers.length;
  const numbers = Int32Array.from(options.species ?? atomicNumbers);
  const masses = options.masses ? Float64Array.from(options.masses) : massesOf(Int32Array.from(atomicNumbers));
  const origin = centreOfMass(coordinates, masses);
  const local = centred(coordinates, origin);
  const detection = detectAt(local, numbers, masses, tolerance);

  const sets = unionFind(count);
  for (const match of detection.factorMatches) for (let i = 0; i < count; i++) sets.union(i, match.permutation[i]!);
  const byRoot = new Map<number, number[]>();
  for (let i = 0; i < count; i++) {
    const root = sets.find(i);
    const list = byRoot.get(root);
    if (list) list.push(i);
    else byRoot.set(root, [i]);
  }
  const equivalentSets = [...byRoot.values()].sort((a, b) => a[0]! - b[0]!);

  let nearGroup: NearSymmetry | undefined;
  if (nearTolerance > tolerance && count > 1) {
    const loose = detectAt(local, numbers, masses, nearTolerance);
    if (groupRank(loose.ideal.id) > groupRank(detection.ideal.id)) {
      nearGroup = { group: loose.ideal.name, within: loose.maxDeviation, tolerance: nearTolerance, description: describe(loose) };
    }
  }

  const abelian = detection.abelian;
  const result: SymmetryResult = {
    fullGroup: detection.ideal.name,
    order: detection.ideal.order,
    abelianGroup: abelian.group,
    abelianOperations: abelian.operations.map((operation) => ({ name: operation.name, matrix: toMatrix3(operation.matrix), permutation: Array.from(operation.match.permutation) })),
    frame: { origin: toVec3(origin), axes: toMatrix3(abelian.frame) },
    equivalentSets,
    tolerance,
    maxDeviation: detection.maxDeviation,
    description: describe(detection),
  };
  return nearGroup ? { ...result, nearGroup } : result;
}

