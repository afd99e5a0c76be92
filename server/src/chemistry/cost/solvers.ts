/**
 * What decides whether a classical solver can run on a fragment: its formal scaling, the floating-
 * point operations and the memory of the method on the fragment's problem (its DMET impurity or
 * its own orbitals), and the time at a given rate. Planning estimates: leading terms with stated
 * prefactors, no screening, no sparsity, no symmetry blocking; real programs differ by constant
 * factors, never by the power.
 *
 * Sizes: N basis functions of the part; n correlated orbitals (outside the frozen core, or the
 * active space); o occupied and v = n − o virtual among them. Closed shells count spatial orbitals
 * (the spin-adapted form of the methods); open shells take o = Nα and v = n − Nβ, the larger
 * occupied and the larger virtual count of the two spins — an upper estimate of the
 * spin-unrestricted cost.
 *
 * Operations are floating-point operations, a multiply–add counting two. Each method's count:
 *
 *   Hartree–Fock (rhf, rohf, uhf): per iteration every unique two-electron integral over the N
 *     basis functions, Q = P(P+1)/2 with P = N(N+1)/2 (8-fold permutational symmetry), contracted
 *     into J and K: 2 multiply–adds per integral and density (two densities for rohf and uhf) —
 *     formally N⁴ (J. Almlöf, K. Faegri, K. Korsell, J. Comput. Chem. 3, 385 (1982), direct SCF).
 *     Memory of a direct SCF: 20 N² doubles per density (overlap, core Hamiltonian, Fock, density,
 *     orbitals and a DIIS history of 8 Fock and error matrices; common practice).
 *   Kohn–Sham DFT (functional names as methods): the same Coulomb work, exact exchange only for
 *     hybrids, plus the exchange–correlation quadrature, G·N² multiply–adds with G = 10⁴ grid points
 *     per atom (common practice: a pruned grid of that order).
 *   MP2: the four-index transformation to (ia|jb), its first quarter o·N⁴ multiply–adds leading,
 *     then o·v·N³ + o²v·N² + o²v² for the rest and the energy — formally N⁵ (M. Head-Gordon,
 *     J. A. Pople, M. J. Frisch, Chem. Phys. Lett. 153, 503 (1988), from memory); memory o²v²
 *     doubles for (ia|jb) (integral-direct programs batch it, as electronic/correlation/mp2.ts does).
 *   CCSD: per iteration o²v⁴ (the particle–particle ladder) + 2·o³v³ (particle–hole terms) +
 *     o⁴v² (hole–hole ladder) multiply–adds, formally N⁶ (G. E. Scuseria, C. L. Janssen,
 *     H. F. Schaefer, J. Chem. Phys. 89, 7382 (1988), closed-shell form; prefactors from memory);
 *     20 iterations (common practice: DIIS-accelerated CCSD converges in 10–30). Memory: v⁴/2 for
 *     (ab|cd) with its pair symmetry, o·v³ for (ia|bc), 3·o²v² for the doubles amplitudes, their
 *     residual and (ia|jb) — the in-core integral classes (common practice; AO-driven ladders need
 *     less).
 *   CCSD(T): CCSD, then once o³v⁴ multiply–adds for the perturbative triples (K. Raghavachari,
 *     G. W. Trucks, J. A. Pople, M. Head-Gordon, Chem. Phys. Lett. 157, 479 (1989)) — formally N⁷;
 *     CCSD's memory plus a v³ block of triples per (i, j, k).
 *   CASCI and FCI: D = C(n, Nα)·C(n, Nβ) determinants; one σ = H·c per Davidson iteration costs a
 *     multiply–add for every nonzero Hamiltonian element, each determinant coupling to itself and
 *     its single and double replacements (Slater–Condon rules: Szabo & Ostlund 1989, §2.3);
 *     20 iterations (common practice; E. R. Davidson, J. Comput. Phys. 17, 87 (1975)).
 *     Memory: 3 vectors of D doubles (trial vector, σ and one correction; common practice).
 *   CASSCF: 20 macro-iterations (common practice), each a CASCI solve and the transformation of
 *     the integrals with active indices, n·N⁴ multiply–adds for its first quarter.
 */
import { binomial, BYTES_PER_REAL, fciDeterminantCount } from './classical';
import { requireWhole } from './inputs';
import { estimatedMagnitude, exactMagnitude, log10OfBigInt, scaleMagnitude, type Magnitude } from './magnitude';

