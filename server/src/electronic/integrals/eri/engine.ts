/**
 * Electron-repulsion integrals (ab|cd) over contracted shells by the Head-Gordon–Pople scheme
 * (M. Head-Gordon and J. A. Pople, J. Chem. Phys. 89, 5777 (1988)): the Obara–Saika vertical
 * recurrence per primitive quartet (S. Obara and A. Saika, J. Chem. Phys. 84, 3963 (1986)),
 * contraction to [e0|f0], then the horizontal recurrence on bra and ket, then the cartesian
 * normalisation or the solid-harmonic transformation (transform.ts). The recurrences are unrolled
 * per class in programs.ts; every buffer belongs to a class and is reused, so computing a quartet
 * allocates nothing.
 *
 * Primitive quartet: ζ, η the pair exponents, ρ = ζη/(ζ+η), W = (ζP + ηQ)/(ζ+η), T = ρ|PQ|²,
 * [00|00]^(m) = 2π^(5/2) / (ζη √(ζ+η)) · K_ab K_cd · F_m(T) with K = c c' exp(−μ|AB|²)
 * (Obara & Saika eq. 44; the 1/ζ and 1/η are kept in the pair weights, shellPairs.ts).
 */
import type { MolecularBasis } from '../../contracts';
import { cartesianCount } from '../../basis/cartesian';
import { BOYS_MAX_ORDER, boys } from '../boys';
import { functionTransform, type FunctionTransform } from '../transform';
import { compileVrr, type VrrKernel } from './compiled';
import { buildHrrProgram, buildVrrProgram, OP_FIELDS, type HrrProgram, type VrrProgram } from './programs';
import type { ShellPairs } from './shellPairs';

const TWO_PI_POW_2_5 = 2 * Math.PI ** 2.5;

/**
 * Primitive quartets whose prefactor 2π^(5/2) K_ab K_cd / (ζη√(ζ+η)) (the size of their [00|00]^(0)
 * contribution, F_m ≤ 1) is below this are skipped: a thousand of them change an integral by less
 * than 1e-12.
 */
const PRIMITIVE_QUARTET_THRESHOLD = 1e-15;

/** Everything one angular-momentum class (la ≥ lb | lc ≥ ld, la+lb ≥ lc+ld) needs, with its buffers. */
interface QuartetClass {
  readonly vrr: VrrProgram;
  /** The recurrence unrolled (compiled.ts), or null for classes too large to unroll. */
  readonly kernel: VrrKernel | null;
  readonly braHrr: HrrProgram;
  readonly ketHrr: HrrProgram;
  readonly ta: FunctionTransform;
  readonly tb: FunctionTransform;
  readonly tc: FunctionTransform;
  readonly td: FunctionTransform;
  readonly allCartesianIdentity: boolean;
  /** VRR work space. */
  readonly v: Float64Array;
  /** Bra HRR rows (eCount inputs first: the contracted [e0|f0]), each fCount wide. */
  readonly braRows: Float64Array;
  /** Ket HRR rows, each (bra cartesian pairs) wide. */
  readonly ketRows: Float64Array;
  /** Cartesian sizes. */
  readonly na: number;
  readonly nb: number;
  readonly nc: number;
  readonly nd: number;
}

interface SharedClass {
  readonly vrr: VrrProgram;
  readonly kernel: VrrKernel | null;
  readonly braHrr: HrrProgram;
  readonly ketHrr: HrrProgram;
}

/**
 * Programs and compiled kernels depend on the momenta only, so they are made once per process and
 * shared by every engine (an SCF guess builds one engine per atom); buffers stay per engine.
 */
const sharedClasses = new Map<number, SharedClass>();

function sharedClass(la: number, lb: number, lc: number, ld: number): SharedClass {
  const key = ((la * 16 + lb) * 16 + lc) * 16 + ld;
  let shared = sharedClasses.get(key);
  if (!shared) {
    const vrr = buildVrrProgram(la, lb, lc, ld);
    shared = { vrr, kernel: compileVrr(vrr), braHrr: buildHrrProgram(la, lb), ketHrr: buildHrrProgram(lc, ld) };
    sharedClasses.set(key, shared);
  }
  return shared;
}

