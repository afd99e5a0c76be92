/**
 * What the analysis asks to have computed for a part of a spec, under which key the result is
 * kept (late.ts), and the shapes the results arrive in. The jobs layer (server/src/jobs) runs the
 * requests in worker threads and writes the results; hover, lenses, views and the command line
 * read them here. A request is plain data, the same in the editor and on the command line, so
 * both compute the same thing.
 *
 * Kinds of request, each a kind of late result:
 * - `mean-field`: the SCF of one part (RHF, UHF or ROHF), with its orbitals;
 * - `mp2`: MP2 on top of a mean-field result (needs it first: `prerequisites`);
 * - `active-space`: a quantum or correlated fragment's active orbitals chosen from its restricted
 *   mean field (ROHF for open shells) — the window or per-irrep counts the spec gives, or a
 *   suggestion (named atomic shells, MP2 natural occupations, which also needs the MP2 result).
 * - `dmet-bath`: a fragment's DMET bath from the system's mean field (under `embedding dmet`).
 * - `hamiltonian`: the active-space integrals and qubit Hamiltonians of a restricted (RHF or ROHF)
 *   mean field, with their computed figures (needs the mean field first).
 * A later kind follows the same pattern: a request that names the
 * mean-field request it builds on, receives that result's orbitals, and is keyed by both.
 */
import type { ActiveSelection } from '../electronic/activeSpace/selection';
import type { MeanFieldResult } from '../electronic/scf/result';
import type { ActiveSpaceIntegrals } from '../electronic/hamiltonian/activeSpace';
import { figuresAtAccuracy, type ActiveSpaceFigures, type ActiveSpaceTooLargeFigures } from '../electronic/measurement/figures';
import type { ScfReference } from '../electronic/scf/options';
import type { SpecModel } from '../language/model';
import { COORDINATE_LIMIT } from '../chemistry/geometry';
import { DEFAULT_PROJECTION_THRESHOLD } from '../chemistry/activeSpaceDefaults';
import { inputKey, partAtoms, partInputs, partLabel, type PartInputs, type PartRef } from './inputKey';

export type { ScfReference };

export const MEAN_FIELD_KIND = 'mean-field';
export const MP2_KIND = 'mp2';
export const HAMILTONIAN_KIND = 'hamiltonian';
export const ACTIVE_SPACE_KIND = 'active-space';
export const DMET_BATH_KIND = 'dmet-bath';
/** Singular values above this give bath orbitals (electronic/embedding/bath.ts says why). */
export const DEFAULT_BATH_THRESHOLD = 1e-6;

export interface MeanFieldRequest {
  readonly kind: typeof MEAN_FIELD_KIND;
  readonly inputs: PartInputs;
  readonly reference: ScfReference;
  /** Fock builds allowed (null: the engine's default, 100). */
  readonly maxIterations: number | null;
  /** Basis functions of the part (follows from the inputs; for cost estimates, not in the key). */
  readonly functions: number;
}

export interface Mp2Request {
  readonly kind: typeof MP2_KIND;
  readonly meanField: MeanFieldRequest;
  /** Noble-gas cores kept uncorrelated (the part's frozen-core setting). */
  readonly frozenCore: boolean;
}

/** How the active orbitals are chosen (atoms are indices within the part). */
export type ActiveSpaceChoice =
  | { readonly kind: 'window'; readonly electrons: number; readonly orbitals: number }
  | { readonly kind: 'irreps'; readonly electrons: number; readonly irreps: readonly { readonly label: string; readonly count: number }[] }
  | { readonly kind: 'shells'; readonly shells: readonly { readonly center: number; readonly n: number | null; readonly l: number }[]; readonly threshold: number }
  | { readonly kind: 'natural'; readonly window: { readonly low: number; readonly high: number } };

export interface ActiveSpaceRequest {
  readonly kind: typeof ACTIVE_SPACE_KIND;
  /** A restricted mean field: RHF, or ROHF for an open shell. */
  readonly meanField: MeanFieldRequest;
  /** MP2 on it, for natural occupations; null otherwise. */
  readonly mp2: Mp2Request | null;
  readonly choice: ActiveSpaceChoice;
  /** Largest number of active orbitals (the qubit limit, two qubits per orbital); null: no limit. */
  readonly maxOrbitals: number | null;
}

