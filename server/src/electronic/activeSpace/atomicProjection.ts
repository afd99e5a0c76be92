/**
 * Active space from atomic valence orbitals (AVAS: E. R. Sayfutyarova, Q. Sun, G. K.-L. Chan,
 * G. Knizia, J. Chem. Theory Comput. 13, 4063 (2017)).
 *
 * The user names atomic shells (for example the 3d shell of an iron atom and the 2p shells of its
 * ligands). Their functions in a minimal reference basis (STO-3G here, the library's minimal basis)
 * span a target space A; P = Σ_ab |a⟩ (S_AA⁻¹)_ab ⟨b| projects onto it. The occupied and the
 * virtual canonical orbitals are projected separately: the eigenvectors of ⟨i|P|j⟩ over the
 * doubly occupied orbitals and of ⟨a|P|b⟩ over the virtual ones are rotations within each space,
 * and their eigenvalues σ (0 to 1) say how much of each rotated orbital lies in A. Orbitals with
 * σ above a threshold (by default 0.2, common practice) are active: the occupied ones bring two
 * electrons each, the rest of the occupied space is the frozen core. The active occupied and the
 * active virtual orbitals are then made canonical within their block (diagonalising the Fock
 * operator there), as the paper does, so each has an orbital energy.
 *
 * Open shells (ROHF): the singly occupied orbitals are always active; the doubly occupied and
 * the virtual orbitals are projected as above. Fitted to a qubit limit, the orbitals with the
 * smallest σ are dropped first.
 *
 * Shells are named by principal quantum number and l ("3d", "2p") or by l alone ("d": the valence
 * shell of that l, the highest of the minimal basis). In the minimal basis the k-th shell of
 * angular momentum l on an atom is the shell n = l + 1 + k (1s 2s 3s…, 2p 3p…, 3d 4d…). The
 * reference basis is built with the part's function kind; for d shells in cartesian functions the
 * target then includes the s-like combination x² + y² + z² of the six components.
 */
import type { MolecularBasis } from '../contracts';
import { buildMolecularBasis } from '../basis';
import { overlapMatrix } from '../integrals';
import { multiply, multiplyTransposeA, symmetricEigen } from '../linalg';
import { adaptBasis, labelOrbitals } from '../scf/symmetry/adapted';
import { shellLetter } from './character';
import { assembleSelection } from './describe';
import { fitToOrbitalLimit } from './fit';
import { canonicalOrbitals, orbitalsHolding, type CanonicalOrbitals, type SelectionReference } from './reference';
import { ActiveSelectionError, type ActiveSelection } from './selection';

/** The minimal basis the named shells are taken from. */
export const REFERENCE_MINIMAL_BASIS = 'sto-3g';
import { DEFAULT_PROJECTION_THRESHOLD } from '../../chemistry/activeSpaceDefaults';
export { DEFAULT_PROJECTION_THRESHOLD };

export interface ShellTarget {
  /** Index of the atom among the part's centres. */
  readonly center: number;
  readonly l: number;
  /** Principal quantum number; null: the highest shell of that l in the minimal basis. */
  readonly n: number | null;
}

export interface AtomicProjectionOptions {
  readonly threshold?: number;
  /** Largest number of active spatial orbitals (from the qubit limit); undefined: no limit. */
  readonly maxOrbitals?: number;
}

/** The shells of each atom in the minimal reference basis, as "1s 2s 2p" text, for messages. */
export function minimalShells(symbol: string, kind: MolecularBasis['kind']): string[] {
  const basis = buildMolecularBasis([{ symbol, x: 0, y: 0, z: 0 }], REFERENCE_MINIMAL_BASIS, kind);
  const seen = new Map<number, number>();
  return basis.shells.map((shell) => {
    const k = seen.get(shell.l) ?? 0;
    seen.set(shell.l, k + 1);
    return `${shell.l + 1 + k}${shellLetter(shell.l)}`;
  });
}

