/**
 * Cartesian components of a shell and their normalisation.
 *
 * Order (contracts.ts): exponents (a, b, c) of x^a y^b z^c with a descending, then b descending:
 * d = xx, xy, xz, yy, yz, zz. A contracted shell's coefficients normalise the x^l component; the
 * component x^a y^b z^c with the same radial part has norm² (2a−1)!!(2b−1)!!(2c−1)!!/(2l−1)!! of it,
 * so it is multiplied by the inverse square root of that to have unit norm.
 */

/** Number of cartesian components of angular momentum l: (l+1)(l+2)/2. */
export function cartesianCount(l: number): number {
  return ((l + 1) * (l + 2)) / 2;
}

/** Number of cartesian components of all momenta 0..l: (l+1)(l+2)(l+3)/6. */
export function cartesianCountUpTo(l: number): number {
  return l < 0 ? 0 : ((l + 1) * (l + 2) * (l + 3)) / 6;
}

/** Index of x^a y^b z^c (a+b+c = l) within its shell, in the order above. */
export function cartesianIndex(a: number, b: number, c: number): number {
  const l = a + b + c;
  const i = l - a; // b + c
  return (i * (i + 1)) / 2 + c;
}

/** The exponents of every component of momentum l, flat: [a0, b0, c0, a1, b1, c1, ...]. */
export function cartesianExponents(l: number): Int32Array {
  const out = new Int32Array(3 * cartesianCount(l));
  let k = 0;
  for (let a = l; a >= 0; a--) {
    for (let b = l - a; b >= 0; b--) {
      out[k++] = a;
      out[k++] = b;
      out[k++] = l - a - b;
    }
  }
  return out;
}

/** (2n−1)!! with (−1)!! = 1. */
export function doubleFactorialOdd(n: number): number {
  let value = 1;
  for (let k = 2 * n - 1; k > 1; k -= 2) value *= k;
  return value;
}

/** Factor that gives x^a y^b z^c unit norm when the shell's coefficients normalise x^l. */
export function cartesianComponentFactor(a: number, b: number, c: number): number {
  const l = a + b + c;
  return Math.sqrt(doubleFactorialOdd(l) / (doubleFactorialOdd(a) * doubleFactorialOdd(b) * doubleFactorialOdd(c)));
}
