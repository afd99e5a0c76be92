/**
 * Direct two-electron integrals: single shell quartets, Schwarz factors, and Coulomb and exchange
 * matrices built straight from the integrals for several densities at once.
 *
 * Screening: |(PQ|RS)| ≤ Q_PQ Q_RS with Q_PQ = √max|(pq|pq)| (Cauchy–Schwarz; M. Häser and
 * R. Ahlrichs, J. Comput. Chem. 10, 104 (1989)); a quartet is skipped when that bound times the
 * largest density element it multiplies stays below the threshold. Pairs are visited in decreasing
 * Q so that a whole row of quartets ends at the first one below the bound.
 *
 * Permutational symmetry: each unique quartet (8-fold) is computed once and its contributions to
 * J and K are added with its degeneracy, then J and K are symmetrised (the scheme of the libint
 * Hartree–Fock example; E. F. Valeev, libint, 2017, as commonly used).
 *
 * Stored integrals: when the quartets above a fixed Schwarz bound fit in the memory limit, the first
 * build keeps them and later builds read them instead of recomputing (a conventional build, as psi4's
 * scf_type pk; J. Almlöf, K. Faegri, K. Korsell, J. Comput. Chem. 3, 385 (1982) contrast the two).
 */
import { throwIfCancelled, type CancelToken, type MolecularBasis, type TwoElectronIntegrals } from '../contracts';
import { assertNoEcp } from './ecp';
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

/** Default memory for stored integrals: above it, every build is direct. */
export const DEFAULT_STORAGE_LIMIT_BYTES = 256 * 2 ** 20;

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
   * Keep the integrals of the first J/K build in memory and read them in later builds when they fit
   * in this many bytes (default 256 MiB); 0 makes every build direct. The size is counted from the
   * Schwarz bounds before anything is stored, so a large basis never tries.
   */
  readonly storageLimitBytes?: number;
}

export interface DirectTwoElectronIntegrals extends TwoElectronIntegrals {
  /** Counts of the last buildJK, for benchmarks and progress. */
  readonly lastStatistics: JkStatistics;
  /** Bytes the stored integrals take or would take (values and quartet indices). */
  readonly storageBytes: number;
  /** Whether builds read stored integrals (true once the first build has stored them). */
  readonly stored: boolean;
}

/** Integrals kept from the first build: shells (a, b, c, d) per quartet and its values, in order. */
interface Storage {
  readonly quartets: Int32Array;
  readonly values: Float64Array;
  /** Schwarz bound of each quartet. */
  readonly bounds: Float64Array;
  count: number;
  filled: boolean;
}

/**
 * Two-electron integrals over `basis`. Computes the shell-pair data and the Schwarz factors at
 * once; refuses a basis with effective core potentials (UnsupportedEcpError).
 */
export function createTwoElectronIntegrals(basis: MolecularBasis, options: TwoElectronOptions = {}): DirectTwoElectronIntegrals {
  assertNoEcp(basis);
  const pairs = buildShellPairs(basis);
  const engine = new EriEngine(basis, pairs);
  const schwarzValues = computeSchwarz(engine, pairs);
  const order = Int32Array.from({ length: pairs.count }, (_, k) => k).sort((x, y) => schwarzValues[y]! - schwarzValues[x]!);
  const { quartets, values } = countStored(basis, pairs, schwarzValues, order);
  const storageBytes = quartets * (4 * 4 + 8) + values * 8;
  let storage: Storage | null =
    storageBytes <= (options.storageLimitBytes ?? DEFAULT_STORAGE_LIMIT_BYTES)
      ? { quartets: new Int32Array(4 * quartets), values: new Float64Array(values), bounds: new Float64Array(quartets), count: 0, filled: false }
      : null;
  let statistics: JkStatistics = { quartetsComputed: 0, quartetsSkipped: 0, quartetsRead: 0 };
  const context: JkContext = { basis, engine, pairs, schwarz: schwarzValues, order };

  return {
    basis,
    storageBytes,
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
      const usable = storage && threshold / Math.max(prepared.densityMax, 1e-300) >= STORED_QUARTET_BOUND;
      if (usable && storage!.filled) {
        statistics = buildFromStorage(context, storage!, prepared, densities, J, K, threshold, cancel);
      } else {
        try {
          statistics = buildDirect(context, prepared, densities, J, K, threshold, cancel, usable ? storage : null);
        } catch (error) {
          // A build stopped part-way leaves nothing half-stored.
          if (storage) storage.count = 0;
          throw error;
        }
      }
      finishBuild(basis, J, K);
    },
  };
}