/** A fragment's DMET bath from the system's mean field. */
export interface DmetBathRequest {
  readonly kind: typeof DMET_BATH_KIND;
  /** The whole system's mean field. */
  readonly meanField: MeanFieldRequest;
  /** The fragment's atoms: indices into the system's atoms (the spec's order). */
  readonly fragmentAtoms: readonly number[];
  /** Singular values above it give bath orbitals. */
  readonly threshold: number;
  /** The fragment's orthogonalised orbitals: Löwdin's, or intrinsic atomic orbitals (closed shells). */
  readonly orbitals: BathOrbitals;
}

export type BathOrbitals = 'lowdin' | 'iao';

export type ComputeRequest = MeanFieldRequest | Mp2Request | DmetBathRequest | ActiveSpaceRequest | HamiltonianRequest;

/** Atom indices as ranges: `0-2,5`. */
function atomRanges(atoms: readonly number[]): string {
  const out: string[] = [];
  for (let k = 0; k < atoms.length; ) {
    let end = k;
    while (end + 1 < atoms.length && atoms[end + 1] === atoms[end]! + 1) end++;
    out.push(end > k ? `${atoms[k]}-${atoms[end]}` : `${atoms[k]}`);
    k = end + 1;
  }
  return out.join(',');
}
/**
 * Which orbitals of the mean field form the active space:
 * - `window`: canonical orbitals in energy order, the doubly occupied ones below the window frozen,
 *   then `orbitals` orbitals holding `electrons` electrons (for a closed shell the Ne/2 highest
 *   occupied and the lowest virtual orbitals; an open shell's singly occupied orbitals inside);
 * - `indices`: the core and active orbitals by index (zero-based, energy order), as a selection
 *   made elsewhere gives them.
 */
export type HamiltonianSpace =
  | { readonly kind: 'window'; readonly electrons: number; readonly orbitals: number }
  | { readonly kind: 'indices'; readonly core: readonly number[]; readonly active: readonly number[]; readonly source: string }
  /**
   * The orbitals the fragment's active-space job chose (per irrep, projected on named shells, or
   * MP2 natural orbitals), in the orbitals it chose them in: `HamiltonianRequest.selection` names
   * that job, whose result arrives as a prerequisite. `window` is used where the part asks for no
   * active-space job (natural orbitals of an open shell, say).
   */
  | { readonly kind: 'selection'; readonly window: { readonly electrons: number; readonly orbitals: number } };

/** The active-space Hamiltonian of a part: always on restricted orbitals (RHF, or ROHF for open shells). */
export interface HamiltonianRequest {
  readonly kind: typeof HAMILTONIAN_KIND;
  /** An RHF or ROHF request (restrictedMeanField makes one from any mean-field request). */
  readonly meanField: MeanFieldRequest;
  readonly space: HamiltonianSpace;
  /** For a `selection` space: the active-space request whose orbitals the Hamiltonian is built in. */
  readonly selection?: ActiveSpaceRequest;
}

/**
 * The Hamiltonian request of a part in a space: a `selection` space builds on the part's
 * active-space request, or on its counted window where the part asks for none.
 */
export function hamiltonianRequest(meanField: MeanFieldRequest, space: HamiltonianSpace, activeSpace: ActiveSpaceRequest | null): HamiltonianRequest {
  if (space.kind !== 'selection') return { kind: HAMILTONIAN_KIND, meanField: restrictedMeanField(meanField), space };
  if (!activeSpace) return { kind: HAMILTONIAN_KIND, meanField: restrictedMeanField(meanField), space: { kind: 'window', ...space.window } };
  return { kind: HAMILTONIAN_KIND, meanField: activeSpace.meanField, space, selection: activeSpace };
}

/** The key a request's result is kept under, within its kind. */
export function requestKey(request: ComputeRequest): string {
  if (request.kind === MP2_KIND) return `fc${request.frozenCore ? 1 : 0};${requestKey(request.meanField)}`;
  if (request.kind === HAMILTONIAN_KIND) return request.selection ? `sel;${requestKey(request.selection)}` : `${spaceKey(request.space)};${requestKey(request.meanField)}`;
  if (request.kind === ACTIVE_SPACE_KIND) return `${JSON.stringify(request.choice)};mo${request.maxOrbitals ?? '-'};${request.mp2 ? requestKey(request.mp2) : requestKey(request.meanField)}`;
  if (request.kind === DMET_BATH_KIND) return `${request.orbitals};t${request.threshold};a${atomRanges(request.fragmentAtoms)};${requestKey(request.meanField)}`;
  return `${request.reference};it${request.maxIterations ?? '-'};${inputKey(request.inputs)}`;
}

