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
 * neighbouring cells. Atoms are sorted by cell into one flat array; a cell's atoms are found by a
 * dense table of cell starts when the box has not many more cells than atoms, and by binary search
 * over the occupied cells otherwise (a sparse or far-flung geometry). No allocation per atom or
 * per pair. Atoms outside ±COORDINATE_LIMIT are left out: they have no neighbours and would
 * stretch the box.
 */
export class NeighbourGrid {
  private readonly cellSize: number;
  private readonly origin: [number, number, number];
  private readonly dims: [number, number, number];
  /** Cell key of each atom: x + nx (y + ny z). */
  private readonly cellOf: Float64Array;
  /** Atoms sorted by cell. */
  private readonly sortedAtoms: Int32Array;
  /** Dense: atoms of cell c are sortedAtoms[cellStart[c] .. cellStart[c + 1]). */
  private readonly cellStart: Int32Array | undefined;
  /** Sparse: the occupied cells' keys, ascending, and where each one's atoms start (one more entry at the end). */
  private readonly occupiedKeys: Float64Array | undefined;
  private readonly occupiedStart: Int32Array | undefined;

  constructor(
    private readonly coords: ArrayLike<number>,
    cellSize: number,
  ) {
    const count = Math.floor(coords.length / 3);
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
    const [ox, oy, oz] = min;
    const [nx, ny] = this.dims;
    const size = this.cellSize;
    for (let i = 0; i < count; i++) {
      if (!coordinatesInRange(coords, i)) {
        this.cellOf[i] = -1;
        continue;
      }
      const x = Math.floor((coords[3 * i]! - ox) / size);
      const y = Math.floor((coords[3 * i + 1]! - oy) / size);
      const z = Math.floor((coords[3 * i + 2]! - oz) / size);
      this.cellOf[i] = x + nx * (y + ny * z);
    }
    const totalCells = this.dims[0] * this.dims[1] * this.dims[2];
    this.sortedAtoms = new Int32Array(included);
    if (totalCells <= Math.min(1 << 24, Math.max(1 << 16, 64 * count))) {
      const start = new Int32Array(totalCells + 1);
      for (let i = 0; i < count; i++) if (this.cellOf[i]! >= 0) start[this.cellOf[i]! + 1]!++;
      for (let c = 0; c < totalCells; c++) start[c + 1]! += start[c]!;
      const fill = start.slice(0, totalCells);
      for (let i = 0; i < count; i++) if (this.cellOf[i]! >= 0) this.sortedAtoms[fill[this.cellOf[i]!]!++] = i;
      this.cellStart = start;
    } else {
      const order = Array.from({ length: count }, (_, i) => i)
        .filter((i) => this.cellOf[i]! >= 0)
        .sort((a, b) => this.cellOf[a]! - this.cellOf[b]! || a - b);
      const keys: number[] = [];
      const starts: number[] = [];
      order.forEach((atom, k) => {
        this.sortedAtoms[k] = atom;
        const key = this.cellOf[atom]!;
        if (keys.length === 0 || keys[keys.length - 1] !== key) {
          keys.push(key);
          starts.push(k);
        }
      });
      starts.push(included);
      this.occupiedKeys = Float64Array.from(keys);
      this.occupiedStart = Int32Array.from(starts);
    }
  }

  private keyOf(x: number, y: number, z: number): number {
    return x + this.dims[0] * (y + this.dims[1] * z);
  }

  /** Where the atoms of cell `key` start in sortedAtoms; `end` receives where they stop. */
  private cellRange(key: number): number {
    if (this.cellStart) {
      this.rangeEnd = this.cellStart[key + 1]!;
      return this.cellStart[key]!;
    }
    const keys = this.occupiedKeys!;
    let low = 0;
    let high = keys.length - 1;
    while (low <= high) {
      const mid = (low + high) >> 1;
      const value = keys[mid]!;
      if (value < key) low = mid + 1;
      else if (value > key) high = mid - 1;
      else {
        this.rangeEnd = this.occupiedStart![mid + 1]!;
        return this.occupiedStart![mid]!;
      }
    }
    this.rangeEnd = 0;
    return 0;
  }

  private rangeEnd = 0;

