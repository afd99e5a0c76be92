/**
 * The effective-core-potential matrix of a molecular basis:
 *   U = Σ_C [ U_L^C(r_C) + Σ_(l<L) Σ_m |lm⟩_C (U_l^C − U_L^C)(r_C) ⟨lm|_C ],
 * the local (type-1) part in closed form (local.ts) and the semi-local (type-2) part by angular
 * projection and adaptive radial quadrature (semilocal.ts), over contracted shells of any
 * momentum on any centres, in the function order and normalisation of contracts.ts.
 *
 * Screening: the operators exp(−ζ r_C²) and P_l exp(−ζ r_C²) P_l are positive and the second is
 * bounded by the first (the projector commutes with a radial function), so by Cauchy–Schwarz
 *   |⟨a|U|b⟩| ≤ Σ_ζ w_ζ Q_a(ζ) Q_b(ζ),   Q_a(ζ) = max_c √⟨a_c| exp(−ζ r_C²) |a_c⟩,
 * with w_ζ the sum of |d_k| over the terms of exponent ζ (every channel). A shell pair whose bound
 * (times the largest row sum of the cartesian-to-function transformation, squared) is below the
 * threshold is skipped for that centre: far from the centre both factors vanish like
 * exp(−ζ d²) (R. A. Shaw and J. G. Hill, J. Chem. Phys. 147, 074108 (2017), where screening of
 * this kind is analysed). Terms with r^(n−2) ≠ 1 have no such bound; a centre with one is not
 * screened.
 */
import { throwIfCancelled, type CancelToken, type MolecularBasis, type Shell } from '../../contracts';
import { cartesianCount } from '../../basis/cartesian';
import { assertEcpSupported } from '../ecpSupport';
import { functionTransform, transformFirstIndex, transformLastIndex, type FunctionTransform } from '../transform';
import { addLocalGaussianPair, LocalWorkspace, type GaussianTerms } from './local';
import { SemilocalEngine, ShellProjection, type SemilocalChannel } from './semilocal';

/** Default screening threshold on the bound of a shell-pair block (hartree). */
export const ECP_SCREENING_THRESHOLD = 1e-14;
const CANCEL_CHECK_INTERVAL = 32;

export interface EcpOptions {
  /** Shell pairs whose bound for a centre is below this are skipped for it; default 1e-14. */
  readonly threshold?: number;
  readonly cancel?: CancelToken;
}

/** Counts of the last matrix build, for benchmarks and tests. */
export interface EcpStatistics {
  readonly pairsComputed: number;
  readonly pairsScreened: number;
}

/** One ECP centre with its channels split into the local and the semi-local parts. */
class EcpSite {
  readonly local: GaussianTerms;
  readonly engine: SemilocalEngine;
  /** Distinct exponents over every channel and the sum of |d| of each. */
  readonly zetas: Float64Array;
  readonly zetaWeights: Float64Array;
  readonly screened: boolean;
  private readonly projections: (ShellProjection | undefined)[];
  private readonly bounds: (Float64Array | undefined)[];

  constructor(
    readonly basis: MolecularBasis,
    readonly x: number,
    readonly y: number,
    readonly z: number,
    localTerms: GaussianTerms,
    readonly channels: readonly SemilocalChannel[],
    lmaxBasis: number,
    readonly workspace: LocalWorkspace,
    private readonly scratch: Float64Array,
  ) {
    this.local = localTerms;
    this.engine = new SemilocalEngine(channels, lmaxBasis);
    const zetas: number[] = [];
    const weights: number[] = [];
    let gaussianOnly = true;
    const add = (zeta: number, d: number, power: number): void => {
      if (power !== 2) gaussianOnly = false;
      const index = zetas.indexOf(zeta);
      if (index < 0) {
        zetas.push(zeta);
        weights.push(Math.abs(d));
      } else {
        weights[index]! += Math.abs(d);
      }
    };
    for (let k = 0; k < localTerms.count; k++) add(localTerms.exponents[k]!, localTerms.coefficients[k]!, 2);
    for (const channel of channels) channel.exponents.forEach((zeta, k) => add(zeta, channel.coefficients[k]!, channel.powers[k]!));
    this.zetas = Float64Array.from(zetas);
    this.zetaWeights = Float64Array.from(weights);
    this.screened = gaussianOnly;
    this.projections = new Array<ShellProjection | undefined>(basis.shells.length);
    this.bounds = new Array<Float64Array | undefined>(basis.shells.length);
  }