/** The quartets and values stored integrals would hold: every quartet with Schwarz bound ≥ STORED_QUARTET_BOUND. */
function countStored(basis: MolecularBasis, pairs: ShellPairs, schwarz: Float64Array, order: Int32Array): { quartets: number; values: number } {
  const shells = basis.shells;
  const pairSize = new Float64Array(pairs.count);
  for (let k = 0; k < pairs.count; k++) pairSize[k] = shells[pairs.pairFirst[k]!]!.size * shells[pairs.pairSecond[k]!]!.size;
  let quartets = 0;
  let values = 0;
  for (let ii = 0; ii < pairs.count; ii++) {
    const pq = order[ii]!;
    const q = schwarz[pq]!;
    if (q * q < STORED_QUARTET_BOUND) break;
    const size = pairSize[pq]!;
    for (let jj = ii; jj < pairs.count; jj++) {
      const rs = order[jj]!;
      if (q * schwarz[rs]! < STORED_QUARTET_BOUND) break;
      quartets++;
      values += size * pairSize[rs]!;
    }
  }
  return { quartets, values };
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

/** The largest density element a quartet's J and K contributions multiply. */
function densityBound(blockMax: Float64Array, nShells: number, P: number, Q: number, R: number, S: number, wantJ: boolean, wantK: boolean): number {
  let dm = 0;
  if (wantJ) dm = Math.max(blockMax[P * nShells + Q]!, blockMax[R * nShells + S]!);
  if (wantK) dm = Math.max(dm, blockMax[P * nShells + R]!, blockMax[P * nShells + S]!, blockMax[Q * nShells + R]!, blockMax[Q * nShells + S]!);
  return dm;
}

function buildDirect(
  context: JkContext,
  prepared: PreparedBuild,
  densities: readonly Float64Array[],
  J: Float64Array[] | null,
  K: Float64Array[] | null,
  threshold: number,
  cancel: CancelToken | undefined,
  storage: Storage | null,
): JkStatistics {
  const { basis, engine, pairs, schwarz, order } = context;
  const { blockMax, densityMax } = prepared;
  const nShells = basis.shells.length;
  const count = pairs.count;
  const wantJ = J !== null;
  const wantK = K !== null;
  // When storing, every quartet with a bound above STORED_QUARTET_BOUND is computed.
  const bound0 = storage ? STORED_QUARTET_BOUND : threshold / Math.max(densityMax, 1e-300);
  let computed = 0;
  let skipped = 0;
  let valueOffset = 0;
  if (storage) storage.count = 0;
  throwIfCancelled(cancel);
  for (let ii = 0; ii < count; ii++) {
    const pq = order[ii]!;
    const qpq = schwarz[pq]!;
    if (qpq * qpq < bound0) break;
    const P = pairs.pairFirst[pq]!;
    const Q = pairs.pairSecond[pq]!;
    for (let jj = ii; jj < count; jj++) {
      const rs = order[jj]!;
      const bound = qpq * schwarz[rs]!;
      if (bound < bound0) break;
      const dm = densityBound(blockMax, nShells, P, Q, pairs.pairFirst[rs]!, pairs.pairSecond[rs]!, wantJ, wantK);
      const needed = bound * dm >= threshold;
      if (!needed && !storage) {
        skipped++;
        continue;
      }
      engine.compute(pq, rs);
      computed++;
      const size = engine.sizeA * engine.sizeB * engine.sizeC * engine.sizeD;
      if (storage) {
        const k = storage.count++;
        storage.quartets[4 * k] = engine.a;
        storage.quartets[4 * k + 1] = engine.b;
        storage.quartets[4 * k + 2] = engine.c;
        storage.quartets[4 * k + 3] = engine.d;
        storage.bounds[k] = bound;
        const stored = storage.values;
        const result = engine.result;
        for (let i = 0; i < size; i++) stored[valueOffset + i] = result[i]!;
        valueOffset += size;
      }
      if (needed) scatter(basis, engine.a, engine.b, engine.c, engine.d, engine.result, 0, densities, J, K);
      else skipped++;
      if (computed % CANCEL_CHECK_INTERVAL === 0) throwIfCancelled(cancel);
    }
  }
  if (storage) storage.filled = true;
  return { quartetsComputed: computed, quartetsSkipped: skipped, quartetsRead: 0 };
}

function buildFromStorage(
  context: JkContext,
  storage: Storage,
  prepared: PreparedBuild,
  densities: readonly Float64Array[],
  J: Float64Array[] | null,
  K: Float64Array[] | null,
  threshold: number,
  cancel: CancelToken | undefined,
): JkStatistics {
  const { basis } = context;
  const shells = basis.shells;
  const nShells = shells.length;
  const wantJ = J !== null;
  const wantK = K !== null;
  const q = storage.quartets;
  let offset = 0;
  let read = 0;
  let skipped = 0;
  throwIfCancelled(cancel);
  for (let k = 0; k < storage.count; k++) {
    const a = q[4 * k]!;
    const b = q[4 * k + 1]!;
    const c = q[4 * k + 2]!;
    const d = q[4 * k + 3]!;
    const size = shells[a]!.size * shells[b]!.size * shells[c]!.size * shells[d]!.size;
    if (storage.bounds[k]! * densityBound(prepared.blockMax, nShells, a, b, c, d, wantJ, wantK) >= threshold) {
      scatter(basis, a, b, c, d, storage.values, offset, densities, J, K);
      read++;
    } else {
      skipped++;
    }
    offset += size;
    if ((k & 1023) === 0) throwIfCancelled(cancel);
  }
  return { quartetsComputed: 0, quartetsSkipped: skipped, quartetsRead: read };
}

function finishBuild(basis: MolecularBasis, J: Float64Array[] | null, K: Float64Array[] | null): void {
  const n = basis.functionCount;
  for (const m of J ?? []) symmetrize(m, n);
  for (const m of K ?? []) symmetrize(m, n);
}

/**
 * Adds one unique quartet's contributions, scaled by its degeneracy, to the unsymmetrised J and K:
 * J_ab += ½ g v D_cd, J_cd += ½ g v D_ab, K_ac += ¼ g v D_bd, K_bd += ¼ g v D_ac, K_ad += ¼ g v D_bc,
 * K_bc += ¼ g v D_ad (g = 1, 2, 4 or 8); symmetrize() then averages each matrix with its transpose.
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
    if (J) {
      const j = J[x]!;
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
    if (K) {
      const k = K[x]!;
      let index = offset;
      for (let ic = 0; ic < nc; ic++) {
        const fc = oc + ic;
        for (let id = 0; id < nd; id++) {
          const fd = od + id;
          for (let ia = 0; ia < na; ia++) {
            const rowA = (oa + ia) * n;
            const dac = quarterG * D[rowA + fc]!;
            const dad = quarterG * D[rowA + fd]!;
            let kac = 0;
            let kad = 0;
            for (let ib = 0; ib < nb; ib++) {
              const v = values[index++]!;
              const rowB = (ob + ib) * n;
              kac += v * D[rowB + fd]!;
              kad += v * D[rowB + fc]!;
              k[rowB + fd]! += v * dac;
              k[rowB + fc]! += v * dad;
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
