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
/**
 * Largest coordinate magnitude accepted, Å: 100,000 Å is 10 µm, far beyond any molecule or
 * cluster, and small enough that squared distances stay exact to well below a bond length.
 * Atoms beyond it (or with a non-finite coordinate) are left out of the neighbour search and the
 * symmetry search; the checks report them.
 */
export const COORDINATE_LIMIT = 1e5;

/** Whether atom i's coordinates are finite and within ±COORDINATE_LIMIT Å. */
export function coordinatesInRange(coords: ArrayLike<number>, i: number): boolean {
  for (let axis = 0; axis < 3; axis++) {
    const value = coords[3 * i + axis]!;
    if (!(Math.abs(value) <= COORDINATE_LIMIT)) return false;
  }
  return true;
}

export function distance(coords: ArrayLike<number>, i: number, j: number): number {
  const dx = coords[3 * i]! - coords[3 * j]!;
  const dy = coords[3 * i + 1]! - coords[3 * j + 1]!;
  const dz = coords[3 * i + 2]! - coords[3 * j + 2]!;
  return Math.sqrt(dx * dx + dy * dy + dz * dz);
}

/**
 * Buckets atoms into cubic cells of a given edge, so that pairs closer than the edge sit in
 * neighbouring cells. Cells are stored densely (counting sort into flat arrays) when the box is
 * not much larger than the number of atoms, and in a hash map otherwise. Atoms outside
 * ±COORDINATE_LIMIT are left out: they have no neighbours and would stretch the box.
 */
export class NeighbourGrid {
  private readonly cellSize: number;
  private readonly origin: [number, number, number];
  private readonly dims: [number, number, number];
  private readonly cellOf: Float64Array;
  /** Dense storage: atoms of cell c are sortedAtoms[cellStart[c] .. cellStart[c + 1]). */
  private readonly cellStart: Int32Array | undefined;
  private readonly sortedAtoms: Int32Array | undefined;
  /** Sparse storage for boxes with far more cells than atoms. */
  private readonly sparse: Map<number, number[]> | undefined;

  constructor(
    private readonly coords: ArrayLike<number>,
    cellSize: number,
  ) {
    const count = coords.length / 3;
    const min: [number, number, number] = [Infinity, Infinity, Infinity];
    const max: [number, number, number] = [-Infinity, -Infinity, -Infinity];
    let included = 0;
    for (let i = 0; i < count; i++) {
      if (!coordinatesInRange(coords, i)) continue;
      included++;
      for (let k = 0; k < 3; k++) {
        const value = coords[3 * i + k]!;
        if (value < min[k]!) min[k] = value;
        if (value > max[k]!) max[k] = value;
      }
    }
    if (included === 0) {
      min.fill(0);
      max.fill(0);
    }
    // Keep the number of cells per axis bounded so that far-flung atoms cannot blow up the keys.
    const extent = Math.max(max[0] - min[0], max[1] - min[1], max[2] - min[2]);
    this.cellSize = Math.max(cellSize, extent / 100_000, 1e-9);
    this.origin = min;
    this.dims = [0, 1, 2].map((k) => Math.floor((max[k]! - min[k]!) / this.cellSize) + 1) as [number, number, number];
    this.cellOf = new Float64Array(count);
    for (let i = 0; i < count; i++) this.cellOf[i] = coordinatesInRange(coords, i) ? this.keyOf(this.cellIndex(i, 0), this.cellIndex(i, 1), this.cellIndex(i, 2)) : -1;
    const totalCells = this.dims[0] * this.dims[1] * this.dims[2];
    if (totalCells <= Math.max(1 << 16, 8 * count)) {
      const start = new Int32Array(totalCells + 1);
      for (let i = 0; i < count; i++) if (this.cellOf[i]! >= 0) start[this.cellOf[i]! + 1]!++;
      for (let c = 0; c < totalCells; c++) start[c + 1]! += start[c]!;
      const fill = start.slice(0, totalCells);
      const sorted = new Int32Array(included);
      for (let i = 0; i < count; i++) if (this.cellOf[i]! >= 0) sorted[fill[this.cellOf[i]!]!++] = i;
      this.cellStart = start;
      this.sortedAtoms = sorted;
    } else {
      const map = new Map<number, number[]>();
      for (let i = 0; i < count; i++) {
        const key = this.cellOf[i]!;
        if (key < 0) continue;
        const bucket = map.get(key);
        if (bucket) bucket.push(i);
        else map.set(key, [i]);
      }
      this.sparse = map;
    }
  }

