/**
 * Superposition of atomic densities (J. Almlöf, K. Faegri, K. Korsell, "Principles for a direct
 * SCF approach to LCAO-MO ab-initio calculations", J. Comput. Chem. 3, 385 (1982); J. H. Van
 * Lenthe, R. Zwaans, H. J. J. Van Dam, M. F. Guest, "Starting SCF calculations by superposition of
 * atomic densities", J. Comput. Chem. 27, 926 (2006)): the guess density is block-diagonal, each
 * block the density of the neutral atom in its own basis.
 *
 * Each atom's density comes from a spin-restricted SCF with fractional occupations: the electrons
 * fill the orbitals in order of energy, and a set of degenerate orbitals (equal energies within
 * DEGENERACY) that is only partly filled shares its electrons equally. The density then stays
 * spherical (an average over the atom's states, not a ground state), so it carries no arbitrary
 * orientation into the molecule. Fock matrix F = H + J(D) − ½K(D) for the spin-summed D, DIIS on
 * FD − DF, at most ATOM_ITERATIONS iterations: the guess needs no tight convergence.
 * Atoms of the same element, basis and core share one calculation.
 */
import { type CancelToken, type MolecularBasis, throwIfCancelled } from '../contracts';
import { canonicalOrthogonalization, congruence, dotMatrices, EigenWorkspace, maxAbs, multiply, symmetricEigen, weightedOuterProducts } from '../linalg';
import { Diis } from './diis';
import type { AtomIntegrals } from './options';
import { MAX_TENSOR_FUNCTIONS, TensorIntegrals, uniqueIntegralsFrom } from './tensorIntegrals';

export const ATOM_ITERATIONS = 60;
const DEGENERACY = 1e-6;

/** Total (α + β) guess density of the molecule, n×n. */
export function atomicDensityGuess(basis: MolecularBasis, atomIntegrals: (center: number) => AtomIntegrals, cancel?: CancelToken): Float64Array {
  const n = basis.functionCount;
  const density = new Float64Array(n * n);
  const cache = new Map<string, Float64Array>();
  basis.centers.forEach((center, index) => {
    throwIfCancelled(cancel);
    let first = -1;
    let count = 0;
    for (let mu = 0; mu < n; mu++) {
      if (basis.functionCenter[mu] !== index) continue;
      if (first < 0) first = mu;
      count++;
    }
    if (count === 0) return;
    const key = `${center.atomicNumber}|${center.charge}|${basis.basisNames[index] ?? ''}|${basis.kind}`;
    let block = cache.get(key);
    if (!block) {
      const atom = atomIntegrals(index);
      if (atom.basis.functionCount !== count) throw new RangeError(`Atom ${index + 1} has ${count} functions in the molecule but ${atom.basis.functionCount} alone.`);
      // A small atom's integrals are read once into a tensor: the atomic SCF then costs almost
      // nothing beyond one pass over its shell quartets.
      const eri = atom.basis.functionCount <= MAX_TENSOR_FUNCTIONS ? new TensorIntegrals(atom.basis, uniqueIntegralsFrom(atom.eri, cancel)) : atom.eri;
      block = fractionalAtomDensity({ ...atom, eri }, center.charge, cancel);
      cache.set(key, block);
    }
    for (let i = 0; i < count; i++) for (let j = 0; j < count; j++) density[(first + i) * n + first + j] = block[i * count + j]!;
  });
  return density;
}

/** Spin-summed density of a spherical atom with `electrons` electrons (fractional aufbau). */
export function fractionalAtomDensity(atom: AtomIntegrals, electrons: number, cancel?: CancelToken): Float64Array {
  const n = atom.basis.functionCount;
  const { x, m } = canonicalOrthogonalization(atom.overlap, n);
  const h = atom.coreHamiltonian;
  const fockOrth = congruence(x, h, n, m, new Float64Array(m * m), new Float64Array(n * m));
  const workspace = new EigenWorkspace(m);
  const energies = new Float64Array(m);
  const u = new Float64Array(m * m);
  const occupations = new Float64Array(m);
  const coefficients = new Float64Array(n * m);
  const density = new Float64Array(n * n);
  const densityOrth = new Float64Array(m * m);
  const j = new Float64Array(n * n);
  const k = new Float64Array(n * n);
  const fock = new Float64Array(n * n);
  const error = new Float64Array(m * m);
  const product = new Float64Array(m * m);
  const column = new Float64Array(Math.max(n, m));
  const scratch = new Float64Array(n * m);
  const diis = new Diis(m * m, 6);
  let previous = NaN;
  for (let iteration = 0; iteration < ATOM_ITERATIONS; iteration++) {
    throwIfCancelled(cancel);
    symmetricEigen(fockOrth, m, { values: energies, vectors: u, workspace });
    fillFractional(energies, electrons, occupations);
    multiply(x, u, n, m, m, coefficients);
    weightedOuterProducts(coefficients, n, m, occupations, m, density, column);
    weightedOuterProducts(u, m, m, occupations, m, densityOrth, column);
    if (electrons === 0) break;
    atom.eri.buildJK([density], [j], [k], { cancel });
    for (let i = 0; i < n * n; i++) fock[i] = h[i]! + j[i]! - 0.5 * k[i]!;
    const energy = 0.5 * (dotMatrices(density, h, n * n) + dotMatrices(density, fock, n * n));
    congruence(x, fock, n, m, fockOrth, scratch);
    multiply(fockOrth, densityOrth, m, m, m, product);
    for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) error[r * m + c] = product[r * m + c]! - product[c * m + r]!;
    if (Math.abs(energy - previous) < 1e-8 && maxAbs(error) < 1e-5) break;
    previous = energy;
    diis.push(fockOrth, error);
    diis.extrapolate(fockOrth);
  }
  return density;
}

/** Occupation numbers (0 … 2) for `electrons` in orbitals of ascending `energies`, degenerate sets shared equally. */
export function fillFractional(energies: Float64Array, electrons: number, occupations: Float64Array): void {
  occupations.fill(0);
  let left = electrons;
  let start = 0;
  while (start < energies.length && left > 0) {
    let end = start + 1;
    while (end < energies.length && energies[end]! - energies[start]! < DEGENERACY * Math.max(1, Math.abs(energies[start]!))) end++;
    const size = end - start;
    const taken = Math.min(left, 2 * size);
    for (let i = start; i < end; i++) occupations[i] = taken / size;
    left -= taken;
    start = end;
  }
}
