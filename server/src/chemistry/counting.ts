/**
 * Electron, basis-function and orbital counting for a system or a fragment.
 *
 * Conventions (each one is named wherever a count is shown):
 * - electrons = sum of nuclear charges − charge − core electrons replaced by effective core potentials;
 * - spatial orbitals = basis functions of the chosen type (linear dependencies are not removed);
 * - frozen core = the noble-gas core of each element (common practice, no source), less the
 *   orbitals an effective core potential already replaces;
 * - active space = what is given, otherwise every orbital outside the frozen core.
 */
import { nobleGasCoreOrbitals } from './elements';
import { functionCount, type FunctionType, type ShellCounts } from './basis/shells';
import { qubitCounts, type QubitCounts } from './qubits';
import { spinState, type SpinProblem, type SpinState } from './spin';

export interface CountedAtom {
  readonly z: number;
  /** Contracted shells of this atom's basis; undefined when the basis does not define the element. */
  readonly shells: ShellCounts | undefined;
  readonly ecpCoreElectrons: number;
}

export interface ActiveSpaceRequest {
  readonly electrons: number;
  readonly orbitals: number;
}

export interface OrbitalSpaceInput {
  readonly atoms: readonly CountedAtom[];
  readonly charge: number;
  readonly multiplicity: number;
  readonly functions: FunctionType;
  readonly frozenCore: boolean;
  readonly active?: ActiveSpaceRequest;
}

export interface OrbitalSpace {
  readonly atomCount: number;
  readonly nuclearCharge: number;
  readonly ecpCoreElectrons: number;
  readonly charge: number;
  readonly electrons: number;
  readonly multiplicity: number;
  /** Undefined when charge and multiplicity do not fit the electron count. */
  readonly spin: SpinState | undefined;
  readonly spinProblem: SpinProblem | undefined;
  readonly basisFunctions: { readonly spherical: number; readonly cartesian: number };
  readonly functions: FunctionType;
  /** Atoms whose element the basis does not define: their functions are missing from the counts. */
  readonly atomsWithoutBasis: number;
  readonly orbitals: number;
  /** Spatial orbitals holding at least one electron (alpha count); undefined with an invalid spin. */
  readonly occupied: number | undefined;
  readonly doublyOccupied: number | undefined;
  readonly singlyOccupied: number | undefined;
  readonly virtual: number | undefined;
  readonly frozenCore: { readonly orbitals: number; readonly electrons: number };
  readonly active: ActiveSpace;
  /** Qubits for the active space. */
  readonly qubits: QubitCounts;
}

export interface ActiveSpace {
  readonly electrons: number;
  readonly orbitals: number;
  readonly alpha: number | undefined;
  readonly beta: number | undefined;
  readonly source: 'given' | 'outside-frozen-core' | 'all-orbitals';
}

export function countOrbitalSpace(input: OrbitalSpaceInput): OrbitalSpace {
  let nuclearCharge = 0;
  let ecpCoreElectrons = 0;
  let spherical = 0;
  let cartesian = 0;
  let atomsWithoutBasis = 0;
  let frozenOrbitals = 0;
  for (const atom of input.atoms) {
    nuclearCharge += atom.z;
    ecpCoreElectrons += atom.ecpCoreElectrons;
    if (atom.shells) {
      spherical += functionCount(atom.shells, 'spherical');
      cartesian += functionCount(atom.shells, 'cartesian');
    } else {
      atomsWithoutBasis++;
    }
    frozenOrbitals += Math.max(0, nobleGasCoreOrbitals(atom.z) - atom.ecpCoreElectrons / 2);
  }
  const electrons = nuclearCharge - input.charge - ecpCoreElectrons;
  const orbitals = input.functions === 'spherical' ? spherical : cartesian;
  const spin = spinState(electrons, input.multiplicity);
  const state = spin.ok ? spin.state : undefined;
  if (!input.frozenCore) frozenOrbitals = 0;
  frozenOrbitals = Math.min(frozenOrbitals, Math.max(0, Math.floor(electrons / 2)), orbitals);
  const active = activeSpace(input, electrons, orbitals, frozenOrbitals, state);
  return {
    atomCount: input.atoms.length,
    nuclearCharge,
    ecpCoreElectrons,
    charge: input.charge,
    electrons,
    multiplicity: input.multiplicity,
    spin: state,
    spinProblem: spin.ok ? undefined : spin.problem,
    basisFunctions: { spherical, cartesian },
    functions: input.functions,
    atomsWithoutBasis,
    orbitals,
    occupied: state?.alpha,
    doublyOccupied: state?.beta,
    singlyOccupied: state?.unpaired,
    virtual: state ? orbitals - state.alpha : undefined,
    frozenCore: { orbitals: frozenOrbitals, electrons: 2 * frozenOrbitals },
    active,
    qubits: qubitCounts(active.orbitals),
  };
}