  private cellIndex(atom: number, axis: number): number {
    return Math.floor((this.coords[3 * atom + axis]! - this.origin[axis]!) / this.cellSize);
  }

  private keyOf(x: number, y: number, z: number): number {
    return x + this.dims[0] * (y + this.dims[1] * z);
  }

  private inside(x: number, y: number, z: number): boolean {
    return x >= 0 && y >= 0 && z >= 0 && x < this.dims[0] && y < this.dims[1] && z < this.dims[2];
  }

  /**
   * Calls `visit` once for every unordered pair closer than `cutoff` (cutoff <= cell size). Stops
   * after examining `maxExamined` pairs (distances computed) and returns false then; true when
   * every pair was seen.
   */
  forEachPairWithin(cutoff: number, visit: (i: number, j: number, distance: number) => void, maxExamined = Infinity): boolean {
    const cutoffSquared = cutoff * cutoff;
    let examined = 0;
    const coords = this.coords;
    const count = coords.length / 3;
    const [nx, ny] = this.dims;
    const start = this.cellStart;
    const sorted = this.sortedAtoms;
    for (let i = 0; i < count; i++) {
      const key = this.cellOf[i]!;
      if (key < 0) continue;
      const x = key % nx;
      const y = Math.floor(key / nx) % ny;
      const z = Math.floor(key / (nx * ny));
      const xi = coords[3 * i]!;
      const yi = coords[3 * i + 1]!;
      const zi = coords[3 * i + 2]!;
      for (let dz = -1; dz <= 1; dz++) {
        for (let dy = -1; dy <= 1; dy++) {
          for (let dx = -1; dx <= 1; dx++) {
            if (!this.inside(x + dx, y + dy, z + dz)) continue;
            const cell = this.keyOf(x + dx, y + dy, z + dz);
            // Dense storage reads a range of `sorted`; sparse storage reads the cell's bucket.
            const bucket = sorted ? undefined : this.sparse?.get(cell);
            const from = sorted ? start![cell]! : 0;
            const to = sorted ? start![cell + 1]! : (bucket?.length ?? 0);
            for (let k = from; k < to; k++) {
              const j = sorted ? sorted[k]! : bucket![k]!;
              if (j <= i) continue;
              if (++examined > maxExamined) return false;
              const ddx = xi - coords[3 * j]!;
              const ddy = yi - coords[3 * j + 1]!;
              const ddz = zi - coords[3 * j + 2]!;
              const squared = ddx * ddx + ddy * ddy + ddz * ddz;
              if (squared < cutoffSquared) visit(i, j, Math.sqrt(squared));
            }
          }
        }
      }
    }
    return true;
  }

