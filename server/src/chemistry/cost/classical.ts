/**
 * Classical cost figures: the size of a full-CI space and its vector, the number and memory of
 * CCSD amplitudes, and the memory of a statevector simulation. Every size is a Magnitude
 * (magnitude.ts): exact as a BigInt when computed exactly, otherwise an estimate that says so.
 */
import { uccsdSpinAdaptedCount, uccsdSpinOrbitalCount, spinOrbitalCounts } from './ansatz';
import { requireFit, requireWhole } from './inputs';
import {
  compareMagnitudes,
  estimatedMagnitude,
  exactMagnitude,
  magnitudeOfNumber,
  scaleMagnitude,
  type Magnitude,
} from './magnitude';

/** Above this many orbitals the determinant count is estimated instead of computed exactly. */
export const EXACT_ORBITAL_LIMIT = 3000;
/** Above this many qubits the statevector size is given as an estimate. */
export const EXACT_QUBIT_LIMIT = 4096;

/** One double-precision number. */
export const BYTES_PER_REAL = 8n;
/** One double-precision complex number. */
export const BYTES_PER_COMPLEX = 16n;

/** C(n, k) exactly (0 when k > n). */
export function binomial(n: number, k: number): bigint {
  requireWhole('n', n);
  requireWhole('k', k);
  if (k > n) return 0n;
  const m = Math.min(k, n - k);
  let result = 1n;
  // the running product of j consecutive integers over j! is itself a binomial, so each division is exact
  for (let j = 1; j <= m; j++) result = (result * BigInt(n - m + j)) / BigInt(j);
  return result;
}

/**
 * ln n! from Stirling's series (DLMF 5.11.1, Abramowitz & Stegun 6.1.41):
 *   ln n! = n ln n − n + ½ ln(2πn) + 1/(12n) − 1/(360n³) + 1/(1260n⁵) − …
 * truncated after the n⁻⁵ term, whose successor 1/(1680n⁷) is below 2·10⁻¹⁴ for n ≥ 32; smaller n
 * are summed directly.
 */
export function lnFactorial(n: number): number {
  requireWhole('n', n);
  if (n < 32) {
    let sum = 0;
    for (let k = 2; k <= n; k++) sum += Math.log(k);
    return sum;
  }
  const inverse = 1 / n;
  const inverse2 = inverse * inverse;
  return n * Math.log(n) - n + 0.5 * Math.log(2 * Math.PI * n) + inverse * (1 / 12 - inverse2 * (1 / 360 - inverse2 / 1260));
}

/** log10 C(n, k) from Stirling's series; −Infinity when k > n. */
export function log10Binomial(n: number, k: number): number {
  requireWhole('n', n);
  requireWhole('k', k);
  if (k > n) return Number.NEGATIVE_INFINITY;
  return (lnFactorial(n) - lnFactorial(k) - lnFactorial(n - k)) / Math.LN10;
}

export interface DeterminantCount {
  readonly determinants: Magnitude;
  readonly method: 'exact' | 'estimate';
  readonly description: string;
}

/**
 * Determinants of a full-CI space of n spatial orbitals with nα alpha and nβ beta electrons:
 * C(n, nα)·C(n, nβ), every alpha string with every beta string (Sherrill, Schaefer, Adv. Quantum
 * Chem. 34, 143 (1999); the string factorization of Knowles, Handy, Chem. Phys. Lett. 111, 315
 * (1984)); no spin or point-group symmetry is used. Exact for n ≤ EXACT_ORBITAL_LIMIT,
 * above that estimated from Stirling's series so that huge inputs return at once.
 */
export function fciDeterminantCount(orbitals: number, alpha: number, beta: number): DeterminantCount {
  requireWhole('orbitals', orbitals);
  requireWhole('alpha electrons', alpha);
  requireWhole('beta electrons', beta);
  const formula = `C(${orbitals},${alpha})·C(${orbitals},${beta})`;
  if (alpha > orbitals || beta > orbitals) {
    return { determinants: exactMagnitude(0n), method: 'exact', description: `Full CI: ${formula} = 0 (the electrons do not fit)` };
  }
  if (orbitals <= EXACT_ORBITAL_LIMIT) {
    return {
      determinants: exactMagnitude(binomial(orbitals, alpha) * binomial(orbitals, beta)),
      method: 'exact',
      description: `Full CI: ${formula} determinants, no spin or point-group symmetry used`,
    };
  }
  return {
    determinants: estimatedMagnitude(log10Binomial(orbitals, alpha) + log10Binomial(orbitals, beta)),
    method: 'estimate',
    description: `Full CI: ${formula} determinants, estimated with Stirling's series (more than ${EXACT_ORBITAL_LIMIT} orbitals)`,
  };
}

