/**
 * Symmetry-adapted functions for the SCF and irrep labels for its orbitals.
 *
 * The abelian group and its operations come from the symmetry module (chemistry/symmetry) applied
 * to the centres. Each operation R acts on the basis as a matrix U_R (harmonics.ts per shell, the
 * shells of an atom going to the same shells of its image atom). The projector onto irrep Γ is
 * P_Γ = (1/h) Σ_R χ_Γ(R) U_R (F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., Wiley
 * 1990, §6.2 — section from memory). Applied to the functions of one shell of one representative
 * atom per set of equivalent atoms, it gives vectors whose independent combinations are the
 * symmetry-adapted functions; per irrep they are orthonormalised in the overlap metric by
 * canonical orthogonalisation, which also drops linear dependencies.
 *
 * The Fock matrix of a symmetric density is then block-diagonal. The blocks are used only when the
 * overlap and core Hamiltonian are block-diagonal to BLOCK_TOLERANCE (the geometry is symmetric to
 * about 1e-8 bohr and the basis follows the symmetry); otherwise the SCF runs in one block and
 * each orbital is labelled afterwards by its weights w_Γ = cᵀ S P_Γ c, after rotating every set of
 * degenerate orbitals of equal occupation onto the irreps (a diagonaliser returns arbitrary
 * mixtures of them). An orbital whose largest weight is below LABEL_WEIGHT gets no label (null):
 * the geometry is too far from the group for that orbital to belong to one irrep.
 */
import { type AbelianGroupName, CHARACTER_TABLES, detectSymmetry, type SymmetryResult } from '../../../chemistry/symmetry';
import { BOHR_IN_ANGSTROM } from '../../../chemistry/units';
import type { MolecularBasis } from '../../contracts';
import { DEFAULT_LINEAR_DEPENDENCY_THRESHOLD, multiply, multiplyTransposeA, orthonormalizeColumns, symmetricEigen } from '../../linalg';
import type { OrbitalBlock, OrbitalSpace } from '../space';
import { shellTransform } from './harmonics';

export const BLOCK_TOLERANCE = 1e-8;
export const LABEL_WEIGHT = 0.9;
/** Orbitals closer in energy than this (hartree, relative above 1) count as degenerate for labelling. */
export const DEGENERACY_TOLERANCE = 1e-6;

export interface BasisOperation {
  readonly name: string;
  /** Sparse U_R: for every function μ its image function index and the small per-shell block. */
  readonly apply: (vector: ArrayLike<number>, out: Float64Array) => void;
  /** Dense U_R (n×n), built on demand for tests. */
  readonly dense: () => Float64Array;
}

export interface SymmetryAdaptation {
  readonly group: AbelianGroupName;
  /** Irrep labels in the character table's order. */
  readonly irreps: readonly string[];
  /** characters[Γ][R] in the table's operation order. */
  readonly characters: readonly (readonly number[])[];
  readonly operations: readonly BasisOperation[];
  readonly basis: MolecularBasis;
}

/** An adaptation for the trivial group (everything 'A'). */
export function trivialAdaptation(basis: MolecularBasis): SymmetryAdaptation {
  const n = basis.functionCount;
  const identity: BasisOperation = {
    name: 'E',
    apply: (vector, out) => {
      for (let i = 0; i < n; i++) out[i] = vector[i]!;
    },
    dense: () => {
      const u = new Float64Array(n * n);
      for (let i = 0; i < n; i++) u[i * n + i] = 1;
      return u;
    },
  };
  return { group: 'C1', irreps: ['A'], characters: [[1]], operations: [identity], basis };
}

/**
 * The basis's symmetry: detected from its centres (in Å, default tolerance) unless given. Falls
 * back to C1 when an operation maps a centre onto one with another basis or core.
 */
