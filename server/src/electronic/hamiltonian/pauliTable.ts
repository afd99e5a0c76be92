/**
 * Accumulates coefficients of Pauli strings keyed by their (x, z) masks in an open-addressing hash
 * table (linear probing, power-of-two capacity, load factor at most ½), so that building a
 * Hamiltonian of 10⁵ strings allocates a handful of typed arrays instead of an object per term.
 */
import type { PauliSum } from './pauli';

export class PauliAccumulator {
  private keysX: Uint32Array;
  private keysZ: Uint32Array;
  private values: Float64Array;
  private used: Uint8Array;
  private mask: number;
  private count = 0;

  constructor(readonly qubits: number, expected = 1024) {
    let capacity = 16;
    while (capacity < 2 * expected) capacity *= 2;
    this.keysX = new Uint32Array(capacity);
    this.keysZ = new Uint32Array(capacity);
    this.values = new Float64Array(capacity);
    this.used = new Uint8Array(capacity);
    this.mask = capacity - 1;
  }

  /** Distinct strings seen so far (whatever their coefficient). */
  get size(): number {
    return this.count;
  }

  add(x: number, z: number, coefficient: number): void {
    let slot = hash(x, z) & this.mask;
    const keysX = this.keysX;
    const keysZ = this.keysZ;
    const used = this.used;
    for (;;) {
      if (used[slot] === 0) {
        used[slot] = 1;
        keysX[slot] = x;
        keysZ[slot] = z;
        this.values[slot] = coefficient;
        this.count++;
        if (2 * this.count > this.mask + 1) this.grow();
        return;
      }
      if (keysX[slot] === x >>> 0 && keysZ[slot] === z >>> 0) {
        this.values[slot]! += coefficient;
        return;
      }
      slot = (slot + 1) & this.mask;
    }
  }

  /** Coefficient of one string (0 when absent). */
  get(x: number, z: number): number {
    let slot = hash(x, z) & this.mask;
    for (;;) {
      if (this.used[slot] === 0) return 0;
      if (this.keysX[slot] === x >>> 0 && this.keysZ[slot] === z >>> 0) return this.values[slot]!;
      slot = (slot + 1) & this.mask;
    }
  }

  /**
   * The strings with |c| > threshold, in a canonical order: |c| descending, then x, then z
   * ascending (so equal inputs give equal outputs whatever the insertion order).
   */
  toSum(threshold: number): PauliSum {
    const capacity = this.mask + 1;
    let kept = 0;
    for (let slot = 0; slot < capacity; slot++) if (this.used[slot] === 1 && Math.abs(this.values[slot]!) > threshold) kept++;
    const x = new Uint32Array(kept);
    const z = new Uint32Array(kept);
    const coefficients = new Float64Array(kept);
    let k = 0;
    for (let slot = 0; slot < capacity; slot++) {
      if (this.used[slot] === 1 && Math.abs(this.values[slot]!) > threshold) {
        x[k] = this.keysX[slot]!;
        z[k] = this.keysZ[slot]!;
        coefficients[k] = this.values[slot]!;
        k++;
      }
    }
    return sortPauliSum({ qubits: this.qubits, length: kept, x, z, coefficients });
  }

  private grow(): void {
    const oldX = this.keysX;
    const oldZ = this.keysZ;
    const oldValues = this.values;
    const oldUsed = this.used;
    const capacity = 2 * (this.mask + 1);
    this.keysX = new Uint32Array(capacity);
    this.keysZ = new Uint32Array(capacity);
    this.values = new Float64Array(capacity);
    this.used = new Uint8Array(capacity);
    this.mask = capacity - 1;
    for (let slot = 0; slot < oldUsed.length; slot++) {
      if (oldUsed[slot] === 0) continue;
      let target = hash(oldX[slot]!, oldZ[slot]!) & this.mask;
      while (this.used[target] === 1) target = (target + 1) & this.mask;
      this.used[target] = 1;
      this.keysX[target] = oldX[slot]!;
      this.keysZ[target] = oldZ[slot]!;
      this.values[target] = oldValues[slot]!;
    }
  }
}

/** A 32-bit mix of the two masks (multiply–xorshift, constants of the MurmurHash3 finaliser). */
function hash(x: number, z: number): number {
  let h = Math.imul(x ^ Math.imul(z, 0x9e3779b1), 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** The same strings in the canonical order of PauliAccumulator.toSum. */
export function sortPauliSum(sum: PauliSum): PauliSum {
  const order = new Uint32Array(sum.length);
  for (let i = 0; i < sum.length; i++) order[i] = i;
  const { x, z, coefficients } = sum;
  order.sort((a, b) => {
    const difference = Math.abs(coefficients[b]!) - Math.abs(coefficients[a]!);
    if (difference !== 0) return difference;
    if (x[a] !== x[b]) return x[a]! - x[b]!;
    return z[a]! - z[b]!;
  });
  const sorted = { qubits: sum.qubits, length: sum.length, x: new Uint32Array(sum.length), z: new Uint32Array(sum.length), coefficients: new Float64Array(sum.length) };
  for (let i = 0; i < sum.length; i++) {
    const from = order[i]!;
    sorted.x[i] = x[from]!;
    sorted.z[i] = z[from]!;
    sorted.coefficients[i] = coefficients[from]!;
  }
  return sorted;
}
