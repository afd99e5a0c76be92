/**
 * Search for the symmetry elements of a non-linear set of atoms (coordinates relative to the
 * centre of mass): proper axes with their highest order, mirror planes, the inversion centre.
 *
 * Candidates come from geometry, not from a scan of directions:
 * - every operation fixes the centre of mass and maps atoms onto atoms of the same element at the
 *   same distance from it and with the same nearest- and second-nearest-neighbour distances, so
 *   atoms fall into classes by those invariants — for a symmetric top also by distance from the
 *   plane ⊥ the unique axis — and an atom's image lies in its class;
 * - with a reference atom a from the smallest class and a second atom b not collinear with a:
 *   an n-fold axis (n ≥ 3) either passes through a or is normal to the plane of a, C_n a and
 *   C_n⁻¹ a, an isosceles triangle with apex a; a two-fold axis u is along a + C2 a unless
 *   u ⊥ a, then along b + C2 b unless u ⊥ b too, then along a × b; a mirror normal is along
 *   a − σa unless a lies in the plane, then along b − σb, else along a × b.
 * The candidates are therefore few (a few per member of the smallest class), and each is tried
 * with a fast image look-up that usually rejects a wrong one on its first atoms.
 *
 * An asymmetric top (three distinct principal moments) has only two-fold axes and mirror normals
 * along its principal axes (each operation maps the inertia tensor onto itself, so it permutes
 * eigenvectors of distinct eigenvalues up to sign; Goldstein, Classical Mechanics, §5.4 — from
 * memory): only those three directions are tried.
 *
 * A candidate is first matched with a looser radius (3 × tolerance), its direction refined by
 * least squares over the matched pairs, and then matched again within the tolerance.
 *
 * Guards that bound the work on large, nearly symmetric-looking clusters (each a place where a
 * symmetry could in principle be missed): at most MAX_TRIANGLES isosceles candidates, and on a
 * class larger than RING_SCAN_LIMIT only the orders 2 to 6 are probed (see possibleOrders).
 */
import { cross, distanceFromAxis, dot, improperRotation, inversion, norm, normalized, reflection, rotation, row, topEigenvector, type Mat } from './linalg';
import type { ImageFinder, OperationMatch } from './images';
import type { PrincipalAxes } from './inertia';

export interface FoundAxis {
  readonly axis: Float64Array;
  /** Highest order found along this axis (≥ 2). */
  readonly order: number;
  readonly match: OperationMatch;
}

export interface FoundMirror {
  readonly normal: Float64Array;
  readonly match: OperationMatch;
}

export interface FoundElements {
  readonly axes: FoundAxis[];
  readonly mirrors: FoundMirror[];
  readonly inversion: OperationMatch | undefined;
}

export interface SearchContext {
  readonly coordinates: Float64Array;
  readonly atomicNumbers: Int32Array;
  readonly tolerance: number;
  readonly finder: ImageFinder;
  readonly principal: PrincipalAxes;
}

/** Matching radius of the first, coarse pass, in units of the tolerance (common practice, no source). */
export const COARSE_FACTOR = 3;

type Kind = 'rotation' | 'mirror' | 'improper';

function operationMatrix(kind: Kind, direction: ArrayLike<number>, order: number): Mat {
  if (kind === 'mirror') return reflection(direction);
  if (kind === 'improper') return improperRotation(direction, (2 * Math.PI) / order);
  return rotation(direction, (2 * Math.PI) / order);
}

/**
 * Least-squares direction of an element from its matched pairs (r, r′):
 * - a half-turn keeps s = r + r′ on the axis and d = r − r′ ⊥ it: top eigenvector of Σ s sᵀ − Σ d dᵀ;
 * - a mirror the reverse: top eigenvector of Σ d dᵀ − Σ s sᵀ;
 * - a rotation by θ ≠ π: Σ r × r′ = sin θ Σ ρ² u over whole orbits (the off-axis terms cancel).
 */