/** Functions of the reference basis (indices into it) that the targets name. */
function targetFunctions(reference: MolecularBasis, targets: readonly ShellTarget[]): number[] {
  const chosen = new Set<number>();
  for (const target of targets) {
    const centre = reference.centers[target.center];
    if (!centre) throw new ActiveSelectionError(`Atom ${target.center + 1} does not exist in this part (it has ${reference.centers.length}).`);
    const shells = reference.shells.filter((shell) => shell.center === target.center);
    const ofL = shells.filter((shell) => shell.l === target.l);
    const names = (() => {
      const seen = new Map<number, number>();
      return shells.map((shell) => {
        const k = seen.get(shell.l) ?? 0;
        seen.set(shell.l, k + 1);
        return `${shell.l + 1 + k}${shellLetter(shell.l)}`;
      });
    })();
    const wanted = target.n === null ? ofL[ofL.length - 1] : ofL[target.n - target.l - 1];
    if (!wanted || (target.n !== null && target.n - target.l - 1 < 0)) {
      const name = `${target.n ?? ''}${shellLetter(target.l)}`;
      throw new ActiveSelectionError(`${centre.symbol} (atom ${target.center + 1}) has no ${name} shell in the minimal reference basis ${REFERENCE_MINIMAL_BASIS.toUpperCase()}; it has ${names.join(' ') || 'none'}.`);
    }
    for (let f = 0; f < wanted.size; f++) chosen.add(wanted.offset + f);
  }
  return [...chosen].sort((a, b) => a - b);
}

