/**
 * Type-2 (semi-local) ECP integrals ⟨a| Σ_m |lm⟩ U_l(r) ⟨lm| |b⟩ about an ECP centre C, with
 * U_l(r) = Σ_k d_k r^(n_k−2) exp(−ζ_k r²), by the angular-projection method of L. E. McMurchie and
 * E. R. Davidson, J. Comput. Phys. 44, 289 (1981), with the radial integrals by quadrature as in
 * R. Flores-Moreno, R. J. Alvarez-Mendez, A. Vela, A. M. Köster, J. Comput. Chem. 27, 1009 (2006).
 *
 * With a = A − C (length a, direction â), a primitive x_A^ax y_A^ay z_A^az exp(−α r_A²) of shell A,
 * expanded about C by the binomial theorem, and the plane-wave expansion
 * exp(2α a·r) = 4π Σ_λ i_λ(2αar) Σ_σ Y_λσ(â) Y_λσ(r̂), has the angular projection
 *   ∫ χ_A(r r̂) Y_lm(r̂) dΩ = 4π Σ_(λ,N) X_A[m][λ][N] r^N G_A(λ; r),
 *   X_A[m][λ][N] = Σ_(i+j+k=N) B_ijk Σ_σ Y_λσ(â) Ω(ijk; λσ; lm),
 *   B_ijk = C(ax,i) C(ay,j) C(az,k) (−a_x)^(ax−i) (−a_y)^(ay−j) (−a_z)^(az−k),
 *   G_A(λ; r) = Σ_α c_α exp(−α(r − a)²) K_λ(2αar),   K_λ(z) = e^(−z) i_λ(z)  (bessel.ts),
 * so that
 *   ⟨a| P_l U_l P_l |b⟩ = (4π)² Σ_m Σ_(λ,N) Σ_(λ',N') X_A[m][λ][N] X_B[m][λ'][N'] R[λ][λ'][N+N'],
 *   R[λ][λ'][n] = ∫₀^∞ r^(2+n) U_l(r) G_A(λ; r) G_B(λ'; r) dr.
 * X depends on one shell only and is computed once per shell and centre (ShellProjection); the
 * radial functions G contract the primitives before the quadrature, so one quadrature per shell
 * pair serves every channel and every (λ, λ', n).
 *
 * The radial quadrature is adaptive Gauss–Kronrod (quadrature.ts) with error control. Its range
 * and first panels come from the Gaussian envelopes of the primitive triples (α of A, β of B, ζ of
 * the potential): exp(−α(r−a)² − β(r−b)² − ζr²) is a Gaussian of exponent p = α+β+ζ about
 * r₀ = (αa + βb)/p with height exp(−(αβ(a−b)² + αζa² + βζb²)/p) (K_λ ≤ 1), so triples below
 * ENVELOPE_CUTOFF are dropped, the range is the union of the others' supports, and each of their
 * peaks starts in a panel at most PANEL_WIDTHS of its widths 1/√p long.
 */
import type { Shell } from '../../contracts';
import { cartesianCount, cartesianCountUpTo, cartesianExponents, cartesianIndex } from '../../basis/cartesian';
import { evaluateHarmonics, projectorAngularTable } from './angular';
import { scaledBesselI } from './bessel';
import { binomial } from './local';
import { AdaptiveQuadrature, type VectorIntegrand } from './quadrature';

/** One semi-local channel U_l − U_L as the data gives it (l ≥ 0). */
export interface SemilocalChannel {
  readonly l: number;
  readonly powers: Int32Array;
  readonly exponents: Float64Array;
  readonly coefficients: Float64Array;
}

/** Primitive triples whose envelope height (with coefficients) falls below this are left out. */
const ENVELOPE_CUTOFF = 1e-20;
/** A peak starts in a panel no longer than this many of its widths (1/√p)... */
const PANEL_WIDTHS = 6;
/** ... and so do its flanks out to this many widths (exp(−64) beyond). */
const TAIL_WIDTHS = 8;
/**
 * Error estimate asked of the radial integrals, relative to the largest ∫|integrand| of the shell
 * pair. QUADPACK's estimate is pessimistic for these smooth integrands: at 1e-10 the ECP matrices
 * of HI, I2, IF and AgCl differ from a run at 1e-16 (PANEL_WIDTHS 2) by at most 6e-14 (measured).
 */
