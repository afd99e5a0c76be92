/**
 * Direct two-electron integrals: single shell quartets, Schwarz factors, and Coulomb and exchange
 * matrices built straight from the integrals for several densities at once.
 *
 * Screening: |(PQ|RS)| ≤ Q_PQ Q_RS with Q_PQ = √max|(pq|pq)| (Cauchy–Schwarz; M. Häser and
 * R. Ahlrichs, J. Comput. Chem. 10, 104 (1989)); a quartet's Coulomb part is skipped when that
 * bound times the largest density element it multiplies (D_PQ, D_RS) stays below the threshold,
 * its exchange part likewise (D_PR, D_PS, D_QR, D_QS), and the quartet when both are. Pairs are
 * visited in decreasing Q so that a whole row of quartets ends at the first one below the bound.
 *
 * Permutational symmetry: each unique quartet (8-fold) is computed once and its contributions to
 * J and K are added with its degeneracy, then J and K are symmetrised (the scheme of the libint
 * Hartree–Fock example; E. F. Valeev, libint, 2017, as commonly used).
 *
 * Stored integrals: when the quartets above a fixed Schwarz bound fit in the memory limit, the first
 * build keeps them and later builds read them instead of recomputing (a conventional build, as psi4's
 * scf_type pk); when they do not, the ones dearest to compute per value are kept and the rest
 * recomputed (semi-direct; J. Almlöf, K. Faegri, K. Korsell, J. Comput. Chem. 3, 385 (1982) set out
 * the direct approach and its trade-offs).
 */
import { throwIfCancelled, type CancelToken, type MolecularBasis, type TwoElectronIntegrals } from '../contracts';
import { EriEngine } from './eri/engine';
import { buildShellPairs, pairIndex, type ShellPairs } from './eri/shellPairs';

/** Quartets computed between two looks at the cancel token. */
const CANCEL_CHECK_INTERVAL = 64;

/**
 * Stored integrals keep every quartet whose Schwarz bound reaches this; a build may read them when
 * its threshold divided by the largest density element is at least this large (so that nothing it
 * would have computed is missing).
 */
export const STORED_QUARTET_BOUND = 1e-14;

/** Default memory for stored integrals. */
export const DEFAULT_STORAGE_LIMIT_BYTES = 512 * 2 ** 20;

export interface JkStatistics {
  /** Unique shell quartets computed in the last buildJK (0 when it read stored integrals). */
  readonly quartetsComputed: number;
  /** Unique shell quartets skipped by the Schwarz × density bound. */
  readonly quartetsSkipped: number;
  /** Unique shell quartets read from memory. */
  readonly quartetsRead: number;
}

export interface TwoElectronOptions {
  /**
   * Memory for integrals kept from the first J/K build and read by later builds (default 512 MiB;
   * 0 makes every build direct). When not all fit, the quartets that are dearest to compute for
   * the memory they take (primitive quartets × 2^L per value) are kept and the rest recomputed
   * (semi-direct). The sizes are counted from the Schwarz bounds before anything is stored.
   */
  readonly storageLimitBytes?: number;
}

export interface DirectTwoElectronIntegrals extends TwoElectronIntegrals {
  /** Counts of the last buildJK, for benchmarks and progress. */
  readonly lastStatistics: JkStatistics;
  /** Bytes the stored integrals take (all, or the dearest share that fits the limit). */
  readonly storageBytes: number;
  /** Fraction of the screened integral values kept in memory (1: all, 0: direct). */
  readonly storedFraction: number;
  /** Whether builds read stored integrals (true once the first build has stored them). */
  readonly stored: boolean;
}

/**
 * Integrals kept from the first build: the values of every quartet whose cost per value reaches
 * `cutoff`, in the order the builds visit quartets (a build walks the same order and so finds each
 * stored quartet at the running offset).
 */
interface Storage {
  readonly values: Float64Array;
  readonly cutoff: number;
  /** Offset of the first stored value of each row of the walk (storedRowOffsets). */
  readonly rowOffset: Float64Array;
  filled: boolean;
}