  projection(index: number, nMax: number): ShellProjection {
    let projection = this.projections[index];
    if (!projection) {
      projection = new ShellProjection(this.basis.shells[index]!, this.x, this.y, this.z, this.channels, nMax);
      this.projections[index] = projection;
    }
    return projection;
  }

  /** Q_a(ζ) for every distinct exponent: max_c √⟨a_c| exp(−ζ r_C²) |a_c⟩. */
  bound(index: number): Float64Array {
    let values = this.bounds[index];
    if (!values) {
      const shell = this.basis.shells[index]!;
      const nc = cartesianCount(shell.l);
      values = new Float64Array(this.zetas.length);
      const one = { count: 1, exponents: new Float64Array(1), coefficients: Float64Array.of(1) };
      for (let k = 0; k < this.zetas.length; k++) {
        one.exponents[0] = this.zetas[k]!;
        this.scratch.fill(0, 0, nc * nc);
        addLocalGaussianPair(shell, shell, this.x, this.y, this.z, one, this.workspace, this.scratch);
        let largest = 0;
        for (let c = 0; c < nc; c++) largest = Math.max(largest, this.scratch[c * nc + c]!);
        values[k] = Math.sqrt(largest);
      }
      this.bounds[index] = values;
    }
    return values;
  }

  pairBound(p: number, q: number): number {
    if (!this.screened) return Infinity;
    const qp = this.bound(p);
    const qq = this.bound(q);
    let sum = 0;
    for (let k = 0; k < this.zetas.length; k++) sum += this.zetaWeights[k]! * qp[k]! * qq[k]!;
    return sum;
  }
}

function largestRowSum(t: FunctionTransform): number {
  let largest = 0;
  for (let i = 0; i < t.functions; i++) {
    let sum = 0;
    for (let c = 0; c < t.cartesians; c++) sum += Math.abs(t.matrix[i * t.cartesians + c]!);
    largest = Math.max(largest, sum);
  }
  return largest;
}

/** ECP integrals of one basis: the sites, their per-shell data and the work buffers, built once. */
export class EcpIntegrals {
  private readonly sites: EcpSite[];
  private readonly lmax: number;
  private readonly raw: Float64Array;
  private readonly half: Float64Array;
  private readonly transformScale: Float64Array;
  private statistics: EcpStatistics = { pairsComputed: 0, pairsScreened: 0 };

  /** Throws UnsupportedEcpError (naming the element) for a potential it cannot integrate. */
  constructor(readonly basis: MolecularBasis) {
    assertEcpSupported(basis);
    let lmax = 0;
    for (const shell of basis.shells) lmax = Math.max(lmax, shell.l);
    this.lmax = lmax;
    const nc = cartesianCount(lmax);
    this.raw = new Float64Array(nc * nc);
    this.half = new Float64Array(nc * nc);
    const workspace = new LocalWorkspace(lmax);
    const scratch = new Float64Array(nc * nc);
    this.transformScale = new Float64Array(lmax + 1);
    for (let l = 0; l <= lmax; l++) this.transformScale[l] = Math.max(1, largestRowSum(functionTransform(l, basis.kind)));
    this.sites = basis.ecps.map((ecp) => {
      const center = basis.centers[ecp.center]!;
      const local = ecp.channels.filter((channel) => channel.l < 0);
      const count = local.reduce((sum, channel) => sum + channel.exponents.length, 0);
      const terms: GaussianTerms = { count, exponents: new Float64Array(count), coefficients: new Float64Array(count) };
      let k = 0;
      for (const channel of local) {
        terms.exponents.set(channel.exponents, k);
        terms.coefficients.set(channel.coefficients, k);
        k += channel.exponents.length;
      }
      const semilocal = ecp.channels.filter((channel) => channel.l >= 0);
      return new EcpSite(basis, center.x, center.y, center.z, terms, semilocal, lmax, workspace, scratch);
    });
  }