export class EriEngine {
  /** The last quartet in layout [c][d][a][b] over functions of shells `c`, `d`, `a`, `b` (below). */
  readonly result: Float64Array;
  a = 0;
  b = 0;
  c = 0;
  d = 0;
  /** Whether (a, b) came from the second pair given to compute() (the bra is the larger pair). */
  swapped = false;
  braPair = 0;
  ketPair = 0;
  /** Function counts of shells a, b, c, d of the last quartet. */
  sizeA = 0;
  sizeB = 0;
  sizeC = 0;
  sizeD = 0;

  private readonly classes = new Map<number, QuartetClass>();
  private readonly boysValues = new Float64Array(BOYS_MAX_ORDER + 1);
  private readonly geometry = new Float64Array(12);
  private readonly factors = new Float64Array(5);
  private readonly scratch1: Float64Array;
  private readonly scratch2: Float64Array;

  constructor(
    private readonly basis: MolecularBasis,
    private readonly pairs: ShellPairs,
  ) {
    let lmax = 0;
    for (const shell of basis.shells) lmax = Math.max(lmax, shell.l);
    if (4 * lmax > BOYS_MAX_ORDER) throw new Error(`Angular momentum ${lmax} is beyond what the integral engine supports.`);
    const big = cartesianCount(lmax) ** 4;
    this.result = new Float64Array(big);
    this.scratch1 = new Float64Array(big);
    this.scratch2 = new Float64Array(big);
  }

  private classFor(la: number, lb: number, lc: number, ld: number): QuartetClass {
    const key = ((la * 16 + lb) * 16 + lc) * 16 + ld;
    let cls = this.classes.get(key);
    if (!cls) {
      const { vrr, kernel, braHrr, ketHrr } = sharedClass(la, lb, lc, ld);
      const kind = this.basis.kind;
      const ta = functionTransform(la, kind);
      const tb = functionTransform(lb, kind);
      const tc = functionTransform(lc, kind);
      const td = functionTransform(ld, kind);
      const na = cartesianCount(la);
      const nb = cartesianCount(lb);
      cls = {
        vrr,
        kernel,
        braHrr,
        ketHrr,
        ta,
        tb,
        tc,
        td,
        allCartesianIdentity: [ta, tb, tc, td].every((t) => t.form === 'identity'),
        v: new Float64Array(vrr.size),
        braRows: new Float64Array(braHrr.rows * vrr.fCount),
        ketRows: new Float64Array(ketHrr.rows * na * nb),
        na,
        nb,
        nc: cartesianCount(lc),
        nd: cartesianCount(ld),
      };
      this.classes.set(key, cls);
    }
    return cls;
  }

  /**
   * Computes the quartet of two shell pairs (indices into `pairs`) into `result`, in layout
   * [c][d][a][b] where (a, b) is the pair with the larger total momentum and each pair is in kernel
   * order (pairFirst, pairSecond). Sets a, b, c, d and their sizes.
   */
  compute(pair1: number, pair2: number): void {
    this.orient(pair1, pair2);
    const bra = this.braPair;
    const ket = this.ketPair;
    const shells = this.basis.shells;
    const sa = shells[this.a]!;
    const sb = shells[this.b]!;
    const sc = shells[this.c]!;
    const sd = shells[this.d]!;
    const cls = this.classFor(sa.l, sb.l, sc.l, sd.l);
    if (cls.vrr.L === 0) {
      this.result[0] = this.contractSsss(bra, ket);
      return;
    }
    this.contract(cls, bra, ket);
    this.horizontal(cls, bra, ket);
    this.toFunctions(cls);
  }