export function adaptBasis(basis: MolecularBasis, given?: Pick<SymmetryResult, 'abelianGroup' | 'abelianOperations'>): SymmetryAdaptation {
  const centers = basis.centers;
  if (centers.length === 0) return trivialAdaptation(basis);
  const symmetry =
    given ??
    detectSymmetry(
      centers.map((center) => center.atomicNumber),
      centers.flatMap((center) => [center.x * BOHR_IN_ANGSTROM, center.y * BOHR_IN_ANGSTROM, center.z * BOHR_IN_ANGSTROM]),
      { nearTolerance: 0 },
    );
  const table = CHARACTER_TABLES[symmetry.abelianGroup];
  const shellsOf: number[][] = centers.map(() => []);
  basis.shells.forEach((shell, index) => shellsOf[shell.center]!.push(index));
  const operations: BasisOperation[] = [];
  for (const name of table.operations) {
    const operation = symmetry.abelianOperations.find((candidate) => candidate.name === name);
    if (!operation) return trivialAdaptation(basis);
    const permutation = operation.permutation;
    for (let a = 0; a < centers.length; a++) {
      const b = permutation[a]!;
      if (basis.basisNames[a] !== basis.basisNames[b] || centers[a]!.charge !== centers[b]!.charge || shellsOf[a]!.length !== shellsOf[b]!.length) return trivialAdaptation(basis);
      if (shellsOf[a]!.some((s, k) => basis.shells[s]!.l !== basis.shells[shellsOf[b]![k]!]!.l)) return trivialAdaptation(basis);
    }
    operations.push(basisOperation(basis, name, operation.matrix.flat(), permutation, shellsOf));
  }
  return {
    group: symmetry.abelianGroup,
    irreps: table.irreps.map((irrep) => irrep.label),
    characters: table.irreps.map((irrep) => irrep.characters),
    operations,
    basis,
  };
}

function basisOperation(basis: MolecularBasis, name: string, matrix: readonly number[], permutation: readonly number[], shellsOf: readonly number[][]): BasisOperation {
  const n = basis.functionCount;
  const cache = new Map<string, Float64Array>();
  // Per shell: target offset and its D block.
  const targets = basis.shells.map((shell) => {
    const local = shellsOf[shell.center]!.indexOf(basis.shells.indexOf(shell));
    const image = basis.shells[shellsOf[permutation[shell.center]!]![local]!]!;
    const key = `${shell.l}|${shell.kind}`;
    let d = cache.get(key);
    if (!d) {
      d = shellTransform(shell.l, shell.kind === 'spherical', matrix);
      cache.set(key, d);
    }
    return { from: shell.offset, to: image.offset, size: shell.size, d };
  });
  const apply = (vector: ArrayLike<number>, out: Float64Array) => {
    out.fill(0, 0, n);
    for (const { from, to, size, d } of targets) {
      for (let nu = 0; nu < size; nu++) {
        let sum = 0;
        for (let mu = 0; mu < size; mu++) sum += d[nu * size + mu]! * vector[from + mu]!;
        out[to + nu]! += sum;
      }
    }
  };
  const dense = () => {
    const u = new Float64Array(n * n);
    for (const { from, to, size, d } of targets) for (let nu = 0; nu < size; nu++) for (let mu = 0; mu < size; mu++) u[(to + nu) * n + from + mu] = d[nu * size + mu]!;
    return u;
  };
  return { name, apply, dense };
}

/** P_Γ v into out (work holds n numbers). */
function project(adaptation: SymmetryAdaptation, irrep: number, vector: ArrayLike<number>, out: Float64Array, work: Float64Array): void {
  const n = adaptation.basis.functionCount;
  const h = adaptation.operations.length;
  out.fill(0, 0, n);
  adaptation.operations.forEach((operation, r) => {
    const chi = adaptation.characters[irrep]![r]!;
    operation.apply(vector, work);
    for (let i = 0; i < n; i++) out[i]! += (chi / h) * work[i]!;
  });
}

/**
 * Symmetry-blocked orthonormal functions, or undefined when the overlap or core Hamiltonian is not
 * block-diagonal in them (then the caller runs unblocked and labels afterwards).
 */