function spaceKey(space: HamiltonianSpace): string {
  if (space.kind === 'selection') return 'sel';
  return space.kind === 'window' ? `w${space.electrons}e${space.orbitals}o` : `i${space.core.join(',')}|${space.active.join(',')}`;
}

/** Requests whose results a request needs before it can run. */
export function prerequisites(request: ComputeRequest): ComputeRequest[] {
  if (request.kind === ACTIVE_SPACE_KIND) return request.mp2 ? [request.meanField, request.mp2] : [request.meanField];
  if (request.kind === HAMILTONIAN_KIND && request.selection) return [request.meanField, request.selection];
  return request.kind === MEAN_FIELD_KIND ? [] : [request.meanField];
}

/**
 * The restricted mean field a Hamiltonian builds on: the request itself for RHF and ROHF; for UHF
 * (the default of open shells) the ROHF request of the same part, because the active-space
 * Hamiltonian needs one set of spatial orbitals for both spins.
 */
export function restrictedMeanField(meanField: MeanFieldRequest): MeanFieldRequest {
  return meanField.reference === 'uhf' ? { ...meanField, reference: 'rohf' } : meanField;
}

/** rhf for singlets, uhf otherwise (a tier's `method rhf|uhf|rohf` chooses instead). */
export function defaultReference(multiplicity: number): ScfReference {
  return multiplicity === 1 ? 'rhf' : 'uhf';
}

/** Orbitals passed on to the requests that build on a mean field (typed arrays, not JSON). */
export interface OrbitalArrays {
  readonly functionCount: number;
  readonly orbitalCount: number;
  /** C[μ·M + p] per spin (β the same array as α for RHF and ROHF). */
  readonly alpha: Float64Array;
  readonly beta: Float64Array;
}

/** A finished mean-field job. */
export interface MeanFieldOutcome {
  readonly result: MeanFieldResult;
  readonly orbitals: OrbitalArrays;
  /** Wall time of the job in its worker, seconds. */
  readonly seconds: number;
}

/** A finished MP2 job. */
export interface Mp2Summary {
  readonly reference: ScfReference;
  readonly correlationEnergy: number;
  /** Mean-field energy + correlation energy. */
  readonly totalEnergy: number;
  readonly oppositeSpin: number;
  readonly sameSpin: number;
  /** Orbitals left uncorrelated. */
  readonly frozenOrbitals: number;
  /** Natural occupation numbers of the unrelaxed MP2 density, descending (RHF only; null for UHF). */
  readonly naturalOccupations: readonly number[] | null;
  /** The natural orbitals in the basis functions (n×M, columns as naturalOccupations), for later requests. */
  readonly naturalOrbitals: Float64Array | null;
  readonly seconds: number;
}

/** A finished Hamiltonian job: the orbitals it used, the integrals (for exports) and the computed figures. */
export interface HamiltonianOutcome {
  readonly reference: 'rhf' | 'rohf';
  /**
   * Zero-based orbital indices: of the mean field's canonical orbitals in energy order, or for a
   * selection of the orbitals it chose them in (`orbitalKind`).
   */
  readonly core: readonly number[];
  readonly active: readonly number[];
  /** Canonical orbitals of the mean field, or the natural or projected orbitals of a selection. */
  readonly orbitalKind: 'canonical' | 'natural' | 'projected';
  /** How the orbitals were chosen, in words. */
  readonly source: string;
  /** Orbital energies of the active orbitals (hartree); null for natural orbitals, which have none. */
  readonly activeOrbitalEnergies: readonly (number | null)[];
  readonly integrals: ActiveSpaceIntegrals;
  /** At chemical accuracy; figuresAtAccuracy gives them at another target. */
  readonly figures: ActiveSpaceFigures | ActiveSpaceTooLargeFigures;
  readonly seconds: number;
}

/** A Hamiltonian's figures at the target accuracy ε (hartree) a spec asks for: the job computes them at chemical accuracy. */
export function hamiltonianFigures(outcome: HamiltonianOutcome, epsilon: number): ActiveSpaceFigures | ActiveSpaceTooLargeFigures {
  return outcome.figures.status === 'computed' ? figuresAtAccuracy(outcome.figures, epsilon) : outcome.figures;
}