/**
 * Two-electron integrals over `basis`. Computes the shell-pair data and the Schwarz factors at
 * once. (Effective core potentials are one-electron operators: they enter the core Hamiltonian.)
 */
export function createTwoElectronIntegrals(basis: MolecularBasis, options: TwoElectronOptions = {}): DirectTwoElectronIntegrals {
  const pairs = buildShellPairs(basis);
  const engine = new EriEngine(basis, pairs);
  const schwarzValues = computeSchwarz(engine, pairs);
  const order = Int32Array.from({ length: pairs.count }, (_, k) => k).sort((x, y) => schwarzValues[y]! - schwarzValues[x]!);
  const cost = pairCosts(basis, pairs);
  const plan = planStorage(pairs, schwarzValues, order, cost, options.storageLimitBytes ?? DEFAULT_STORAGE_LIMIT_BYTES);
  const storage: Storage | null = plan ? { values: new Float64Array(plan.values), cutoff: plan.cutoff, rowOffset: storedRowOffsets(pairs, schwarzValues, order, cost, plan.cutoff), filled: false } : null;
  const storageBytes = plan ? plan.values * 8 : 0;
  let statistics: JkStatistics = { quartetsComputed: 0, quartetsSkipped: 0, quartetsRead: 0 };
  const context: JkContext = { basis, engine, pairs, schwarz: schwarzValues, order, cost };

  return {
    basis,
    storageBytes,
    storedFraction: plan ? plan.fraction : 0,
    get stored() {
      return storage?.filled ?? false;
    },
    get lastStatistics() {
      return statistics;
    },
    schwarz: (p, q) => schwarzValues[pairIndex(p, q)]!,
    shellQuartet(p, q, r, s, out) {
      engine.compute(pairIndex(p, q), pairIndex(r, s));
      writeQuartet(basis, engine, p, q, r, s, out);
    },
    buildJK(densities, J, K, buildOptions) {
      const threshold = buildOptions?.threshold ?? 1e-12;
      const cancel = buildOptions?.cancel;
      const prepared = prepareBuild(basis, densities, J, K);
      const usable = storage !== null && threshold / Math.max(prepared.densityMax, 1e-300) >= STORED_QUARTET_BOUND;
      // A build stopped part-way leaves the storage unfilled (filled is set at the end), so the next fills it again.
      statistics = buildPass(context, prepared, densities, J, K, threshold, cancel, usable ? storage : null);
      finishBuild(basis, J, K);
    },
  };
}

/** Per shell pair: functions, and its share of the work per value of its quartets (below). */
interface PairCosts {
  readonly size: Float64Array;
  /** Primitive pairs × 2^(la+lb) / functions: a quartet's cost per value is the product over its two pairs. */
  readonly workPerValue: Float64Array;
}

function pairCosts(basis: MolecularBasis, pairs: ShellPairs): PairCosts {
  const shells = basis.shells;
  const size = new Float64Array(pairs.count);
  const workPerValue = new Float64Array(pairs.count);
  for (let k = 0; k < pairs.count; k++) {
    const a = shells[pairs.pairFirst[k]!]!;
    const b = shells[pairs.pairSecond[k]!]!;
    size[k] = a.size * b.size;
    workPerValue[k] = (Math.max(1, pairs.primStart[k + 1]! - pairs.primStart[k]!) * 2 ** (a.l + b.l)) / size[k]!;
  }
  return { size, workPerValue };
}

/**
 * Work per stored value of a quartet: primitive quartets × 2^L (the recurrence grows about so with
 * the total momentum L) over its values. Stored quartets are those at or above a cutoff of this.
 */
function costPerValue(cost: PairCosts, pq: number, rs: number): number {
  return cost.workPerValue[pq]! * cost.workPerValue[rs]!;
}

/**
 * What to store: everything with a Schwarz bound ≥ STORED_QUARTET_BOUND when it fits the limit,
 * else the dearest quartets (cost per value at or above a power-of-two cutoff) that fit; null when
 * nothing useful fits.
 */