/** Default rate when `limits` gives none: 10^11 floating-point operations per second (an assumption, common practice: a few cores of one node). */
export const DEFAULT_FLOPS = 1e11;
/** Iterations assumed for SCF, CCSD, Davidson and CASSCF (common practice). */
export const ASSUMED_ITERATIONS = 20;
/** Quadrature points per atom for Kohn–Sham DFT (common practice, order of magnitude). */
export const GRID_POINTS_PER_ATOM = 10_000;

export type SolverFamily = 'hartree-fock' | 'kohn-sham' | 'mp2' | 'coupled-cluster' | 'configuration-interaction';

export interface SolverSpace {
  /** N: basis functions of the part (the AO basis of the mean field and the transformations). */
  readonly basisFunctions: number;
  /** n: correlated orbitals (the problem outside the frozen core, or the active space). */
  readonly orbitals: number;
  readonly alpha: number;
  readonly beta: number;
  /** Atoms of the part, for the DFT grid. */
  readonly atoms: number;
}

export interface SolverCost {
  readonly method: string;
  readonly family: SolverFamily;
  /** The formal scaling, a colon, and its leading term: `N⁶: o²v⁴ per iteration`. */
  readonly scaling: string;
  /** The sizes the formulas use. */
  readonly sizes: { readonly N: number; readonly n: number; readonly o: number; readonly v: number; readonly determinants: Magnitude | null };
  readonly operationsPerIteration: Magnitude | null;
  readonly iterations: number | null;
  /** Every floating-point operation of the whole solve (iterations × per iteration + one-pass steps). */
  readonly operations: Magnitude;
  readonly memoryBytes: Magnitude;
  /** The operation and memory formulas, as applied. */
  readonly formula: string;
  readonly references: readonly string[];
}

export interface SolverTime {
  /** Operations per second the time is taken at. */
  readonly flopsPerSecond: number;
  /** log10 of the seconds. */
  readonly log10Seconds: number;
  /** The seconds, or null beyond 1e300. */
  readonly seconds: number | null;
  readonly text: string;
}

interface MethodInfo {
  readonly family: SolverFamily;
  /** For DFT: whether the functional has exact exchange. */
  readonly hybrid?: boolean;
}

/**
 * The methods costed here. DFT functionals are trade names (Perdew–Burke–Ernzerhof, Becke's
 * three-parameter hybrid with Lee–Yang–Parr, ...); their cost differs only by exact exchange.
 */
export const SOLVER_METHODS: Readonly<Record<string, MethodInfo>> = {
  rhf: { family: 'hartree-fock' },
  rohf: { family: 'hartree-fock' },
  uhf: { family: 'hartree-fock' },
  pbe: { family: 'kohn-sham', hybrid: false },
  pbe0: { family: 'kohn-sham', hybrid: true },
  b3lyp: { family: 'kohn-sham', hybrid: true },
  tpss: { family: 'kohn-sham', hybrid: false },
  mp2: { family: 'mp2' },
  ccsd: { family: 'coupled-cluster' },
  'ccsd(t)': { family: 'coupled-cluster' },
  casci: { family: 'configuration-interaction' },
  fci: { family: 'configuration-interaction' },
  casscf: { family: 'configuration-interaction' },
};

const b = (value: number) => BigInt(value);

/** Unique two-electron integrals over N functions: P(P+1)/2, P = N(N+1)/2. */
export function uniqueIntegrals(functions: number): bigint {
  const pairs = (b(functions) * b(functions + 1)) / 2n;
  return (pairs * (pairs + 1n)) / 2n;
}

/**
 * Determinants that couple to one determinant through H (itself, its single and double
 * replacements; Slater–Condon rules), for n orbitals with Nα and Nβ electrons.
 */
export function connectedDeterminants(orbitals: number, alpha: number, beta: number): bigint {
  const sa = b(alpha) * b(orbitals - alpha);
  const sb = b(beta) * b(orbitals - beta);
  const doubles = binomial(alpha, 2) * binomial(orbitals - alpha, 2) + binomial(beta, 2) * binomial(orbitals - beta, 2) + sa * sb;
  return 1n + sa + sb + doubles;
}

function bytes(doubles: bigint): Magnitude {
  return exactMagnitude(doubles * BYTES_PER_REAL);
}

const REFERENCES = {
  directScf: 'J. Almlöf, K. Faegri, K. Korsell, J. Comput. Chem. 3, 385 (1982)',
  mp2: 'M. Head-Gordon, J. A. Pople, M. J. Frisch, Chem. Phys. Lett. 153, 503 (1988)',
  ccsd: 'G. E. Scuseria, C. L. Janssen, H. F. Schaefer, J. Chem. Phys. 89, 7382 (1988)',
  triples: 'K. Raghavachari, G. W. Trucks, J. A. Pople, M. Head-Gordon, Chem. Phys. Lett. 157, 479 (1989)',
  slaterCondon: 'A. Szabo, N. S. Ostlund, Modern Quantum Chemistry (1989), §2.3',
  davidson: 'E. R. Davidson, J. Comput. Phys. 17, 87 (1975)',
} as const;