export function atomicProjectionSelection(reference: SelectionReference, targets: readonly ShellTarget[], options: AtomicProjectionOptions = {}): ActiveSelection {
  if (targets.length === 0) throw new ActiveSelectionError('Name at least one atomic shell to project onto.');
  const canonical = canonicalOrbitals(reference);
  const threshold = options.threshold ?? DEFAULT_PROJECTION_THRESHOLD;
  if (!(threshold > 0 && threshold < 1)) throw new ActiveSelectionError(`The projection threshold ${threshold} must lie between 0 and 1.`);
  const basis = reference.basis;
  const N = basis.functionCount;
  const M = canonical.orbitalCount;
  const atoms = basis.centers.map(({ symbol, x, y, z }) => ({ symbol, x, y, z }));
  const minimal = buildMolecularBasis(atoms, REFERENCE_MINIMAL_BASIS, basis.kind);
  const targetsInMinimal = targetFunctions(minimal, targets);
  const t = targetsInMinimal.length;

  // Mixed overlap ⟨μ|a⟩ from one basis holding both sets of functions.
  const both = buildMolecularBasis([...atoms, ...atoms], [...basis.basisNames, ...atoms.map(() => REFERENCE_MINIMAL_BASIS)], basis.kind);
  const Nb = both.functionCount;
  const full = overlapMatrix(both);
  const mixed = new Float64Array(N * t);
  for (let mu = 0; mu < N; mu++) for (let a = 0; a < t; a++) mixed[mu * t + a] = full[mu * Nb + N + targetsInMinimal[a]!]!;
  const targetOverlap = new Float64Array(t * t);
  for (let a = 0; a < t; a++) for (let b = 0; b < t; b++) targetOverlap[a * t + b] = full[(N + targetsInMinimal[a]!) * Nb + N + targetsInMinimal[b]!]!;
  const inverse = inverseSymmetric(targetOverlap, t);

  const doubly = orbitalsHolding(canonical, 2);
  const singly = orbitalsHolding(canonical, 1);
  const virtual = orbitalsHolding(canonical, 0);
  const occupiedSpace = projectSpace(canonical.coefficients, N, M, doubly, mixed, inverse, t);
  const virtualSpace = projectSpace(canonical.coefficients, N, M, virtual, mixed, inverse, t);

  const ranked = [
    ...singly.map((p) => ({ index: 2 * M + p, importance: 2, occupied: true, required: true })),
    ...occupiedSpace.values.flatMap((sigma, k) => (sigma > threshold ? [{ index: k, importance: sigma, occupied: true }] : [])),
    ...virtualSpace.values.flatMap((sigma, k) => (sigma > threshold ? [{ index: M + k, importance: sigma, occupied: false }] : [])),
  ];
  if (ranked.length === singly.length) throw new ActiveSelectionError(`No orbital lies more than ${threshold} in the named shells (largest projections: occupied ${occupiedSpace.values[0]?.toFixed(3) ?? '—'}, virtual ${virtualSpace.values[0]?.toFixed(3) ?? '—'}).`);
  if (options.maxOrbitals !== undefined && singly.length > options.maxOrbitals) throw new ActiveSelectionError(`The ${singly.length} singly occupied orbitals must be active, more than the ${options.maxOrbitals} the qubit limit allows.`);
  const fit = fitToOrbitalLimit(ranked, options.maxOrbitals);
  const kept = new Set(fit.kept);
  const activeOccupied = occupiedSpace.values.map((_, k) => k).filter((k) => kept.has(k));
  const activeVirtual = virtualSpace.values.map((_, k) => M + k).filter((k) => kept.has(k)).map((k) => k - M);
  const coreOccupied = occupiedSpace.values.map((_, k) => k).filter((k) => !kept.has(k));
  const restVirtual = virtualSpace.values.map((_, k) => k).filter((k) => !kept.has(M + k));

  // The new orbitals: core | active occupied | singly occupied | active virtual | other virtual.
  const fock = fockOperator(reference, canonical);
  const columnsOut: Float64Array[] = [];
  const energies: number[] = [];
  const occupations: number[] = [];
  const projections: number[] = [];
  const push = (vectors: Float64Array[], values: readonly number[], electrons: number, sigma: readonly number[]) => {
    vectors.forEach((v, k) => {
      columnsOut.push(v);
      energies.push(values[k]!);
      occupations.push(electrons);
      projections.push(sigma[k]!);
    });
  };
  const rotatedCore = coreOccupied.map((k) => occupiedSpace.vector(k));
  push(rotatedCore, rotatedCore.map((v) => expectation(fock, v, N)), 2, coreOccupied.map((k) => occupiedSpace.values[k]!));
  const projectorAo = projector(mixed, inverse, N, t);
  const occBlock = semicanonical(activeOccupied.map((k) => occupiedSpace.vector(k)), fock, N, projectorAo);
  push(occBlock.vectors, occBlock.energies, 2, occBlock.projections);
  const singlyVectors = singly.map((p) => column(canonical.coefficients, N, M, p));
  push(singlyVectors, singly.map((p) => canonical.energies[p]!), 1, singlyVectors.map((v) => expectationProjector(v, mixed, inverse, N, t)));
  const virBlock = semicanonical(activeVirtual.map((k) => virtualSpace.vector(k)), fock, N, projectorAo);
  push(virBlock.vectors, virBlock.energies, 0, virBlock.projections);
  const rotatedRest = restVirtual.map((k) => virtualSpace.vector(k));
  push(rotatedRest, rotatedRest.map((v) => expectation(fock, v, N)), 0, restVirtual.map((k) => virtualSpace.values[k]!));

  const coefficients = new Float64Array(N * M);
  columnsOut.forEach((v, p) => {
    for (let mu = 0; mu < N; mu++) coefficients[mu * M + p] = v[mu]!;
  });
  const nc = rotatedCore.length;
  const active = Array.from({ length: occBlock.vectors.length + singly.length + virBlock.vectors.length }, (_, k) => nc + k);
  const irreps = activeIrreps(reference, coefficients, N, M, active, energies, occupations);

  const notes = [`Projected onto ${t} functions of ${REFERENCE_MINIMAL_BASIS.toUpperCase()}; projection eigenvalues above ${threshold}: ${occupiedSpace.values.filter((s) => s > threshold).length} occupied, ${virtualSpace.values.filter((s) => s > threshold).length} virtual.`];
  if (fit.toCore.length + fit.toVirtual.length > 0) notes.push(`Fitted to ${options.maxOrbitals} orbitals: ${fit.toCore.length} occupied moved to the core, ${fit.toVirtual.length} virtual left out (smallest projections first).`);
  return assembleSelection(reference, {
    source: 'atomic-projection',
    orbitalKind: 'projected',
    orbitals: { functionCount: N, orbitalCount: M, coefficients },
    core: Array.from({ length: nc }, (_, k) => k),
    active,
    energies,
    occupations,
    irreps,
    projections,
    totalElectrons: canonical.electrons,
    notes,
  });
}

