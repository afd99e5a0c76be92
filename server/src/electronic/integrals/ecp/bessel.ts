/**
 * Exponentially scaled modified spherical Bessel functions of the first kind,
 * K_λ(z) = exp(−z) i_λ(z), for λ = 0 … λmax at once and z ≥ 0 (0 ≤ K_λ ≤ 1, no overflow).
 *
 * They carry the angular projections of off-centre Gaussians in the semi-local ECP integrals:
 * exp(2αa r cos θ) = Σ_λ (2λ+1) i_λ(2αar) P_λ(cos θ) (L. E. McMurchie and E. R. Davidson,
 * J. Comput. Phys. 44, 289 (1981), eq. 13), and exp(−α(r² + a²)) i_λ(2αar) = exp(−α(r−a)²) K_λ(2αar).
 *
 * - z ≤ SERIES_LIMIT: the power series i_λ(z) = z^λ/(2λ+1)!! Σ_k (z²/2)^k / (k! (2λ+3)(2λ+5)…(2λ+2k+1))
 *   (positive terms) for the two highest orders, then the downward recursion
 *   i_(λ−1) = i_(λ+1) + (2λ+1)/z i_λ, whose terms are all positive (stable);
 * - z > SERIES_LIMIT: the closed forms K_0 = (1 − e^(−2z))/(2z),
 *   K_1 = ((1 + e^(−2z)) − 2K_0)/(2z), and the upward recursion K_(λ+1) = K_(λ−1) − (2λ+1)/z K_λ,
 *   stable while λ² is small against z (λ ≤ 16 here: SERIES_LIMIT grows with λmax to keep it so).
 * M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (1964), 10.2.5, 10.2.12,
 * 10.2.18; checked against arbitrary-precision values (mpmath) in tests/electronic/ecp.test.ts.
 */

/** Highest order evaluated (basis l ≤ 4 plus projector l ≤ 4, with room to spare). */
export const BESSEL_MAX_ORDER = 16;

/** Below this argument (or λmax² / 2, whichever is larger) the series is used. */
const SERIES_LIMIT = 16;

/**
 * Writes K_0(z) … K_lmax(z) into out[offset … offset + lmax]. No allocation.
 */
export function scaledBesselI(z: number, lmax: number, out: Float64Array, offset = 0): void {
  if (z === 0) {
    out[offset] = 1;
    for (let l = 1; l <= lmax; l++) out[offset + l] = 0;
    return;
  }
  if (z <= Math.max(SERIES_LIMIT, 0.5 * lmax * lmax)) {
    const e = Math.exp(-z);
    const top = lmax + 1;
    // Series for orders top and top − 1 (top is one above lmax so that λmax itself also comes from
    // the recursion when lmax ≥ 1 — both start values are series values).
    const hi = series(z, top) * e;
    const lo = series(z, top - 1) * e;
    let upper = hi;
    let current = lo;
    out[offset + Math.min(top - 1, lmax)] = current;
    for (let l = top - 1; l >= 1; l--) {
      const next = upper + ((2 * l + 1) / z) * current;
      upper = current;
      current = next;
      if (l - 1 <= lmax) out[offset + l - 1] = current;
    }
    return;
  }
  const e2 = Math.exp(-2 * z);
  const inv = 1 / z;
  const k0 = 0.5 * (1 - e2) * inv;
  out[offset] = k0;
  if (lmax === 0) return;
  const k1 = 0.5 * (1 + e2) * inv - k0 * inv;
  out[offset + 1] = k1;
  let previous = k0;
  let current = k1;
  for (let l = 1; l < lmax; l++) {
    const next = previous - (2 * l + 1) * inv * current;
    previous = current;
    current = next;
    out[offset + l + 1] = current;
  }
}

/** i_λ(z) by its power series (positive terms). */
function series(z: number, l: number): number {
  let lead = 1;
  for (let k = 1; k <= l; k++) lead *= z / (2 * k + 1);
  const x = 0.5 * z * z;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 500; k++) {
    term *= x / (k * (2 * l + 2 * k + 1));
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return lead * sum;
}
