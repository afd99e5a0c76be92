/**
 * Adaptive Gauss–Kronrod quadrature of a vector of integrals over one interval, with the error
 * controlled panel by panel: each panel gets the 15-point Kronrod rule and its embedded 7-point
 * Gauss rule; the largest |K15 − G7| over the vector is the panel's error estimate, and a panel
 * whose estimate exceeds its share of the tolerance (tolerance × panel length / total length)
 * is halved. Nodes and weights: R. Piessens, E. de Doncker-Kapenga, C. W. Überhuber, D. K. Kahaner,
 * QUADPACK (Springer, 1983), routine QK15. The estimate |K15 − G7| bounds the error of G7, so the
 * accepted K15 values are in practice far more accurate than the tolerance.
 *
 * The caller seeds the first panels so that every narrow feature of the integrand starts in a
 * panel only a few of its widths long (a Gaussian peak between two nodes would otherwise go
 * unseen); see semilocal.ts.
 */

const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926, 0.741531185599394439863864773280788,
  0.586087235467691130294144845693013, 0.405845151377397166906606412076961, 0.207784955007898467600689403773245, 0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518, 0.140653259715525918745189590510238,
  0.16900472663926790282658342659855, 0.190350578064785409913256402421014, 0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
/** Gauss weights of the nodes XGK[1], XGK[3], XGK[5], XGK[7]. */
const WG = [0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975, 0.417959183673469387755102040816327];

/** Nodes on [−1, 1] in the order the panel evaluates them, with Kronrod and Gauss weights. */
export const KRONROD_NODES = new Float64Array(15);
export const KRONROD_WEIGHTS = new Float64Array(15);
export const GAUSS_WEIGHTS = new Float64Array(15);
{
  let k = 0;
  for (let i = 0; i < 7; i++) {
    for (const sign of [-1, 1]) {
      KRONROD_NODES[k] = sign * XGK[i]!;
      KRONROD_WEIGHTS[k] = WGK[i]!;
      GAUSS_WEIGHTS[k] = i % 2 === 1 ? WG[(i - 1) / 2]! : 0;
      k++;
    }
  }
  KRONROD_NODES[14] = 0;
  KRONROD_WEIGHTS[14] = WGK[7]!;
  GAUSS_WEIGHTS[14] = WG[3]!;
}

/** A vector-valued integrand: writes its `dimension` values at r into out[offset …]. */
export interface VectorIntegrand {
  evaluate(r: number, out: Float64Array, offset: number): void;
}

/** Relative rounding level below which a panel's error estimate is noise. */
const NOISE_FLOOR = 1e-14;

export class QuadratureLimitError extends Error {
  constructor(panels: number) {
    super(`The radial quadrature of an effective core potential integral did not converge within ${panels} panels.`);
    this.name = 'QuadratureLimitError';
  }
}

/** Scratch space of the adaptive rule, grown when a larger vector or panel stack is needed. */
export class AdaptiveQuadrature {
  private values = new Float64Array(0);
  private kronrod = new Float64Array(0);
  private gauss = new Float64Array(0);
  private absolute = new Float64Array(0);
  private seedResults = new Float64Array(0);
  private seedErrors = new Float64Array(0);
  private stackLo = new Float64Array(256);
  private stackHi = new Float64Array(256);
  /** Panels evaluated by the last integrate call (for benchmarks and tests). */
  panelsEvaluated = 0;

  constructor(readonly maxPanels = 20000) {}

  private reserve(dimension: number, seeds: number): void {
    if (this.kronrod.length < dimension) {
      this.values = new Float64Array(15 * dimension);
      this.kronrod = new Float64Array(dimension);
      this.gauss = new Float64Array(dimension);
      this.absolute = new Float64Array(dimension);
    }
    if (this.seedResults.length < dimension * seeds) this.seedResults = new Float64Array(Math.max(dimension * seeds, 2 * this.seedResults.length));
    if (this.seedErrors.length < seeds) this.seedErrors = new Float64Array(Math.max(seeds, 2 * this.seedErrors.length));
  }

  private push(depth: number, lo: number, hi: number): void {
    if (depth >= this.stackLo.length) {
      const lo2 = new Float64Array(this.stackLo.length * 2);
      const hi2 = new Float64Array(this.stackHi.length * 2);
      lo2.set(this.stackLo);
      hi2.set(this.stackHi);
      this.stackLo = lo2;
      this.stackHi = hi2;
    }
    this.stackLo[depth] = lo;
    this.stackHi[depth] = hi;
  }