function planStorage(pairs: ShellPairs, schwarz: Float64Array, order: Int32Array, cost: PairCosts, limitBytes: number): { values: number; cutoff: number; fraction: number } | null {
  if (limitBytes <= 0) return null;
  // Values per cost bin (bin k: cost per value in [2^(k−32), 2^(k−31))).
  const BINS = 96;
  const valuesInBin = new Float64Array(BINS);
  let total = 0;
  for (let ii = 0; ii < pairs.count; ii++) {
    const pq = order[ii]!;
    const q = schwarz[pq]!;
    if (q * q < STORED_QUARTET_BOUND) break;
    for (let jj = ii; jj < pairs.count; jj++) {
      const rs = order[jj]!;
      if (q * schwarz[rs]! < STORED_QUARTET_BOUND) break;
      const values = cost.size[pq]! * cost.size[rs]!;
      const bin = Math.min(BINS - 1, Math.max(0, Math.floor(Math.log2(costPerValue(cost, pq, rs))) + 32));
      valuesInBin[bin]! += values;
      total += values;
    }
  }
  const limitValues = Math.floor(limitBytes / 8);
  if (total <= limitValues) return total > 0 ? { values: total, cutoff: 0, fraction: 1 } : null;
  let kept = 0;
  let bin = BINS - 1;
  for (; bin >= 0; bin--) {
    if (kept + valuesInBin[bin]! > limitValues) break;
    kept += valuesInBin[bin]!;
  }
  if (kept === 0) return null;
  return { values: kept, cutoff: 2 ** (bin + 1 - 32), fraction: kept / total };
}

function computeSchwarz(engine: EriEngine, pairs: ShellPairs): Float64Array {
  const values = new Float64Array(pairs.count);
  for (let k = 0; k < pairs.count; k++) {
    engine.compute(k, k);
    const n = engine.sizeA * engine.sizeB * engine.sizeC * engine.sizeD;
    let largest = 0;
    for (let i = 0; i < n; i++) largest = Math.max(largest, Math.abs(engine.result[i]!));
    // max |(pq|rs)| over a diagonal block is its largest diagonal element (Cauchy–Schwarz).
    values[k] = Math.sqrt(largest);
  }
  return values;
}

/** Copies the engine's [c][d][a][b] result into out[p][q][r][s]. */
function writeQuartet(basis: MolecularBasis, engine: EriEngine, p: number, q: number, r: number, s: number, out: Float64Array): void {
  const shells = basis.shells;
  const nq = shells[q]!.size;
  const nr = shells[r]!.size;
  const ns = shells[s]!.size;
  const stride = [nq * nr * ns, nr * ns, ns, 1] as const;
  // The requested position (0 … 3) each internal shell stands for.
  let posA: number;
  let posC: number;
  if (!engine.swapped) {
    posA = engine.a === p ? 0 : 1;
    posC = engine.c === r ? 2 : 3;
  } else {
    posA = engine.a === r ? 2 : 3;
    posC = engine.c === p ? 0 : 1;
  }
  const sa = stride[posA as 0]!;
  const sb = stride[(posA ^ 1) as 0]!;
  const sc = stride[posC as 0]!;
  const sd = stride[(posC ^ 1) as 0]!;
  const na = engine.sizeA;
  const nb = engine.sizeB;
  const nc = engine.sizeC;
  const nd = engine.sizeD;
  const result = engine.result;
  let k = 0;
  for (let ic = 0; ic < nc; ic++) {
    for (let id = 0; id < nd; id++) {
      for (let ia = 0; ia < na; ia++) {
        for (let ib = 0; ib < nb; ib++) out[ia * sa + ib * sb + ic * sc + id * sd] = result[k++]!;
      }
    }
  }
}

interface JkContext {
  readonly basis: MolecularBasis;
  readonly engine: EriEngine;
  readonly pairs: ShellPairs;
  readonly schwarz: Float64Array;
  readonly order: Int32Array;
  readonly cost: PairCosts;
}

interface PreparedBuild {
  /** Largest |D| per shell block over all densities, nShells². */
  readonly blockMax: Float64Array;
  readonly densityMax: number;
}

