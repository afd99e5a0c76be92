/**
 * Variational parameter counts of the ansätze Tessera plans with: UCCSD (spin-orbital and
 * closed-shell spin-adapted, each with or without point-group screening), k-UpCCGSD and a
 * hardware-efficient ansatz. Every function is pure and returns a one-line description of the
 * convention it counted under, for hover cards.
 *
 * Orbital counts are those of the active space: o = occupied, v = virtual spatial orbitals, per
 * spin for open shells (oα = alpha electrons, vα = orbitals − oα, and the same for beta).
 */
import { requireFit, requireWhole } from './inputs';
import { at, checkIrreps, irrepHistogram, pairHistogram, productHistogram, symmetricPairs } from './symmetry';

export interface SpinOrbitalCounts {
  readonly occupiedAlpha: number;
  readonly occupiedBeta: number;
  readonly virtualAlpha: number;
  readonly virtualBeta: number;
}

/** Irreps (bit masks, see symmetry.ts) of the occupied and virtual orbitals of each spin. */
export interface SpinOrbitalIrreps {
  readonly occupiedAlpha: readonly number[];
  readonly occupiedBeta: readonly number[];
  readonly virtualAlpha: readonly number[];
  readonly virtualBeta: readonly number[];
}

export interface ExcitationCount {
  readonly singles: number;
  readonly doubles: number;
  readonly total: number;
  readonly description: string;
}

/** The spin-orbital counts of an active space of `orbitals` spatial orbitals with alpha ≥ beta electrons. */
export function spinOrbitalCounts(orbitals: number, alpha: number, beta: number): SpinOrbitalCounts {
  requireFit(orbitals, alpha, beta);
  return { occupiedAlpha: alpha, occupiedBeta: beta, virtualAlpha: orbitals - alpha, virtualBeta: orbitals - beta };
}

/**
 * Splits per-orbital irreps into the occupied and virtual lists of each spin for the reference
 * determinant that fills the orbitals in the order given: orbitals 0..beta−1 doubly occupied,
 * beta..alpha−1 singly occupied (alpha), the rest empty.
 */
export function referenceIrreps(orbitalIrreps: readonly number[], alpha: number, beta: number): SpinOrbitalIrreps {
  checkIrreps(orbitalIrreps, 'orbital irreps');
  spinOrbitalCounts(orbitalIrreps.length, alpha, beta);
  return {
    occupiedAlpha: orbitalIrreps.slice(0, alpha),
    occupiedBeta: orbitalIrreps.slice(0, beta),
    virtualAlpha: orbitalIrreps.slice(alpha),
    virtualBeta: orbitalIrreps.slice(beta),
  };
}

/**
 * UCCSD in spin orbitals with spin-conserving excitations (the operator of Peruzzo et al., Nat.
 * Commun. 5, 4213 (2014); counted as in Romero et al., Quantum Sci. Technol. 4, 014008 (2019)):
 *   singles = oα·vα + oβ·vβ
 *   doubles = C(oα,2)·C(vα,2) + C(oβ,2)·C(vβ,2) + oα·oβ·vα·vβ
 * One parameter per excitation (i<j, a<b: the antisymmetry of the amplitudes leaves one each).
 */
export function uccsdSpinOrbitalCount(counts: SpinOrbitalCounts): ExcitationCount {
  const { occupiedAlpha: oa, occupiedBeta: ob, virtualAlpha: va, virtualBeta: vb } = checkCounts(counts);
  const singles = oa * va + ob * vb;
  const doubles = pairs(oa) * pairs(va) + pairs(ob) * pairs(vb) + oa * ob * va * vb;
  return {
    singles,
    doubles,
    total: singles + doubles,
    description: 'UCCSD, spin orbitals: spin-conserving singles oα·vα + oβ·vβ, doubles C(oα,2)C(vα,2) + C(oβ,2)C(vβ,2) + oα·oβ·vα·vβ (Romero et al. 2019)',
  };
}

/**
 * The spin-orbital UCCSD count keeping only excitations whose irreps multiply to the totally
 * symmetric irrep (XOR of the masks = 0): a single i→a needs irrep(i) = irrep(a); a double needs
 * irrep(i)⊗irrep(j)⊗irrep(a)⊗irrep(b) = A. The Hamiltonian is totally symmetric, so by the
 * vanishing-integral rule only these excitations couple to a totally symmetric reference (Cotton,
 * Chemical Applications of Group Theory, 3rd ed., Wiley (1990)).
 */