  /**
   * Calls `visit` once for every unordered pair closer than `cutoff` (cutoff <= cell size); false
   * when it stopped after examining `maxExamined` pairs.
   */
  forEachPairWithin(cutoff: number, visit: (i: number, j: number, distance: number) => void, maxExamined = Infinity): boolean {
    const cutoffSquared = cutoff * cutoff;
    let examined = 0;
    const coords = this.coords;
    const sorted = this.sortedAtoms;
    const [nx, ny, nz] = this.dims;
    const count = sorted.length;
    // Each cell meets itself and the 13 neighbours of one half-shell, so each pair of cells once.
    for (let first = 0; first < count; ) {
      const key = this.cellOf[sorted[first]!]!;
      let last = first + 1;
      while (last < count && this.cellOf[sorted[last]!] === key) last++;
      const x = key % nx;
      const y = Math.floor(key / nx) % ny;
      const z = Math.floor(key / (nx * ny));
      for (let a = first; a < last; a++) {
        const i = sorted[a]!;
        const xi = coords[3 * i]!;
        const yi = coords[3 * i + 1]!;
        const zi = coords[3 * i + 2]!;
        for (let b = a + 1; b < last; b++) {
          const j = sorted[b]!;
          if (++examined > maxExamined) return false;
          const dx = xi - coords[3 * j]!;
          const dy = yi - coords[3 * j + 1]!;
          const dz = zi - coords[3 * j + 2]!;
          const squared = dx * dx + dy * dy + dz * dz;
          if (squared < cutoffSquared) (i < j ? visit(i, j, Math.sqrt(squared)) : visit(j, i, Math.sqrt(squared)));
        }
      }
      for (let h = 0; h < HALF_SHELL.length; h += 3) {
        const cx = x + HALF_SHELL[h]!;
        const cy = y + HALF_SHELL[h + 1]!;
        const cz = z + HALF_SHELL[h + 2]!;
        if (cx < 0 || cy < 0 || cz < 0 || cx >= nx || cy >= ny || cz >= nz) continue;
        const from = this.cellRange(this.keyOf(cx, cy, cz));
        const to = this.rangeEnd;
        if (from === to) continue;
        for (let a = first; a < last; a++) {
          const i = sorted[a]!;
          const xi = coords[3 * i]!;
          const yi = coords[3 * i + 1]!;
          const zi = coords[3 * i + 2]!;
          for (let b = from; b < to; b++) {
            const j = sorted[b]!;
            if (++examined > maxExamined) return false;
            const dx = xi - coords[3 * j]!;
            const dy = yi - coords[3 * j + 1]!;
            const dz = zi - coords[3 * j + 2]!;
            const squared = dx * dx + dy * dy + dz * dz;
            if (squared < cutoffSquared) (i < j ? visit(i, j, Math.sqrt(squared)) : visit(j, i, Math.sqrt(squared)));
          }
        }
      }
      first = last;
    }
    return true;
  }

  /** Atoms within `radius` of atom `i`, excluding `i` itself, nearest first. */
  neighboursOf(i: number, radius: number): AtomPair[] {
    const found: AtomPair[] = [];
    const key = this.cellOf[i]!;
    if (key < 0) return found;
    const [nx, ny, nz] = this.dims;
    const cx = key % nx;
    const cy = Math.floor(key / nx) % ny;
    const cz = Math.floor(key / (nx * ny));
    const reach = Math.ceil(radius / this.cellSize);
    for (let dz = -reach; dz <= reach; dz++) {
      for (let dy = -reach; dy <= reach; dy++) {
        for (let dx = -reach; dx <= reach; dx++) {
          const x = cx + dx;
          const y = cy + dy;
          const z = cz + dz;
          if (x < 0 || y < 0 || z < 0 || x >= nx || y >= ny || z >= nz) continue;
          const from = this.cellRange(this.keyOf(x, y, z));
          const to = this.rangeEnd;
          for (let k = from; k < to; k++) {
            const j = this.sortedAtoms[k]!;
            if (j === i) continue;
            const d = distance(this.coords, i, j);
            if (d <= radius) found.push({ i, j, distance: d });
          }
        }
      }
    }
    return found.sort((a, b) => a.distance - b.distance || a.j - b.j);
  }
}

/** The 13 cell offsets of a half-shell: with the cell itself, every neighbouring pair of cells once. */
const HALF_SHELL = new Int8Array([1, 0, 0, -1, 1, 0, 0, 1, 0, 1, 1, 0, -1, -1, 1, 0, -1, 1, 1, -1, 1, -1, 0, 1, 0, 0, 1, 1, 0, 1, -1, 1, 1, 0, 1, 1, 1, 1, 1]);