const RELATIVE_TOLERANCE = 1e-10;
const FOUR_PI_SQUARED = 16 * Math.PI * Math.PI;
/**
 * A primitive whose exp(−α(r − a)²) is below e^−75 (3e-33) at a point is left out there: with
 * normalised coefficients below 1e6 its share of any integrand value is under 1e-26.
 */
const PRIMITIVE_CUTOFF = 75;

/** The angular factors X of one shell about one ECP centre, for every channel. */
export class ShellProjection {
  /** Distance |A − C| and the unit vector from C to A ((0, 0, 1) when A = C). */
  readonly distance: number;
  /** X per channel: [c][m][λ][N], sizes ncart × (2l+1) × (la+l+1) × (la+1). */
  readonly factors: Float64Array[];

  constructor(shell: Shell, cx: number, cy: number, cz: number, channels: readonly SemilocalChannel[], nMax: number) {
    const ax = shell.x - cx;
    const ay = shell.y - cy;
    const az = shell.z - cz;
    const distance = Math.sqrt(ax * ax + ay * ay + az * az);
    this.distance = distance;
    const ux = distance > 0 ? ax / distance : 0;
    const uy = distance > 0 ? ay / distance : 0;
    const uz = distance > 0 ? az / distance : 1;
    const la = shell.l;
    const nc = cartesianCount(la);
    const exps = cartesianExponents(la);
    let lambdaMax = 0;
    for (const channel of channels) lambdaMax = Math.max(lambdaMax, la + channel.l);
    const harmonics = new Float64Array((lambdaMax + 1) ** 2);
    for (let lambda = 0; lambda <= lambdaMax; lambda++) evaluateHarmonics(lambda, ux, uy, uz, harmonics, lambda * lambda);
    const powX = powers(-ax, la);
    const powY = powers(-ay, la);
    const powZ = powers(-az, la);
    this.factors = channels.map((channel) => {
      const l = channel.l;
      const table = projectorAngularTable(l, nMax);
      const mCount = 2 * l + 1;
      const lambdaCount = la + l + 1;
      const nCount = la + 1;
      const tableBlock = (table.lambdaMax + 1) ** 2;
      const x = new Float64Array(nc * mCount * lambdaCount * nCount);
      for (let c = 0; c < nc; c++) {
        const ex = exps[3 * c]!;
        const ey = exps[3 * c + 1]!;
        const ez = exps[3 * c + 2]!;
        for (let i = 0; i <= ex; i++) {
          for (let j = 0; j <= ey; j++) {
            for (let k = 0; k <= ez; k++) {
              const coefficient = binomial(ex, i) * binomial(ey, j) * binomial(ez, k) * powX[ex - i]! * powY[ey - j]! * powZ[ez - k]!;
              if (coefficient === 0) continue;
              const n = i + j + k;
              const monomial = cartesianCountUpTo(n - 1) + cartesianIndex(i, j, k);
              // |λ − l| ≤ N and λ + l + N even (angular.ts)
              for (let lambda = l >= n ? l - n : (l + n) % 2; lambda <= l + n; lambda += 2) {
                for (let m = 0; m < mCount; m++) {
                  let sum = 0;
                  const base = (monomial * tableBlock + lambda * lambda) * mCount + m;
                  for (let sigma = 0; sigma < 2 * lambda + 1; sigma++) sum += harmonics[lambda * lambda + sigma]! * table.values[base + sigma * mCount]!;
                  x[((c * mCount + m) * lambdaCount + lambda) * nCount + n]! += coefficient * sum;
                }
              }
            }
          }
        }
      }
      return x;
    });
  }
}