function prepareBuild(basis: MolecularBasis, densities: readonly Float64Array[], J: Float64Array[] | null, K: Float64Array[] | null): PreparedBuild {
  const n = basis.functionCount;
  const shells = basis.shells;
  const nShells = shells.length;
  const nd = densities.length;
  if (J && J.length !== nd) throw new Error(`buildJK: ${nd} densities but ${J.length} Coulomb matrices.`);
  if (K && K.length !== nd) throw new Error(`buildJK: ${nd} densities but ${K.length} exchange matrices.`);
  for (const m of [...densities, ...(J ?? []), ...(K ?? [])]) {
    if (m.length !== n * n) throw new Error(`buildJK: a matrix has ${m.length} elements, expected ${n * n}.`);
  }
  for (const m of J ?? []) m.fill(0);
  for (const m of K ?? []) m.fill(0);
  const blockMax = new Float64Array(nShells * nShells);
  let densityMax = 0;
  for (let P = 0; P < nShells; P++) {
    const sp = shells[P]!;
    for (let Q = 0; Q < nShells; Q++) {
      const sq = shells[Q]!;
      let largest = 0;
      for (const d of densities) {
        for (let i = sp.offset; i < sp.offset + sp.size; i++) {
          for (let j = sq.offset; j < sq.offset + sq.size; j++) largest = Math.max(largest, Math.abs(d[i * n + j]!));
        }
      }
      blockMax[P * nShells + Q] = largest;
      densityMax = Math.max(densityMax, largest);
    }
  }
  return { blockMax, densityMax };
}

/** The largest density element a quartet's Coulomb contributions multiply (D_PQ, D_RS). */
function coulombDensityBound(blockMax: Float64Array, nShells: number, P: number, Q: number, R: number, S: number): number {
  return Math.max(blockMax[P * nShells + Q]!, blockMax[R * nShells + S]!);
}

/** The largest density element a quartet's exchange contributions multiply (D_PR, D_PS, D_QR, D_QS). */
function exchangeDensityBound(blockMax: Float64Array, nShells: number, P: number, Q: number, R: number, S: number): number {
  return Math.max(blockMax[P * nShells + R]!, blockMax[P * nShells + S]!, blockMax[Q * nShells + R]!, blockMax[Q * nShells + S]!);
}

/**
 * One J/K build: walks the unique quartets in decreasing Schwarz order; each needed quartet is
 * read from the storage when it is kept there (after the first build) or computed. The first build
 * with a storage computes and keeps every quartet the storage holds, needed now or not. Later
 * builds end a row at the first quartet whose Schwarz bound times the largest density element is
 * below the threshold (the rows are sorted), and find each row's stored values at its recorded
 * offset, so an incremental build with a small density difference visits few quartets.
 */