/** Atoms within `radius` of atom `i` by a scan of every atom (no grid to build): nearest first, at most `limit`. */
export function nearestAtoms(coords: ArrayLike<number>, i: number, radius: number, limit: number): AtomPair[] {
  const count = Math.floor(coords.length / 3);
  const found: AtomPair[] = [];
  if (!coordinatesInRange(coords, i)) return found;
  const squaredRadius = radius * radius;
  const x = coords[3 * i]!;
  const y = coords[3 * i + 1]!;
  const z = coords[3 * i + 2]!;
  for (let j = 0; j < count; j++) {
    if (j === i || !coordinatesInRange(coords, j)) continue;
    const dx = x - coords[3 * j]!;
    const dy = y - coords[3 * j + 1]!;
    const dz = z - coords[3 * j + 2]!;
    const squared = dx * dx + dy * dy + dz * dz;
    if (squared <= squaredRadius) found.push({ i, j, distance: Math.sqrt(squared) });
  }
  return found.sort((a, b) => a.distance - b.distance || a.j - b.j).slice(0, limit);
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

/**
 * Near pairs kept for updates after an edit (about three per atom in a real structure); a pile of
 * clashing atoms that passes it is searched again in full after every edit.
 */
export const MAX_STORED_PAIRS = 2_000_000;

export interface ContactAnalysis {
  /** Sorted by atoms; at most MAX_STORED_BONDS. */
  readonly bonds: AtomPair[];
  /** Sorted by atoms; at most MAX_STORED_CLASHES. */
  readonly clashes: AtomPair[];
  /** Every bond and clash found, stored or not (lower bounds when not complete). */
  readonly bondCount: number;
  readonly clashCount: number;
  /** False when the search stopped after MAX_EXAMINED_PAIRS pairs (or kept MAX_STORED_PAIRS). */
  readonly complete: boolean;
  /** Per atom: distance to its nearest neighbour within the search cutoff, or Infinity. */
  readonly nearestDistance: Float64Array;
  /** Per atom: index of that nearest neighbour, or -1. */
  readonly nearestAtom: Int32Array;
  /** Every pair closer than the cutoff, sorted by (i, j), with what they were found from: the start of an update after a small edit. */
  readonly pairs: ContactPairs;
}

export interface ContactPairs {
  readonly cutoff: number;
  /** False when the search stopped before every pair was found. */
  readonly complete: boolean;
  readonly i: Int32Array;
  readonly j: Int32Array;
  readonly distance: Float64Array;
  readonly coordinates: Float64Array;
  readonly radii: Float64Array;
}

/** Above this many moved, added or removed atoms an update searches the whole geometry again. */
const MAX_UPDATED_ATOMS = 64;

/**
 * One pass over near pairs finds bonds (d < factor × (r_i + r_j)), clashes (d < CLASH_DISTANCE)
 * and each atom's nearest neighbour within the largest bond cutoff. Given the analysis of a
 * previous version of the geometry, only the atoms an edit moved, added or removed are searched
 * again (each against every atom, no grid to build); the other pairs are carried over.
 */
export function analyseContacts(coords: ArrayLike<number>, radii: ArrayLike<number>, previous?: ContactAnalysis): ContactAnalysis {
  const count = radii.length;
  let maxRadius = 0;
  for (let i = 0; i < count; i++) maxRadius = Math.max(maxRadius, radii[i]!);
  const cutoff = Math.max(2 * maxRadius * BOND_TOLERANCE_FACTOR, CLASH_DISTANCE, 1e-6);
  const coordinates = coords instanceof Float64Array ? coords.slice() : Float64Array.from(coords);
  const radiusCopy = radii instanceof Float64Array ? radii.slice() : Float64Array.from(radii);
  const reusable = previous && previous.pairs.complete && previous.pairs.cutoff === cutoff;
  const updated = reusable ? updatedPairs(previous.pairs, coordinates, radiusCopy, cutoff) : undefined;
  return updated ? contactsFromPairs(updated, radiusCopy, true, previous) : searchContacts(coordinates, radiusCopy, cutoff);
}

/**
 * The whole search: the pairs kept for later updates while they fit MAX_STORED_PAIRS; a pile of
 * clashing atoms beyond that is searched a second time to count its bonds and clashes.
 */
function searchContacts(coordinates: Float64Array, radii: Float64Array, cutoff: number): ContactAnalysis {
  const found = new PairList();
  const count = radii.length;
  let stored = true;
  const searched = new NeighbourGrid(coordinates, cutoff).forEachPairWithin(
    cutoff,
    (i, j, d) => {
      if (found.size < MAX_STORED_PAIRS) found.add(i, j, d, count);
      else stored = false;
    },
    MAX_EXAMINED_PAIRS,
  );
  const pairs = found.sorted(count, cutoff, coordinates, radii, searched && stored);
  const contacts = contactsFromPairs(pairs, radii, searched);
  if (stored) return contacts;
  // The counts and nearest neighbours from every pair, stored or not.
  let bondCount = 0;
  let clashCount = 0;
  const nearestDistance = new Float64Array(count).fill(Infinity);
  const nearestAtom = new Int32Array(count).fill(-1);
  new NeighbourGrid(coordinates, cutoff).forEachPairWithin(
    cutoff,
    (i, j, d) => {
      if (d < CLASH_DISTANCE) clashCount++;
      if (d < BOND_TOLERANCE_FACTOR * (radii[i]! + radii[j]!)) bondCount++;
      if (d < nearestDistance[i]! || (d === nearestDistance[i]! && j < nearestAtom[i]!)) {
        nearestDistance[i] = d;
        nearestAtom[i] = j;
      }
      if (d < nearestDistance[j]! || (d === nearestDistance[j]! && i < nearestAtom[j]!)) {
        nearestDistance[j] = d;
        nearestAtom[j] = i;
      }
    },
    MAX_EXAMINED_PAIRS,
  );
  return { ...contacts, bondCount, clashCount, nearestDistance, nearestAtom };
}

/** The pairs after an edit that moved, added or removed a few atoms in one run; undefined when the edit is larger. */
function updatedPairs(old: ContactPairs, coordinates: Float64Array, radii: Float64Array, cutoff: number): ContactPairs | undefined {
  const oldCount = old.radii.length;
  const count = radii.length;
  const same = (a: number, b: number) =>
    old.radii[a] === radii[b] && old.coordinates[3 * a] === coordinates[3 * b] && old.coordinates[3 * a + 1] === coordinates[3 * b + 1] && old.coordinates[3 * a + 2] === coordinates[3 * b + 2];
  // Atoms out of range take no part in the search; an edit that touches them searches again.
  let prefix = 0;
  while (prefix < oldCount && prefix < count && same(prefix, prefix)) prefix++;
  let suffix = 0;
  while (suffix < oldCount - prefix && suffix < count - prefix && same(oldCount - 1 - suffix, count - 1 - suffix)) suffix++;
  // Old atoms [prefix, oldEnd) became new atoms [prefix, newEnd).
  const oldEnd = oldCount - suffix;
  const newEnd = count - suffix;
  if (oldEnd - prefix > MAX_UPDATED_ATOMS || newEnd - prefix > MAX_UPDATED_ATOMS) return undefined;
  const shift = count - oldCount;
  // The pairs of the new atoms, found against every atom and sorted.
  const fresh = new PairList();
  const squared = cutoff * cutoff;
  for (let c = prefix; c < newEnd; c++) {
    const x = coordinates[3 * c]!;
    const y = coordinates[3 * c + 1]!;
    const z = coordinates[3 * c + 2]!;
    for (let k = 0; k < count; k++) {
      // Pairs of two new atoms once, from the earlier one.
      if (k === c || (k >= prefix && k < newEnd && k < c) || !coordinatesInRange(coordinates, k)) continue;
      const dx = x - coordinates[3 * k]!;
      const dy = y - coordinates[3 * k + 1]!;
      const dz = z - coordinates[3 * k + 2]!;
      const d2 = dx * dx + dy * dy + dz * dz;
      if (d2 < squared) fresh.add(Math.min(c, k), Math.max(c, k), Math.sqrt(d2), count);
    }
  }
  for (let c = prefix; c < newEnd; c++) if (!coordinatesInRange(coordinates, c)) return undefined;
  const added = fresh.sorted(count, cutoff, coordinates, radii, true);
  // The old pairs of unchanged atoms, renumbered (an order-keeping map), merged with the new ones.
  const capacity = old.i.length + added.i.length;
  const is = new Int32Array(capacity);
  const js = new Int32Array(capacity);
  const distance = new Float64Array(capacity);
  let n = 0;
  let a = 0;
  const takeAdded = (i: number, j: number) => {
    while (a < added.i.length && (added.i[a]! < i || (added.i[a] === i && added.j[a]! < j))) {
      is[n] = added.i[a]!;
      js[n] = added.j[a]!;
      distance[n++] = added.distance[a++]!;
    }
  };
  for (let k = 0; k < old.i.length; k++) {
    let i = old.i[k]!;
    let j = old.j[k]!;
    if ((i >= prefix && i < oldEnd) || (j >= prefix && j < oldEnd)) continue;
    if (i >= oldEnd) i += shift;
    if (j >= oldEnd) j += shift;
    takeAdded(i, j);
    is[n] = i;
    js[n] = j;
    distance[n++] = old.distance[k]!;
  }
  takeAdded(count, 0);
  if (n > MAX_STORED_PAIRS) return undefined;
  return { cutoff, complete: true, i: is.slice(0, n), j: js.slice(0, n), distance: distance.slice(0, n), coordinates, radii };
}

function contactsFromPairs(pairs: ContactPairs, radii: Float64Array, complete: boolean, previous?: ContactAnalysis): ContactAnalysis {
  const count = radii.length;
  const bonds: AtomPair[] = [];
  const clashes: AtomPair[] = [];
  // Bonds that read the same as in the previous version are kept as they were (both lists are sorted).
  const oldBonds = previous?.bonds ?? [];
  let old = 0;
  const bond = (i: number, j: number, distance: number): AtomPair => {
    while (old < oldBonds.length && (oldBonds[old]!.i < i || (oldBonds[old]!.i === i && oldBonds[old]!.j < j))) old++;
    const candidate = oldBonds[old];
    return candidate && candidate.i === i && candidate.j === j && candidate.distance === distance ? candidate : { i, j, distance };
  };
  let bondCount = 0;
  let clashCount = 0;
  const nearestDistance = new Float64Array(count).fill(Infinity);
  const nearestAtom = new Int32Array(count).fill(-1);
  for (let k = 0; k < pairs.i.length; k++) {
    const i = pairs.i[k]!;
    const j = pairs.j[k]!;
    const d = pairs.distance[k]!;
    if (d < CLASH_DISTANCE && clashCount++ < MAX_STORED_CLASHES) clashes.push({ i, j, distance: d });
    if (d < BOND_TOLERANCE_FACTOR * (radii[i]! + radii[j]!) && bondCount++ < MAX_STORED_BONDS) bonds.push(bond(i, j, d));
    // Ties go to the lower index, whatever order the pairs were found in.
    if (d < nearestDistance[i]! || (d === nearestDistance[i]! && j < nearestAtom[i]!)) {
      nearestDistance[i] = d;
      nearestAtom[i] = j;
    }
    if (d < nearestDistance[j]! || (d === nearestDistance[j]! && i < nearestAtom[j]!)) {
      nearestDistance[j] = d;
      nearestAtom[j] = i;
    }
  }
  return { bonds, clashes, bondCount, clashCount, complete, nearestDistance, nearestAtom, pairs };
}

/** Pairs collected as numbers and sorted by (i, j) with a native numeric sort. */
class PairList {
  private keys = new Float64Array(64);
  private distances = new Float64Array(64);
  private length = 0;

  get size(): number {
    return this.length;
  }

  add(i: number, j: number, distance: number, count: number): void {
    if (this.length === this.keys.length) {
      const keys = new Float64Array(this.length * 2);
      keys.set(this.keys);
      this.keys = keys;
      const distances = new Float64Array(this.length * 2);
      distances.set(this.distances);
      this.distances = distances;
    }
    // i < j < count, so i · count + j orders the pairs by i, then j.
    this.keys[this.length] = i * count + j;
    this.distances[this.length] = distance;
    this.length++;
  }

  sorted(count: number, cutoff: number, coordinates: Float64Array, radii: Float64Array, complete: boolean): ContactPairs {
    const n = this.length;
    const order = new Int32Array(n);
    if (count * count * n < Number.MAX_SAFE_INTEGER) {
      // Key and position packed into one double, so that one native sort of doubles orders the pairs.
      const packed = new Float64Array(n);
      for (let k = 0; k < n; k++) packed[k] = this.keys[k]! * n + k;
      packed.sort();
      for (let k = 0; k < n; k++) order[k] = packed[k]! % n;
    } else {
      for (let k = 0; k < n; k++) order[k] = k;
      order.sort((a, b) => this.keys[a]! - this.keys[b]!);
    }
    const is = new Int32Array(n);
    const js = new Int32Array(n);
    const distance = new Float64Array(n);
    for (let k = 0; k < n; k++) {
      const at = order[k]!;
      const key = this.keys[at]!;
      const i = Math.floor(key / count);
      is[k] = i;
      js[k] = key - i * count;
      distance[k] = this.distances[at]!;
    }
    return { cutoff, complete, i: is, j: js, distance, coordinates, radii };
  }
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