/** Memory of one CI vector: 8 bytes (one double) per determinant. */
export function ciVectorBytes(determinants: Magnitude): Magnitude {
  return scaleMagnitude(determinants, BYTES_PER_REAL);
}

/**
 * 'spin-orbital': unique amplitudes t_i^a and t_ij^ab (i<j, a<b) over spin orbitals, spin-conserving
 *   — the same count as the spin-orbital UCCSD parameters (Crawford, Schaefer, Rev. Comput. Chem.
 *   14, 33 (2000)).
 * 'closed-shell': o·v singles and o·v(o·v+1)/2 doubles under t_ij^ab = t_ji^ba (Scuseria, Scheiner,
 *   Lee, Rice, Schaefer, J. Chem. Phys. 86, 2881 (1987)); needs alpha = beta.
 */
export type AmplitudeConvention = 'spin-orbital' | 'closed-shell';

export interface AmplitudeCount {
  readonly convention: AmplitudeConvention;
  readonly singles: Magnitude;
  readonly doubles: Magnitude;
  readonly amplitudes: Magnitude;
  /** 8 bytes per amplitude: one copy of the amplitude vector, without intermediates. */
  readonly bytes: Magnitude;
  readonly description: string;
}

/**
 * CCSD amplitudes of an active space. Without a convention, closed shells (alpha = beta) use the
 * closed-shell count and open shells the spin-orbital one.
 */
export function ccsdAmplitudeCount(orbitals: number, alpha: number, beta: number, convention?: AmplitudeConvention): AmplitudeCount {
  requireFit(orbitals, alpha, beta);
  const chosen = convention ?? (alpha === beta ? 'closed-shell' : 'spin-orbital');
  if (chosen === 'closed-shell' && alpha !== beta) {
    throw new RangeError(`The closed-shell amplitude count needs as many alpha as beta electrons (${alpha} ≠ ${beta}).`);
  }
  const count = chosen === 'closed-shell' ? uccsdSpinAdaptedCount(alpha, orbitals - alpha) : uccsdSpinOrbitalCount(spinOrbitalCounts(orbitals, alpha, beta));
  const amplitudes = magnitudeOfNumber(count.total);
  const rule =
    chosen === 'closed-shell'
      ? 'closed-shell: o·v singles + o·v(o·v+1)/2 doubles with t_ij^ab = t_ji^ba (Scuseria et al. 1987)'
      : 'spin orbitals: unique t_i^a and t_ij^ab, i<j, a<b, spin-conserving (Crawford & Schaefer 2000)';
  return {
    convention: chosen,
    singles: magnitudeOfNumber(count.singles),
    doubles: magnitudeOfNumber(count.doubles),
    amplitudes,
    bytes: scaleMagnitude(amplitudes, BYTES_PER_REAL),
    description: `CCSD amplitudes, ${rule}; 8 bytes each, one copy`,
  };
}

/**
 * Memory of a statevector simulation of q qubits: 2^q complex amplitudes of 16 bytes (two
 * doubles) — common practice, no source. Exact up to EXACT_QUBIT_LIMIT qubits, then an estimate.
 */
export function statevectorBytes(qubits: number): Magnitude {
  requireWhole('qubits', qubits);
  if (qubits <= EXACT_QUBIT_LIMIT) return exactMagnitude(BYTES_PER_COMPLEX << BigInt(qubits));
  return estimatedMagnitude((qubits + 4) * Math.log10(2));
}

export interface MemoryComparison {
  /** The size is at most the limit. */
  readonly fits: boolean;
  /** False when an estimate lies too close to the limit to decide (then `fits` is true). */
  readonly certain: boolean;
  /** log10(size / limit); undefined when either is zero. */
  readonly ratioLog10: number | undefined;
}

export function compareWithMemoryLimit(bytes: Magnitude, limitBytes: number | bigint): MemoryComparison {
  const limit = typeof limitBytes === 'bigint' ? exactMagnitude(limitBytes) : magnitudeOfNumber(limitBytes);
  const order = compareMagnitudes(bytes, limit);
  const bothExact = bytes.exact !== undefined && limit.exact !== undefined;
  const ratioLog10 = Number.isFinite(bytes.log10) && Number.isFinite(limit.log10) ? bytes.log10 - limit.log10 : undefined;
  return { fits: order <= 0, certain: bothExact || order !== 0, ratioLog10 };
}
