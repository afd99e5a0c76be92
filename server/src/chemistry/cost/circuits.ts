/**
 * Gate counts of one Trotter step of UCCSD under Jordan–Wigner, for a given spin-orbital register
 * order (see weights.ts), in two constructions, and of the hardware-efficient layouts.
 *
 * One Trotter step applies every spin-orbital excitation once. A spin-adapted UCCSD shares angles
 * between excitations but still applies each of them, so its circuit is the spin-orbital one.
 *
 * 1. Pauli rotations with CNOT staircases (Whitfield, Biamonte, Aspuru-Guzik, Mol. Phys. 109, 735
 *    (2011); Romero et al., Quantum Sci. Technol. 4, 014008 (2019)). A single excitation splits into
 *    2 commuting Pauli strings, a double into 8; exp(iθP) for a string P of weight w takes a basis
 *    change on each X/Y qubit (H or RX(π/2), undone after), a CNOT staircase of w − 1 gates, RZ(θ),
 *    and the staircase back: 2(w − 1) CNOTs.
 *      CNOTs        = Σ_strings 2(w − 1)
 *      rotations    = number of strings (one RZ each)
 *      basis gates  = 2 per X/Y qubit per string: 8 per single excitation, 64 per double
 *      depth        = Σ_strings (2(w − 1) + 3): strings one after another, each with a basis-change
 *                     layer, its staircases, the RZ and the basis-change layer back — an upper
 *                     estimate, since no two strings are run in parallel and no gates cancel.
 *
 * 2. Fermionic excitation circuits after Yordanov, Arvidsson-Shukur, Barnes, Phys. Rev. A 102,
 *    062612 (2020): a qubit excitation (the excitation without its Jordan–Wigner Z string) costs
 *    2 CNOTs for a single and 13 for a double; the fermionic sign is restored by computing the
 *    parity of the m qubits inside the Z string onto one qubit with a CNOT ladder and applying it
 *    with a controlled-Z before and after, undoing the ladder: 2(m − 1) + 2 = 2m CNOTs (0 for m = 0).
 *      single on qubits x1 < x2:   m = x2 − x1 − 1,                 CNOTs = 2 + 2m = 2(x2 − x1)
 *      double on x1 < x2 < x3 < x4: m = (x2 − x1 − 1) + (x4 − x3 − 1), CNOTs = 13 + 2m
 *    i.e. 2(w − 1) and 2w + 5 in terms of the weight w above. Only CNOTs are counted for this
 *    construction; its single-qubit gates and depth are left undefined.
 *    Caveat: the 2- and 13-CNOT qubit-excitation circuits are the paper's; the parity overhead 2m
 *    is our reconstruction of its fermionic circuits (ladder + controlled-Z), written without the
 *    paper's text at hand. Check the constants against the paper's fermionic-excitation section
 *    before quoting them as its equations.
 */
import { hardwareEfficientModel, type HardwareEfficientLayout } from './ansatz';
import { uccsdExcitationWeights, type ExcitationWeights, type RegisterLayout } from './weights';

export type CircuitConstruction = 'pauli-rotations' | 'fermionic-excitations' | 'hardware-efficient';

export interface CircuitCost {
  readonly construction: CircuitConstruction;
  readonly cnots: number;
  /** Parameterized single-qubit rotations; undefined when the construction does not fix them. */
  readonly rotations: number | undefined;
  /** Fixed single-qubit gates (basis changes); undefined when not counted. */
  readonly basisChanges: number | undefined;
  readonly depth: number | undefined;
  /** False when a figure exceeds 2^53 and is therefore rounded. */
  readonly exact: boolean;
  readonly description: string;
}

/** CNOTs of a qubit single excitation, Yordanov et al. 2020. */
export const QUBIT_SINGLE_EXCITATION_CNOTS = 2;
/** CNOTs of a qubit double excitation, Yordanov et al. 2020. */
export const QUBIT_DOUBLE_EXCITATION_CNOTS = 13;

const STRINGS_PER_SINGLE = 2;
const STRINGS_PER_DOUBLE = 8;

export function uccsdPauliRotationCircuit(layout: RegisterLayout, weights: ExcitationWeights = uccsdExcitationWeights(layout)): CircuitCost {
  const { singles, doubles } = weights;
  const strings = STRINGS_PER_SINGLE * singles.count + STRINGS_PER_DOUBLE * doubles.count;
  // Σ_strings (w − 1): every string of an excitation has the excitation's weight
  const stringWeightExcess = STRINGS_PER_SINGLE * (singles.weightSum - singles.count) + STRINGS_PER_DOUBLE * (doubles.weightSum - doubles.count);
  const cnots = 2 * stringWeightExcess;
  const basisChanges = STRINGS_PER_SINGLE * 2 * 2 * singles.count + STRINGS_PER_DOUBLE * 4 * 2 * doubles.count;
  const depth = cnots + 3 * strings;
  return {
    construction: 'pauli-rotations',
    cnots,
    rotations: strings,
    basisChanges,
    depth,
    exact: allSafe(cnots, strings, basisChanges, depth),
    description: `UCCSD Trotter step, Jordan–Wigner (${layout.order} order), Pauli rotations with CNOT staircases: 2(w−1) CNOTs per string, strings run one after another (Romero et al. 2019)`,
  };
}

export function uccsdFermionicExcitationCircuit(layout: RegisterLayout, weights: ExcitationWeights = uccsdExcitationWeights(layout)): CircuitCost {
  const { singles, doubles } = weights;
  // parity qubits m = w − 2 (singles), w − 4 (doubles), 2 CNOTs each
  const singleCnots = QUBIT_SINGLE_EXCITATION_CNOTS * singles.count + 2 * (singles.weightSum - 2 * singles.count);
  const doubleCnots = QUBIT_DOUBLE_EXCITATION_CNOTS * doubles.count + 2 * (doubles.weightSum - 4 * doubles.count);
  const cnots = singleCnots + doubleCnots;
  return {
    construction: 'fermionic-excitations',
    cnots,
    rotations: undefined,
    basisChanges: undefined,
    depth: undefined,
    exact: allSafe(cnots),
    description: `UCCSD Trotter step, Jordan–Wigner (${layout.order} order), fermionic excitation circuits: 2 + 2m CNOTs per single, 13 + 2m per double, m = qubits in the parity string (Yordanov et al. 2020)`,
  };
}

export function hardwareEfficientCircuit(qubits: number, blocks: number, layout: HardwareEfficientLayout = 'euler'): CircuitCost {
  const model = hardwareEfficientModel(qubits, blocks, layout);
  return {
    construction: 'hardware-efficient',
    cnots: model.twoQubitGates,
    rotations: model.singleQubitRotations,
    basisChanges: 0,
    depth: model.depth,
    exact: allSafe(model.twoQubitGates, model.singleQubitRotations, model.depth),
    description: model.description,
  };
}

function allSafe(...values: number[]): boolean {
  return values.every((value) => Number.isSafeInteger(value));
}