/** The cost of `method` on `space`; undefined for a method this module does not cost (quantum methods). */
export function solverCost(method: string, space: SolverSpace): SolverCost | undefined {
  const info = SOLVER_METHODS[method];
  if (!info) return undefined;
  const { basisFunctions: N, orbitals: n, alpha, beta, atoms } = space;
  requireWhole('basis functions', N);
  requireWhole('orbitals', n);
  requireWhole('alpha electrons', alpha);
  requireWhole('beta electrons', beta);
  if (alpha > n || beta > n) throw new RangeError(`${alpha} alpha and ${beta} beta electrons do not fit in ${n} orbitals.`);
  const o = Math.max(alpha, beta);
  const v = n - Math.min(alpha, beta);
  const sizes = { N, n, o, v, determinants: null as Magnitude | null };
  const I = b(ASSUMED_ITERATIONS);
  const [BN, Bo, Bv, Bn] = [b(N), b(o), b(v), b(n)];

  switch (info.family) {
    case 'hartree-fock':
    case 'kohn-sham': {
      const densities = method === 'rhf' || (info.family === 'kohn-sham' && alpha === beta) ? 1n : 2n;
      const exchange = info.family === 'hartree-fock' || info.hybrid;
      // J (and K) from every unique integral: a multiply–add each per density and per matrix.
      const perIntegral = (exchange ? 2n : 1n) * densities;
      const coulomb = 2n * perIntegral * uniqueIntegrals(N);
      const grid = info.family === 'kohn-sham' ? 2n * b(GRID_POINTS_PER_ATOM) * b(atoms) * BN * BN * densities : 0n;
      const perIteration = coulomb + grid;
      const memory = 20n * BN * BN * densities;
      const what = info.family === 'kohn-sham' ? `Kohn–Sham DFT (${info.hybrid ? 'hybrid, exact exchange' : 'no exact exchange'})` : 'Hartree–Fock';
      return {
        method,
        family: info.family,
        scaling: `N⁴: every unique two-electron integral per iteration${info.family === 'kohn-sham' ? ', plus G·N² on the grid' : ''}`,
        sizes,
        operationsPerIteration: exactMagnitude(perIteration),
        iterations: ASSUMED_ITERATIONS,
        operations: exactMagnitude(perIteration * I),
        memoryBytes: bytes(memory),
        formula: `${what}, direct: 2 × ${exchange ? '2 (J and K)' : '1 (J)'} × ${densities} densit${densities === 1n ? 'y' : 'ies'} × P(P+1)/2 unique integrals, P = N(N+1)/2, N = ${N}${info.family === 'kohn-sham' ? ` + 2·G·N² quadrature (G = ${GRID_POINTS_PER_ATOM.toLocaleString('en-US')} points per atom × ${atoms} atoms)` : ''} per iteration, ${ASSUMED_ITERATIONS} iterations; memory 20 N² doubles per density`,
        references: [REFERENCES.directScf],
      };
    }
    case 'mp2': {
      const transformation = Bo * BN ** 4n + Bo * Bv * BN ** 3n + Bo * Bo * Bv * BN * BN + Bo * Bo * Bv * Bv;
      return {
        method,
        family: 'mp2',
        scaling: 'N⁵: o·N⁴ for the first quarter of the integral transformation',
        sizes,
        operationsPerIteration: null,
        iterations: null,
        operations: exactMagnitude(2n * transformation),
        memoryBytes: bytes(Bo * Bo * Bv * Bv),
        formula: `2 × (o·N⁴ + o·v·N³ + o²·v·N² + o²v²), o = ${o}, v = ${v}, N = ${N}; memory o²v² doubles for (ia|jb)`,
        references: [REFERENCES.mp2],
      };
    }
    case 'coupled-cluster': {
      const perIteration = 2n * (Bo * Bo * Bv ** 4n + 2n * Bo ** 3n * Bv ** 3n + Bo ** 4n * Bv * Bv);
      const triples = method === 'ccsd(t)' ? 2n * Bo ** 3n * Bv ** 4n : 0n;
      const memory = (Bv ** 4n + 1n) / 2n + Bo * Bv ** 3n + 3n * Bo * Bo * Bv * Bv + (triples > 0n ? Bv ** 3n : 0n);
      return {
        method,
        family: 'coupled-cluster',
        scaling: method === 'ccsd(t)' ? 'N⁷: o³v⁴ once for the triples, after N⁶ (o²v⁴) per CCSD iteration' : 'N⁶: o²v⁴ per iteration',
        sizes,
        operationsPerIteration: exactMagnitude(perIteration),
        iterations: ASSUMED_ITERATIONS,
        operations: exactMagnitude(perIteration * I + triples),
        memoryBytes: bytes(memory),
        formula: `2 × (o²v⁴ + 2·o³v³ + o⁴v²) per iteration, ${ASSUMED_ITERATIONS} iterations${triples > 0n ? ', + 2 × o³v⁴ once for (T)' : ''}, o = ${o}, v = ${v}; memory v⁴/2 + o·v³ + 3·o²v²${triples > 0n ? ' + v³' : ''} doubles`,
        references: triples > 0n ? [REFERENCES.ccsd, REFERENCES.triples] : [REFERENCES.ccsd],
      };
    }
    case 'configuration-interaction': {
      // Exact up to EXACT_ORBITAL_LIMIT orbitals, as the determinant count of classical.ts.
      const D = fciDeterminantCount(n, alpha, beta).determinants;
      sizes.determinants = D;
      const sigma = scaleMagnitude(D, 2n * connectedDeterminants(n, alpha, beta));
      const macro = method === 'casscf';
      const transformation = macro ? 2n * Bn * BN ** 4n : 0n;
      const perIteration = macro ? addMagnitude(scaleMagnitude(sigma, I), transformation) : sigma;
      return {
        method,
        family: 'configuration-interaction',
        scaling: macro ? 'exponential: D determinants × their couplings per σ, plus n·N⁴ per macro-iteration' : 'exponential: D determinants × their couplings per σ',
        sizes,
        operationsPerIteration: perIteration,
        iterations: ASSUMED_ITERATIONS,
        operations: scaleMagnitude(perIteration, I),
        memoryBytes: scaleMagnitude(D, 3n * BYTES_PER_REAL),
        formula: `${macro ? `${ASSUMED_ITERATIONS} macro-iterations, each ${ASSUMED_ITERATIONS} σ builds + 2·n·N⁴ for the active-index transformation; ` : `${ASSUMED_ITERATIONS} Davidson iterations, `}one σ = 2 × D × (1 + singles + doubles per determinant), D = C(${n},${alpha})·C(${n},${beta}); memory 3 vectors of D doubles`,
        references: [REFERENCES.slaterCondon, REFERENCES.davidson],
      };
    }
  }
}

