/**
 * Runs one request to its result, synchronously: what a worker thread does with each job (and
 * what tests call directly). Pure apart from reading basis data: the same request gives the same
 * result in the editor's worker and on the command line.
 *
 * - `mean-field`: the part's atoms (ångström in the request) go to bohr, the basis and integrals
 *   are built, and the SCF runs (electronic/scf); the plain-data summary and the orbital
 *   coefficients come back.
 * - `mp2`: the mean-field result it builds on arrives as input; the integrals are built again
 *   (their shell-pair data and Schwarz factors; MP2 recomputes quartets batch by batch anyway)
 *   and MP2 runs on it (RHF: energy, density and natural orbitals; UHF: energy).
 * - `active-space`: the restricted mean field (and for natural occupations the MP2 result) arrive
 *   as inputs; the basis and overlap are built again and electronic/activeSpace chooses the orbitals.
  * - `dmet-bath`: the system's mean-field result arrives as input; the basis and its overlap are
 *   built again and the fragment's bath is cut from the per-spin densities (electronic/embedding).
 * - `hamiltonian`: the restricted mean field it builds on arrives as input; the core Hamiltonian
 *   and the integral source are built again, the active space is chosen (the canonical window, or
 *   the indices given), its integrals are transformed (frozen core folded into a constant and an
 *   effective one-body term) and the qubit Hamiltonians and their figures are computed
 *   (electronic/hamiltonian, electronic/measurement).
 */
import {
  ACTIVE_SPACE_KIND,
  DMET_BATH_KIND,
  HAMILTONIAN_KIND,
  MP2_KIND,
  type ActiveSpaceOutcome,
  type ActiveSpaceRequest,
  type ComputeRequest,
  type DmetBathRequest,
  type DmetBathSummary,
  type HamiltonianOutcome,
  type HamiltonianRequest,
  type MeanFieldOutcome,
  type MeanFieldRequest,
  type Mp2Request,
  type Mp2Summary,
} from '../analysis/computed';
import { bathSize } from '../chemistry/cost/dmet';
import { atomicProjectionSelection, canonicalWindow, degenerateSplitNote, degenerateSplits, irrepWindow, naturalOccupationSelection, type ActiveSelection, type SelectionReference } from '../electronic/activeSpace';
import { naturalOrbitalIrreps, type Mp2Outcome } from '../electronic/correlation';
import { BOHR_IN_ANGSTROM } from '../chemistry/units';
import { buildMolecularBasis, type BasisAtom } from '../electronic/basis';
import { throwIfCancelled, type CancelToken } from '../electronic/contracts';
import { mp2, unrestrictedMp2 } from '../electronic/correlation';
import { DEFAULT_MINIMAL_BASIS, dmetBath, minimalBasisOverlaps, spinDensity, type DmetBathInput, type SpinBath } from '../electronic/embedding';
import { coreHamiltonian, createTwoElectronIntegrals, nuclearRepulsionEnergy, overlapMatrix } from '../electronic/integrals';
import { activeSpaceIntegrals, activeWindow } from '../electronic/hamiltonian';
import type { RestrictedOrbitals } from '../electronic/hamiltonian/activeSpace';
import { activeSpaceFigures } from '../electronic/measurement';
import { buildScfProblem, MINIMUM_NUCLEAR_DISTANCE, runScf, type ScfWavefunction } from '../electronic/scf';
import type { JobFailure, JobProgress } from './protocol';

export interface RunContext {
  readonly cancel: CancelToken;
  readonly onProgress: (progress: JobProgress) => void;
  /** Memory for stored two-electron integrals. */
  readonly storageLimitBytes: number;
}

/** A refusal found before any integral, with the atoms it is about. */
export class JobInputError extends Error {
  constructor(readonly failure: JobFailure) {
    super(failure.message);
    this.name = 'JobInputError';
  }
}

function atomsInBohr(request: MeanFieldRequest): BasisAtom[] {
  return request.inputs.atoms.map((atom) => ({ symbol: atom.symbol, x: atom.x / BOHR_IN_ANGSTROM, y: atom.y / BOHR_IN_ANGSTROM, z: atom.z / BOHR_IN_ANGSTROM }));
}

function basisNames(request: MeanFieldRequest): string[] {
  return request.inputs.basis.map((name, k) => {
    if (name === null) throw new JobInputError({ code: 'basis', message: `Atom ${k + 1} of the part (${request.inputs.atoms[k]!.symbol}) has no basis set.`, atoms: [k] });
    return name;
  });
}