function refine(kind: Kind, order: number, coordinates: Float64Array, permutation: Int32Array, guess: Float64Array): Float64Array {
  const count = permutation.length;
  if (kind === 'rotation' && order > 2) {
    const sum = new Float64Array(3);
    for (let i = 0; i < count; i++) {
      const j = permutation[i]!;
      const c = cross(coordinates.subarray(3 * i, 3 * i + 3), coordinates.subarray(3 * j, 3 * j + 3));
      sum[0]! += c[0]!;
      sum[1]! += c[1]!;
      sum[2]! += c[2]!;
    }
    const u = normalized(sum, 1e-9);
    if (!u) return guess;
    return dot(u, guess) < 0 ? u.map((v) => -v) : u;
  }
  const m = new Float64Array(9);
  const sign = kind === 'mirror' ? -1 : 1;
  for (let i = 0; i < count; i++) {
    const j = permutation[i]!;
    for (let a = 0; a < 3; a++) {
      const sa = coordinates[3 * i + a]! + coordinates[3 * j + a]!;
      const da = coordinates[3 * i + a]! - coordinates[3 * j + a]!;
      for (let b = 0; b < 3; b++) {
        const sb = coordinates[3 * i + b]! + coordinates[3 * j + b]!;
        const db = coordinates[3 * i + b]! - coordinates[3 * j + b]!;
        m[3 * a + b]! += sign * (sa * sb - da * db);
      }
    }
  }
  const u = topEigenvector(m);
  if (!(Math.abs(dot(u, guess)) > 0.5)) return guess;
  return dot(u, guess) < 0 ? u.map((v) => -v) : u;
}

/** Tries an element: coarse match, refine its direction, match within the tolerance. */
export function confirmElement(context: SearchContext, kind: Kind, direction: Float64Array, order: number): { direction: Float64Array; match: OperationMatch } | undefined {
  const { finder, tolerance, coordinates } = context;
  const coarse = finder.match(operationMatrix(kind, direction, order), COARSE_FACTOR * tolerance);
  if (!coarse) return undefined;
  if (kind === 'improper') return coarse.deviation <= tolerance ? { direction, match: coarse } : undefined;
  const refined = refine(kind, order, coordinates, coarse.permutation, direction);
  const fine = finder.match(operationMatrix(kind, refined, order), tolerance);
  if (fine) return { direction: refined, match: fine };
  return coarse.deviation <= tolerance ? { direction, match: coarse } : undefined;
}

interface AtomClasses {
  readonly classOf: Int32Array;
  readonly members: Int32Array[];
}

/**
 * Groups atoms by invariants no symmetry operation changes: element, distance from the centre,
 * distances to the nearest and second-nearest neighbour and, given `axis`, |height| along it.
 * Each list of values is sorted and split wherever neighbours differ by more than `gap` (single
 * linkage), one invariant after another, so atoms whose invariants all agree within `gap` always
 * share a class.
 */
function classify(coordinates: Float64Array, atomicNumbers: Int32Array, gap: number, axis: Float64Array | undefined, neighbours: { first: Float64Array; second: Float64Array }): AtomClasses {
  const count = atomicNumbers.length;
  const keys: Float64Array[] = [new Float64Array(count), neighbours.first, neighbours.second];
  for (let i = 0; i < count; i++) {
    const x = coordinates[3 * i]!;
    const y = coordinates[3 * i + 1]!;
    const z = coordinates[3 * i + 2]!;
    keys[0]![i] = Math.sqrt(x * x + y * y + z * z);
  }
  if (axis) keys.push(Float64Array.from({ length: count }, (_, i) => Math.abs(coordinates[3 * i]! * axis[0]! + coordinates[3 * i + 1]! * axis[1]! + coordinates[3 * i + 2]! * axis[2]!)));
  // Start from one group per element, then split by each invariant in turn.
  const byElement = new Map<number, number[]>();
  for (let i = 0; i < count; i++) {
    const list = byElement.get(atomicNumbers[i]!);
    if (list) list.push(i);
    else byElement.set(atomicNumbers[i]!, [i]);
  }
  let groups = [...byElement.values()];
  for (const key of keys) {
    const next: number[][] = [];
    for (const group of groups) {
      group.sort((p, q) => key[p]! - key[q]!);
      let part: number[] = [group[0]!];
      for (let k = 1; k < group.length; k++) {
        if (key[group[k]!]! - key[group[k - 1]!]! > gap) {
          next.push(part);
          part = [];
        }
        part.push(group[k]!);
      }
      next.push(part);
    }
    groups = next;
  }
  const members = groups.map((group) => Int32Array.from(group).sort());
  const classOf = new Int32Array(count);
  members.forEach((list, c) => list.forEach((i) => (classOf[i] = c)));
  return { classOf, members };
}

