/**
 * Measurement groups for variational energy estimates: Pauli strings that commute qubit by qubit
 * (on every qubit the two strings are equal or one is the identity) can be measured together with
 * single-qubit rotations. Fewest groups is a minimum clique cover of the qubit-wise commutation
 * graph, i.e. a colouring of its complement; greedy colourings are the usual heuristics
 * (V. Verteletskyi, T.-C. Yen, A. F. Izmaylov, J. Chem. Phys. 152, 124114 (2020)).
 *
 * Here: largest-degree-first greedy colouring of the conflict graph (two strings conflict when some
 * qubit carries a different non-identity Pauli in each; D. J. A. Welsh, M. B. Powell, Comput. J.
 * 10, 85 (1967) for the largest-first order). A group of qubit-wise commuting strings has at most
 * one Pauli per qubit, so it is kept as one (x, z) signature and a string joins the first group
 * whose signature agrees with it wherever both act.
 *
 * The identity needs no measurement and is left out of the groups.
 *
 * Strings come from the structural generator (termClasses.ts), Jordan–Wigner, up to 32 qubits
 * (n = 16); grouping is O(m²) in the number of strings m, so explicit groups are used up to
 * EXPLICIT_GROUPING_QUBITS qubits and an estimate from the term count beyond.
 */
import type { IntegralPattern } from './integralPattern';
import { countPauliTerms } from './pauliTerms';
import { jordanWignerStrings, type PauliStrings, type SpinOrbitalOrdering } from './termClasses';

export { jordanWignerStrings, type PauliStrings, type SpinOrbitalOrdering } from './termClasses';

export interface QwcGrouping {
  /** Number of groups (the identity excluded). */
  readonly groups: number;
  /** Group of each string; 0xffffffff for the identity. */
  readonly assignment: Uint32Array;
  /** Strings per group. */
  readonly sizes: Uint32Array;
}

const UNASSIGNED = 0xffffffff;

/** Largest-degree-first greedy grouping of qubit-wise commuting strings. */
export function groupQubitWise(strings: PauliStrings): QwcGrouping {
  const m = strings.length;
  const { x, z } = strings;
  const support = new Uint32Array(m);
  for (let s = 0; s < m; s++) support[s] = (x[s]! | z[s]!) >>> 0;

  // Conflict degrees.
  const degree = new Uint32Array(m);
  for (let a = 0; a < m; a++) {
    const xa = x[a]!;
    const za = z[a]!;
    const sa = support[a]!;
    if (sa === 0) continue;
    let d = degree[a]!;
    for (let b = a + 1; b < m; b++) {
      if ((sa & support[b]! & ((xa ^ x[b]!) | (za ^ z[b]!))) !== 0) {
        d++;
        degree[b]!++;
      }
    }
    degree[a] = d;
  }

  // Order: degree descending, index ascending on ties (counting sort on degree).
  let maxDegree = 0;
  for (let s = 0; s < m; s++) if (degree[s]! > maxDegree) maxDegree = degree[s]!;
  const bucketStart = new Uint32Array(maxDegree + 2);
  for (let s = 0; s < m; s++) bucketStart[maxDegree - degree[s]! + 1]!++;
  for (let b = 1; b < bucketStart.length; b++) bucketStart[b]! += bucketStart[b - 1]!;
  const order = new Uint32Array(m);
  for (let s = 0; s < m; s++) order[bucketStart[maxDegree - degree[s]!]!++] = s;

  const assignment = new Uint32Array(m).fill(UNASSIGNED);
  let groupX = new Uint32Array(64);
  let groupZ = new Uint32Array(64);
  let groupSupport = new Uint32Array(64);
  let sizes = new Uint32Array(64);
  let groups = 0;
  for (let o = 0; o < m; o++) {
    const s = order[o]!;
    const ss = support[s]!;
    if (ss === 0) continue;
    const xs = x[s]!;
    const zs = z[s]!;
    let g = 0;
    for (; g < groups; g++) {
      if ((ss & groupSupport[g]! & ((xs ^ groupX[g]!) | (zs ^ groupZ[g]!))) === 0) break;
    }
    if (g === groups) {
      if (groups === groupX.length) {
        groupX = grow(groupX);
        groupZ = grow(groupZ);
        groupSupport = grow(groupSupport);
        sizes = grow(sizes);
      }
      groups++;
    }
    groupX[g] = (groupX[g]! | xs) >>> 0;
    groupZ[g] = (groupZ[g]! | zs) >>> 0;
    groupSupport[g] = (groupSupport[g]! | ss) >>> 0;
    sizes[g]!++;
    assignment[s] = g;
  }
  return { groups, assignment, sizes: sizes.slice(0, groups) };
}