/** A finished active-space job: the selection (electronic/activeSpace) and its wall time. */
export type ActiveSpaceOutcome = ActiveSelection & { readonly seconds: number };
/** One spin's Schmidt decomposition, as the bath job returns it. */
export interface SpinBathSummary {
  /** Singular values of the environment–fragment block of the spin's orthogonalised density, descending. */
  readonly singularValues: readonly number[];
  /** Singular values above the threshold. */
  readonly bathOrbitals: number;
  /** The counting rule min(L, M − L, Nσ, M − Nσ) on the same orbitals (chemistry/cost/dmet.ts). */
  readonly countedBathOrbitals: number;
  /** Electrons of the spin on fragment + bath, from the projected density. */
  readonly impurityElectrons: number;
  /** The counting rule's electrons of the spin on the impurity: counted bath + max(0, L + Nσ − M). */
  readonly countedImpurityElectrons: number;
  /** Fragment orbitals fully occupied (no bath partner). */
  readonly occupiedFragmentOrbitals: number;
  readonly idempotencyError: number;
}

/** A finished DMET bath job (electronic/embedding). */
export interface DmetBathSummary {
  readonly reference: ScfReference;
  readonly orbitals: BathOrbitals;
  /** The minimal basis of the intrinsic atomic orbitals (null for Löwdin's). */
  readonly minimalBasis: string | null;
  readonly threshold: number;
  /** L: orthogonalised orbitals on the fragment's atoms (Löwdin: its basis functions; IAO: its minimal-basis functions). */
  readonly fragmentOrbitals: number;
  /** M: the system's orbitals (linearly independent). */
  readonly systemOrbitals: number;
  /** One spatial bath for both spins (RHF). */
  readonly restricted: boolean;
  readonly alpha: SpinBathSummary;
  readonly beta: SpinBathSummary;
  readonly impurityOrbitals: number;
  readonly impurityElectrons: number;
  readonly coreElectrons: number;
  readonly seconds: number;
}

/**
 * One part of a spec as a candidate for computation: what it would ask for, or why it cannot. The
 * requests and keys are built when first read (a large system's key costs a pass over its atoms,
 * and parts beyond the memory limit never need one).
 */
export interface PartComputation {
  readonly part: PartRef;
  /** `system` or `fragment <name>`. */
  readonly label: string;
  /** Basis functions of the spec's function type. */
  readonly functions: number;
  /** Why the part cannot be computed at all; null when it can. */
  readonly refusal: string | null;
  /** Null when refused. */
  readonly meanField: MeanFieldRequest | null;
  readonly meanFieldKey: string | null;
  /** MP2 after the mean field: RHF and UHF references only. */
  readonly mp2: Mp2Request | null;
  readonly mp2Key: string | null;
  /** The active-space Hamiltonian after a restricted mean field: quantum fragments within the explicit limit. */
  readonly hamiltonian: HamiltonianRequest | null;
  readonly hamiltonianKey: string | null;
  /** Why a quantum fragment keeps its counted figures (a space beyond the explicit limit); null otherwise. */
  readonly hamiltonianNote: string | null;
  /** The active orbitals of a fragment whose tier has an active space; null otherwise. */
  readonly activeSpace: ActiveSpaceRequest | null;
  readonly activeSpaceKey: string | null;
  /** A fragment's DMET bath from the system's mean field: under `embedding dmet`, when the system can be computed. */
  readonly bath: DmetBathRequest | null;
  readonly bathKey: string | null;
}

/** Every part of a spec: the system first, then the fragments in spec order. */
export function specParts(model: SpecModel): PartRef[] {
  return [{ kind: 'system' }, ...model.fragments.map((fragment) => ({ kind: 'fragment' as const, index: fragment.index }))];
}

export function samePart(a: PartRef, b: PartRef): boolean {
  return a.kind === b.kind && (a.kind === 'system' || a.index === (b as { index: number }).index);
}

