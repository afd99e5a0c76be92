/**
 * Real solid harmonics as combinations of cartesian monomials, from their closed form.
 *
 * S_lm = N_lm Σ_t Σ_u Σ_v C_tuv x^(2t+|m|−2(u+v)) y^(2(u+v)) z^(l−2t−|m|), with
 *   C_tuv = (−1)^(t+v−v_m) (1/4)^t C(l,t) C(l−t,|m|+t) C(t,u) C(|m|,2v),
 *   N_lm  = (1/(2^|m| l!)) √(2 (l+|m|)! (l−|m|)! / 2^δ(m,0)),
 *   v_m = 0 for m ≥ 0 (cosine-like) and ½ for m < 0 (sine-like), v stepping by 1 from v_m,
 *   t = 0 … ⌊(l−|m|)/2⌋, u = 0 … t, 2v ≤ |m|.
 * T. Helgaker, P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory (Wiley, 2000),
 * eqs. 6.4.47–6.4.50; the same transformation in the general form of H. B. Schlegel and M. J. Frisch,
 * Int. J. Quantum Chem. 54, 83 (1995), eq. 15, restricted to real harmonics.
 *
 * With monomials that share the radial part normalising x^l (the convention of Shell.coefficients)
 * these combinations have unit norm; `tests/electronic/basis.test.ts` checks that through the
 * one-centre metric, and the integrals against psi4 check the signs and order.
 * Rows are m = −l, …, 0, …, +l (contracts.ts); columns the cartesian order of cartesian.ts.
 */
import { cartesianCount, cartesianIndex } from './cartesian';

function factorial(n: number): number {
  let value = 1;
  for (let k = 2; k <= n; k++) value *= k;
  return value;
}

function binomial(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  let value = 1;
  for (let i = 1; i <= k; i++) value = (value * (n - k + i)) / i;
  return Math.round(value);
}

/** The (2l+1) × (l+1)(l+2)/2 matrix of S_lm in cartesian monomials, row-major. */
function buildSphericalTransform(l: number): Float64Array {
  const ncart = cartesianCount(l);
  const out = new Float64Array((2 * l + 1) * ncart);
  for (let m = -l; m <= l; m++) {
    const am = Math.abs(m);
    const norm = Math.sqrt((2 * factorial(l + am) * factorial(l - am)) / (m === 0 ? 2 : 1)) / (2 ** am * factorial(l));
    const twoVm = m < 0 ? 1 : 0;
    const row = (m + l) * ncart;
    for (let t = 0; t <= Math.floor((l - am) / 2); t++) {
      for (let u = 0; u <= t; u++) {
        for (let twoV = twoVm; twoV <= am; twoV += 2) {
          const sign = (t + (twoV - twoVm) / 2) % 2 === 0 ? 1 : -1;
          const c = sign * 0.25 ** t * binomial(l, t) * binomial(l - t, am + t) * binomial(t, u) * binomial(am, twoV);
          const b = 2 * u + twoV;
          const a = 2 * t + am - b;
          const z = l - 2 * t - am;
          out[row + cartesianIndex(a, b, z)]! += norm * c;
        }
      }
    }
  }
  return out;
}

const transforms: Float64Array[] = [];

/** Cached S_lm coefficients for momentum l (rows m = −l … l over cartesian components). */
export function sphericalTransform(l: number): Float64Array {
  let matrix = transforms[l];
  if (!matrix) {
    matrix = buildSphericalTransform(l);
    transforms[l] = matrix;
  }
  return matrix;
}