export function symmetryAdaptedSpace(
  adaptation: SymmetryAdaptation,
  overlap: Float64Array,
  coreHamiltonian: Float64Array,
  threshold = DEFAULT_LINEAR_DEPENDENCY_THRESHOLD,
): OrbitalSpace | undefined {
  if (adaptation.group === 'C1') return undefined;
  const basis = adaptation.basis;
  const n = basis.functionCount;
  // Representative centre of each set of equivalent centres: the lowest index reached.
  const representative = new Int32Array(basis.centers.length).fill(-1);
  const unit = new Float64Array(n);
  const image = new Float64Array(n);
  basis.centers.forEach((_, a) => {
    if (representative[a]! >= 0) return;
    representative[a] = a;
    // Centres reached from a by the operations (read off a probe function).
    const shell = basis.shells.find((s) => s.center === a);
    if (!shell) return;
    for (const operation of adaptation.operations) {
      unit.fill(0);
      unit[shell.offset] = 1;
      operation.apply(unit, image);
      for (let i = 0; i < n; i++) if (image[i] !== 0 && representative[basis.functionCenter[i]!]! < 0) representative[basis.functionCenter[i]!] = a;
    }
  });
  const columns: number[][][] = adaptation.irreps.map(() => []);
  const projected = new Float64Array(n);
  const work = new Float64Array(n);
  for (const shell of basis.shells) {
    if (representative[shell.center] !== shell.center) continue;
    for (let g = 0; g < adaptation.irreps.length; g++) {
      const vectors: Float64Array[] = [];
      for (let mu = 0; mu < shell.size; mu++) {
        unit.fill(0);
        unit[shell.offset + mu] = 1;
        project(adaptation, g, unit, projected, work);
        vectors.push(Float64Array.from(projected));
      }
      // Independent combinations: eigenvectors of the Euclidean Gram matrix with non-zero eigenvalue
      // (they are at least 1/h for a projector; the others vanish to rounding).
      const k = vectors.length;
      const gram = new Float64Array(k * k);
      for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) {
        let sum = 0;
        for (let p = 0; p < n; p++) sum += vectors[i]![p]! * vectors[j]![p]!;
        gram[i * k + j] = sum;
      }
      const { values, vectors: w } = symmetricEigen(gram, k);
      for (let e = 0; e < k; e++) {
        if (values[e]! < 1e-6) continue;
        const column = new Array<number>(n).fill(0);
        for (let i = 0; i < k; i++) {
          const weight = w[i * k + e]! / Math.sqrt(values[e]!);
          if (weight === 0) continue;
          for (let p = 0; p < n; p++) column[p]! += weight * vectors[i]![p]!;
        }
        columns[g]!.push(column);
      }
    }
  }
  const total = columns.reduce((sum, list) => sum + list.length, 0);
  if (total !== n) return undefined;
  const blocks: OrbitalBlock[] = [];
  let dropped = 0;
  let smallest = Infinity;
  columns.forEach((list, g) => {
    if (list.length === 0) return;
    const k = list.length;
    const b = new Float64Array(n * k);
    list.forEach((column, j) => column.forEach((value, p) => (b[p * k + j] = value)));
    const orthonormal = orthonormalizeColumns(b, overlap, n, k, threshold);
    dropped += orthonormal.dropped;
    smallest = Math.min(smallest, orthonormal.smallestEigenvalue);
    if (orthonormal.m > 0) blocks.push({ irrep: adaptation.irreps[g]!, x: orthonormal.x, m: orthonormal.m });
  });
  if (!blockDiagonal(blocks, overlap, n) || !blockDiagonal(blocks, coreHamiltonian, n)) return undefined;
  return { n, blocks, m: blocks.reduce((sum, block) => sum + block.m, 0), linearDependencies: { dropped, threshold, smallestEigenvalue: smallest } };
}