  /** Atoms within `radius` of atom `i`, excluding `i` itself, nearest first. */
  neighboursOf(i: number, radius: number): AtomPair[] {
    const found: AtomPair[] = [];
    const key = this.cellOf[i]!;
    if (key < 0) return found;
    const [nx, ny] = this.dims;
    const cx = key % nx;
    const cy = Math.floor(key / nx) % ny;
    const cz = Math.floor(key / (nx * ny));
    const reach = Math.ceil(radius / this.cellSize);
    for (let dz = -reach; dz <= reach; dz++) {
      for (let dy = -reach; dy <= reach; dy++) {
        for (let dx = -reach; dx <= reach; dx++) {
          if (!this.inside(cx + dx, cy + dy, cz + dz)) continue;
          const cell = this.keyOf(cx + dx, cy + dy, cz + dz);
          const atoms = this.sortedAtoms ? this.sortedAtoms.subarray(this.cellStart![cell]!, this.cellStart![cell + 1]!) : (this.sparse?.get(cell) ?? []);
          for (let k = 0; k < atoms.length; k++) {
            const j = atoms[k]!;
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

/** Clash pairs kept; the rest are counted (the check reports 50 of them and how many more there are). */
export const MAX_STORED_CLASHES = 1_000;
/**
 * Bonds kept: a real structure has about two per atom, so this is far beyond the supported
 * 100,000 atoms; only atoms piled on top of each other reach it, and the rest are counted.
 */
export const MAX_STORED_BONDS = 400_000;
/**
 * Atom pairs examined at most. Within the cutoff a cell holds a handful of atoms unless they
 * clash, so only a pile of clashing atoms (thousands within half an ångström) gets here; the
 * counts are then lower bounds and the contacts are marked incomplete.
 */
export const MAX_EXAMINED_PAIRS = 50_000_000;

export interface ContactAnalysis {
  /** Sorted by atoms; at most MAX_STORED_BONDS. */
  readonly bonds: AtomPair[];
  /** Sorted by atoms; at most MAX_STORED_CLASHES. */
  readonly clashes: AtomPair[];
  /** Every bond and clash found, stored or not (lower bounds when not complete). */
  readonly bondCount: number;
  readonly clashCount: number;
  /** False when the search stopped after MAX_EXAMINED_PAIRS pairs. */
  readonly complete: boolean;
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
  let bondCount = 0;
  let clashCount = 0;
  const nearestDistance = new Float64Array(count).fill(Infinity);
  const nearestAtom = new Int32Array(count).fill(-1);
  const complete = grid.forEachPairWithin(cutoff, (i, j, d) => {
    if (d < CLASH_DISTANCE && clashCount++ < MAX_STORED_CLASHES) clashes.push({ i, j, distance: d });
    if (d < BOND_TOLERANCE_FACTOR * (radii[i]! + radii[j]!) && bondCount++ < MAX_STORED_BONDS) bonds.push({ i, j, distance: d });
    if (d < nearestDistance[i]!) {
      nearestDistance[i] = d;
      nearestAtom[i] = j;
    }
    if (d < nearestDistance[j]!) {
      nearestDistance[j] = d;
      nearestAtom[j] = i;
    }
  }, MAX_EXAMINED_PAIRS);
  const byAtoms = (a: AtomPair, b: AtomPair) => a.i - b.i || a.j - b.j;
  return { bonds: bonds.sort(byAtoms), clashes: clashes.sort(byAtoms), bondCount, clashCount, complete, nearestDistance, nearestAtom };
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
  // Without every near pair (a pile of clashing atoms) the distances say nothing about the unit.
  if (count < 2 || !contacts.complete) return undefined;
  let nearest = contacts.nearestDistance;
  let partner = contacts.nearestAtom;
  if (declared === 'angstrom') {
    if (contacts.bonds.length >= count / 2) return undefined;
    let maxRadius = 0;
    for (let i = 0; i < count; i++) maxRadius = Math.max(maxRadius, radii[i]!);
    const cutoff = 2 * maxRadius * 2.5;
    nearest = new Float64Array(count).fill(Infinity);
    partner = new Int32Array(count).fill(-1);
    const seen = new NeighbourGrid(coords, cutoff).forEachPairWithin(
      cutoff,
      (i, j, d) => {
        if (d < nearest[i]!) {
          nearest[i] = d;
          partner[i] = j;
        }
        if (d < nearest[j]!) {
          nearest[j] = d;
          partner[j] = i;
        }
      },
      MAX_EXAMINED_PAIRS,
    );
    if (!seen) return undefined;
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
