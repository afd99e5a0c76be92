/**
 * Geometry analysis over coordinates in ångström: neighbour search on a uniform grid (linear in
 * the number of atoms for ordinary densities), bonds, clashes, and a units sanity check.
 */
export interface AtomPair {
  readonly i: number;
  readonly j: number;
  readonly distance: number;
}

/** Bond test: distance below the sum of covalent radii times this factor (common practice, no source). */
export const BOND_TOLERANCE_FACTOR = 1.2;
/** Atoms closer than this are almost certainly a typing mistake (common practice, no source). */
export const CLASH_DISTANCE = 0.5;

export function distance(coords: ArrayLike<number>, i: number, j: number): number {
  const dx = coords[3 * i]! - coords[3 * j]!;
  const dy = coords[3 * i + 1]! - coords[3 * j + 1]!;
  const dz = coords[3 * i + 2]! - coords[3 * j + 2]!;
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/** Buckets atoms into cubic cells of a given edge; pairs closer than the edge sit in adjacent cells. */
export class NeighbourGrid {
  private readonly cells = new Map<number, number[]>();
  private readonly cellSize: number;
  private readonly origin: [number, number, number];
  private readonly dims: [number, number, number];

  constructor(
    private readonly coords: ArrayLike<number>,
    cellSize: number,
  ) {
    const count = coords.length / 3;
    const min: [number, number, number] = [Infinity, Infinity, Infinity];
    const max: [number, number, number] = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < count; i++) {
      for (let k = 0; k < 3; k++) {
        const value = coords[3 * i + k]!;
        if (value < min[k]!) min[k] = value;
        if (value > max[k]!) max[k] = value;
      }
    }
    if (count === 0) {
      min.fill(0);
      max.fill(0);
    }
    // Keep the number of cells per axis bounded so that far-flung atoms cannot blow up the keys.
    const extent = Math.max(max[0] - min[0], max[1] - min[1], max[2] - min[2]);
    this.cellSize = Math.max(cellSize, extent / 100_000, 1e-9);
    this.origin = min;
    this.dims = [0, 1, 2].map((k) => Math.floor((max[k]! - min[k]!) / this.cellSize) + 1) as [number, number, number];
    for (let i = 0; i < count; i++) {
      const key = this.keyOf(this.cellIndex(i, 0), this.cellIndex(i, 1), this.cellIndex(i, 2));
      const bucket = this.cells.get(key);
      if (bucket) bucket.push(i);
      else this.cells.set(key, [i]);
    }
  }

  private cellIndex(atom: number, axis: number): number {
    return Math.floor((this.coords[3 * atom + axis]! - this.origin[axis]!) / this.cellSize);
  }

  private keyOf(x: number, y: number, z: number): number {
    return x + this.dims[0] * (y + this.dims[1] * z);
  }

  /** Calls `visit` once for every unordered pair closer than `cutoff` (cutoff <= cell size). */
  forEachPairWithin(cutoff: number, visit: (i: number, j: number, distance: number) => void): void {
    const cutoffSquared = cutoff * cutoff;
    const coords = this.coords;
    const [nx, ny, nz] = this.dims;
    for (const [key, bucket] of this.cells) {
      const x = key % nx;
      const y = Math.floor(key / nx) % ny;
      const z = Math.floor(key / (nx * ny));
      for (let dz = -1; dz <= 1; dz++) {
        for (let dy = -1; dy <= 1; dy++) {
          for (let dx = -1; dx <= 1; dx++) {
            const cx = x + dx;
            const cy = y + dy;
            const cz = z + dz;
            if (cx < 0 || cy < 0 || cz < 0 || cx >= nx || cy >= ny || cz >= nz) continue;
            const otherKey = this.keyOf(cx, cy, cz);
            if (otherKey < key) continue;
            const other = this.cells.get(otherKey);
            if (!other) continue;
            const same = otherKey === key;
            for (let a = 0; a < bucket.length; a++) {
              const i = bucket[a]!;
              const xi = coords[3 * i]!;
              const yi = coords[3 * i + 1]!;
              const zi = coords[3 * i + 2]!;
              for (let b = same ? a + 1 : 0; b < other.length; b++) {
                const j = other[b]!;
                const ddx = xi - coords[3 * j]!;
                const ddy = yi - coords[3 * j + 1]!;
                const ddz = zi - coords[3 * j + 2]!;
                const squared = ddx * ddx + ddy * ddy + ddz * ddz;
                if (squared < cutoffSquared) visit(Math.min(i, j), Math.max(i, j), Math.sqrt(squared));
              }
            }
          }
        }
      }
    }
  }

  /** Atoms within `radius` of atom `i` (radius <= cell size), excluding `i` itself. */
  neighboursOf(i: number, radius: number): AtomPair[] {
    const found: AtomPair[] = [];
    const cx = this.cellIndex(i, 0);
    const cy = this.cellIndex(i, 1);
    const cz = this.cellIndex(i, 2);
    const reach = Math.ceil(radius / this.cellSize);
    for (let dz = -reach; dz <= reach; dz++) {
      for (let dy = -reach; dy <= reach; dy++) {
        for (let dx = -reach; dx <= reach; dx++) {
          const x = cx + dx;
          const y = cy + dy;
          const z = cz + dz;
          if (x < 0 || y < 0 || z < 0 || x >= this.dims[0] || y >= this.dims[1] || z >= this.dims[2]) continue;
          for (const j of this.cells.get(this.keyOf(x, y, z)) ?? []) {
            if (j === i) continue;
            const d = distance(this.coords, i, j);
            if (d <= radius) found.push({ i, j, distance: d });
          }
        }
      }
    }
    return found.sort((a, b) => a.distance - b.distance);
  }
}