function buildPass(
  context: JkContext,
  prepared: PreparedBuild,
  densities: readonly Float64Array[],
  J: Float64Array[] | null,
  K: Float64Array[] | null,
  threshold: number,
  cancel: CancelToken | undefined,
  storage: Storage | null,
): JkStatistics {
  const { basis, engine, pairs, schwarz, order, cost } = context;
  const { blockMax, densityMax } = prepared;
  const nShells = basis.shells.length;
  const count = pairs.count;
  const wantJ = J !== null;
  const wantK = K !== null;
  const filling = storage !== null && !storage.filled;
  // Quartets with a Schwarz bound below `limit` are not needed; the filling build visits all the
  // storage may hold so that the running offset stays in step.
  const limit = threshold / Math.max(densityMax, 1e-300);
  const visitBound = filling ? Math.min(limit, STORED_QUARTET_BOUND) : limit;
  const cutoff = storage ? storage.cutoff : Number.POSITIVE_INFINITY;
  const stored = storage ? storage.values : null;
  const rowOffset = storage ? storage.rowOffset : null;
  const workPerValue = cost.workPerValue;
  let computed = 0;
  let used = 0;
  let read = 0;
  throwIfCancelled(cancel);
  for (let ii = 0; ii < count; ii++) {
    const pq = order[ii]!;
    const qpq = schwarz[pq]!;
    if (qpq * qpq < visitBound) break;
    const P = pairs.pairFirst[pq]!;
    const Q = pairs.pairSecond[pq]!;
    const sizePQ = cost.size[pq]!;
    const workPQ = workPerValue[pq]!;
    let offset = rowOffset ? rowOffset[ii]! : 0;
    for (let jj = ii; jj < count; jj++) {
      const rs = order[jj]!;
      const bound = qpq * schwarz[rs]!;
      if (bound < visitBound) break;
      const R = pairs.pairFirst[rs]!;
      const S = pairs.pairSecond[rs]!;
      // Coulomb and exchange are screened each by the density they multiply.
      const neededJ = wantJ && bound * coulombDensityBound(blockMax, nShells, P, Q, R, S) >= threshold;
      const neededK = wantK && bound * exchangeDensityBound(blockMax, nShells, P, Q, R, S) >= threshold;
      const needed = neededJ || neededK;
      const keep = stored !== null && bound >= STORED_QUARTET_BOUND && workPQ * workPerValue[rs]! >= cutoff;
      if (keep && !filling) {
        if (needed) {
          // Stored in the engine's layout; the engine's orientation depends on the pairs only.
          engine.orient(pq, rs);
          scatter(basis, engine.a, engine.b, engine.c, engine.d, stored, offset, densities, neededJ ? J : null, neededK ? K : null);
          read++;
          used++;
          if (read % 1024 === 0) throwIfCancelled(cancel);
        }
        offset += sizePQ * cost.size[rs]!;
        continue;
      }
      if (!needed && !keep) continue;
      engine.compute(pq, rs);
      computed++;
      if (keep) {
        const size = sizePQ * cost.size[rs]!;
        const result = engine.result;
        for (let i = 0; i < size; i++) stored![offset + i] = result[i]!;
        offset += size;
      }
      if (needed) {
        scatter(basis, engine.a, engine.b, engine.c, engine.d, engine.result, 0, densities, neededJ ? J : null, neededK ? K : null);
        used++;
      }
      if (computed % CANCEL_CHECK_INTERVAL === 0) throwIfCancelled(cancel);
    }
  }
  if (filling) storage!.filled = true;
  return { quartetsComputed: computed, quartetsSkipped: (count * (count + 1)) / 2 - used, quartetsRead: read };
}

/**
 * Where each row of the walk (the quartets of order[ii] with order[jj], jj ≥ ii) starts in the
 * stored values: the sizes of the kept quartets of all rows before it.
 */
function storedRowOffsets(pairs: ShellPairs, schwarz: Float64Array, order: Int32Array, cost: PairCosts, cutoff: number): Float64Array {
  const offsets = new Float64Array(pairs.count);
  let offset = 0;
  for (let ii = 0; ii < pairs.count; ii++) {
    offsets[ii] = offset;
    const pq = order[ii]!;
    const q = schwarz[pq]!;
    if (q * q < STORED_QUARTET_BOUND) continue;
    for (let jj = ii; jj < pairs.count; jj++) {
      const rs = order[jj]!;
      if (q * schwarz[rs]! < STORED_QUARTET_BOUND) break;
      if (costPerValue(cost, pq, rs) >= cutoff) offset += cost.size[pq]! * cost.size[rs]!;
    }
  }
  return offsets;
}

function finishBuild(basis: MolecularBasis, J: Float64Array[] | null, K: Float64Array[] | null): void {
  const n = basis.functionCount;
  for (const m of J ?? []) symmetrize(m, n);
  for (const m of K ?? []) symmetrize(m, n);
}

/**
 * Adds one unique quartet's contributions, scaled by its degeneracy, to the unsymmetrised J and K:
 * J_ab += ½ g v D_cd, J_cd += ½ g v D_ab, K_ac += ¼ g v D_bd, K_bd += ¼ g v D_ac, K_ad += ¼ g v D_bc,
 * K_bc += ¼ g v D_ad (g = 1, 2, 4 or 8); finishBuild() then averages each matrix with its
 * transpose. Because of that average, and because the densities are symmetric, the innermost loop
 * (over b) reads D_db for D_bd and adds to K_db for K_bd, so that it walks rows, not columns.
 * `values[offset …]` holds the quartet in layout [c][d][a][b].
 */
