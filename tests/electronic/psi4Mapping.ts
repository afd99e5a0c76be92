/**
 * How psi4 1.3.2 orders and normalises basis functions, and how its integral blocks map onto
 * Tessera's conventions (server/src/electronic/contracts.ts). Read from psi4's documentation of its
 * basis-function ordering and confirmed by the integral comparisons themselves:
 *
 * - spherical (puream) shells, psi4 order: m = 0, +1, −1, +2, −2, … (real solid harmonics with the
 *   same signs as ours); Tessera: m = −l … +l, except p, which is x, y, z in Tessera and
 *   z, x, y (m = 0, +1, −1) in psi4;
 * - cartesian shells: the same component order in both (xx, xy, xz, yy, yz, zz, …), but psi4 gives
 *   every component the normalisation of x^l, so that d_xy has norm 1/√3; Tessera normalises every
 *   component, so Tessera's value = psi4's value × Π over indices of
 *   √((2l−1)!!/((2a−1)!!(2b−1)!!(2c−1)!!)).
 */
import { cartesianComponentFactor, cartesianExponents } from '../../server/src/electronic/basis/cartesian';

/** For one shell: tessera[ourIndex[k]] = psi4[k] × factor[k]. */
export interface ShellMapping {
  readonly ourIndex: Int32Array;
  readonly factor: Float64Array;
}

export function shellMapping(l: number, spherical: boolean): ShellMapping {
  if (spherical) {
    const n = 2 * l + 1;
    const ourIndex = new Int32Array(n);
    for (let k = 0; k < n; k++) {
      const m = k === 0 ? 0 : k % 2 === 1 ? (k + 1) / 2 : -k / 2;
      ourIndex[k] = l === 1 ? [2, 0, 1][k]! : m + l;
    }
    return { ourIndex, factor: new Float64Array(n).fill(1) };
  }
  const exps = cartesianExponents(l);
  const n = exps.length / 3;
  const ourIndex = new Int32Array(n);
  const factor = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    ourIndex[k] = k;
    factor[k] = cartesianComponentFactor(exps[3 * k]!, exps[3 * k + 1]!, exps[3 * k + 2]!);
  }
  return { ourIndex, factor };
}

/** Maps a psi4 block over shells of momenta ls (row-major in psi4 order) to Tessera's order and normalisation. */
export function mapBlock(values: readonly number[], ls: readonly number[], spherical: boolean): Float64Array {
  const maps = ls.map((l) => shellMapping(l, spherical));
  const sizes = maps.map((m) => m.ourIndex.length);
  const out = new Float64Array(values.length);
  const strides = sizes.map((_, i) => sizes.slice(i + 1).reduce((a, b) => a * b, 1));
  const index = new Array<number>(ls.length).fill(0);
  for (let k = 0; k < values.length; k++) {
    let rest = k;
    let target = 0;
    let factor = 1;
    for (let d = 0; d < ls.length; d++) {
      index[d] = Math.floor(rest / strides[d]!);
      rest -= index[d]! * strides[d]!;
      target += maps[d]!.ourIndex[index[d]!]! * strides[d]!;
      factor *= maps[d]!.factor[index[d]!]!;
    }
    out[target] = values[k]! * factor;
  }
  return out;
}