/** Unit directions with duplicates (equal to about 0.001 rad, either sign) removed. */
class DirectionSet {
  readonly list: Float64Array[] = [];
  private readonly keys = new Set<string>();

  add(v: ArrayLike<number>, minimum = 1e-6): void {
    const u = normalized(v, minimum);
    if (!u) return;
    // Canonical sign: the largest component positive.
    let k = 0;
    for (let c = 1; c < 3; c++) if (Math.abs(u[c]!) > Math.abs(u[k]!)) k = c;
    if (u[k]! < 0) for (let c = 0; c < 3; c++) u[c] = -u[c]!;
    const key = `${Math.round(u[0]! * 1000)},${Math.round(u[1]! * 1000)},${Math.round(u[2]! * 1000)}`;
    if (this.keys.has(key)) return;
    this.keys.add(key);
    this.list.push(u);
  }
}

/** Neighbour distances beyond this (Å) count as equal (common practice, no source). */
const NEIGHBOUR_CAP = 2.5;

/** Largest number of isosceles-triangle candidates taken from one reference atom (a guard). */
const MAX_TRIANGLES = 20_000;

export function searchElements(context: SearchContext): FoundElements {
  const { coordinates, atomicNumbers, tolerance, principal } = context;
  const count = atomicNumbers.length;
  const found: { axes: FoundAxis[]; mirrors: FoundMirror[] } = { axes: [], mirrors: [] };
  const inversionMatch = context.finder.match(inversion(), tolerance);

  const axisCandidates = new DirectionSet();
  const mirrorCandidates = new DirectionSet();
  const unique = principal.kind === 'symmetric' ? row(principal.axes, principal.uniqueAxis) : undefined;
  // Principal axes are candidates only where they are defined: all three for an asymmetric top,
  // the unique one for a symmetric top (a degenerate pair's eigenvectors are arbitrary).
  if (principal.kind === 'asymmetric') {
    for (let k = 0; k < 3; k++) {
      axisCandidates.add(row(principal.axes, k));
      mirrorCandidates.add(row(principal.axes, k));
    }
  } else if (unique) {
    axisCandidates.add(unique);
    mirrorCandidates.add(unique);
  }
  // Reference atoms and their classes (only needed for symmetric and spherical tops).
  let classes: AtomClasses | undefined;
  let a = -1;
  let b = -1;
  // Partners within the tolerance differ by at most 2·tolerance in every invariant; a little slack
  // covers the shift of the centre of mass.
  const gap = 2.5 * tolerance;
  if (principal.kind !== 'asymmetric') {
    classes = classify(coordinates, atomicNumbers, gap, unique, context.finder.neighbourDistances(NEIGHBOUR_CAP));
    const radiusOf = (i: number) => norm(coordinates.subarray(3 * i, 3 * i + 3));
    const offCentre = classes.members.filter((list) => radiusOf(list[0]!) > gap);
    offCentre.sort((p, q) => p.length - q.length || radiusOf(q[0]!) - radiusOf(p[0]!));
    a = offCentre[0]?.[0] ?? -1;
    if (a >= 0) {
      const ra = coordinates.subarray(3 * a, 3 * a + 3);
      const sine = (i: number) => norm(cross(ra, coordinates.subarray(3 * i, 3 * i + 3))) / (norm(ra) * Math.max(radiusOf(i), 1e-12));
      for (const list of offCentre) {
        for (const i of list) if (sine(i) > 0.2 && (b < 0 || sine(i) > sine(b))) b = i;
        if (b >= 0) break;
      }
      if (b < 0) for (let i = 0; i < count; i++) if (radiusOf(i) > gap && (b < 0 || sine(i) > sine(b))) b = i;
    }
  }

  if (classes && a >= 0) {
    const ra = coordinates.slice(3 * a, 3 * a + 3);
    axisCandidates.add(ra);
    const classA = classes.members[classes.classOf[a]!]!;
    for (const c of classA) {
      const rc = coordinates.subarray(3 * c, 3 * c + 3);
      axisCandidates.add([ra[0]! + rc[0]!, ra[1]! + rc[1]!, ra[2]! + rc[2]!]);
      if (c !== a) mirrorCandidates.add([ra[0]! - rc[0]!, ra[1]! - rc[1]!, ra[2]! - rc[2]!]);
    }
    if (b >= 0) {
      const rb = coordinates.slice(3 * b, 3 * b + 3);
      axisCandidates.add(rb);
      axisCandidates.add(cross(ra, rb));
      mirrorCandidates.add(cross(ra, rb));
      for (const c of classes.members[classes.classOf[b]!]!) {
        const rc = coordinates.subarray(3 * c, 3 * c + 3);
        axisCandidates.add([rb[0]! + rc[0]!, rb[1]! + rc[1]!, rb[2]! + rc[2]!]);
        if (c !== b) mirrorCandidates.add([rb[0]! - rc[0]!, rb[1]! - rc[1]!, rb[2]! - rc[2]!]);
      }
    }
    // Isosceles triangles with apex a: pairs of class members at equal distance from a.
    const others = Array.from(classA).filter((c) => c !== a);
    const distance = new Map<number, number>();
    for (const c of others) distance.set(c, norm([coordinates[3 * c]! - ra[0]!, coordinates[3 * c + 1]! - ra[1]!, coordinates[3 * c + 2]! - ra[2]!]));
    others.sort((p, q) => distance.get(p)! - distance.get(q)!);
    let triangles = 0;
    for (let start = 0; start < others.length && triangles < MAX_TRIANGLES; ) {
      let end = start + 1;
      while (end < others.length && distance.get(others[end]!)! - distance.get(others[end - 1]!)! <= gap) end++;
      for (let p = start; p < end && triangles < MAX_TRIANGLES; p++) {
        for (let q = p + 1; q < end && triangles < MAX_TRIANGLES; q++) {
          const c1 = others[p]!;
          const c2 = others[q]!;
          const u = [coordinates[3 * c1]! - ra[0]!, coordinates[3 * c1 + 1]! - ra[1]!, coordinates[3 * c1 + 2]! - ra[2]!];
          const v = [coordinates[3 * c2]! - ra[0]!, coordinates[3 * c2 + 1]! - ra[1]!, coordinates[3 * c2 + 2]! - ra[2]!];
          axisCandidates.add(cross(u, v));
          triangles++;
        }
      }
      start = end;
    }
  }

  // A symmetric top's elements are along its unique axis or perpendicular to it.
  const allowed = (u: Float64Array, isUnique: boolean) => !unique || isUnique || Math.abs(dot(u, unique)) < 0.3;

  const sameAxis = (u: Float64Array, v: Float64Array) => Math.abs(dot(u, v)) > 0.9995;
  for (const candidate of axisCandidates.list) {
    const isUnique = unique !== undefined && Math.abs(dot(candidate, unique)) > 0.999;
    if (!allowed(candidate, isUnique)) continue;
    if (found.axes.some((axis) => sameAxis(axis.axis, candidate))) continue;
    const orders = principal.kind === 'asymmetric' || (unique && !isUnique) ? [2] : possibleOrders(context, classes!, candidate, a, b, gap);
    for (const order of orders) {
      const confirmed = confirmElement(context, 'rotation', candidate, order);
      if (confirmed) {
        if (!found.axes.some((axis) => sameAxis(axis.axis, confirmed.direction))) found.axes.push({ axis: confirmed.direction, order, match: confirmed.match });
        break;
      }
    }
  }
  for (const candidate of mirrorCandidates.list) {
    const isUnique = unique !== undefined && Math.abs(dot(candidate, unique)) > 0.999;
    if (!allowed(candidate, isUnique)) continue;
    if (found.mirrors.some((mirror) => sameAxis(mirror.normal, candidate))) continue;
    const confirmed = confirmElement(context, 'mirror', candidate, 2);
    if (confirmed && !found.mirrors.some((mirror) => sameAxis(mirror.normal, confirmed.direction))) found.mirrors.push({ normal: confirmed.direction, match: confirmed.match });
  }
  return { axes: found.axes, mirrors: found.mirrors, inversion: inversionMatch };
}