function scatter(
  basis: MolecularBasis,
  a: number,
  b: number,
  c: number,
  d: number,
  values: Float64Array,
  offset: number,
  densities: readonly Float64Array[],
  J: Float64Array[] | null,
  K: Float64Array[] | null,
): void {
  const n = basis.functionCount;
  const shells = basis.shells;
  const degeneracy = (a === b ? 1 : 2) * (c === d ? 1 : 2) * (pairIndex(a, b) === pairIndex(c, d) ? 1 : 2);
  const halfG = 0.5 * degeneracy;
  const quarterG = 0.25 * degeneracy;
  const sa = shells[a]!;
  const sb = shells[b]!;
  const sc = shells[c]!;
  const sd = shells[d]!;
  const oa = sa.offset;
  const ob = sb.offset;
  const oc = sc.offset;
  const od = sd.offset;
  const na = sa.size;
  const nb = sb.size;
  const nc = sc.size;
  const nd = sd.size;
  for (let x = 0; x < densities.length; x++) {
    const D = densities[x]!;
    const j = J ? J[x]! : null;
    const k = K ? K[x]! : null;
    if (j && k) {
      // Both in one pass over the values.
      let index = offset;
      for (let ic = 0; ic < nc; ic++) {
        const fc = oc + ic;
        const rowC = fc * n;
        for (let id = 0; id < nd; id++) {
          const fd = od + id;
          const rowD = fd * n;
          const dcd = halfG * D[rowC + fd]!;
          let jcd = 0;
          for (let ia = 0; ia < na; ia++) {
            const rowA = (oa + ia) * n;
            const dac = quarterG * D[rowA + fc]!;
            const dad = quarterG * D[rowA + fd]!;
            let kac = 0;
            let kad = 0;
            for (let ib = 0; ib < nb; ib++) {
              const v = values[index++]!;
              const fb = ob + ib;
              j[rowA + fb]! += v * dcd;
              jcd += v * D[rowA + fb]!;
              kac += v * D[rowD + fb]!;
              kad += v * D[rowC + fb]!;
              k[rowD + fb]! += v * dac;
              k[rowC + fb]! += v * dad;
            }
            k[rowA + fc]! += quarterG * kac;
            k[rowA + fd]! += quarterG * kad;
          }
          j[rowC + fd]! += halfG * jcd;
        }
      }
      continue;
    }
    if (j) {
      let index = offset;
      for (let ic = 0; ic < nc; ic++) {
        const rowC = (oc + ic) * n;
        for (let id = 0; id < nd; id++) {
          const dcd = halfG * D[rowC + od + id]!;
          let jcd = 0;
          for (let ia = 0; ia < na; ia++) {
            const rowA = (oa + ia) * n + ob;
            for (let ib = 0; ib < nb; ib++) {
              const v = values[index++]!;
              j[rowA + ib]! += v * dcd;
              jcd += v * D[rowA + ib]!;
            }
          }
          j[rowC + od + id]! += halfG * jcd;
        }
      }
    }
    if (k) {
      let index = offset;
      for (let ic = 0; ic < nc; ic++) {
        const fc = oc + ic;
        const rowC = fc * n;
        for (let id = 0; id < nd; id++) {
          const fd = od + id;
          const rowD = fd * n;
          for (let ia = 0; ia < na; ia++) {
            const rowA = (oa + ia) * n;
            const dac = quarterG * D[rowA + fc]!;
            const dad = quarterG * D[rowA + fd]!;
            let kac = 0;
            let kad = 0;
            for (let ib = 0; ib < nb; ib++) {
              const v = values[index++]!;
              const fb = ob + ib;
              kac += v * D[rowD + fb]!;
              kad += v * D[rowC + fb]!;
              k[rowD + fb]! += v * dac;
              k[rowC + fb]! += v * dad;
            }
            k[rowA + fc]! += quarterG * kac;
            k[rowA + fd]! += quarterG * kad;
          }
        }
      }
    }
  }
}

function symmetrize(m: Float64Array, n: number): void {
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < i; j++) {
      const value = 0.5 * (m[i * n + j]! + m[j * n + i]!);
      m[i * n + j] = value;
      m[j * n + i] = value;
    }
  }
}
