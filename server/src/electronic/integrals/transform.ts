/**
 * From cartesian integrals (every component with the radial normalisation of x^l, the convention
 * of Shell.coefficients) to the basis functions of contracts.ts: s and p unchanged (p is x, y, z in
 * both kinds); cartesian l ≥ 2 scaled component by component to unit norm; spherical l ≥ 2 combined
 * into real solid harmonics m = −l … l.
 */
import type { FunctionKind } from '../contracts';
import { cartesianComponentFactor, cartesianCount, cartesianExponents } from '../basis/cartesian';
import { sphericalTransform } from '../basis/solidHarmonics';

export interface FunctionTransform {
  readonly l: number;
  readonly functions: number;
  readonly cartesians: number;
  /** functions × cartesians, row-major. */
  readonly matrix: Float64Array;
  /** 'identity' (s, p), 'diagonal' (cartesian l ≥ 2: `scale` per component) or 'dense' (spherical l ≥ 2). */
  readonly form: 'identity' | 'diagonal' | 'dense';
  readonly scale: Float64Array;
  /** For 'dense': per function row the first and one-past-last non-zero cartesian column. */
  readonly rowStart: Int32Array;
  readonly rowEnd: Int32Array;
}

const cache = new Map<string, FunctionTransform>();

export function functionTransform(l: number, kind: FunctionKind): FunctionTransform {
  const key = `${kind}${l}`;
  const cached = cache.get(key);
  if (cached) return cached;
  const cartesians = cartesianCount(l);
  const exps = cartesianExponents(l);
  const scale = new Float64Array(cartesians);
  for (let c = 0; c < cartesians; c++) scale[c] = cartesianComponentFactor(exps[3 * c]!, exps[3 * c + 1]!, exps[3 * c + 2]!);
  let form: FunctionTransform['form'];
  let matrix: Float64Array;
  let functions: number;
  if (l <= 1) {
    form = 'identity';
    functions = cartesians;
    matrix = new Float64Array(functions * cartesians);
    for (let i = 0; i < functions; i++) matrix[i * cartesians + i] = 1;
  } else if (kind === 'cartesian') {
    form = 'diagonal';
    functions = cartesians;
    matrix = new Float64Array(functions * cartesians);
    for (let i = 0; i < functions; i++) matrix[i * cartesians + i] = scale[i]!;
  } else {
    form = 'dense';
    functions = 2 * l + 1;
    matrix = sphericalTransform(l);
  }
  const rowStart = new Int32Array(functions);
  const rowEnd = new Int32Array(functions);
  for (let i = 0; i < functions; i++) {
    let first = cartesians;
    let last = 0;
    for (let c = 0; c < cartesians; c++) {
      if (matrix[i * cartesians + c] !== 0) {
        if (first === cartesians) first = c;
        last = c + 1;
      }
    }
    rowStart[i] = first;
    rowEnd[i] = last;
  }
  const transform: FunctionTransform = { l, functions, cartesians, matrix, form, scale, rowStart, rowEnd };
  cache.set(key, transform);
  return transform;
}

/**
 * Transforms the first index of a block: input [cartesians of A][inner] → output [functions of A][inner],
 * where `inner` is the number of trailing elements per row. Allocation-free.
 */
export function transformFirstIndex(t: FunctionTransform, input: Float64Array, inner: number, output: Float64Array): void {
  if (t.form === 'identity') {
    const n = t.functions * inner;
    for (let k = 0; k < n; k++) output[k] = input[k]!;
    return;
  }
  if (t.form === 'diagonal') {
    for (let i = 0; i < t.functions; i++) {
      const s = t.scale[i]!;
      const base = i * inner;
      for (let k = 0; k < inner; k++) output[base + k] = s * input[base + k]!;
    }
    return;
  }
  const m = t.matrix;
  const nc = t.cartesians;
  for (let i = 0; i < t.functions; i++) {
    const out = i * inner;
    for (let k = 0; k < inner; k++) output[out + k] = 0;
    for (let c = t.rowStart[i]!; c < t.rowEnd[i]!; c++) {
      const w = m[i * nc + c]!;
      if (w === 0) continue;
      const src = c * inner;
      for (let k = 0; k < inner; k++) output[out + k]! += w * input[src + k]!;
    }
  }
}

/**
 * Transforms the last index of a block: input [outer][cartesians of B] → output [outer][functions of B].
 */
export function transformLastIndex(t: FunctionTransform, input: Float64Array, outer: number, output: Float64Array): void {
  const nc = t.cartesians;
  const nf = t.functions;
  if (t.form === 'identity') {
    const n = outer * nf;
    for (let k = 0; k < n; k++) output[k] = input[k]!;
    return;
  }
  if (t.form === 'diagonal') {
    for (let o = 0; o < outer; o++) for (let i = 0; i < nf; i++) output[o * nf + i] = t.scale[i]! * input[o * nc + i]!;
    return;
  }
  const m = t.matrix;
  for (let o = 0; o < outer; o++) {
    const src = o * nc;
    for (let i = 0; i < nf; i++) {
      let sum = 0;
      for (let c = t.rowStart[i]!; c < t.rowEnd[i]!; c++) sum += m[i * nc + c]! * input[src + c]!;
      output[o * nf + i] = sum;
    }
  }
}