/** True when X_Γᵀ A X_Γ' vanishes (to BLOCK_TOLERANCE) for every pair of different blocks. */
function blockDiagonal(blocks: readonly OrbitalBlock[], a: Float64Array, n: number): boolean {
  for (let p = 0; p < blocks.length; p++) {
    const ax = multiply(a, blocks[p]!.x, n, n, blocks[p]!.m, new Float64Array(n * blocks[p]!.m));
    for (let q = 0; q < p; q++) {
      const cross = multiplyTransposeA(blocks[q]!.x, ax, n, blocks[q]!.m, blocks[p]!.m, new Float64Array(blocks[q]!.m * blocks[p]!.m));
      for (const value of cross) if (Math.abs(value) > BLOCK_TOLERANCE) return false;
    }
  }
  return true;
}

/**
 * Labels orbitals computed without symmetry blocks (columns of the n×M matrix `coefficients`,
 * ascending energies): rotates each degenerate set of equal occupation onto the irreps (changing
 * `coefficients` within the set only) and returns the irrep of each orbital, or null when its
 * largest weight is below LABEL_WEIGHT.
 */
export function labelOrbitals(adaptation: SymmetryAdaptation, overlap: Float64Array, coefficients: Float64Array, energies: ArrayLike<number>, occupations: ArrayLike<number>): (string | null)[] {
  const n = adaptation.basis.functionCount;
  const count = energies.length;
  const irreps = adaptation.irreps.length;
  const column = new Float64Array(n);
  const projected = new Float64Array(n);
  const work = new Float64Array(n);
  const sp = new Float64Array(n);
  const labels: (string | null)[] = [];
  const columnOf = (k: number, out: Float64Array) => {
    for (let i = 0; i < n; i++) out[i] = coefficients[i * count + k]!;
  };
  /** ⟨a|S P_Γ|b⟩ for columns a and b. */
  const projectedOverlap = (a: number, b: number, g: number): number => {
    columnOf(b, column);
    project(adaptation, g, column, projected, work);
    multiply(overlap, projected, n, n, 1, sp);
    let sum = 0;
    for (let i = 0; i < n; i++) sum += coefficients[i * count + a]! * sp[i]!;
    return sum;
  };
  let start = 0;
  while (start < count) {
    let end = start + 1;
    while (end < count && energies[end]! - energies[start]! < DEGENERACY_TOLERANCE * Math.max(1, Math.abs(energies[start]!)) && occupations[end] === occupations[start]) end++;
    const size = end - start;
    if (size > 1 && irreps > 1) {
      // Diagonalise Σ_Γ (Γ + 1)·⟨i|S P_Γ|j⟩ within the set: its eigenvectors belong to single irreps.
      const a = new Float64Array(size * size);
      for (let i = 0; i < size; i++) for (let j = 0; j <= i; j++) {
        let sum = 0;
        for (let g = 0; g < irreps; g++) sum += (g + 1) * 0.5 * (projectedOverlap(start + i, start + j, g) + projectedOverlap(start + j, start + i, g));
        a[i * size + j] = a[j * size + i] = sum;
      }
      const { vectors } = symmetricEigen(a, size);
      const rotated = new Float64Array(n * size);
      for (let p = 0; p < n; p++) for (let k = 0; k < size; k++) {
        let sum = 0;
        for (let i = 0; i < size; i++) sum += coefficients[p * count + start + i]! * vectors[i * size + k]!;
        rotated[p * size + k] = sum;
      }
      for (let p = 0; p < n; p++) for (let k = 0; k < size; k++) coefficients[p * count + start + k] = rotated[p * size + k]!;
    }
    for (let k = start; k < end; k++) {
      let best = -1;
      let weight = -Infinity;
      for (let g = 0; g < irreps; g++) {
        const w = projectedOverlap(k, k, g);
        if (w > weight) {
          weight = w;
          best = g;
        }
      }
      labels.push(weight >= LABEL_WEIGHT ? adaptation.irreps[best]! : null);
    }
    start = end;
  }
  return labels;
}