  /**
   * Sets a, b, c, d, their sizes and `swapped` for the quartet of two pairs without computing it
   * (the layout compute() would use), and braPair / ketPair.
   */
  orient(pair1: number, pair2: number): void {
    const pairs = this.pairs;
    const shells = this.basis.shells;
    const l1 = shells[pairs.pairFirst[pair1]!]!.l + shells[pairs.pairSecond[pair1]!]!.l;
    const l2 = shells[pairs.pairFirst[pair2]!]!.l + shells[pairs.pairSecond[pair2]!]!.l;
    this.swapped = l2 > l1;
    const bra = this.swapped ? pair2 : pair1;
    const ket = this.swapped ? pair1 : pair2;
    this.a = pairs.pairFirst[bra]!;
    this.b = pairs.pairSecond[bra]!;
    this.c = pairs.pairFirst[ket]!;
    this.d = pairs.pairSecond[ket]!;
    this.sizeA = shells[this.a]!.size;
    this.sizeB = shells[this.b]!.size;
    this.sizeC = shells[this.c]!.size;
    this.sizeD = shells[this.d]!.size;
    this.braPair = bra;
    this.ketPair = ket;
  }

  /** (ss|ss): the sum over primitive quartets of the prefactor times F_0. */
  private contractSsss(bra: number, ket: number): number {
    const p = this.pairs;
    const f = this.boysValues;
    let sum = 0;
    const ssssCutoff = PRIMITIVE_QUARTET_THRESHOLD / TWO_PI_POW_2_5;
    const braEnd = p.primStart[bra + 1]!;
    const ketStart = p.primStart[ket]!;
    const ketEnd = p.primStart[ket + 1]!;
    for (let i = p.primStart[bra]!; i < braEnd; i++) {
      const zeta = p.zeta[i]!;
      const px = p.px[i]!;
      const py = p.py[i]!;
      const pz = p.pz[i]!;
      const wi = p.weight[i]!;
      let partial = 0;
      for (let j = ketStart; j < ketEnd; j++) {
        const eta = p.zeta[j]!;
        const s = zeta + eta;
        const dx = px - p.px[j]!;
        const dy = py - p.py[j]!;
        const dz = pz - p.pz[j]!;
        const weight = p.weight[j]! / Math.sqrt(s);
        if (Math.abs(wi * weight) < ssssCutoff) continue;
        const t = ((zeta * eta) / s) * (dx * dx + dy * dy + dz * dz);
        boys(0, t, f);
        partial += weight * f[0]!;
      }
      sum += wi * partial;
    }
    return TWO_PI_POW_2_5 * sum;
  }

