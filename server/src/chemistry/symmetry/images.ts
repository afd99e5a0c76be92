/**
 * Finds where a candidate symmetry operation sends each atom: the atom of the same element
 * nearest to its image, within a search radius. Atoms are bucketed once in a uniform grid (flat
 * typed arrays, counting sort), so one operation costs O(N) look-ups instead of O(N²) distance
 * checks, and a wrong candidate usually fails on the first atoms it tries.
 */
import type { Mat } from './linalg';

export interface OperationMatch {
  /** permutation[i] = j: the operation moves atom i onto the place of atom j. */
  readonly permutation: Int32Array;
  /** Largest distance between an atom's image and its partner, Å. */
  readonly deviation: number;
}

export class ImageFinder {
  readonly count: number;
  private readonly cellSize: number;
  private readonly origin: Float64Array;
  private readonly dims: Int32Array;
  private readonly cellStart: Int32Array;
  private readonly cellAtoms: Int32Array;
  /** Atoms in the order they are tried: farthest from the centre first (they fail first). */
  private readonly probeOrder: Int32Array;
  private readonly claimed: Int32Array;
  private stamp = 0;
  private readonly scratch: Int32Array;

  /**
   * @param coordinates centred coordinates, Å
   * @param atomicNumbers one per atom
   * @param maxRadius the largest search radius `match` will be called with
   */
  constructor(
    readonly coordinates: Float64Array,
    readonly atomicNumbers: Int32Array,
    maxRadius: number,
  ) {
    const count = atomicNumbers.length;
    this.count = count;
    const min = [Infinity, Infinity, Infinity];
    const max = [-Infinity, -Infinity, -Infinity];
    for (let i = 0; i < count; i++) {
      for (let k = 0; k < 3; k++) {
        const value = coordinates[3 * i + k]!;
        if (value < min[k]!) min[k] = value;
        if (value > max[k]!) max[k] = value;
      }
    }
    if (count === 0) {
      min.fill(0);
      max.fill(0);
    }
    // Cells of about 1 Å (a bond length holds one or two atoms) but never smaller than the search
    // radius, and at most about 8 cells per atom so that sparse or far-flung atoms stay cheap.
    const extent = [max[0]! - min[0]!, max[1]! - min[1]!, max[2]! - min[2]!];
    let cell = Math.max(1.0, maxRadius, 1e-6);
    const cellBudget = 8 * count + 4096;
    while ((Math.floor(extent[0]! / cell) + 1) * (Math.floor(extent[1]! / cell) + 1) * (Math.floor(extent[2]! / cell) + 1) > cellBudget) cell *= 1.5;
    this.cellSize = cell;
    this.origin = Float64Array.from(min);
    this.dims = Int32Array.from(extent, (e) => Math.floor(e / cell) + 1);
    const cells = this.dims[0]! * this.dims[1]! * this.dims[2]!;
    const cellOf = new Int32Array(count);
    const start = new Int32Array(cells + 1);
    for (let i = 0; i < count; i++) {
      const c = this.cellIndex(coordinates[3 * i]!, coordinates[3 * i + 1]!, coordinates[3 * i + 2]!);
      cellOf[i] = c;
      start[c + 1]!++;
    }
    for (let c = 0; c < cells; c++) start[c + 1]! += start[c]!;
    const fill = start.slice(0, cells);
    const atoms = new Int32Array(count);
    for (let i = 0; i < count; i++) atoms[fill[cellOf[i]!]!++] = i;
    this.cellStart = start;
    this.cellAtoms = atoms;
    const radius = Float64Array.from({ length: count }, (_, i) => coordinates[3 * i]! ** 2 + coordinates[3 * i + 1]! ** 2 + coordinates[3 * i + 2]! ** 2);
    this.probeOrder = Int32Array.from({ length: count }, (_, i) => i).sort((a, b) => radius[b]! - radius[a]! || a - b);
    this.claimed = new Int32Array(count);
    this.scratch = new Int32Array(count);
  }

  private axisCell(value: number, axis: number): number {
    const index = Math.floor((value - this.origin[axis]!) / this.cellSize);
    return index < 0 ? 0 : index >= this.dims[axis]! ? this.dims[axis]! - 1 : index;
  }

  private cellIndex(x: number, y: number, z: number): number {
    return this.axisCell(x, 0) + this.dims[0]! * (this.axisCell(y, 1) + this.dims[1]! * this.axisCell(z, 2));
  }