export function uccsdSpinOrbitalCountWithSymmetry(irreps: SpinOrbitalIrreps): ExcitationCount {
  const oa = irrepHistogram(irreps.occupiedAlpha, 'occupiedAlpha');
  const ob = irrepHistogram(irreps.occupiedBeta, 'occupiedBeta');
  const va = irrepHistogram(irreps.virtualAlpha, 'virtualAlpha');
  const vb = irrepHistogram(irreps.virtualBeta, 'virtualBeta');
  const singles = symmetricPairs(oa, va) + symmetricPairs(ob, vb);
  const sameSpin = symmetricPairs(pairHistogram(oa), pairHistogram(va)) + symmetricPairs(pairHistogram(ob), pairHistogram(vb));
  const mixedSpin = symmetricPairs(productHistogram(oa, va), productHistogram(ob, vb));
  const doubles = sameSpin + mixedSpin;
  return {
    singles,
    doubles,
    total: singles + doubles,
    description: 'UCCSD, spin orbitals, point-group screened: only excitations whose irrep product is totally symmetric (Romero et al. 2019)',
  };
}

/**
 * Closed-shell UCCSD with spin-adapted (singlet) excitation operators, o doubly occupied and v
 * virtual spatial orbitals:
 *   singles = o·v                 (E_ai = a†_aα a_iα + a†_aβ a_iβ)
 *   doubles = o·v·(o·v + 1)/2     (unique closed-shell amplitudes t_ij^ab under t_ij^ab = t_ji^ba:
 *                                  unordered pairs of the o·v single replacements (ia), (jb))
 * The doubles are the closed-shell CCSD amplitudes of Scuseria, Scheiner, Lee, Rice, Schaefer,
 * J. Chem. Phys. 86, 2881 (1987); the same count equals the number of linearly independent singlet
 * double-excitation operators, 2·C(o,2)C(v,2) + o·C(v,2) + C(o,2)·v + o·v (two spin couplings when
 * i≠j and a≠b, one otherwise) — the singlet operators of the spin-adapted UCC of Sokolov et al.,
 * J. Chem. Phys. 152, 124107 (2020). The identity is checked in the tests.
 */
export function uccsdSpinAdaptedCount(occupied: number, virtual: number): ExcitationCount {
  requireWhole('occupied orbitals', occupied);
  requireWhole('virtual orbitals', virtual);
  const replacements = occupied * virtual;
  const singles = replacements;
  const doubles = (replacements * (replacements + 1)) / 2;
  return {
    singles,
    doubles,
    total: singles + doubles,
    description: 'UCCSD, closed-shell spin-adapted: singles o·v, doubles o·v(o·v+1)/2 unique amplitudes with t_ij^ab = t_ji^ba (Scuseria et al. 1987)',
  };
}

/**
 * The spin-adapted count with point-group screening. With S[g] the number of replacements i→a of
 * product irrep g: singles = S[A]; doubles = (Σ_g S[g]² + o·v)/2 — ordered pairs of replacements
 * whose products match, made unordered (the o·v pairs of a replacement with itself are always
 * allowed and counted once).
 */
export function uccsdSpinAdaptedCountWithSymmetry(occupiedIrreps: readonly number[], virtualIrreps: readonly number[]): ExcitationCount {
  const occupied = irrepHistogram(occupiedIrreps, 'occupied irreps');
  const virtual = irrepHistogram(virtualIrreps, 'virtual irreps');
  const replacementsByIrrep = productHistogram(occupied, virtual);
  const replacements = occupiedIrreps.length * virtualIrreps.length;
  const singles = at(replacementsByIrrep, 0);
  const doubles = (symmetricPairs(replacementsByIrrep, replacementsByIrrep) + replacements) / 2;
  return {
    singles,
    doubles,
    total: singles + doubles,
    description: 'UCCSD, closed-shell spin-adapted, point-group screened: only replacements pairs with a totally symmetric product (Scuseria et al. 1987)',
  };
}

export interface LayeredCount {
  readonly singlesPerLayer: number;
  readonly doublesPerLayer: number;
  readonly perLayer: number;
  readonly layers: number;
  readonly total: number;
  readonly description: string;
}

/**
 * k-UpCCGSD (Lee, Huggins, Head-Gordon, Whaley, J. Chem. Theory Comput. 15, 311 (2019), Sec. 2):
 * k products, each with its own parameters, of the exponential of generalized singles and
 * paired doubles over n spatial orbitals. "Generalized" means any orbital to any other, occupied
 * or not; "paired" means the doubles move an alpha–beta pair from one spatial orbital to another.
 * With one parameter per anti-Hermitian generator (p>q):
 *   generalized singles per layer = 2·C(n,2) = n(n−1)   (spin-conserving, alpha and beta separately)
 *                                 = C(n,2)              with `spinPairedSingles` (one angle for both spins)
 *   paired doubles per layer      = C(n,2) = n(n−1)/2
 * so 3n(n−1)/2 parameters per layer by default, k·3n(n−1)/2 in total: the O(kN²) the paper gives.
 */