/** The eigen-decomposition of ⟨i|P|j⟩ over a set of canonical orbitals, σ descending. */
interface ProjectedSpace {
  readonly values: readonly number[];
  vector(k: number): Float64Array;
}

function projectSpace(coefficients: Float64Array, N: number, M: number, orbitals: readonly number[], mixed: Float64Array, inverse: Float64Array, t: number): ProjectedSpace {
  const k = orbitals.length;
  const C = new Float64Array(N * k);
  for (let mu = 0; mu < N; mu++) for (let i = 0; i < k; i++) C[mu * k + i] = coefficients[mu * M + orbitals[i]!]!;
  // B = Cᵀ S_μa (k × t), O = B S_AA⁻¹ Bᵀ (k × k).
  const B = multiplyTransposeA(C, mixed, N, k, t, new Float64Array(k * t));
  const BS = multiply(B, inverse, k, t, t, new Float64Array(k * t));
  const O = new Float64Array(k * k);
  for (let i = 0; i < k; i++) for (let j = 0; j <= i; j++) {
    let sum = 0;
    for (let a = 0; a < t; a++) sum += BS[i * t + a]! * B[j * t + a]!;
    O[i * k + j] = O[j * k + i] = sum;
  }
  const { values, vectors } = symmetricEigen(O, k);
  const order = Array.from({ length: k }, (_, i) => k - 1 - i); // descending
  return {
    values: order.map((i) => values[i]!),
    vector(r: number): Float64Array {
      const e = order[r]!;
      const out = new Float64Array(N);
      for (let mu = 0; mu < N; mu++) {
        let sum = 0;
        for (let i = 0; i < k; i++) sum += C[mu * k + i]! * vectors[i * k + e]!;
        out[mu] = sum;
      }
      return out;
    },
  };
}

function inverseSymmetric(a: Float64Array, n: number): Float64Array {
  const { values, vectors } = symmetricEigen(a, n);
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    let sum = 0;
    for (let k = 0; k < n; k++) sum += (vectors[i * n + k]! * vectors[j * n + k]!) / values[k]!;
    out[i * n + j] = sum;
  }
  return out;
}

/** The projector as an AO matrix Π = S_μa S_AA⁻¹ S_aν (N × N), so that ⟨φ|P|ψ⟩ = φᵀ Π ψ. */
function projector(mixed: Float64Array, inverse: Float64Array, N: number, t: number): Float64Array {
  const MS = multiply(mixed, inverse, N, t, t, new Float64Array(N * t));
  const out = new Float64Array(N * N);
  for (let mu = 0; mu < N; mu++) for (let nu = 0; nu < N; nu++) {
    let sum = 0;
    for (let a = 0; a < t; a++) sum += MS[mu * t + a]! * mixed[nu * t + a]!;
    out[mu * N + nu] = sum;
  }
  return out;
}

function expectationProjector(v: Float64Array, mixed: Float64Array, inverse: Float64Array, N: number, t: number): number {
  const b = new Float64Array(t);
  for (let a = 0; a < t; a++) {
    let sum = 0;
    for (let mu = 0; mu < N; mu++) sum += v[mu]! * mixed[mu * t + a]!;
    b[a] = sum;
  }
  let value = 0;
  for (let a = 0; a < t; a++) for (let c = 0; c < t; c++) value += b[a]! * inverse[a * t + c]! * b[c]!;
  return value;
}