function powers(value: number, n: number): Float64Array {
  const out = new Float64Array(n + 1);
  out[0] = 1;
  for (let k = 1; k <= n; k++) out[k] = out[k - 1]! * value;
  return out;
}

/**
 * The radial integrand of one shell pair for every channel of one centre: values at r of
 * r^(2+n) U_l(r) G_A(λ; r) G_B(λ'; r) for the (λ, λ', n) the angular factors can meet: X_A[λ][N]
 * vanishes unless |l − λ| ≤ N ≤ l_A with N + λ + l even, so n = N + N' runs from
 * |l − λ| + |l − λ'| to l_A + l_B in steps of 2. slot(h, λ, λ') is where the run of one (λ, λ')
 * starts; n sits at slot + (n − |l − λ| − |l − λ'|)/2.
 */
class RadialIntegrand implements VectorIntegrand {
  a!: Shell;
  b!: Shell;
  distanceA = 0;
  distanceB = 0;
  lambdaA = 0;
  lambdaB = 0;
  nCount = 0;
  /**
   * Highest λ of shell A (and λ' of B) per channel: l_A + l, or for a shell on the centre 0 (only
   * K_0(0) is non-zero) when l ≤ l_A and −1 (no projection at all) when l > l_A.
   */
  readonly topA: Int32Array;
  readonly topB: Int32Array;
  /** Stride of λ and λ' in `slots`. */
  readonly lambdaStride: number;
  /** First slot of each (channel, λ, λ'): slots[(h · stride + λ) · stride + λ']. */
  readonly slots: Int32Array;
  readonly gA: Float64Array;
  readonly gB: Float64Array;
  readonly bessel: Float64Array;
  readonly rPowers: Float64Array;

  constructor(
    readonly channels: readonly SemilocalChannel[],
    lambdaMax: number,
    nMax: number,
  ) {
    this.lambdaStride = lambdaMax + 1;
    this.topA = new Int32Array(channels.length);
    this.topB = new Int32Array(channels.length);
    this.slots = new Int32Array(channels.length * this.lambdaStride * this.lambdaStride);
    this.gA = new Float64Array(lambdaMax + 1);
    this.gB = new Float64Array(lambdaMax + 1);
    this.bessel = new Float64Array(lambdaMax + 1);
    this.rPowers = new Float64Array(2 * nMax + 1);
  }

  /** Sets the pair; returns the vector dimension. */
  bind(a: Shell, distanceA: number, b: Shell, distanceB: number): number {
    this.a = a;
    this.b = b;
    this.distanceA = distanceA;
    this.distanceB = distanceB;
    let lmax = 0;
    for (const channel of this.channels) lmax = Math.max(lmax, channel.l);
    this.lambdaA = a.l + lmax;
    this.lambdaB = b.l + lmax;
    this.nCount = a.l + b.l + 1;
    const stride = this.lambdaStride;
    let slot = 0;
    const top = (shellL: number, l: number, distance: number): number => (distance > 0 ? shellL + l : l <= shellL ? 0 : -1);
    this.channels.forEach((channel, h) => {
      const l = channel.l;
      const topA = top(a.l, l, distanceA);
      const topB = top(b.l, l, distanceB);
      this.topA[h] = topA;
      this.topB[h] = topB;
      for (let lambda = 0; lambda <= topA; lambda++) {
        for (let mu = 0; mu <= topB; mu++) {
          this.slots[(h * stride + lambda) * stride + mu] = slot;
          const first = Math.abs(l - lambda) + Math.abs(l - mu);
          if (first < this.nCount) slot += ((this.nCount - 1 - first) >> 1) + 1;
        }
      }
    });
    return slot;
  }