function activeSpace(
  input: OrbitalSpaceInput,
  electrons: number,
  orbitals: number,
  frozenOrbitals: number,
  state: SpinState | undefined,
): ActiveSpace {
  const unpaired = state?.unpaired ?? input.multiplicity - 1;
  if (input.active) {
    const { electrons: activeElectrons, orbitals: activeOrbitals } = input.active;
    const split = activeSpin(activeElectrons, unpaired);
    return { electrons: activeElectrons, orbitals: activeOrbitals, ...split, source: 'given' };
  }
  const activeElectrons = electrons - 2 * frozenOrbitals;
  const split = activeSpin(activeElectrons, unpaired);
  return {
    electrons: activeElectrons,
    orbitals: Math.max(0, orbitals - frozenOrbitals),
    ...split,
    source: frozenOrbitals > 0 || input.frozenCore ? 'outside-frozen-core' : 'all-orbitals',
  };
}

function activeSpin(electrons: number, unpaired: number): { alpha: number | undefined; beta: number | undefined } {
  if (unpaired < 0 || unpaired > electrons || (electrons - unpaired) % 2 !== 0) return { alpha: undefined, beta: undefined };
  return { alpha: (electrons + unpaired) / 2, beta: (electrons - unpaired) / 2 };
}

export interface ActiveSpaceProblem {
  readonly kind:
    | 'electrons-negative'
    | 'electrons-exceed-capacity'
    | 'parity'
    | 'spin-does-not-fit'
    | 'orbitals-exceed-available'
    | 'electrons-exceed-available'
    | 'orbitals-not-positive';
  readonly message: string;
}

/**
 * Checks an active space against the orbital space it is chosen from. The active orbitals come
 * from outside the frozen core. When the active electrons have the parity the multiplicity needs,
 * the electrons left outside are even and fill whole inactive orbitals, so that needs no check.
 * With `orbitalsKnown` false (a basis that misses some element) the orbital total is not checked.
 */
export function checkActiveSpace(space: OrbitalSpace, request: ActiveSpaceRequest, orbitalsKnown = true): ActiveSpaceProblem[] {
  const problems: ActiveSpaceProblem[] = [];
  const { electrons, orbitals } = request;
  const unpaired = space.multiplicity - 1;
  const availableOrbitals = space.orbitals - space.frozenCore.orbitals;
  const availableElectrons = space.electrons - space.frozenCore.electrons;
  if (orbitals < 1) problems.push({ kind: 'orbitals-not-positive', message: `An active space needs at least one orbital; ${orbitals} given.` });
  if (electrons < 0) problems.push({ kind: 'electrons-negative', message: `Active electrons cannot be negative (${electrons}).` });
  if (electrons > 2 * orbitals) {
    problems.push({
      kind: 'electrons-exceed-capacity',
      message: `${electrons} electrons do not fit in ${orbitals} orbitals (at most ${2 * orbitals}).`,
    });
  }
  if (orbitalsKnown && orbitals > availableOrbitals) {
    const frozenNote = space.frozenCore.orbitals > 0 ? ` (${space.orbitals} orbitals − ${space.frozenCore.orbitals} frozen-core)` : '';
    problems.push({
      kind: 'orbitals-exceed-available',
      message: `${orbitals} active orbitals requested but only ${availableOrbitals} are available${frozenNote}.`,
    });
  }
  if (electrons > availableElectrons) {
    const frozenNote = space.frozenCore.electrons > 0 ? ` (${space.electrons} − ${space.frozenCore.electrons} frozen-core)` : '';
    problems.push({
      kind: 'electrons-exceed-available',
      message: `${electrons} active electrons requested but only ${availableElectrons} are available${frozenNote}.`,
    });
  }
  if (space.spin && electrons >= 0 && electrons <= 2 * orbitals) {
    if ((electrons - unpaired) % 2 !== 0) {
      problems.push({
        kind: 'parity',
        message: `${electrons} active electrons cannot have multiplicity ${space.multiplicity}: ${unpaired} unpaired electrons need an ${unpaired % 2 === 0 ? 'even' : 'odd'} electron count.`,
      });
    } else if (unpaired > electrons || (electrons + unpaired) / 2 > orbitals) {
      problems.push({
        kind: 'spin-does-not-fit',
        message: `Multiplicity ${space.multiplicity} needs ${unpaired} unpaired electrons, which ${electrons} electrons in ${orbitals} orbitals cannot hold.`,
      });
    }
  }
  return problems;
}