function refusalOf(model: SpecModel, part: PartRef): string | null {
  const atoms = partAtoms(model, part);
  const space = part.kind === 'system' ? model.system : model.fragments[part.index]!.space;
  if (atoms.length === 0) return 'it has no atoms';
  if (!model.basis.main && model.basis.overrides.length === 0) return 'the spec chooses no basis set';
  const c = model.coordinates;
  for (const atom of atoms) {
    const symbol = model.atoms[atom]!.element.symbol;
    const set = model.basis.atomSets[atom];
    if (!set) return `atom #${atom + 1} (${symbol}) has no basis set: the spec's basis name is not in the library`;
    if (!set.shellsFor(symbol)) return `${set.displayName} does not define ${symbol} (atom #${atom + 1})`;
    for (let axis = 0; axis < 3; axis++) {
      const value = c[3 * atom + axis]!;
      if (!Number.isFinite(value) || Math.abs(value) > COORDINATE_LIMIT) return `atom #${atom + 1} (${symbol}) has a coordinate beyond ±${COORDINATE_LIMIT} Å`;
    }
  }
  if (!space.spin) return `charge ${space.charge} and multiplicity ${space.multiplicity} do not fit its ${space.electrons} electrons`;
  return null;
}

/** The reference a part asks for: its tier's mean-field method when it names one, else the default. */
function referenceOf(model: SpecModel, part: PartRef, multiplicity: number): ScfReference {
  const method = part.kind === 'fragment' ? model.fragments[part.index]!.tier?.method : undefined;
  return method === 'rhf' || method === 'uhf' || method === 'rohf' ? method : defaultReference(multiplicity);
}

export interface RequestOptions {
  /** Overrides the reference the spec implies. */
  readonly reference?: ScfReference;
  readonly maxIterations?: number | null;
  /** Overrides the part's frozen-core setting for MP2. */
  readonly frozenCore?: boolean;
  /** The part's active space for a Hamiltonian, or why it keeps the bound; none without it. */
  readonly activeSpace?: HamiltonianSpace | { readonly bound: string } | null;
  /** Singular values above it give DMET bath orbitals (default DEFAULT_BATH_THRESHOLD). */
  readonly bathThreshold?: number;
  /** The fragment's orbitals for the DMET bath (default lowdin). */
  readonly bathOrbitals?: BathOrbitals;
}

/**
 * The system's mean-field request that every fragment's bath builds on, made once per model and
 * request options (not once per fragment: a spec of 10,000 fragments would otherwise key its
 * system 10,000 times). Null when the system cannot be computed.
 */
const systemRequests = new WeakMap<SpecModel, Map<string, MeanFieldRequest | null>>();

function systemMeanField(model: SpecModel, options: RequestOptions): MeanFieldRequest | null {
  let perOptions = systemRequests.get(model);
  if (!perOptions) systemRequests.set(model, (perOptions = new Map()));
  const key = `${options.reference ?? '-'};${options.maxIterations ?? '-'}`;
  let request = perOptions.get(key);
  if (request === undefined) {
    request = refusalOf(model, { kind: 'system' }) ? null : partComputation(model, { kind: 'system' }, options).meanField;
    perOptions.set(key, request);
  }
  return request;
}

