/**
 * Direct inversion in the iterative subspace (P. Pulay, "Convergence acceleration of iterative
 * sequences. The case of SCF iteration", Chem. Phys. Lett. 73, 393 (1980); P. Pulay, "Improved SCF
 * convergence acceleration", J. Comput. Chem. 3, 556 (1982)): the Fock matrix of the next step is
 * Σ c_i F_i with the coefficients that minimise |Σ c_i e_i|² subject to Σ c_i = 1, where e_i is
 * the commutator FDS − SDF (here: FD − DF in orthonormal functions) of step i.
 *
 * Vectors are stored as flat Float64Array (every block of every spin concatenated); the oldest
 * is replaced when the subspace is full, and when the small linear system is singular (nearly
 * equal errors) the oldest vectors are dropped until it is not.
 */

export const DEFAULT_DIIS_SIZE = 8;

export class Diis {
  private readonly focks: Float64Array[] = [];
  private readonly errors: Float64Array[] = [];
  private next = 0;

  constructor(
    private readonly length: number,
    private readonly size = DEFAULT_DIIS_SIZE,
  ) {}

  get count(): number {
    return this.focks.length;
  }

  clear(): void {
    this.focks.length = 0;
    this.errors.length = 0;
    this.next = 0;
  }

  /** Stores a copy of one step's Fock and error vectors. */
  push(fock: Float64Array, error: Float64Array): void {
    if (this.focks.length < this.size) {
      this.focks.push(Float64Array.from(fock.subarray(0, this.length)));
      this.errors.push(Float64Array.from(error.subarray(0, this.length)));
      this.next = this.focks.length % this.size;
      return;
    }
    this.focks[this.next]!.set(fock.subarray(0, this.length));
    this.errors[this.next]!.set(error.subarray(0, this.length));
    this.next = (this.next + 1) % this.size;
  }

  /** Writes the extrapolated Fock vector into `out`; false when fewer than two vectors are stored. */
  extrapolate(out: Float64Array): boolean {
    const count = this.focks.length;
    if (count < 2) return false;
    // Order by age so that the oldest can be dropped when the system is singular.
    const order = Array.from({ length: count }, (_, k) => (this.next + k) % count);
    if (count < this.size) order.sort((a, b) => a - b);
    const overlaps = new Float64Array(count * count);
    for (let i = 0; i < count; i++) {
      for (let j = 0; j <= i; j++) {
        const a = this.errors[order[i]!]!;
        const b = this.errors[order[j]!]!;
        let sum = 0;
        for (let k = 0; k < this.length; k++) sum += a[k]! * b[k]!;
        overlaps[i * count + j] = overlaps[j * count + i] = sum;
      }
    }
    for (let first = 0; first < count - 1; first++) {
      const coefficients = solveBordered(overlaps, count, first);
      if (!coefficients) continue;
      out.fill(0, 0, this.length);
      for (let i = first; i < count; i++) {
        const c = coefficients[i - first]!;
        const fock = this.focks[order[i]!]!;
        for (let k = 0; k < this.length; k++) out[k]! += c * fock[k]!;
      }
      return true;
    }
    return false;
  }
}

/**
 * Solves [B 1; 1ᵀ 0][c; λ] = [0; 1] over the vectors first … count−1, with B scaled by its largest
 * diagonal element for conditioning. Undefined when (nearly) singular.
 */
function solveBordered(overlaps: Float64Array, count: number, first: number): Float64Array | undefined {
  const size = count - first;
  const n = size + 1;
  let scale = 0;
  for (let i = first; i < count; i++) scale = Math.max(scale, overlaps[i * count + i]!);
  if (!(scale > 0)) return undefined;
  const a = new Float64Array(n * n);
  const rhs = new Float64Array(n);
  for (let i = 0; i < size; i++) {
    for (let j = 0; j < size; j++) a[i * n + j] = overlaps[(first + i) * count + first + j]! / scale;
    a[i * n + size] = a[size * n + i] = -1;
  }
  rhs[size] = -1;
  // Gaussian elimination with partial pivoting.
  for (let col = 0; col < n; col++) {
    let pivot = col;
    for (let row = col + 1; row < n; row++) if (Math.abs(a[row * n + col]!) > Math.abs(a[pivot * n + col]!)) pivot = row;
    if (Math.abs(a[pivot * n + col]!) < 1e-14) return undefined;
    if (pivot !== col) {
      for (let k = 0; k < n; k++) [a[col * n + k], a[pivot * n + k]] = [a[pivot * n + k]!, a[col * n + k]!];
      [rhs[col], rhs[pivot]] = [rhs[pivot]!, rhs[col]!];
    }
    for (let row = col + 1; row < n; row++) {
      const factor = a[row * n + col]! / a[col * n + col]!;
      if (factor === 0) continue;
      for (let k = col; k < n; k++) a[row * n + k]! -= factor * a[col * n + k]!;
      rhs[row]! -= factor * rhs[col]!;
    }
  }
  const x = new Float64Array(n);
  for (let row = n - 1; row >= 0; row--) {
    let sum = rhs[row]!;
    for (let k = row + 1; k < n; k++) sum -= a[row * n + k]! * x[k]!;
    x[row] = sum / a[row * n + row]!;
  }
  const coefficients = x.subarray(0, size);
  for (const c of coefficients) if (!Number.isFinite(c) || Math.abs(c) > 1e6) return undefined;
  return coefficients;
}