  /**
   * The unclaimed atom of element `z` nearest to (x, y, z) within `radius`, and its squared
   * distance; -1 when there is none.
   */
  private nearest(element: number, x: number, y: number, z: number, radius: number, out: Float64Array): number {
    const [nx, ny] = [this.dims[0]!, this.dims[1]!];
    const x0 = this.axisCell(x - radius, 0);
    const x1 = this.axisCell(x + radius, 0);
    const y0 = this.axisCell(y - radius, 1);
    const y1 = this.axisCell(y + radius, 1);
    const z0 = this.axisCell(z - radius, 2);
    const z1 = this.axisCell(z + radius, 2);
    let best = -1;
    let bestSquared = radius * radius;
    const coords = this.coordinates;
    for (let cz = z0; cz <= z1; cz++) {
      for (let cy = y0; cy <= y1; cy++) {
        const base = nx * (cy + ny * cz);
        for (let cx = x0; cx <= x1; cx++) {
          const cell = base + cx;
          for (let k = this.cellStart[cell]!; k < this.cellStart[cell + 1]!; k++) {
            const j = this.cellAtoms[k]!;
            if (this.atomicNumbers[j] !== element || this.claimed[j] === this.stamp) continue;
            const dx = coords[3 * j]! - x;
            const dy = coords[3 * j + 1]! - y;
            const dz = coords[3 * j + 2]! - z;
            const squared = dx * dx + dy * dy + dz * dz;
            if (squared <= bestSquared) {
              bestSquared = squared;
              best = j;
            }
          }
        }
      }
    }
    out[0] = bestSquared;
    return best;
  }

  /** Whether some atom of element `element` lies within `radius` of (x, y, z). */
  hasAtomNear(element: number, x: number, y: number, z: number, radius: number): boolean {
    this.stamp++;
    return this.nearest(element, x, y, z, radius, new Float64Array(1)) >= 0;
  }

  /**
   * Distances from each atom to its nearest and second-nearest other atom, capped at `cap`
   * (capping keeps them continuous in the coordinates: moving every atom by at most δ changes
   * each by at most 2δ, so they separate atoms that no symmetry can exchange).
   */
  neighbourDistances(cap: number): { first: Float64Array; second: Float64Array } {
    const first = new Float64Array(this.count).fill(cap);
    const second = new Float64Array(this.count).fill(cap);
    const coords = this.coordinates;
    const [nx, ny] = [this.dims[0]!, this.dims[1]!];
    for (let i = 0; i < this.count; i++) {
      const x = coords[3 * i]!;
      const y = coords[3 * i + 1]!;
      const z = coords[3 * i + 2]!;
      const [x0, x1] = [this.axisCell(x - cap, 0), this.axisCell(x + cap, 0)];
      const [y0, y1] = [this.axisCell(y - cap, 1), this.axisCell(y + cap, 1)];
      const [z0, z1] = [this.axisCell(z - cap, 2), this.axisCell(z + cap, 2)];
      let d1 = cap * cap;
      let d2 = cap * cap;
      for (let cz = z0; cz <= z1; cz++) {
        for (let cy = y0; cy <= y1; cy++) {
          const base = nx * (cy + ny * cz);
          for (let cx = x0; cx <= x1; cx++) {
            const cell = base + cx;
            for (let k = this.cellStart[cell]!; k < this.cellStart[cell + 1]!; k++) {
              const j = this.cellAtoms[k]!;
              if (j === i) continue;
              const dx = coords[3 * j]! - x;
              const dy = coords[3 * j + 1]! - y;
              const dz = coords[3 * j + 2]! - z;
              const squared = dx * dx + dy * dy + dz * dz;
              if (squared < d1) {
                d2 = d1;
                d1 = squared;
              } else if (squared < d2) d2 = squared;
            }
          }
        }
      }
      first[i] = Math.sqrt(d1);
      second[i] = Math.sqrt(d2);
    }
    return { first, second };
  }

  /**
   * Applies `m` (about the origin) to every atom and pairs each image with an unclaimed atom of
   * the same element within `radius`. Undefined as soon as one atom has no partner.
   */
  match(m: Mat, radius: number): OperationMatch | undefined {
    this.stamp++;
    const coords = this.coordinates;
    const permutation = this.scratch;
    const squared = new Float64Array(1);
    let worst = 0;
    const [m0, m1, m2, m3, m4, m5, m6, m7, m8] = [m[0]!, m[1]!, m[2]!, m[3]!, m[4]!, m[5]!, m[6]!, m[7]!, m[8]!];
    for (let k = 0; k < this.count; k++) {
      const i = this.probeOrder[k]!;
      const x = coords[3 * i]!;
      const y = coords[3 * i + 1]!;
      const z = coords[3 * i + 2]!;
      const j = this.nearest(this.atomicNumbers[i]!, m0 * x + m1 * y + m2 * z, m3 * x + m4 * y + m5 * z, m6 * x + m7 * y + m8 * z, radius, squared);
      if (j < 0) return undefined;
      this.claimed[j] = this.stamp;
      permutation[i] = j;
      if (squared[0]! > worst) worst = squared[0]!;
    }
    return { permutation: permutation.slice(), deviation: Math.sqrt(worst) };
  }
}
