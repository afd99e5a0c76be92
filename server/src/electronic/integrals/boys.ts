/**
 * The Boys function F_m(T) = ∫₀¹ t^(2m) exp(−T t²) dt (S. F. Boys, Proc. R. Soc. A 200, 542 (1950)),
 * for m = 0 … BOYS_MAX_ORDER at once, relative accuracy better than 1e-14 over T ≥ 0.
 *
 * - T < BOYS_TABLE_LIMIT: a table of F_m at grid points T₀ = k·h (h = 1/16) for m up to
 *   BOYS_MAX_ORDER + TAYLOR_TERMS. The highest wanted order comes from the Taylor series
 *   F_m(T₀ + Δ) = Σ_k F_(m+k)(T₀) (−Δ)^k / k! (|Δ| ≤ h/2, eight terms: truncation below 1e-16
 *   relative), the lower orders from the downward recursion F_m = (2T F_(m+1) + e^(−T)) / (2m+1),
 *   which is stable (errors shrink going down).
 * - T ≥ BOYS_TABLE_LIMIT: F_0 = ½ √(π/T) (erf √T = 1 to 1e-17 there) and the upward recursion
 *   F_(m+1) = ((2m+1) F_m − e^(−T)) / (2T), stable while 2m+1 < 2T.
 * The table is filled once from the series F_m(T) = e^(−T) Σ_k (2T)^k / ((2m+1)(2m+3)…(2m+2k+1))
 * (positive terms, no cancellation) at the top order and the downward recursion below it.
 * Scheme as in T. Helgaker, P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory (2000),
 * section 9.8.
 */

/** Highest order the evaluator returns: enough for (gg|gg) with derivatives and for i functions. */
export const BOYS_MAX_ORDER = 32;
export const BOYS_TABLE_LIMIT = 40;
const TAYLOR_TERMS = 8;
const STEPS_PER_UNIT = 16;
const STEP = 1 / STEPS_PER_UNIT;
const TABLE_ORDERS = BOYS_MAX_ORDER + TAYLOR_TERMS + 1;
const GRID_POINTS = BOYS_TABLE_LIMIT * STEPS_PER_UNIT + 1;
const HALF_SQRT_PI = 0.5 * Math.sqrt(Math.PI);

/** table[k · TABLE_ORDERS + m] = F_m(k·h). */
const table = new Float64Array(GRID_POINTS * TABLE_ORDERS);
const inverseFactorial = new Float64Array(TAYLOR_TERMS);

function fillTable(): void {
  let f = 1;
  for (let j = 0; j < TAYLOR_TERMS; j++) {
    inverseFactorial[j] = 1 / f;
    f *= j + 1;
  }
  const top = TABLE_ORDERS - 1;
  for (let k = 0; k < GRID_POINTS; k++) {
    const t = k * STEP;
    const expT = Math.exp(-t);
    // Series at the top order: terms (2T)^j / ((2m+1)(2m+3)…(2m+2j+1)).
    let term = 1 / (2 * top + 1);
    let sum = term;
    for (let j = 1; j < 2000; j++) {
      term *= (2 * t) / (2 * top + 2 * j + 1);
      sum += term;
      if (term < sum * 1e-18) break;
    }
    const base = k * TABLE_ORDERS;
    table[base + top] = expT * sum;
    for (let m = top - 1; m >= 0; m--) table[base + m] = (2 * t * table[base + m + 1]! + expT) / (2 * m + 1);
  }
}
fillTable();

/**
 * Writes F_0(T) … F_maxOrder(T) into out[0 … maxOrder]. No allocation; maxOrder ≤ BOYS_MAX_ORDER.
 */
export function boys(maxOrder: number, t: number, out: Float64Array): void {
  if (t < BOYS_TABLE_LIMIT) {
    const k = Math.round(t * STEPS_PER_UNIT);
    const delta = k * STEP - t; // F(T) = Σ F_(m+j)(T₀) (T₀ − T)^j / j!
    const base = k * TABLE_ORDERS + maxOrder;
    let value = 0;
    for (let j = TAYLOR_TERMS - 1; j >= 0; j--) value = value * delta + table[base + j]! * inverseFactorial[j]!;
    out[maxOrder] = value;
    if (maxOrder > 0) {
      const expT = Math.exp(-t);
      const twoT = 2 * t;
      for (let m = maxOrder - 1; m >= 0; m--) {
        value = (twoT * value + expT) / (2 * m + 1);
        out[m] = value;
      }
    }
    return;
  }
  let value = HALF_SQRT_PI / Math.sqrt(t);
  out[0] = value;
  if (maxOrder > 0) {
    const expT = Math.exp(-t);
    const inverseTwoT = 0.5 / t;
    for (let m = 0; m < maxOrder; m++) {
      value = ((2 * m + 1) * value - expT) * inverseTwoT;
      out[m + 1] = value;
    }
  }
}