  private radial(shell: Shell, distance: number, r: number, lambdaMax: number, g: Float64Array): void {
    g.fill(0, 0, lambdaMax + 1);
    const bessel = this.bessel;
    const d = r - distance;
    for (let p = 0; p < shell.exponents.length; p++) {
      const alpha = shell.exponents[p]!;
      const exponent = alpha * d * d;
      if (exponent > PRIMITIVE_CUTOFF) continue;
      const weight = shell.coefficients[p]! * Math.exp(-exponent);
      if (distance === 0) {
        g[0]! += weight; // K_0(0) = 1, K_λ(0) = 0 for λ > 0
        continue;
      }
      scaledBesselI(2 * alpha * distance * r, lambdaMax, bessel);
      for (let lambda = 0; lambda <= lambdaMax; lambda++) g[lambda]! += weight * bessel[lambda]!;
    }
  }

  evaluate(r: number, out: Float64Array, offset: number): void {
    this.radial(this.a, this.distanceA, r, this.lambdaA, this.gA);
    this.radial(this.b, this.distanceB, r, this.lambdaB, this.gB);
    const nCount = this.nCount;
    const stride = this.lambdaStride;
    const rPowers = this.rPowers;
    const r2 = r * r;
    rPowers[0] = r2;
    for (let n = 1; n < nCount; n++) rPowers[n] = rPowers[n - 1]! * r;
    const gA = this.gA;
    const gB = this.gB;
    for (let h = 0; h < this.channels.length; h++) {
      const channel = this.channels[h]!;
      if (this.topA[h]! < 0 || this.topB[h]! < 0) continue;
      let u = 0;
      for (let k = 0; k < channel.exponents.length; k++) {
        const power = channel.powers[k]! - 2;
        const term = channel.coefficients[k]! * Math.exp(-channel.exponents[k]! * r2);
        u += power === 0 ? term : term * r ** power;
      }
      const l = channel.l;
      const la = this.topA[h]!;
      const lb = this.topB[h]!;
      let slot = offset + this.slots[h * stride * stride]!;
      for (let lambda = 0; lambda <= la; lambda++) {
        const ga = u * gA[lambda]!;
        const firstA = Math.abs(l - lambda);
        for (let mu = 0; mu <= lb; mu++) {
          const gab = ga * gB[mu]!;
          for (let n = firstA + Math.abs(l - mu); n < nCount; n += 2) out[slot++] = gab * rPowers[n]!;
        }
      }
    }
  }
}

/** Type-2 integrals of shell pairs about one ECP centre; work buffers reused across pairs. */
export class SemilocalEngine {
  private readonly integrand: RadialIntegrand;
  private readonly quadrature = new AdaptiveQuadrature();
  private radialIntegrals = new Float64Array(0);
  private readonly contracted: Float64Array;
  private breakpoints = new Float64Array(64);
  private featureCenter = new Float64Array(64);
  private featureWidth = new Float64Array(64);
  private featureCount = 0;
  /** Distinct exponents of the channels and the largest |d_k| r^(n−2) weight of each. */
  private readonly zetas: Float64Array;
  private readonly zetaWeights: Float64Array;
  private readonly maxPower: number;
  readonly lmaxChannel: number;

  constructor(
    readonly channels: readonly SemilocalChannel[],
    lmaxBasis: number,
  ) {
    let lmax = 0;
    let maxPower = 0;
    const zetas: number[] = [];
    const weights: number[] = [];
    for (const channel of channels) {
      lmax = Math.max(lmax, channel.l);
      channel.exponents.forEach((zeta, k) => {
        maxPower = Math.max(maxPower, channel.powers[k]!);
        const index = zetas.indexOf(zeta);
        const weight = Math.abs(channel.coefficients[k]!);
        if (index < 0) {
          zetas.push(zeta);
          weights.push(weight);
        } else {
          weights[index] = Math.max(weights[index]!, weight);
        }
      });
    }
    this.lmaxChannel = lmax;
    this.maxPower = maxPower;
    this.zetas = Float64Array.from(zetas);
    this.zetaWeights = Float64Array.from(weights);
    this.integrand = new RadialIntegrand(channels, lmaxBasis + lmax, lmaxBasis);
    const nc = cartesianCount(lmaxBasis);
    this.contracted = new Float64Array(nc * (2 * lmax + 1) * (lmaxBasis + lmax + 1) * (lmaxBasis + 1));
  }

