/** The test references themselves: the eigenvalue routine and the Fock-space matrix. */
import { describe, expect, it } from 'vitest';
import { fermionicMatrix, sectorStates, symmetricEigenvalues } from './fockSpace';

/** A deterministic pseudo-random sequence (LCG of Numerical Recipes, §7.1). */
function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

describe('symmetric eigenvalues (Householder + QL)', () => {
  it('recovers a known spectrum hidden by reflections: A = Q diag(d) Qᵀ with Q a product of Householder reflections', () => {
    const dim = 40;
    const next = random(7);
    const d = Array.from({ length: dim }, (_, i) => i * 0.37 - 5 + (i % 3 === 0 ? 0 : 1e-3 * i));
    const A = new Float64Array(dim * dim);
    for (let i = 0; i < dim; i++) A[i * dim + i] = d[i]!;
    for (let r = 0; r < 3; r++) {
      const v = Array.from({ length: dim }, next);
      const norm2 = v.reduce((s, x) => s + x * x, 0);
      // A ← H A H with H = I − 2vvᵀ/|v|².
      const Av = new Float64Array(dim);
      for (let i = 0; i < dim; i++) for (let j = 0; j < dim; j++) Av[i]! += A[i * dim + j]! * v[j]!;
      const vAv = v.reduce((s, x, i) => s + x * Av[i]!, 0);
      for (let i = 0; i < dim; i++) {
        for (let j = 0; j < dim; j++) {
          A[i * dim + j]! += (-2 * (v[i]! * Av[j]! + Av[i]! * v[j]!)) / norm2 + (4 * vAv * v[i]! * v[j]!) / (norm2 * norm2);
        }
      }
    }
    const eigenvalues = symmetricEigenvalues(A, dim);
    const expected = [...d].sort((a, b) => a - b);
    eigenvalues.forEach((value, i) => expect(value).toBeCloseTo(expected[i]!, 10));
  });

  it('a sector holds C(n, Nα)·C(n, Nβ) occupation vectors', () => {
    expect(sectorStates(6, 4, 2)).toHaveLength(15 * 15);
    expect(sectorStates(2, 1, 1)).toEqual([1 | 4, 1 | 8, 2 | 4, 2 | 8]);
  });

  it('the fermionic matrix of a one-orbital space is diagonal: 2h + (00|00) for the pair (hand-computed)', () => {
    const integrals = { orbitals: 1, electrons: { alpha: 1, beta: 1 }, constant: 0.5, nuclearRepulsion: 0.5, coreEnergy: 0, oneBody: Float64Array.of(-1.25), twoBody: Float64Array.of(0.75) };
    const H = fermionicMatrix(integrals, [0b11]);
    expect(H[0]).toBeCloseTo(0.5 + 2 * -1.25 + 0.75, 14);
  });
});