/**
 * Nuclei closer than the engine accepts, named by their place in the part (the engine's own check,
 * checkNuclei, says the same without saying which atoms of the spec they are).
 */
function checkDistances(atoms: readonly BasisAtom[]): void {
  for (let a = 0; a < atoms.length; a++) {
    for (let b = 0; b < a; b++) {
      const distance = Math.hypot(atoms[a]!.x - atoms[b]!.x, atoms[a]!.y - atoms[b]!.y, atoms[a]!.z - atoms[b]!.z);
      if (!(distance >= MINIMUM_NUCLEAR_DISTANCE)) {
        throw new JobInputError({
          code: 'input',
          message:
            `Atoms ${b + 1} (${atoms[b]!.symbol}) and ${a + 1} (${atoms[a]!.symbol}) of the part are ${(distance * BOHR_IN_ANGSTROM).toFixed(3)} Å apart; ` +
            `a mean-field calculation needs every pair at least ${(MINIMUM_NUCLEAR_DISTANCE * BOHR_IN_ANGSTROM).toFixed(2)} Å apart.`,
          atoms: [b, a],
        });
      }
    }
  }
}

export function runMeanField(request: MeanFieldRequest, context: RunContext): MeanFieldOutcome {
  const start = performance.now();
  throwIfCancelled(context.cancel);
  const atoms = atomsInBohr(request);
  checkDistances(atoms);
  context.onProgress({ phase: 'integrals' });
  const problem = buildScfProblem({ atoms, basis: basisNames(request), kind: request.inputs.functions, charge: request.inputs.charge, multiplicity: request.inputs.multiplicity }, { storageLimitBytes: context.storageLimitBytes });
  throwIfCancelled(context.cancel);
  context.onProgress({ phase: 'guess' });
  const outcome = runScf(problem, {
    reference: request.reference,
    ...(request.maxIterations !== null ? { maxIterations: request.maxIterations } : {}),
    cancel: context.cancel,
    onProgress: (progress) =>
      context.onProgress({ phase: 'scf', iteration: progress.iteration, energy: progress.energy, energyChange: Number.isNaN(progress.energyChange) ? null : progress.energyChange }),
  });
  const { coefficients } = outcome.wavefunction;
  return {
    result: outcome.result,
    orbitals: { functionCount: problem.basis.functionCount, orbitalCount: outcome.result.orbitalCount, alpha: coefficients.alpha, beta: coefficients.beta },
    seconds: (performance.now() - start) / 1000,
  };
}

/** The parts of an SCF wavefunction MP2 reads, rebuilt from a mean-field result. */
function wavefunctionOf(meanField: MeanFieldOutcome): ScfWavefunction {
  const { result, orbitals } = meanField;
  return {
    reference: result.reference,
    coefficients: { alpha: orbitals.alpha, beta: orbitals.beta },
    orbitalEnergies: { alpha: Float64Array.from(result.orbitalEnergies.alpha), beta: Float64Array.from(result.orbitalEnergies.beta) },
    occupations: { alpha: Float64Array.from(result.occupations.alpha), beta: Float64Array.from(result.occupations.beta) },
    electrons: result.electrons,
    energy: result.energy,
  } as unknown as ScfWavefunction;
}

export function runMp2(request: Mp2Request, meanField: MeanFieldOutcome, context: RunContext): Mp2Summary {
  const start = performance.now();
  if (!meanField.result.converged) {
    throw new JobInputError({ code: 'prerequisite', message: `MP2 needs a converged mean field; it stopped after ${meanField.result.iterations} iterations without converging.` });
  }
  throwIfCancelled(context.cancel);
  context.onProgress({ phase: 'integrals' });
  const basis = buildMolecularBasis(atomsInBohr(request.meanField), basisNames(request.meanField), request.meanField.inputs.functions);
  const eri = createTwoElectronIntegrals(basis, { storageLimitBytes: 0 });
  const wavefunction = wavefunctionOf(meanField);
  const options = {
    frozenCore: request.frozenCore,
    cancel: context.cancel,
    onProgress: (progress: { done: number; total: number }) => context.onProgress({ phase: 'mp2', done: progress.done, total: progress.total }),
  };
  context.onProgress({ phase: 'mp2', done: 0, total: wavefunction.electrons.alpha });
  if (wavefunction.reference === 'uhf') {
    const result = unrestrictedMp2(wavefunction, eri, options);
    return { reference: 'uhf', correlationEnergy: result.correlationEnergy, totalEnergy: result.totalEnergy, oppositeSpin: result.oppositeSpin, sameSpin: result.sameSpin, frozenOrbitals: result.frozenCore, naturalOccupations: null, naturalOrbitals: null, seconds: (performance.now() - start) / 1000 };
  }
  const outcome = mp2(wavefunction, eri, options);
  const result = outcome.result;
  return {
    reference: wavefunction.reference,
    correlationEnergy: result.correlationEnergy,
    totalEnergy: result.totalEnergy,
    oppositeSpin: result.oppositeSpin,
    sameSpin: result.sameSpin,
    frozenOrbitals: result.frozenCore,
    naturalOccupations: result.naturalOccupations,
    naturalOrbitals: outcome.naturalOrbitals,
    seconds: (performance.now() - start) / 1000,
  };
}