  /** Panels the last pair's quadrature evaluated. */
  get lastPanels(): number {
    return this.quadrature.panelsEvaluated;
  }

  /**
   * Adds the type-2 integrals of shells a and b (cartesian components with the radial
   * normalisation of x^l) into out[c·ncart(b) + c'].
   */
  addPair(a: Shell, pa: ShellProjection, b: Shell, pb: ShellProjection, out: Float64Array): void {
    if (this.channels.length === 0) return;
    const dimension = this.integrand.bind(a, pa.distance, b, pb.distance);
    if (this.radialIntegrals.length < dimension) this.radialIntegrals = new Float64Array(dimension);
    const radial = this.radialIntegrals;
    radial.fill(0, 0, dimension);
    const count = this.panels(a, pa.distance, b, pb.distance);
    if (count < 2) return;
    if (this.quadrature.integrate(this.integrand, dimension, this.breakpoints, count, RELATIVE_TOLERANCE, radial) === 0) return;
    this.contract(a, pa, b, pb, out);
  }

  private ensureFeatures(n: number): void {
    if (this.featureCenter.length >= n) return;
    const size = Math.max(n, 2 * this.featureCenter.length);
    this.featureCenter = new Float64Array(size);
    this.featureWidth = new Float64Array(size);
  }

  private pushBreakpoint(count: number, value: number): number {
    if (count >= this.breakpoints.length) {
      const grown = new Float64Array(this.breakpoints.length * 2);
      grown.set(this.breakpoints);
      this.breakpoints = grown;
    }
    this.breakpoints[count] = value;
    return count + 1;
  }

  /** Range and first panels from the primitive-triple envelopes; returns the breakpoint count. */
  private panels(a: Shell, distanceA: number, b: Shell, distanceB: number): number {
    const logCutoff = Math.log(ENVELOPE_CUTOFF);
    const features = a.exponents.length * b.exponents.length * this.zetas.length;
    this.ensureFeatures(features);
    let lo = Infinity;
    let hi = -Infinity;
    let kept = 0;
    const power = 2 + a.l + b.l + this.maxPower;
    const ab = distanceA - distanceB;
    for (let i = 0; i < a.exponents.length; i++) {
      const alpha = a.exponents[i]!;
      const logA = Math.log(Math.abs(a.coefficients[i]!));
      for (let j = 0; j < b.exponents.length; j++) {
        const beta = b.exponents[j]!;
        const logAB = logA + Math.log(Math.abs(b.coefficients[j]!));
        for (let k = 0; k < this.zetas.length; k++) {
          const zeta = this.zetas[k]!;
          const p = alpha + beta + zeta;
          const center = (alpha * distanceA + beta * distanceB) / p;
          const logHeight =
            logAB + Math.log(this.zetaWeights[k]!) - (alpha * beta * ab * ab + alpha * zeta * distanceA * distanceA + beta * zeta * distanceB * distanceB) / p;
          // r^power grows the envelope outwards: solve r = r₀ + √((log h + power·ln r − ln ε)/p).
          const base = logHeight - logCutoff;
          let reach = center + Math.sqrt(Math.max(base, 0) / p);
          for (let iteration = 0; iteration < 3; iteration++) {
            reach = center + Math.sqrt(Math.max(base + power * Math.log(Math.max(reach, 1)), 0) / p);
          }
          if (base + power * Math.log(Math.max(reach, 1)) <= 0) continue;
          const halfWidth = Math.sqrt(Math.max(base + power * Math.log(Math.max(center, 1)), 0) / p);
          lo = Math.min(lo, Math.max(0, center - halfWidth));
          hi = Math.max(hi, reach);
          this.featureCenter[kept] = center;
          this.featureWidth[kept] = 1 / Math.sqrt(p);
          kept++;
        }
      }
    }
    if (kept === 0 || !(hi > lo)) return 0;
    // Panels halved while one holds the centre of a peak narrower than its length / PANEL_WIDTHS.
    this.featureCount = kept;
    const count = this.pushBreakpoint(0, lo);
    return this.split(lo, hi, count);
  }

