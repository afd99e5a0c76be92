/**
 * Point-group bookkeeping for excitation screening. Irreducible representations of an abelian
 * group (D2h or one of its subgroups) arrive as bit masks over the group's generators: 0 is the
 * totally symmetric irrep and the direct product of two irreps is their XOR. D2h has three
 * generators, so a mask lies in 0..7. (Every irrep of an abelian group is one-dimensional, with
 * characters ±1, so a product of irreps is fixed by which generators flip sign; Cotton, Chemical
 * Applications of Group Theory, 3rd ed., Wiley (1990).)
 *
 * An excitation is allowed by symmetry when the product of the irreps of the orbitals it empties
 * and fills is totally symmetric, i.e. when their XOR is 0.
 */

export const IRREP_COUNT = 8;

/** Per-irrep counts of a list of orbital irreps (index = irrep mask). */
export type IrrepHistogram = readonly number[];

export function checkIrreps(irreps: readonly number[], what: string): void {
  irreps.forEach((irrep, index) => {
    if (!Number.isInteger(irrep) || irrep < 0 || irrep >= IRREP_COUNT) {
      throw new RangeError(`${what}[${index}] = ${irrep} is not an irrep mask of D2h or a subgroup (a whole number 0–7).`);
    }
  });
}

export function irrepHistogram(irreps: readonly number[], what = 'irreps'): number[] {
  checkIrreps(irreps, what);
  const histogram = new Array<number>(IRREP_COUNT).fill(0);
  for (const irrep of irreps) histogram[irrep] = (histogram[irrep] ?? 0) + 1;
  return histogram;
}

/** Ordered pairs (x from a, y from b) counted by the product irrep x ⊗ y. */
export function productHistogram(a: IrrepHistogram, b: IrrepHistogram): number[] {
  const result = new Array<number>(IRREP_COUNT).fill(0);
  for (let x = 0; x < IRREP_COUNT; x++) {
    for (let y = 0; y < IRREP_COUNT; y++) {
      const g = x ^ y;
      result[g] = (result[g] ?? 0) + at(a, x) * at(b, y);
    }
  }
  return result;
}

/** Unordered pairs of distinct orbitals from one list, counted by their product irrep. */
export function pairHistogram(a: IrrepHistogram): number[] {
  const result = new Array<number>(IRREP_COUNT).fill(0);
  for (let x = 0; x < IRREP_COUNT; x++) {
    const nx = at(a, x);
    result[0] = (result[0] ?? 0) + (nx * (nx - 1)) / 2;
    for (let y = x + 1; y < IRREP_COUNT; y++) {
      const g = x ^ y;
      result[g] = (result[g] ?? 0) + nx * at(a, y);
    }
  }
  return result;
}

export function at(histogram: IrrepHistogram, irrep: number): number {
  return histogram[irrep] ?? 0;
}

/** Σ_g a[g]·b[g]: pairs of items whose irreps multiply to the totally symmetric one. */
export function symmetricPairs(a: IrrepHistogram, b: IrrepHistogram): number {
  let total = 0;
  for (let g = 0; g < IRREP_COUNT; g++) total += at(a, g) * at(b, g);
  return total;
}