/** What computing one part would ask for (the requests are plain data: see the file comment). */
export function partComputation(model: SpecModel, part: PartRef, options: RequestOptions = {}): PartComputation {
  const space = part.kind === 'system' ? model.system : model.fragments[part.index]!.space;
  const functions = space.basisFunctions[model.basis.functions];
  const refusal = refusalOf(model, part);
  let built:
    | { meanField: MeanFieldRequest; meanFieldKey: string; mp2: Mp2Request | null; mp2Key: string | null; activeSpace: ActiveSpaceRequest | null; activeSpaceKey: string | null; hamiltonian: HamiltonianRequest | null; hamiltonianKey: string | null }
    | undefined;
  let bath: { request: DmetBathRequest; key: string } | null | undefined;
  const buildBath = () => {
    if (bath !== undefined) return bath;
    bath = null;
    if (part.kind !== 'fragment' || model.embedding !== 'dmet') return bath;
    const system = systemMeanField(model, options);
    if (!system) return bath;
    const request: DmetBathRequest = { kind: DMET_BATH_KIND, meanField: system, fragmentAtoms: [...partAtoms(model, part)], threshold: options.bathThreshold ?? DEFAULT_BATH_THRESHOLD, orbitals: options.bathOrbitals ?? 'lowdin' };
    bath = { request, key: requestKey(request) };
    return bath;
  };
  const build = () => {
    if (built) return built;
    const inputs = partInputs(model, part);
    const meanField: MeanFieldRequest = {
      kind: MEAN_FIELD_KIND,
      inputs,
      reference: options.reference ?? referenceOf(model, part, inputs.multiplicity),
      maxIterations: options.maxIterations ?? null,
      functions,
    };
    const frozenCore = options.frozenCore ?? (part.kind === 'fragment' ? (model.fragments[part.index]!.tier?.frozenCore ?? model.frozenCore) : model.frozenCore);
    const mp2: Mp2Request | null = meanField.reference === 'rohf' ? null : { kind: MP2_KIND, meanField, frozenCore };
    const activeSpace = activeSpaceRequest(model, part, meanField, frozenCore);
    const space = options.activeSpace;
    const hamiltonian = space && 'kind' in space ? hamiltonianRequest(meanField, space, activeSpace) : null;
    built = { meanField, meanFieldKey: requestKey(meanField), mp2, mp2Key: mp2 ? requestKey(mp2) : null, activeSpace, activeSpaceKey: activeSpace ? requestKey(activeSpace) : null, hamiltonian, hamiltonianKey: hamiltonian ? requestKey(hamiltonian) : null };
    return built;
  };
  return {
    part,
    label: partLabel(model, part),
    functions,
    refusal,
    get meanField() {
      return refusal ? null : build().meanField;
    },
    get meanFieldKey() {
      return refusal ? null : build().meanFieldKey;
    },
    get mp2() {
      return refusal ? null : build().mp2;
    },
    get mp2Key() {
      return refusal ? null : build().mp2Key;
    },
    get hamiltonian() {
      return refusal ? null : build().hamiltonian;
    },
    get hamiltonianKey() {
      return refusal ? null : build().hamiltonianKey;
    },
    hamiltonianNote: options.activeSpace && 'bound' in options.activeSpace ? options.activeSpace.bound : null,
    get activeSpace() {
      return refusal ? null : build().activeSpace;
    },
    get activeSpaceKey() {
      return refusal ? null : build().activeSpaceKey;
    },
    get bath() {
      return buildBath()?.request ?? null;
    },
    get bathKey() {
      return buildBath()?.key ?? null;
    },
  };
}

/**
 * What choosing a fragment's active orbitals asks for: the counts or the suggestion of its tier,
 * from a restricted mean field of the part (ROHF where the part's own reference is UHF), fitted to
 * the spec's qubit limit. Null for the system, fragments without an active space, mean-field tiers,
 * and natural occupations of an open shell (MP2 natural orbitals come from RHF).
 */
function activeSpaceRequest(model: SpecModel, part: PartRef, meanField: MeanFieldRequest, frozenCore: boolean): ActiveSpaceRequest | null {
  if (part.kind !== 'fragment') return null;
  const fragment = model.fragments[part.index]!;
  const tier = fragment.tier;
  if (!tier || tier.level === 'mean-field' || !tier.active) return null;
  const restricted: MeanFieldRequest = meanField.reference === 'uhf' ? { ...meanField, reference: 'rohf' } : meanField;
  let choice: ActiveSpaceChoice;
  let mp2: Mp2Request | null = null;
  const atoms = partAtoms(model, part);
  if (tier.activeChoice?.kind === 'natural') {
    if (restricted.reference !== 'rhf') return null;
    mp2 = { kind: MP2_KIND, meanField: restricted, frozenCore };
    choice = { kind: 'natural', window: tier.activeChoice.window };
  } else if (tier.activeChoice?.kind === 'shells') {
    const place = new Map(atoms.map((atom, k) => [atom, k]));
    const shells = tier.activeChoice.shells.flatMap((shell) => (place.has(shell.atom) ? [{ center: place.get(shell.atom)!, n: shell.n, l: shell.l }] : []));
    if (shells.length === 0) return null;
    choice = { kind: 'shells', shells, threshold: DEFAULT_PROJECTION_THRESHOLD };
  } else if (tier.activeIrreps && tier.activeIrreps.length > 0) {
    choice = { kind: 'irreps', electrons: tier.active.electrons, irreps: tier.activeIrreps };
  } else {
    choice = { kind: 'window', electrons: tier.active.electrons, orbitals: tier.active.orbitals };
  }
  const qubits = model.limits.qubits;
  const suggestion = choice.kind === 'shells' || choice.kind === 'natural';
  return { kind: ACTIVE_SPACE_KIND, meanField: restricted, mp2, choice, maxOrbitals: suggestion && qubits !== undefined ? Math.max(1, Math.floor(qubits / 2)) : null };
}