/**
 * The Fock operator in the atomic-orbital basis from the canonical orbitals: F = S C ε Cᵀ S (F C = S C ε
 * with Cᵀ S C = 1). For ROHF this is the effective operator of scf/engine.ts, whose doubly occupied
 * and virtual diagonal blocks are ½(Fα + Fβ), the only blocks the semicanonical step reads.
 */
function fockOperator(reference: SelectionReference, canonical: CanonicalOrbitals): Float64Array {
  const N = canonical.functionCount;
  const M = canonical.orbitalCount;
  const SC = multiply(reference.overlap, canonical.coefficients, N, N, M, new Float64Array(N * M));
  const out = new Float64Array(N * N);
  for (let mu = 0; mu < N; mu++) for (let nu = 0; nu <= mu; nu++) {
    let sum = 0;
    for (let p = 0; p < M; p++) sum += SC[mu * M + p]! * canonical.energies[p]! * SC[nu * M + p]!;
    out[mu * N + nu] = out[nu * N + mu] = sum;
  }
  return out;
}

function expectation(matrix: Float64Array, v: Float64Array, N: number): number {
  let sum = 0;
  for (let mu = 0; mu < N; mu++) {
    let row = 0;
    for (let nu = 0; nu < N; nu++) row += matrix[mu * N + nu]! * v[nu]!;
    sum += v[mu]! * row;
  }
  return sum;
}

/** Diagonalises the Fock operator within a block of orbitals: energies ascending, and ⟨P⟩ of each new orbital. */
function semicanonical(vectors: Float64Array[], fock: Float64Array, N: number, projectorAo: Float64Array): { vectors: Float64Array[]; energies: number[]; projections: number[] } {
  const k = vectors.length;
  if (k === 0) return { vectors: [], energies: [], projections: [] };
  const X = new Float64Array(N * k);
  vectors.forEach((v, i) => {
    for (let mu = 0; mu < N; mu++) X[mu * k + i] = v[mu]!;
  });
  const FX = multiply(fock, X, N, N, k, new Float64Array(N * k));
  const F = multiplyTransposeA(X, FX, N, k, k, new Float64Array(k * k));
  for (let i = 0; i < k; i++) for (let j = 0; j < i; j++) F[j * k + i] = F[i * k + j] = 0.5 * (F[i * k + j]! + F[j * k + i]!);
  const { values, vectors: U } = symmetricEigen(F, k);
  const rotated = multiply(X, U, N, k, k, new Float64Array(N * k));
  const out = Array.from({ length: k }, (_, i) => column(rotated, N, k, i));
  return { vectors: out, energies: Array.from(values), projections: out.map((v) => expectation(projectorAo, v, N)) };
}

function column(matrix: Float64Array, N: number, M: number, p: number): Float64Array {
  const out = new Float64Array(N);
  for (let mu = 0; mu < N; mu++) out[mu] = matrix[mu * M + p]!;
  return out;
}

/** Irreps of the active orbitals only (the rest need none), each block labelled on its own. */
function activeIrreps(reference: SelectionReference, coefficients: Float64Array, N: number, M: number, active: readonly number[], energies: readonly number[], occupations: readonly number[]): (string | null)[] {
  const labels: (string | null)[] = Array<string | null>(M).fill(null);
  if (reference.pointGroup === 'C1') return labels;
  const k = active.length;
  const X = new Float64Array(N * k);
  for (let mu = 0; mu < N; mu++) for (let i = 0; i < k; i++) X[mu * k + i] = coefficients[mu * M + active[i]!]!;
  const found = labelOrbitals(adaptBasis(reference.basis), reference.overlap, X, active.map((p) => energies[p]!), active.map((p) => occupations[p]!));
  // labelOrbitals may rotate degenerate orbitals onto irreps: copy them back.
  for (let mu = 0; mu < N; mu++) for (let i = 0; i < k; i++) coefficients[mu * M + active[i]!] = X[mu * k + i]!;
  active.forEach((p, i) => (labels[p] = found[i] ?? null));
  return labels;
}