  /** Vertical recurrence per primitive quartet, summed into the first eCount rows of braRows. */
  private contract(cls: QuartetClass, bra: number, ket: number): void {
    const p = this.pairs;
    const vrr = cls.vrr;
    const v = cls.v;
    const f = this.boysValues;
    const g = this.geometry;
    const ops = vrr.ops;
    const braEnd = vrr.braOps * OP_FIELDS;
    const allEnd = braEnd + vrr.ketOps * OP_FIELDS;
    const L = vrr.L;
    const targets = vrr.targets;
    const kernel = cls.kernel;
    const nTargets = targets.length;
    const acc = cls.braRows;
    for (let k = 0; k < nTargets; k++) acc[k] = 0;
    const braStartIndex = p.primStart[bra]!;
    const braEndIndex = p.primStart[bra + 1]!;
    const ketStartIndex = p.primStart[ket]!;
    const ketEndIndex = p.primStart[ket + 1]!;
    for (let i = braStartIndex; i < braEndIndex; i++) {
      const zeta = p.zeta[i]!;
      const px = p.px[i]!;
      const py = p.py[i]!;
      const pz = p.pz[i]!;
      g[0] = p.pax[i]!;
      g[1] = p.pay[i]!;
      g[2] = p.paz[i]!;
      const wi = TWO_PI_POW_2_5 * p.weight[i]!;
      const halfInverseZeta = 0.5 * p.inverseZeta[i]!;
      for (let j = ketStartIndex; j < ketEndIndex; j++) {
        const eta = p.zeta[j]!;
        const s = zeta + eta;
        const inverseS = 1 / s;
        const prefactor = wi * p.weight[j]! * Math.sqrt(inverseS);
        if (Math.abs(prefactor) < PRIMITIVE_QUARTET_THRESHOLD) continue;
        const rho = zeta * eta * inverseS;
        const pqx = px - p.px[j]!;
        const pqy = py - p.py[j]!;
        const pqz = pz - p.pz[j]!;
        const t = rho * (pqx * pqx + pqy * pqy + pqz * pqz);
        boys(L, t, f);
        for (let m = 0; m <= L; m++) v[m] = prefactor * f[m]!;
        // W − P = −η/(ζ+η) PQ, W − Q = ζ/(ζ+η) PQ.
        const wpScale = -eta * inverseS;
        const wqScale = zeta * inverseS;
        g[3] = wpScale * pqx;
        g[4] = wpScale * pqy;
        g[5] = wpScale * pqz;
        g[6] = p.pax[j]!;
        g[7] = p.pay[j]!;
        g[8] = p.paz[j]!;
        g[9] = wqScale * pqx;
        g[10] = wqScale * pqy;
        g[11] = wqScale * pqz;
        const halfInverseEta = 0.5 * p.inverseZeta[j]!;
        const rhoOverZeta = eta * inverseS;
        const rhoOverEta = zeta * inverseS;
        const halfInverseS = 0.5 * inverseS;
        if (kernel) {
          const c = this.factors;
          c[0] = halfInverseZeta;
          c[1] = rhoOverZeta;
          c[2] = halfInverseEta;
          c[3] = rhoOverEta;
          c[4] = halfInverseS;
          kernel(v, g, c, acc);
          continue;
        }
        for (let o = 0; o < braEnd; o += OP_FIELDS) {
          const dir = ops[o]!;
          const dst = ops[o + 1]!;
          const s1 = ops[o + 2]!;
          const s2 = ops[o + 3]!;
          const mCount = ops[o + 7]!;
          const pa = g[dir]!;
          const wp = g[3 + dir]!;
          if (s2 < 0) {
            for (let m = 0; m < mCount; m++) v[dst + m] = pa * v[s1 + m]! + wp * v[s1 + m + 1]!;
          } else {
            const c2 = ops[o + 5]! * halfInverseZeta;
            for (let m = 0; m < mCount; m++) {
              v[dst + m] = pa * v[s1 + m]! + wp * v[s1 + m + 1]! + c2 * (v[s2 + m]! - rhoOverZeta * v[s2 + m + 1]!);
            }
          }
        }
        for (let o = braEnd; o < allEnd; o += OP_FIELDS) {
          const dir = ops[o]!;
          const dst = ops[o + 1]!;
          const s1 = ops[o + 2]!;
          const s2 = ops[o + 3]!;
          const s3 = ops[o + 4]!;
          const mCount = ops[o + 7]!;
          const qc = g[6 + dir]!;
          const wq = g[9 + dir]!;
          if (s2 < 0 && s3 < 0) {
            for (let m = 0; m < mCount; m++) v[dst + m] = qc * v[s1 + m]! + wq * v[s1 + m + 1]!;
          } else if (s2 < 0) {
            const c3 = ops[o + 6]! * halfInverseS;
            for (let m = 0; m < mCount; m++) v[dst + m] = qc * v[s1 + m]! + wq * v[s1 + m + 1]! + c3 * v[s3 + m + 1]!;
          } else if (s3 < 0) {
            const c2 = ops[o + 5]! * halfInverseEta;
            for (let m = 0; m < mCount; m++) {
              v[dst + m] = qc * v[s1 + m]! + wq * v[s1 + m + 1]! + c2 * (v[s2 + m]! - rhoOverEta * v[s2 + m + 1]!);
            }
          } else {
            const c2 = ops[o + 5]! * halfInverseEta;
            const c3 = ops[o + 6]! * halfInverseS;
            for (let m = 0; m < mCount; m++) {
              v[dst + m] = qc * v[s1 + m]! + wq * v[s1 + m + 1]! + c2 * (v[s2 + m]! - rhoOverEta * v[s2 + m + 1]!) + c3 * v[s3 + m + 1]!;
            }
          }
        }
        for (let k = 0; k < nTargets; k++) acc[k]! += v[targets[k]!]!;
      }
    }
  }

