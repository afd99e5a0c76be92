/**
 * Type-1 (local) ECP integrals ⟨a| Σ_k d_k exp(−ζ_k r_C²) |b⟩ for Gaussian terms (power n = 2,
 * r^(n−2) = 1: every def2 potential), in closed form: the three Gaussians on A, B and C combine
 * into one on Q = (αA + βB + ζC)/q, q = α + β + ζ (Gaussian product theorem), with the prefactor
 * exp(−(αβ AB² + αζ AC² + βζ BC²)/q); per cartesian direction
 *   ∫ (x−A_x)^i (x−B_x)^j exp(−q(x−Q_x)²) dx
 *     = Σ_s Σ_t C(i,s) C(j,t) (Q_x−A_x)^(i−s) (Q_x−B_x)^(j−t) M_(s+t),
 *   M_(2v) = (2v−1)!! / (2q)^v · √(π/q), M_odd = 0
 * (the overlap scheme of S. F. Boys, Proc. R. Soc. A 200, 542 (1950), extended to three centres;
 * T. Helgaker, P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory (2000), section 9.2).
 * Exact up to rounding: no quadrature. The same routine gives the Cauchy–Schwarz factors used to
 * screen shell pairs (index.ts).
 */
import type { Shell } from '../../contracts';
import { cartesianCount, cartesianExponents } from '../../basis/cartesian';

const BINOMIAL: number[][] = [];
for (let n = 0; n <= 16; n++) {
  BINOMIAL[n] = [];
  for (let k = 0; k <= n; k++) BINOMIAL[n]![k] = k === 0 || k === n ? 1 : BINOMIAL[n - 1]![k - 1]! + BINOMIAL[n - 1]![k]!;
}

/** Binomial coefficient C(n, k), n ≤ 16. */
export function binomial(n: number, k: number): number {
  return BINOMIAL[n]![k]!;
}

/** Gaussian terms of a local potential: exponents ζ_k and coefficients d_k about one centre. */
export interface GaussianTerms {
  readonly count: number;
  readonly exponents: Float64Array;
  readonly coefficients: Float64Array;
}

/** Scratch for one shell pair; sized for momenta up to lmax. */
export class LocalWorkspace {
  readonly ix: Float64Array;
  readonly iy: Float64Array;
  readonly iz: Float64Array;
  readonly moments: Float64Array;
  readonly powA: Float64Array;
  readonly powB: Float64Array;
  readonly dim: number;

  constructor(lmax: number) {
    this.dim = lmax + 1;
    this.ix = new Float64Array(this.dim * this.dim);
    this.iy = new Float64Array(this.dim * this.dim);
    this.iz = new Float64Array(this.dim * this.dim);
    this.moments = new Float64Array(2 * lmax + 1);
    this.powA = new Float64Array(this.dim);
    this.powB = new Float64Array(this.dim);
  }
}

/** The 1D integrals table[i·dim + j] for i ≤ la, j ≤ lb of one direction. */
function oneDimension(table: Float64Array, dim: number, la: number, lb: number, qa: number, qb: number, w: LocalWorkspace): void {
  const { moments, powA, powB } = w;
  powA[0] = 1;
  powB[0] = 1;
  for (let k = 1; k <= la; k++) powA[k] = powA[k - 1]! * qa;
  for (let k = 1; k <= lb; k++) powB[k] = powB[k - 1]! * qb;
  for (let i = 0; i <= la; i++) {
    for (let j = 0; j <= lb; j++) {
      let sum = 0;
      for (let s = 0; s <= i; s++) {
        const left = BINOMIAL[i]![s]! * powA[i - s]!;
        for (let t = s % 2; t <= j; t += 2) sum += left * BINOMIAL[j]![t]! * powB[j - t]! * moments[s + t]!;
      }
      table[i * dim + j] = sum;
    }
  }
}

/**
 * Adds Σ_k d_k ⟨a_c| exp(−ζ_k |r − C|²) |b_c'⟩ over the cartesian components of shells a and b
 * (each with the radial normalisation of x^l, as Shell.coefficients) into out[c·ncart(b) + c'].
 */
export function addLocalGaussianPair(a: Shell, b: Shell, cx: number, cy: number, cz: number, terms: GaussianTerms, w: LocalWorkspace, out: Float64Array): void {
  const la = a.l;
  const lb = b.l;
  const na = cartesianCount(la);
  const nb = cartesianCount(lb);
  const ea = cartesianExponents(la);
  const eb = cartesianExponents(lb);
  const dim = w.dim;
  const abx = a.x - b.x;
  const aby = a.y - b.y;
  const abz = a.z - b.z;
  const acx = a.x - cx;
  const acy = a.y - cy;
  const acz = a.z - cz;
  const bcx = b.x - cx;
  const bcy = b.y - cy;
  const bcz = b.z - cz;
  const ab2 = abx * abx + aby * aby + abz * abz;
  const ac2 = acx * acx + acy * acy + acz * acz;
  const bc2 = bcx * bcx + bcy * bcy + bcz * bcz;
  const moments = w.moments;
  const maxMoment = la + lb;
  for (let i = 0; i < a.exponents.length; i++) {
    const alpha = a.exponents[i]!;
    const ca = a.coefficients[i]!;
    for (let j = 0; j < b.exponents.length; j++) {
      const beta = b.exponents[j]!;
      const cab = ca * b.coefficients[j]!;
      for (let k = 0; k < terms.count; k++) {
        const zeta = terms.exponents[k]!;
        const q = alpha + beta + zeta;
        const exponent = (alpha * beta * ab2 + alpha * zeta * ac2 + beta * zeta * bc2) / q;
        if (exponent > 745) continue; // exp underflows to 0
        const prefactor = cab * terms.coefficients[k]! * Math.exp(-exponent);
        if (prefactor === 0) continue;
        const qx = (alpha * a.x + beta * b.x + zeta * cx) / q;
        const qy = (alpha * a.y + beta * b.y + zeta * cy) / q;
        const qz = (alpha * a.z + beta * b.z + zeta * cz) / q;
        // M_(2v) = (2v−1)!!/(2q)^v √(π/q)
        let m = Math.sqrt(Math.PI / q);
        for (let v = 0; 2 * v <= maxMoment; v++) {
          moments[2 * v] = m;
          if (2 * v + 1 <= maxMoment) moments[2 * v + 1] = 0;
          m *= (2 * v + 1) / (2 * q);
        }
        oneDimension(w.ix, dim, la, lb, qx - a.x, qx - b.x, w);
        oneDimension(w.iy, dim, la, lb, qy - a.y, qy - b.y, w);
        oneDimension(w.iz, dim, la, lb, qz - a.z, qz - b.z, w);
        for (let p = 0; p < na; p++) {
          const px = ea[3 * p]! * dim;
          const py = ea[3 * p + 1]! * dim;
          const pz = ea[3 * p + 2]! * dim;
          for (let r = 0; r < nb; r++) {
            out[p * nb + r]! += prefactor * w.ix[px + eb[3 * r]!]! * w.iy[py + eb[3 * r + 1]!]! * w.iz[pz + eb[3 * r + 2]!]!;
          }
        }
      }
    }
  }
}