  get lastStatistics(): EcpStatistics {
    return this.statistics;
  }

  /** Cartesian block of shells p and q summed over the centres into this.raw; false when all screened. */
  private cartesianPair(p: number, q: number, threshold: number): boolean {
    const a = this.basis.shells[p]!;
    const b = this.basis.shells[q]!;
    const size = cartesianCount(a.l) * cartesianCount(b.l);
    this.raw.fill(0, 0, size);
    const scale = this.transformScale[a.l]! * this.transformScale[b.l]!;
    let computed = false;
    for (const site of this.sites) {
      if (scale * site.pairBound(p, q) < threshold) continue;
      computed = true;
      addLocalGaussianPair(a, b, site.x, site.y, site.z, site.local, site.workspace, this.raw);
      site.engine.addPair(a, site.projection(p, this.lmax), b, site.projection(q, this.lmax), this.raw);
    }
    return computed;
  }

  /** The block of shells p and q in basis functions: out[i·size_q + j]. */
  block(p: number, q: number, out: Float64Array, threshold = 0): void {
    const a = this.basis.shells[p]!;
    const b = this.basis.shells[q]!;
    if (!this.cartesianPair(p, q, threshold)) {
      out.fill(0, 0, a.size * b.size);
      return;
    }
    toFunctions(a, b, this.basis.kind, this.raw, this.half, out);
  }

  /** The symmetric matrix (functionCount², row-major). */
  matrix(options: EcpOptions = {}): Float64Array {
    const n = this.basis.functionCount;
    const matrix = new Float64Array(n * n);
    if (this.sites.length === 0) return matrix;
    const threshold = options.threshold ?? ECP_SCREENING_THRESHOLD;
    const shells = this.basis.shells;
    const nc = cartesianCount(this.lmax);
    const block = new Float64Array(nc * nc);
    let computed = 0;
    let screened = 0;
    for (let p = 0; p < shells.length; p++) {
      const a = shells[p]!;
      for (let q = 0; q <= p; q++) {
        if ((computed + screened) % CANCEL_CHECK_INTERVAL === 0) throwIfCancelled(options.cancel);
        const b = shells[q]!;
        if (!this.cartesianPair(p, q, threshold)) {
          screened++;
          continue;
        }
        computed++;
        toFunctions(a, b, this.basis.kind, this.raw, this.half, block);
        for (let i = 0; i < a.size; i++) {
          for (let j = 0; j < b.size; j++) {
            const value = block[i * b.size + j]!;
            matrix[(a.offset + i) * n + b.offset + j] = value;
            matrix[(b.offset + j) * n + a.offset + i] = value;
          }
        }
      }
    }
    this.statistics = { pairsComputed: computed, pairsScreened: screened };
    return matrix;
  }
}

function toFunctions(a: Shell, b: Shell, kind: MolecularBasis['kind'], raw: Float64Array, half: Float64Array, out: Float64Array): void {
  const ta = functionTransform(a.l, kind);
  const tb = functionTransform(b.l, kind);
  transformFirstIndex(ta, raw, tb.cartesians, half);
  transformLastIndex(tb, half, ta.functions, out);
}

/**
 * The ECP matrix of a basis (all zeros without ECP centres). Throws UnsupportedEcpError for a
 * potential Tessera cannot integrate, CancelledError when cancelled.
 */
export function ecpMatrix(basis: MolecularBasis, options: EcpOptions = {}): Float64Array {
  if (basis.ecps.length === 0) return new Float64Array(basis.functionCount * basis.functionCount);
  return new EcpIntegrals(basis).matrix(options);
}

/** One shell-pair block of the ECP matrix, unscreened (for tests). */
export function ecpBlock(basis: MolecularBasis, p: number, q: number, out: Float64Array): void {
  new EcpIntegrals(basis).block(p, q, out);
}