  /** Horizontal recurrences: bra rows → (ab| over the ket's e-range, transposed, then the ket. */
  private horizontal(cls: QuartetClass, bra: number, ket: number): void {
    const p = this.pairs;
    const width = cls.vrr.fCount;
    const rows = cls.braRows;
    runHrr(cls.braHrr.ops, rows, width, p.abx[bra]!, p.aby[bra]!, p.abz[bra]!);
    // Transpose (ab)[f] into ket rows f[(ab)].
    const outputs = cls.braHrr.outputs;
    const nab = outputs.length;
    const ketRows = cls.ketRows;
    for (let ab = 0; ab < nab; ab++) {
      const src = outputs[ab]! * width;
      for (let f = 0; f < width; f++) ketRows[f * nab + ab] = rows[src + f]!;
    }
    runHrr(cls.ketHrr.ops, ketRows, nab, p.abx[ket]!, p.aby[ket]!, p.abz[ket]!);
  }

  /** Gathers the ket outputs as [c][d][a][b] cartesians, then transforms every index to functions. */
  private toFunctions(cls: QuartetClass): void {
    const nab = cls.na * cls.nb;
    const outputs = cls.ketHrr.outputs;
    const ncd = outputs.length;
    const ketRows = cls.ketRows;
    const target = cls.allCartesianIdentity ? this.result : this.scratch1;
    for (let cd = 0; cd < ncd; cd++) {
      const src = outputs[cd]! * nab;
      const dst = cd * nab;
      for (let ab = 0; ab < nab; ab++) target[dst + ab] = ketRows[src + ab]!;
    }
    if (cls.allCartesianIdentity) return;
    // Transform b (innermost), a, d, c in turn, between the scratch buffers.
    const { ta, tb, tc, td } = cls;
    transformIndex(tb, this.scratch1, cls.nc * cls.nd * cls.na, 1, this.scratch2);
    transformIndex(ta, this.scratch2, cls.nc * cls.nd, tb.functions, this.scratch1);
    transformIndex(td, this.scratch1, cls.nc, ta.functions * tb.functions, this.scratch2);
    transformIndex(tc, this.scratch2, 1, td.functions * ta.functions * tb.functions, this.result);
  }
}

/** Row ops: row[dst] = row[s1] + AB[dir] · row[s2], rows `width` long. */
function runHrr(ops: Int32Array, rows: Float64Array, width: number, abx: number, aby: number, abz: number): void {
  for (let o = 0; o < ops.length; o += 4) {
    const dir = ops[o]!;
    const ab = dir === 0 ? abx : dir === 1 ? aby : abz;
    const dst = ops[o + 1]! * width;
    const s1 = ops[o + 2]! * width;
    const s2 = ops[o + 3]! * width;
    for (let k = 0; k < width; k++) rows[dst + k] = rows[s1 + k]! + ab * rows[s2 + k]!;
  }
}

/** Transforms the middle index of a tensor [outer][cartesians][inner] into [outer][functions][inner]. */
function transformIndex(t: FunctionTransform, input: Float64Array, outer: number, inner: number, output: Float64Array): void {
  const nc = t.cartesians;
  const nf = t.functions;
  if (t.form === 'identity') {
    const n = outer * nc * inner;
    for (let k = 0; k < n; k++) output[k] = input[k]!;
    return;
  }
  if (t.form === 'diagonal') {
    for (let o = 0; o < outer; o++) {
      for (let i = 0; i < nf; i++) {
        const s = t.scale[i]!;
        const base = (o * nc + i) * inner;
        for (let r = 0; r < inner; r++) output[base + r] = s * input[base + r]!;
      }
    }
    return;
  }
  const m = t.matrix;
  for (let o = 0; o < outer; o++) {
    const inBase = o * nc * inner;
    for (let i = 0; i < nf; i++) {
      const outBase = (o * nf + i) * inner;
      for (let r = 0; r < inner; r++) output[outBase + r] = 0;
      for (let c = t.rowStart[i]!; c < t.rowEnd[i]!; c++) {
        const w = m[i * nc + c]!;
        if (w === 0) continue;
        const src = inBase + c * inner;
        for (let r = 0; r < inner; r++) output[outBase + r]! += w * input[src + r]!;
      }
    }
  }
}
