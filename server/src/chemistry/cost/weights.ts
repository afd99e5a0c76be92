/**
 * Pauli weights of the UCCSD excitation operators under the Jordan–Wigner mapping, summed over all
 * excitations of a reference determinant for a given spin-orbital register order.
 *
 * Jordan–Wigner (Z. Phys. 47, 631 (1928); as used for chemistry by Whitfield, Biamonte,
 * Aspuru-Guzik, Mol. Phys. 109, 735 (2011)): a_p = Z_0 ⋯ Z_{p−1} σ_p. In a product of ladder
 * operators on distinct qubits the Z strings cancel pairwise, so with the qubit indices sorted:
 *   single excitation on x1 < x2:           weight w = x2 − x1 + 1
 *   double excitation on x1 < x2 < x3 < x4: weight w = (x2 − x1 − 1) + (x4 − x3 − 1) + 4
 * (Z on the qubits strictly between x1 and x2 and between x3 and x4, plus X or Y on the four).
 * Each of the Pauli strings an excitation splits into has this same weight.
 *
 * Register orders (spatial orbital p of n, spin σ):
 *   'interleaved' — α of p on qubit 2p, β on 2p + 1 (α, β per spatial orbital);
 *   'blocked'     — α of p on qubit p, β on n + p (all α, then all β).
 * The reference fills spatial orbitals in the order given: 0..nβ−1 doubly, nβ..nα−1 with alpha only.
 *
 * The sums are exact and cost O(Q log Q) per symmetry block (Q = qubits), not O(o²v²): writing the
 * weight as (−x1 + x2 − x3 + x4) + 2 (doubles) or (−x1 + x2) + 1 (singles), each qubit x
 * contributes x times the signed number of excitations in which it holds each rank, and that number
 * follows from how many qubits of each kind lie below and above x.
 */
import { checkIrreps, IRREP_COUNT } from './symmetry';
import { requireFit } from './inputs';

export type RegisterOrder = 'interleaved' | 'blocked';

export interface RegisterLayout {
  /** Spatial orbitals of the active space. */
  readonly orbitals: number;
  readonly alpha: number;
  readonly beta: number;
  readonly order: RegisterOrder;
  /** Irrep mask of each spatial orbital (see symmetry.ts); when given, excitations are screened. */
  readonly irreps?: readonly number[];
}

export interface WeightSum {
  /** Number of excitations. */
  readonly count: number;
  /** Sum of their Jordan–Wigner Pauli weights. */
  readonly weightSum: number;
}

export interface ExcitationWeights {
  readonly singles: WeightSum;
  readonly doubles: WeightSum;
  readonly qubits: number;
}

export type Spin = 'alpha' | 'beta';

export function qubitIndex(orbital: number, spin: Spin, orbitals: number, order: RegisterOrder): number {
  if (order === 'interleaved') return 2 * orbital + (spin === 'alpha' ? 0 : 1);
  return orbital + (spin === 'alpha' ? 0 : orbitals);
}

/** A choice of `take` distinct qubits from a sorted set; sets of different picks are disjoint. */
interface Pick {
  readonly qubits: readonly number[];
  readonly take: 1 | 2;
}

/**
 * Over every selection (one set of `take` qubits from each pick): the number of selections and the
 * sum of the alternating rank sums −x1 + x2 − x3 + x4 (qubits of the selection in increasing order).
 */
function alternatingRankSum(picks: readonly Pick[]): RankSum {
  let count = 1;
  for (const pick of picks) count *= choose(pick.qubits.length, pick.take);
  if (count === 0) return { count: 0, alternating: 0 };
  let sum = 0;
  picks.forEach((own, ownIndex) => {
    for (const x of own.qubits) {
      // ways[t]: selections containing x with exactly t chosen qubits below x
      let ways = [1];
      picks.forEach((other, otherIndex) => {
        const take = otherIndex === ownIndex ? other.take - 1 : other.take;
        if (take === 0) return;
        const below = countBelow(other.qubits, x);
        const above = other.qubits.length - below - (otherIndex === ownIndex ? 1 : 0);
        const factor: number[] = [];
        for (let k = 0; k <= take; k++) factor.push(choose(below, k) * choose(above, take - k));
        ways = multiply(ways, factor);
      });
      // rank t + 1: odd ranks count −x, even ranks +x
      ways.forEach((n, t) => {
        sum += (t % 2 === 1 ? x : -x) * n;
      });
    }
  });
  return { count, alternating: sum };
}

