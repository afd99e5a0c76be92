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
 */
import { throwIfCancelled, type CancelToken, type MolecularBasis, type TwoElectronIntegrals } from '../contracts';
import { assertNoEcp } from './ecp';
import { EriEngine } from './eri/engine';
import { buildShellPairs, pairIndex, type ShellPairs } from './eri/shellPairs';

/** Quartets computed between two looks at the cancel token. */
const CANCEL_CHECK_INTERVAL = 64;

export interface JkStatistics {
  /** Unique shell quartets computed in the last buildJK. */
  readonly quartetsComputed: number;
  /** Unique shell quartets skipped by the Schwarz × density bound. */
  readonly quartetsSkipped: number;
}

export interface DirectTwoElectronIntegrals extends TwoElectronIntegrals {
  /** Counts of the last buildJK, for benchmarks and progress. */
  readonly lastStatistics: JkStatistics;
}

/**
 * Two-electron integrals over `basis`. Computes the shell-pair data and the Schwarz factors at
 * once; refuses a basis with effective core potentials (UnsupportedEcpError).
 */
export function createTwoElectronIntegrals(basis: MolecularBasis): DirectTwoElectronIntegrals {
  assertNoEcp(basis);
  const pairs = buildShellPairs(basis);
  const engine = new EriEngine(basis, pairs);
  const schwarzValues = computeSchwarz(engine, pairs);
  const order = Int32Array.from({ length: pairs.count }, (_, k) => k).sort((x, y) => schwarzValues[y]! - schwarzValues[x]!);
  let statistics: JkStatistics = { quartetsComputed: 0, quartetsSkipped: 0 };

  return {
    basis,
    get lastStatistics() {
      return statistics;
    },
    schwarz: (p, q) => schwarzValues[pairIndex(p, q)]!,
    shellQuartet(p, q, r, s, out) {
      engine.compute(pairIndex(p, q), pairIndex(r, s));
      writeQuartet(basis, engine, p, q, r, s, out);
    },
    buildJK(densities, J, K, options) {
      statistics = buildJK(basis, engine, pairs, schwarzValues, order, densities, J, K, options?.threshold ?? 1e-12, options?.cancel);
    },
  };
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

function buildJK(
  basis: MolecularBasis,
  engine: EriEngine,
  pairs: ShellPairs,
  schwarz: Float64Array,
  order: Int32Array,
  densities: readonly Float64Array[],
  J: Float64Array[] | null,
  K: Float64Array[] | null,
  threshold: number,
  cancel: CancelToken | undefined,
): JkStatistics {
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

  // Largest |D| per shell block over all densities.
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

  let computed = 0;
  let skipped = 0;
  const count = pairs.count;
  const wantJ = J !== null;
  const wantK = K !== null;
  throwIfCancelled(cancel);
  for (let ii = 0; ii < count; ii++) {
    const pq = order[ii]!;
    const qpq = schwarz[pq]!;
    if (qpq * qpq * densityMax < threshold) break;
    const P = pairs.pairFirst[pq]!;
    const Q = pairs.pairSecond[pq]!;
    for (let jj = ii; jj < count; jj++) {
      const rs = order[jj]!;
      const bound = qpq * schwarz[rs]!;
      if (bound * densityMax < threshold) break;
      const R = pairs.pairFirst[rs]!;
      const S = pairs.pairSecond[rs]!;
      let dm = 0;
      if (wantJ) dm = Math.max(blockMax[P * nShells + Q]!, blockMax[R * nShells + S]!);
      if (wantK) {
        dm = Math.max(dm, blockMax[P * nShells + R]!, blockMax[P * nShells + S]!, blockMax[Q * nShells + R]!, blockMax[Q * nShells + S]!);
      }
      if (bound * dm < threshold) {
        skipped++;
        continue;
      }
      engine.compute(pq, rs);
      scatter(basis, engine, densities, J, K);
      computed++;
      if (computed % CANCEL_CHECK_INTERVAL === 0) throwIfCancelled(cancel);
    }
  }
  for (const m of J ?? []) symmetrize(m, n);
  for (const m of K ?? []) symmetrize(m, n);
  return { quartetsComputed: computed, quartetsSkipped: skipped };
}

/**
 * Adds one unique quartet's contributions, scaled by its degeneracy, to the unsymmetrised J and K:
 * J_ab += ½ g v D_cd, J_cd += ½ g v D_ab, K_ac += ¼ g v D_bd, K_bd += ¼ g v D_ac, K_ad += ¼ g v D_bc,
 * K_bc += ¼ g v D_ad (g = 1, 2, 4 or 8); symmetrize() then averages each matrix with its transpose.
 */
function scatter(basis: MolecularBasis, engine: EriEngine, densities: readonly Float64Array[], J: Float64Array[] | null, K: Float64Array[] | null): void {
  const n = basis.functionCount;
  const shells = basis.shells;
  const a = engine.a;
  const b = engine.b;
  const c = engine.c;
  const d = engine.d;
  const degeneracy = (a === b ? 1 : 2) * (c === d ? 1 : 2) * (pairIndex(a, b) === pairIndex(c, d) ? 1 : 2);
  const halfG = 0.5 * degeneracy;
  const quarterG = 0.25 * degeneracy;
  const oa = shells[a]!.offset;
  const ob = shells[b]!.offset;
  const oc = shells[c]!.offset;
  const od = shells[d]!.offset;
  const na = engine.sizeA;
  const nb = engine.sizeB;
  const nc = engine.sizeC;
  const nd = engine.sizeD;
  const result = engine.result;
  for (let x = 0; x < densities.length; x++) {
    const D = densities[x]!;
    const j = J ? J[x]! : null;
    const k = K ? K[x]! : null;
    let index = 0;
    for (let ic = 0; ic < nc; ic++) {
      const fc = oc + ic;
      for (let id = 0; id < nd; id++) {
        const fd = od + id;
        const dcd = D[fc * n + fd]!;
        let jcd = 0;
        for (let ia = 0; ia < na; ia++) {
          const fa = oa + ia;
          const dac = D[fa * n + fc]!;
          const dad = D[fa * n + fd]!;
          for (let ib = 0; ib < nb; ib++) {
            const v = result[index++]!;
            if (v === 0) continue;
            const fb = ob + ib;
            if (j) {
              j[fa * n + fb]! += halfG * v * dcd;
              jcd += v * D[fa * n + fb]!;
            }
            if (k) {
              const w = quarterG * v;
              k[fa * n + fc]! += w * D[fb * n + fd]!;
              k[fb * n + fd]! += w * dac;
              k[fa * n + fd]! += w * D[fb * n + fc]!;
              k[fb * n + fc]! += w * dad;
            }
          }
        }
        if (j) j[fc * n + fd]! += halfG * jcd;
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