export function kUpccgsdCount(orbitals: number, layers: number, options: { spinPairedSingles?: boolean } = {}): LayeredCount {
  requireWhole('orbitals', orbitals);
  requireWhole('layers', layers);
  const orbitalPairs = pairs(orbitals);
  const singlesPerLayer = options.spinPairedSingles ? orbitalPairs : 2 * orbitalPairs;
  const doublesPerLayer = orbitalPairs;
  const perLayer = singlesPerLayer + doublesPerLayer;
  const singlesNote = options.spinPairedSingles ? 'C(n,2) spin-paired' : 'n(n−1) spin-conserving';
  return {
    singlesPerLayer,
    doublesPerLayer,
    perLayer,
    layers,
    total: layers * perLayer,
    description: `k-UpCCGSD: k = ${layers} layers × (${singlesNote} generalized singles + C(n,2) paired doubles) for n = ${orbitals} (Lee et al. 2019)`,
  };
}

/**
 * Hardware-efficient layouts on q qubits with d entangling blocks.
 *
 * 'euler' — Kandala et al., Nature 549, 242 (2017): an Euler rotation Z·X·Z on every qubit, then d
 *   times an entangler followed by another Euler layer. The first Z acts on |0⟩ and is dropped,
 *   which leaves the paper's q(3d + 2) angles. We model the entangler (cross-resonance drift in the
 *   paper) as a CNOT chain along a line, (0,1), (1,2), …, (q−2,q−1): q − 1 CNOTs of depth q − 1.
 *     parameters = rotations = q(3d + 2); two-qubit gates = d(q − 1);
 *     depth = 2 + d·(3 + (q − 1))  (one layer per rotation, the chain sequential; q − 1 → 0 for q = 1)
 *
 * 'ry' — a common reduced form (common practice, no source): an RY layer, then d times the same
 *   CNOT chain followed by an RY layer.
 *     parameters = rotations = q(d + 1); two-qubit gates = d(q − 1); depth = (d + 1) + d(q − 1)
 */
export type HardwareEfficientLayout = 'euler' | 'ry';

export interface HardwareEfficientModel {
  readonly layout: HardwareEfficientLayout;
  readonly qubits: number;
  readonly blocks: number;
  readonly parameters: number;
  readonly singleQubitRotations: number;
  readonly twoQubitGates: number;
  readonly depth: number;
  readonly description: string;
}

export function hardwareEfficientModel(qubits: number, blocks: number, layout: HardwareEfficientLayout = 'euler'): HardwareEfficientModel {
  requireWhole('qubits', qubits);
  requireWhole('entangling blocks', blocks);
  const chain = Math.max(0, qubits - 1);
  const twoQubitGates = blocks * chain;
  if (layout === 'euler') {
    const rotations = qubits * (3 * blocks + 2);
    return {
      layout,
      qubits,
      blocks,
      parameters: rotations,
      singleQubitRotations: rotations,
      twoQubitGates,
      depth: qubits === 0 ? 0 : 2 + blocks * (3 + chain),
      description: `Hardware-efficient (Kandala et al. 2017): Euler Z·X·Z rotations on ${qubits} qubits around ${blocks} CNOT-chain entanglers; q(3d+2) angles`,
    };
  }
  const rotations = qubits * (blocks + 1);
  return {
    layout,
    qubits,
    blocks,
    parameters: rotations,
    singleQubitRotations: rotations,
    twoQubitGates,
    depth: qubits === 0 ? 0 : blocks + 1 + blocks * chain,
    description: `Hardware-efficient (RY layers and CNOT chains, common practice): ${qubits} qubits, ${blocks} blocks; q(d+1) angles`,
  };
}

function checkCounts(counts: SpinOrbitalCounts): SpinOrbitalCounts {
  requireWhole('occupied alpha orbitals', counts.occupiedAlpha);
  requireWhole('occupied beta orbitals', counts.occupiedBeta);
  requireWhole('virtual alpha orbitals', counts.virtualAlpha);
  requireWhole('virtual beta orbitals', counts.virtualBeta);
  return counts;
}

/** C(n, 2). */
function pairs(n: number): number {
  return (n * (n - 1)) / 2;
}