  /**
   * One panel: the K15 values into this.kronrod, the largest ∫|f| into this.mass, and the error
   * estimate of K15 as the return value (max |K15 − G7| when that is already below `share`). The estimate is QUADPACK's:
   * per component ε = I_asc · min(1, (200 |K15 − G7| / I_asc)^1.5) with I_asc = ∫|f − K15/length|.
   */
  private panel(f: VectorIntegrand, dimension: number, lo: number, hi: number, share: number): number {
    const values = this.values;
    const kronrod = this.kronrod;
    const gauss = this.gauss;
    const absolute = this.absolute;
    const half = 0.5 * (hi - lo);
    const mid = 0.5 * (hi + lo);
    kronrod.fill(0, 0, dimension);
    gauss.fill(0, 0, dimension);
    absolute.fill(0, 0, dimension);
    for (let node = 0; node < 15; node++) {
      const base = node * dimension;
      f.evaluate(mid + half * KRONROD_NODES[node]!, values, base);
      const wk = KRONROD_WEIGHTS[node]! * half;
      const wg = GAUSS_WEIGHTS[node]! * half;
      for (let c = 0; c < dimension; c++) {
        const v = values[base + c]!;
        kronrod[c]! += wk * v;
        gauss[c]! += wg * v;
        absolute[c]! += wk * Math.abs(v);
      }
    }
    this.panelsEvaluated++;
    let mass = 0;
    let largest = 0;
    for (let c = 0; c < dimension; c++) {
      mass = Math.max(mass, absolute[c]!);
      largest = Math.max(largest, Math.abs(kronrod[c]! - gauss[c]!));
    }
    this.mass = mass;
    // |K15 − G7| bounds the error of G7 and so, with room to spare, that of K15: below the panel's
    // share it is answer enough, without the finer estimate.
    if (largest <= share) return largest;
    let error = 0;
    const inverseLength = 0.5 / half;
    for (let c = 0; c < dimension; c++) {
      const difference = Math.abs(kronrod[c]! - gauss[c]!);
      if (difference === 0) continue;
      const mean = kronrod[c]! * inverseLength;
      let asc = 0;
      for (let node = 0; node < 15; node++) asc += KRONROD_WEIGHTS[node]! * Math.abs(values[node * dimension + c]! - mean);
      asc *= half;
      const estimate = asc > 0 ? asc * Math.min(1, (200 * difference / asc) ** 1.5) : difference;
      error = Math.max(error, estimate);
    }
    return error;
  }

  private mass = 0;

  /**
   * ∫ f over the panels between consecutive `breakpoints[0 … count−1]` (ascending), added into
   * result[0 … dimension−1] (which the caller clears). The first panels are evaluated first; the
   * largest ∫|f| among the components, summed over them, sets the scale, and every panel is then
   * halved until its error estimate is below relativeTolerance × scale × its share of the range
   * (or at rounding level, NOISE_FLOOR × its own ∫|f|). Returns the scale. Throws
   * QuadratureLimitError past maxPanels.
   */
  integrate(f: VectorIntegrand, dimension: number, breakpoints: Float64Array, count: number, relativeTolerance: number, result: Float64Array): number {
    const seeds = count - 1;
    this.reserve(dimension, Math.max(seeds, 1));
    this.panelsEvaluated = 0;
    const total = breakpoints[count - 1]! - breakpoints[0]!;
    if (!(total > 0)) return 0;
    let scale = 0;
    for (let k = 0; k < seeds; k++) {
      const lo = breakpoints[k]!;
      const hi = breakpoints[k + 1]!;
      if (!(hi > lo)) {
        this.seedErrors[k] = -1;
        continue;
      }
      this.seedErrors[k] = this.panel(f, dimension, lo, hi, 0);
      for (let c = 0; c < dimension; c++) this.seedResults[k * dimension + c] = this.kronrod[c]!;
      scale += this.mass;
    }
    const tolerance = relativeTolerance * scale;
    let depth = 0;
    for (let k = seeds - 1; k >= 0; k--) {
      const error = this.seedErrors[k]!;
      if (error < 0) continue;
      const lo = breakpoints[k]!;
      const hi = breakpoints[k + 1]!;
      if (error <= (tolerance * (hi - lo)) / total) {
        for (let c = 0; c < dimension; c++) result[c]! += this.seedResults[k * dimension + c]!;
      } else {
        const mid = 0.5 * (lo + hi);
        this.push(depth++, mid, hi);
        this.push(depth++, lo, mid);
      }
    }
    while (depth > 0) {
      depth--;
      const lo = this.stackLo[depth]!;
      const hi = this.stackHi[depth]!;
      const error = this.panel(f, dimension, lo, hi, (tolerance * (hi - lo)) / total);
      const mass = this.mass;
      if (error <= (tolerance * (hi - lo)) / total || error <= NOISE_FLOOR * mass || hi - lo <= 1e-12 * total) {
        for (let c = 0; c < dimension; c++) result[c]! += this.kronrod[c]!;
        continue;
      }
      if (this.panelsEvaluated >= this.maxPanels) throw new QuadratureLimitError(this.maxPanels);
      const mid = 0.5 * (lo + hi);
      this.push(depth++, mid, hi);
      this.push(depth++, lo, mid);
    }
    return scale;
  }
}