interface RankSum {
  readonly count: number;
  readonly alternating: number;
}

export function uccsdExcitationWeights(layout: RegisterLayout): ExcitationWeights {
  const { orbitals, alpha, beta, order } = layout;
  requireFit(orbitals, alpha, beta);
  const irreps = layout.irreps ?? new Array<number>(orbitals).fill(0);
  if (irreps.length !== orbitals) throw new RangeError(`${irreps.length} irreps given for ${orbitals} orbitals.`);
  checkIrreps(irreps, 'orbital irreps');

  // qubits[spin][occupied?][irrep], each list sorted ascending
  const sets = (spin: Spin, occupied: boolean): number[][] => {
    const electrons = spin === 'alpha' ? alpha : beta;
    const byIrrep: number[][] = Array.from({ length: IRREP_COUNT }, () => []);
    for (let p = 0; p < orbitals; p++) {
      if (p < electrons === occupied) byIrrep[irreps[p] ?? 0]?.push(qubitIndex(p, spin, orbitals, order));
    }
    return byIrrep;
  };
  const occ = { alpha: sets('alpha', true), beta: sets('beta', true) };
  const vir = { alpha: sets('alpha', false), beta: sets('beta', false) };
  const get = (lists: number[][], g: number): number[] => lists[g] ?? [];

  const singles = accumulate();
  const doubles = accumulate();
  for (const spin of ['alpha', 'beta'] as const) {
    for (let g = 0; g < IRREP_COUNT; g++) {
      singles.add(alternatingRankSum([{ qubits: get(occ[spin], g), take: 1 }, { qubits: get(vir[spin], g), take: 1 }]));
    }
    // same-spin doubles: unordered occupied irrep pair {g1 ≤ g2}, unordered virtual pair {h1 ≤ h2}
    for (let g1 = 0; g1 < IRREP_COUNT; g1++) {
      for (let g2 = g1; g2 < IRREP_COUNT; g2++) {
        for (let h1 = 0; h1 < IRREP_COUNT; h1++) {
          const h2 = g1 ^ g2 ^ h1;
          if (h2 < h1) continue;
          doubles.add(alternatingRankSum([...pairPicks(get(occ[spin], g1), get(occ[spin], g2), g1 === g2), ...pairPicks(get(vir[spin], h1), get(vir[spin], h2), h1 === h2)]));
        }
      }
    }
  }
  // mixed-spin doubles: one alpha and one beta replacement, irreps multiplying to A
  for (let ga = 0; ga < IRREP_COUNT; ga++) {
    for (let gb = 0; gb < IRREP_COUNT; gb++) {
      for (let ha = 0; ha < IRREP_COUNT; ha++) {
        const hb = ga ^ gb ^ ha;
        doubles.add(
          alternatingRankSum([
            { qubits: get(occ.alpha, ga), take: 1 },
            { qubits: get(occ.beta, gb), take: 1 },
            { qubits: get(vir.alpha, ha), take: 1 },
            { qubits: get(vir.beta, hb), take: 1 },
          ]),
        );
      }
    }
  }
  return {
    singles: { count: singles.count, weightSum: singles.alternating + singles.count },
    doubles: { count: doubles.count, weightSum: doubles.alternating + 2 * doubles.count },
    qubits: 2 * orbitals,
  };
}

function pairPicks(first: readonly number[], second: readonly number[], same: boolean): Pick[] {
  return same ? [{ qubits: first, take: 2 }] : [{ qubits: first, take: 1 }, { qubits: second, take: 1 }];
}

function accumulate() {
  const total = {
    count: 0,
    alternating: 0,
    add(part: RankSum) {
      total.count += part.count;
      total.alternating += part.alternating;
    },
  };
  return total;
}

function countBelow(sorted: readonly number[], x: number): number {
  let low = 0;
  let high = sorted.length;
  while (low < high) {
    const mid = (low + high) >> 1;
    if ((sorted[mid] ?? Number.POSITIVE_INFINITY) < x) low = mid + 1;
    else high = mid;
  }
  return low;
}

function choose(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  if (k === 0) return 1;
  if (k === 1) return n;
  return (n * (n - 1)) / 2;
}

function multiply(a: readonly number[], b: readonly number[]): number[] {
  const result = new Array<number>(a.length + b.length - 1).fill(0);
  a.forEach((x, i) => b.forEach((y, j) => (result[i + j] = (result[i + j] ?? 0) + x * y)));
  return result;
}