/** How a selection chose its orbitals, for the Hamiltonian's source line. */
const SELECTION_TEXT: Record<ActiveSelection['source'], string> = {
  'canonical-window': 'canonical orbitals around the Fermi level',
  'irrep-window': 'canonical orbitals per irrep, each irrep\'s nearest the Fermi level',
  'natural-occupations': 'MP2 natural orbitals whose occupation lies inside the window',
  'atomic-projection': 'orbitals projected onto the named atomic shells (AVAS), canonical within the occupied and the virtual block',
};

interface ChosenSpace {
  core: number[];
  active: number[];
  source: string;
  orbitalKind: HamiltonianOutcome['orbitalKind'];
  /** The orbitals the indices refer to; the mean field's canonical orbitals when absent. */
  orbitals?: RestrictedOrbitals;
  energies: (number | null)[];
}

/** The core and active orbitals a Hamiltonian request names, checked against the mean field. */
function chooseSpace(request: HamiltonianRequest, meanField: MeanFieldOutcome, selection: ActiveSpaceOutcome | null): ChosenSpace {
  const { result } = meanField;
  const space = request.space;
  const canonicalEnergies = (active: readonly number[]) => active.map((p) => result.orbitalEnergies.alpha[p]!);
  if (space.kind === 'selection') {
    if (!selection) throw new JobInputError({ code: 'prerequisite', message: 'The Hamiltonian of a chosen active space needs the active-space result; none arrived.' });
    const electrons = selection.electrons.alpha + selection.electrons.beta;
    return {
      core: [...selection.core],
      active: [...selection.active],
      orbitals: selection.orbitals,
      orbitalKind: selection.orbitalKind,
      energies: selection.details.map((orbital) => orbital.energy),
      source: `${SELECTION_TEXT[selection.source]}: ${selection.core.length} doubly occupied below frozen, ${selection.active.length} active (${electrons}e, ${selection.active.length}o)`,
    };
  }
  if (space.kind === 'indices') return { core: [...space.core], active: [...space.active], source: space.source, orbitalKind: 'canonical', energies: canonicalEnergies(space.active) };
  const window = activeWindow(result.orbitalCount, result.electrons, space.electrons, space.orbitals);
  const open = result.electrons.alpha !== result.electrons.beta;
  const occupations = result.occupations.alpha.map((a, p) => a + result.occupations.beta[p]!);
  const degenerate = degenerateSplitNote(degenerateSplits(result.orbitalEnergies.alpha, occupations, window.active));
  return {
    ...window,
    orbitalKind: 'canonical',
    energies: canonicalEnergies(window.active),
    source:
      `canonical ${result.reference.toUpperCase()} orbitals in energy order: ${window.core.length} doubly occupied below frozen, ` +
      `orbitals ${window.active[0]! + 1}–${window.active[window.active.length - 1]! + 1} active (${space.electrons}e, ${space.orbitals}o${open ? '; the singly occupied orbitals inside' : ''})` +
      // The caller ends the sentence.
      (degenerate ? `. ${degenerate.replace(/\.$/, '')}` : ''),
  };
}