/** Classes larger than this get probed orders instead of a scan of the ring (a guard). */
const RING_SCAN_LIMIT = 64;
/** Orders probed on such classes: those of the cubic and icosahedral groups, and 6. */
const PROBED_ORDERS = [6, 5, 4, 3, 2];

/**
 * Orders an axis might have, highest first: the angles, seen along the axis, between a reference
 * atom off the axis and the atoms of its class at the same height and distance from the axis.
 * C_n sends the atom to one of them at exactly 2π/n. For a class larger than RING_SCAN_LIMIT
 * the orders 6, 5, 4, 3, 2 are probed instead (one look-up each); a spherical top (the only kind
 * that gets here with a large class besides a symmetric top's unique axis) has axes of order
 * 2 to 5 unless its moments are equal by accident, so an order above 6 on a large class of such
 * an accidental spherical top is the one thing this can miss.
 */
function possibleOrders(context: SearchContext, classes: AtomClasses, axis: Float64Array, a: number, b: number, gap: number): number[] {
  const { coordinates, tolerance } = context;
  const window = gap + COARSE_FACTOR * tolerance;
  const offAxis = (i: number) => (i < 0 ? -1 : distanceFromAxis(coordinates.subarray(3 * i, 3 * i + 3), axis));
  const reference = offAxis(a) > window ? a : offAxis(b) > window ? b : -1;
  if (reference < 0) return [];
  const members = classes.members[classes.classOf[reference]!]!;
  const r = coordinates.subarray(3 * reference, 3 * reference + 3);
  const isUniqueAxis = context.principal.kind === 'symmetric';
  if (members.length > RING_SCAN_LIMIT && !isUniqueAxis) {
    const element = context.atomicNumbers[reference]!;
    return PROBED_ORDERS.filter((n) => {
      const image = rotationImage(axis, (2 * Math.PI) / n, r);
      return context.finder.hasAtomNear(element, image[0]!, image[1]!, image[2]!, COARSE_FACTOR * tolerance);
    });
  }
  const h = dot(r, axis);
  const rho = offAxis(reference);
  const e1 = normalized([r[0]! - h * axis[0]!, r[1]! - h * axis[1]!, r[2]! - h * axis[2]!])!;
  const e2 = cross(axis, e1);
  const orders = new Set<number>();
  for (const c of members) {
    if (c === reference) continue;
    const x = coordinates[3 * c]!;
    const y = coordinates[3 * c + 1]!;
    const z = coordinates[3 * c + 2]!;
    const hc = x * axis[0]! + y * axis[1]! + z * axis[2]!;
    if (Math.abs(hc - h) > window) continue;
    const px = x - hc * axis[0]!;
    const py = y - hc * axis[1]!;
    const pz = z - hc * axis[2]!;
    if (Math.abs(Math.sqrt(px * px + py * py + pz * pz) - rho) > window) continue;
    const angle = Math.abs(Math.atan2(px * e2[0]! + py * e2[1]! + pz * e2[2]!, px * e1[0]! + py * e1[1]! + pz * e1[2]!));
    if (angle * rho < window) continue;
    const n = Math.round((2 * Math.PI) / angle);
    if (n >= 2 && Math.abs(angle - (2 * Math.PI) / n) * rho <= window) orders.add(n);
  }
  return [...orders].sort((p, q) => q - p);
}

function rotationImage(axis: Float64Array, angle: number, r: ArrayLike<number>): Float64Array {
  const m = rotation(axis, angle);
  return Float64Array.of(m[0]! * r[0]! + m[1]! * r[1]! + m[2]! * r[2]!, m[3]! * r[0]! + m[4]! * r[1]! + m[5]! * r[2]!, m[6]! * r[0]! + m[7]! * r[1]! + m[8]! * r[2]!);
}

/** Tries the improper rotation S_order about `axis` (used to tell S2n from Cn). */
export function hasImproperAxis(context: SearchContext, axis: Float64Array, order: number): OperationMatch | undefined {
  return confirmElement(context, 'improper', axis, order)?.match;
}