function grow(array: Uint32Array<ArrayBuffer>): Uint32Array<ArrayBuffer> {
  const next = new Uint32Array(array.length * 2);
  next.set(array);
  return next;
}

/**
 * Explicit grouping is used up to this register size, beyond it the estimate: the greedy colouring
 * of 20 qubits (n = 10, C1) takes about half a second, too long for a figure shown while typing;
 * 14 qubits take about a third of that, once (results are kept). The estimate's ratio is fitted on
 * explicit groupings up to 20 qubits.
 */
export const EXPLICIT_GROUPING_QUBITS = 14;

/**
 * Scaling assumption for larger registers: the number of groups grows in proportion to the number of
 * non-identity strings, groups ≈ r · (terms − 1). The ratio r = Σ groups / Σ (terms − 1) is fitted
 * to this module's explicit groups (block order) for 8–20 qubits, n = 4..10, with orbitals spread
 * round-robin over the irreps of C1, C2v (masks 0–3) and D2h (masks 0–7):
 *
 *   n (qubits)    C1 terms / groups   C2v terms / groups   D2h terms / groups
 *    4 (8)            361 /   73           97 /  35             97 /  35
 *    5 (10)           876 /  170          228 /  52            132 /  43
 *    6 (12)          1819 /  364          471 /  89            247 /  75
 *    7 (14)          3382 /  680          862 / 178            442 / 153
 *    8 (16)          5793 / 1150         1473 / 320            753 / 268
 *    9 (18)          9316 / 1872         2356 / 484           1196 / 329
 *   10 (20)         14251 / 2868         3599 / 732           1823 / 440
 *
 * giving r = 10410 / 49553 = 0.210. Beyond the fit the measured ratio stays between 0.20 and 0.23
 * (C1 n = 12 and 14: 0.202; D2h n = 12, 14, 16: 0.220–0.226; C2v n = 12, 14: 0.203–0.208), which
 * the tests check for D2h at 24 and 28 qubits. The interleaved order gives more groups than block
 * order (C1, 20 qubits: 3951 against 2868). An estimate, not a count: it extrapolates one greedy
 * heuristic on generic integrals beyond where it was measured.
 */
export const QWC_GROUPS_PER_TERM = 0.21;

export interface MeasurementEstimate {
  readonly qubits: number;
  /** Pauli strings, identity included (Jordan–Wigner). */
  readonly terms: number;
  /** Qubit-wise commuting groups: explicit up to EXPLICIT_GROUPING_QUBITS qubits, else an estimate. */
  readonly groups: number;
  readonly exact: boolean;
  readonly method: string;
}

/** Estimated groups for a Hamiltonian of `terms` strings (identity included): r · (terms − 1). */
export function estimateQubitWiseGroups(terms: number): number {
  const measured = terms - 1;
  if (measured <= 0) return 0;
  return Math.max(1, Math.round(QWC_GROUPS_PER_TERM * measured));
}

/** Groups for an active space: explicit up to EXPLICIT_GROUPING_QUBITS, estimated beyond (Jordan–Wigner, block order). */
export function measurementGroups(pattern: IntegralPattern, ordering: SpinOrbitalOrdering = 'block'): MeasurementEstimate {
  const qubits = 2 * pattern.orbitals;
  const terms = countPauliTerms(pattern).jordanWigner;
  if (qubits <= EXPLICIT_GROUPING_QUBITS) {
    const groups = groupQubitWise(jordanWignerStrings(pattern, ordering)).groups;
    return { qubits, terms, groups, exact: true, method: `largest-degree-first greedy grouping of the qubit-wise commuting strings, Jordan–Wigner in ${ordering === 'block' ? 'block spin-orbital order (all α, then all β)' : 'interleaved spin-orbital order'} — a heuristic, not the minimum; the order changes the count` };
  }
  return { qubits, terms, groups: estimateQubitWiseGroups(terms), exact: false, method: estimatedGroupsMethod() };
}

/** How an estimated group count was made, for reports. */
export function estimatedGroupsMethod(): string {
  return `extrapolated beyond ${EXPLICIT_GROUPING_QUBITS} qubits: ${QWC_GROUPS_PER_TERM} × (terms − 1), the ratio fitted to explicit greedy groupings (block order) of 8–20 qubits`;
}