export function runHamiltonian(request: HamiltonianRequest, meanField: MeanFieldOutcome, context: RunContext, selection: ActiveSpaceOutcome | null = null): HamiltonianOutcome {
  const start = performance.now();
  const { result, orbitals } = meanField;
  if (!result.converged) {
    throw new JobInputError({ code: 'prerequisite', message: `The active-space Hamiltonian needs a converged mean field; the SCF stopped after ${result.iterations} iterations without converging.` });
  }
  if (result.reference !== 'rhf' && result.reference !== 'rohf') {
    throw new JobInputError({ code: 'input', message: `The active-space Hamiltonian needs restricted orbitals (RHF or ROHF), not ${result.reference.toUpperCase()}.` });
  }
  const chosen = chooseSpace(request, meanField, selection);
  const { core, active, source } = chosen;
  throwIfCancelled(context.cancel);
  context.onProgress({ phase: 'integrals' });
  const basis = buildMolecularBasis(atomsInBohr(request.meanField), basisNames(request.meanField), request.meanField.inputs.functions);
  const eri = createTwoElectronIntegrals(basis, { storageLimitBytes: 0 });
  context.onProgress({ phase: 'hamiltonian' });
  const { statistics: _statistics, ...integrals } = activeSpaceIntegrals({
    hCore: coreHamiltonian(basis),
    twoElectron: eri,
    orbitals: chosen.orbitals ?? { functionCount: orbitals.functionCount, orbitalCount: orbitals.orbitalCount, coefficients: orbitals.alpha },
    nuclearRepulsion: nuclearRepulsionEnergy(basis),
    core,
    active,
    electrons: result.electrons,
    cancel: context.cancel,
  });
  throwIfCancelled(context.cancel);
  return {
    reference: result.reference,
    core,
    active,
    orbitalKind: chosen.orbitalKind,
    source,
    activeOrbitalEnergies: chosen.energies,
    integrals,
    figures: activeSpaceFigures(integrals),
    seconds: (performance.now() - start) / 1000,
  };
}

export function runActiveSpace(request: ActiveSpaceRequest, meanField: MeanFieldOutcome, mp2Result: Mp2Summary | null, context: RunContext): ActiveSpaceOutcome {
  const start = performance.now();
  if (!meanField.result.converged) {
    throw new JobInputError({ code: 'prerequisite', message: `Choosing the active space needs a converged mean field; it stopped after ${meanField.result.iterations} iterations without converging.` });
  }
  throwIfCancelled(context.cancel);
  context.onProgress({ phase: 'active-space' });
  const basis = buildMolecularBasis(atomsInBohr(request.meanField), basisNames(request.meanField), request.meanField.inputs.functions);
  const overlap = overlapMatrix(basis);
  const { result, orbitals } = meanField;
  const reference: SelectionReference = {
    basis,
    overlap,
    pointGroup: result.pointGroup,
    wavefunction: {
      reference: result.reference,
      coefficients: { alpha: orbitals.alpha },
      orbitalEnergies: { alpha: result.orbitalEnergies.alpha },
      occupations: result.occupations,
      irreps: { alpha: result.irreps.alpha },
      electrons: result.electrons,
    },
  };
  const maxOrbitals = request.maxOrbitals ?? undefined;
  const choice = request.choice;
  let selection: ActiveSelection;
  switch (choice.kind) {
    case 'window':
      selection = canonicalWindow(reference, choice.electrons, choice.orbitals);
      break;
    case 'irreps':
      selection = irrepWindow(reference, choice.irreps, choice.electrons);
      break;
    case 'shells':
      selection = atomicProjectionSelection(reference, choice.shells, { threshold: choice.threshold, ...(maxOrbitals !== undefined ? { maxOrbitals } : {}) });
      break;
    case 'natural': {
      if (!mp2Result?.naturalOccupations || !mp2Result.naturalOrbitals) throw new JobInputError({ code: 'prerequisite', message: 'Natural occupations need MP2 on an RHF mean field; none arrived.' });
      const outcome = { result: { naturalOccupations: mp2Result.naturalOccupations }, naturalOrbitals: mp2Result.naturalOrbitals } as unknown as Mp2Outcome;
      const irreps = naturalOrbitalIrreps(outcome, basis, overlap);
      selection = naturalOccupationSelection(reference, outcome, { window: choice.window, irreps, ...(maxOrbitals !== undefined ? { maxOrbitals } : {}) });
      break;
    }
  }
  return { ...selection, seconds: (performance.now() - start) / 1000 };
}