export interface ContactAnalysis {
  readonly bonds: AtomPair[];
  readonly clashes: AtomPair[];
  /** Per atom: distance to its nearest neighbour within the search cutoff, or Infinity. */
  readonly nearestDistance: Float64Array;
  /** Per atom: index of that nearest neighbour, or -1. */
  readonly nearestAtom: Int32Array;
}

/**
 * One pass over near pairs finds bonds (d < factor × (r_i + r_j)), clashes (d < CLASH_DISTANCE)
 * and each atom's nearest neighbour within the largest bond cutoff.
 */
export function analyseContacts(coords: ArrayLike<number>, radii: ArrayLike<number>): ContactAnalysis {
  const count = radii.length;
  let maxRadius = 0;
  for (let i = 0; i < count; i++) maxRadius = Math.max(maxRadius, radii[i]!);
  const cutoff = Math.max(2 * maxRadius * BOND_TOLERANCE_FACTOR, CLASH_DISTANCE, 1e-6);
  const grid = new NeighbourGrid(coords, cutoff);
  const bonds: AtomPair[] = [];
  const clashes: AtomPair[] = [];
  const nearestDistance = new Float64Array(count).fill(Infinity);
  const nearestAtom = new Int32Array(count).fill(-1);
  grid.forEachPairWithin(cutoff, (i, j, d) => {
    if (d < CLASH_DISTANCE) clashes.push({ i, j, distance: d });
    if (d < BOND_TOLERANCE_FACTOR * (radii[i]! + radii[j]!)) bonds.push({ i, j, distance: d });
    if (d < nearestDistance[i]!) {
      nearestDistance[i] = d;
      nearestAtom[i] = j;
    }
    if (d < nearestDistance[j]!) {
      nearestDistance[j] = d;
      nearestAtom[j] = i;
    }
  });
  const byAtoms = (a: AtomPair, b: AtomPair) => a.i - b.i || a.j - b.j;
  return { bonds: bonds.sort(byAtoms), clashes: clashes.sort(byAtoms), nearestDistance, nearestAtom };
}

export interface UnitsSuspicion {
  /** The unit the coordinates look like they were typed in. */
  readonly looksLike: 'bohr' | 'angstrom';
  /** Median of nearest-neighbour distance over the sum of covalent radii. */
  readonly medianRatio: number;
  readonly atomsConsidered: number;
}

/**
 * Distances that suggest the wrong unit (a heuristic; common practice, no source). Every atom's
 * nearest neighbour is compared with the sum of their covalent radii: in a sensible structure the
 * median ratio is near 1; coordinates typed in bohr but read as ångström give about 1.89
 * (1/0.529), and the reverse about 0.53. A structure with ordinary bonds for at least half its
 * atoms is taken as typed in the declared unit and not searched further.
 */
export function suspectUnits(
  coords: ArrayLike<number>,
  radii: ArrayLike<number>,
  declared: 'angstrom' | 'bohr',
  contacts: ContactAnalysis,
): UnitsSuspicion | undefined {
  const count = radii.length;
  if (count < 2) return undefined;
  let nearest = contacts.nearestDistance;
  let partner = contacts.nearestAtom;
  if (declared === 'angstrom') {
    if (contacts.bonds.length >= count / 2) return undefined;
    let maxRadius = 0;
    for (let i = 0; i < count; i++) maxRadius = Math.max(maxRadius, radii[i]!);
    const cutoff = 2 * maxRadius * 2.5;
    nearest = new Float64Array(count).fill(Infinity);
    partner = new Int32Array(count).fill(-1);
    new NeighbourGrid(coords, cutoff).forEachPairWithin(cutoff, (i, j, d) => {
      if (d < nearest[i]!) {
        nearest[i] = d;
        partner[i] = j;
      }
      if (d < nearest[j]!) {
        nearest[j] = d;
        partner[j] = i;
      }
    });
  }
  const ratios: number[] = [];
  for (let i = 0; i < count; i++) {
    const j = partner[i]!;
    if (j >= 0) ratios.push(nearest[i]! / (radii[i]! + radii[j]!));
  }
  if (ratios.length < 2) return undefined;
  ratios.sort((a, b) => a - b);
  const median = ratios[Math.floor(ratios.length / 2)]!;
  if (declared === 'angstrom' && median > 1.5 && median < 2.5) {
    return { looksLike: 'bohr', medianRatio: median, atomsConsidered: ratios.length };
  }
  if (declared === 'bohr' && median > 0.35 && median < 0.66) {
    return { looksLike: 'angstrom', medianRatio: median, atomsConsidered: ratios.length };
  }
  return undefined;
}