  /**
   * Appends the right ends of the panels covering [lo, hi] (left to right): a panel is halved
   * while it reaches within TAIL_WIDTHS widths of a peak and is longer than PANEL_WIDTHS of them,
   * so that a peak's flanks too lie in panels the rule can see (a Gaussian tail at the edge of a
   * long panel falls between its nodes).
   */
  private split(lo: number, hi: number, count: number): number {
    let narrowest = Infinity;
    for (let f = 0; f < this.featureCount; f++) {
      const width = this.featureWidth[f]!;
      const center = this.featureCenter[f]!;
      if (center + TAIL_WIDTHS * width >= lo && center - TAIL_WIDTHS * width <= hi) narrowest = Math.min(narrowest, width);
    }
    if (narrowest === Infinity || hi - lo <= PANEL_WIDTHS * narrowest) return this.pushBreakpoint(count, hi);
    const mid = 0.5 * (lo + hi);
    return this.split(mid, hi, this.split(lo, mid, count));
  }

  /** out[ca][cb] += (4π)² Σ_h Σ_m Σ_(λ,N) X_A Σ_(λ',N') X_B R. */
  private contract(a: Shell, pa: ShellProjection, b: Shell, pb: ShellProjection, out: Float64Array): void {
    const na = cartesianCount(a.l);
    const nb = cartesianCount(b.l);
    const nCountA = a.l + 1;
    const nCountB = b.l + 1;
    const stride = this.integrand.lambdaStride;
    const slots = this.integrand.slots;
    const t = this.contracted;
    const radial = this.radialIntegrals;
    for (let h = 0; h < this.channels.length; h++) {
      const l = this.channels[h]!.l;
      const mCount = 2 * l + 1;
      const lambdaCountA = a.l + l + 1;
      const lambdaCountB = b.l + l + 1;
      const topA = this.integrand.topA[h]!;
      const topB = this.integrand.topB[h]!;
      if (topA < 0 || topB < 0) continue;
      const xa = pa.factors[h]!;
      const xb = pb.factors[h]!;
      // T[cb][m][λ][N] = Σ_(λ',N') X_B[cb][m][λ'][N'] R[λ][λ'][N+N']
      const tSize = nb * mCount * lambdaCountA * nCountA;
      t.fill(0, 0, tSize);
      for (let cb = 0; cb < nb; cb++) {
        for (let m = 0; m < mCount; m++) {
          const xbBase = (cb * mCount + m) * lambdaCountB;
          const tBase = (cb * mCount + m) * lambdaCountA;
          for (let mu = 0; mu <= topB; mu++) {
            for (let nb2 = 0; nb2 < nCountB; nb2++) {
              const xv = xb[(xbBase + mu) * nCountB + nb2]!;
              if (xv === 0) continue;
              for (let lambda = 0; lambda <= topA; lambda++) {
                const firstA = Math.abs(l - lambda);
                const first = firstA + Math.abs(l - mu);
                const rBase = slots[(h * stride + lambda) * stride + mu]! - (first >> 1);
                const tRow = (tBase + lambda) * nCountA;
                // R[λ][λ'][N + N'] for the N that X_A allows (|l − λ| ≤ N, N + λ + l even)
                for (let na2 = firstA; na2 < nCountA; na2 += 2) t[tRow + na2]! += xv * radial[rBase + ((na2 + nb2) >> 1)]!;
              }
            }
          }
        }
      }
      const block = mCount * lambdaCountA * nCountA;
      for (let ca = 0; ca < na; ca++) {
        const xaBase = ca * block;
        for (let cb = 0; cb < nb; cb++) {
          const tBase = cb * block;
          let sum = 0;
          for (let k = 0; k < block; k++) sum += xa[xaBase + k]! * t[tBase + k]!;
          out[ca * nb + cb]! += FOUR_PI_SQUARED * sum;
        }
      }
    }
  }

}