export function runDmetBath(request: DmetBathRequest, meanField: MeanFieldOutcome, context: RunContext): DmetBathSummary {
  const start = performance.now();
  const { result, orbitals } = meanField;
  if (!result.converged) {
    throw new JobInputError({ code: 'prerequisite', message: `The DMET bath needs a converged mean field of the system; it stopped after ${result.iterations} iterations without converging.` });
  }
  throwIfCancelled(context.cancel);
  context.onProgress({ phase: 'embedding' });
  const basis = buildMolecularBasis(atomsInBohr(request.meanField), basisNames(request.meanField), request.meanField.inputs.functions);
  const n = basis.functionCount;
  const M = orbitals.orbitalCount;
  const alpha = spinDensity(orbitals.alpha, n, M, result.occupations.alpha);
  const beta = result.reference === 'rhf' ? alpha : spinDensity(orbitals.beta, n, M, result.occupations.beta);
  let iao: DmetBathInput['iao'];
  if (request.orbitals === 'iao') {
    if (result.reference !== 'rhf') {
      throw new JobInputError({ code: 'input', message: `The bath in intrinsic atomic orbitals needs a closed-shell (RHF) mean field of the system; this one is ${result.reference.toUpperCase()}. Use Löwdin orbitals (the default) for an open-shell system.` });
    }
    const minimal = minimalBasisOverlaps(basis, DEFAULT_MINIMAL_BASIS);
    const occupiedColumns = result.occupations.alpha.flatMap((value, k) => (value === 1 ? [k] : []));
    const k = occupiedColumns.length;
    const occupied = new Float64Array(n * k);
    for (let i = 0; i < n; i++) occupiedColumns.forEach((column, c) => (occupied[i * k + c] = orbitals.alpha[i * M + column]!));
    iao = { minimalOverlap: minimal.overlap, mixedOverlap: minimal.mixedOverlap, minimalFunctionCenter: minimal.functionCenter, occupied, occupiedCount: k };
  }
  const bath = dmetBath({
    ...(iao ? { iao } : {}),
    overlap: overlapMatrix(basis),
    functionCenter: basis.functionCenter,
    density: { alpha, beta },
    electrons: result.electrons,
    fragmentAtoms: request.fragmentAtoms,
    threshold: request.threshold,
    cancel: context.cancel,
  });
  const L = Math.min(bath.fragmentOrbitals, M);
  const spin = (value: SpinBath, electrons: number) => ({
    singularValues: Array.from(value.singularValues),
    bathOrbitals: value.bathOrbitals,
    countedBathOrbitals: bathSize(L, M, electrons),
    countedImpurityElectrons: bathSize(L, M, electrons) + Math.max(0, L + electrons - M),
    impurityElectrons: value.impurityElectrons,
    occupiedFragmentOrbitals: value.occupiedFragmentOrbitals,
    idempotencyError: value.idempotencyError,
  });
  return {
    reference: result.reference,
    orbitals: bath.orbitals,
    minimalBasis: iao ? DEFAULT_MINIMAL_BASIS : null,
    threshold: bath.threshold,
    fragmentOrbitals: bath.fragmentOrbitals,
    systemOrbitals: M,
    restricted: bath.restricted,
    alpha: spin(bath.alpha, result.electrons.alpha),
    beta: spin(bath.beta, result.electrons.beta),
    impurityOrbitals: bath.impurityOrbitals,
    impurityElectrons: bath.impurityElectrons,
    coreElectrons: bath.coreElectrons,
    seconds: (performance.now() - start) / 1000,
  };
}

/** Runs any request, given the results of its prerequisites (in the order `prerequisites` lists them). */
export function runRequest(request: ComputeRequest, inputs: readonly unknown[], context: RunContext): MeanFieldOutcome | Mp2Summary | DmetBathSummary | ActiveSpaceOutcome | HamiltonianOutcome {
  if (request.kind === MP2_KIND) return runMp2(request, inputs[0] as MeanFieldOutcome, context);
  if (request.kind === DMET_BATH_KIND) return runDmetBath(request, inputs[0] as MeanFieldOutcome, context);
  if (request.kind === ACTIVE_SPACE_KIND) return runActiveSpace(request, inputs[0] as MeanFieldOutcome, (inputs[1] as Mp2Summary | undefined) ?? null, context);
  if (request.kind === HAMILTONIAN_KIND) return runHamiltonian(request, inputs[0] as MeanFieldOutcome, context, (inputs[1] as ActiveSpaceOutcome | undefined) ?? null);
  return runMeanField(request, context);
}