/** value + an exact whole number (the estimate keeps its logarithm when the addend is negligible). */
function addMagnitude(value: Magnitude, addend: bigint): Magnitude {
  if (value.exact !== undefined) return exactMagnitude(value.exact + addend);
  const other = log10OfBigInt(addend);
  if (!Number.isFinite(other) || other < value.log10 - 15) return value;
  const high = Math.max(value.log10, other);
  return estimatedMagnitude(high + Math.log10(10 ** (value.log10 - high) + 10 ** (other - high)));
}

const YEAR = 365.25 * 86400;

/** The time of `operations` at `flopsPerSecond`, with a readable text. */
export function solverTime(operations: Magnitude, flopsPerSecond: number): SolverTime {
  if (!(flopsPerSecond > 0) || !Number.isFinite(flopsPerSecond)) throw new RangeError(`A rate must be a positive number of operations per second, not ${flopsPerSecond}.`);
  const log10Seconds = (operations.exact !== undefined ? log10OfBigInt(operations.exact) : operations.log10) - Math.log10(flopsPerSecond);
  const seconds = log10Seconds > 300 ? null : operations.exact !== undefined && operations.exact === 0n ? 0 : 10 ** log10Seconds;
  return { flopsPerSecond, log10Seconds, seconds, text: timeText(seconds, log10Seconds) };
}

function timeText(seconds: number | null, log10Seconds: number): string {
  if (seconds !== null && seconds < 1) return 'under a second';
  if (seconds !== null && seconds < 120) return `${seconds.toPrecision(2)} s`;
  if (seconds !== null && seconds < 7200) return `${(seconds / 60).toPrecision(2)} min`;
  if (seconds !== null && seconds < 2 * 86400) return `${(seconds / 3600).toPrecision(2)} h`;
  if (seconds !== null && seconds < YEAR) return `${(seconds / 86400).toPrecision(2)} days`;
  const years = log10Seconds - Math.log10(YEAR);
  if (years < 6) return `${(10 ** years).toPrecision(2)} years`;
  return `10^${Math.floor(years)} years`;
}
