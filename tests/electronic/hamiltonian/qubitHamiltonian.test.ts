/**
 * Qubit Hamiltonians from psi4 integrals (tests/fixtures/hamiltonian.psi4.json, numpy on psi4
 * 1.3.2 matrices) checked against sources outside the builder:
 *  • H2 in STO-3G at 0.7414 Å has 15 Pauli strings including the identity under Jordan–Wigner and
 *    Bravyi–Kitaev (J. T. Seeley, M. J. Richard, P. J. Love, J. Chem. Phys. 137, 224109 (2012)).
 *  • every Jordan–Wigner coefficient, hence λ and the identity coefficient, against a term-by-term
 *    expansion of the second-quantised Hamiltonian in a string-keyed operator algebra written for
 *    the tests (operatorAlgebra.ts);
 *  • the matrix of each mapping's strings on its encoded occupation states against the fermionic
 *    Hamiltonian's matrix built by ladder operators on occupation vectors (fockSpace.ts);
 *  • the lowest eigenvalue in the active space's (Nα, Nβ) sector against psi4's CASCI energy for
 *    the same active space to 1e-8 Ha, and the three mappings' spectra in that sector equal.
 */
import { describe, expect, it } from 'vitest';
import { applyBinary, encodingMatrix } from '../../../server/src/electronic/hamiltonian/encodings';
import { parsePauliLabel, pauliLabel } from '../../../server/src/electronic/hamiltonian/pauli';
import { ActiveSpaceTooLarge, canBuildExplicitly, COEFFICIENT_THRESHOLD, qubitHamiltonians, unreducedParity, type QubitHamiltonian } from '../../../server/src/electronic/hamiltonian/qubitHamiltonian';
import { identityCoefficient, oneNorm } from '../../../server/src/electronic/hamiltonian/summary';
import { fermionicMatrix, pauliMatrix, sectorStates, symmetricEigenvalues } from '../fockSpace';
import { jordanWignerByExpansion } from '../operatorAlgebra';
import { psi4Cases, psi4Space, referenceIntegrals } from '../psi4Fixture';

const spaces = psi4Cases().flatMap((c) =>
  c.spaces.map((space) => ({ label: `${c.name} (${space.electrons.alpha + space.electrons.beta}e, ${space.active}o)`, integrals: referenceIntegrals(space, c.nuclearRepulsion), space })),
);
const eigenSpaces = spaces.filter(({ space }) => space.casciEnergy !== undefined);

/** Occupation vectors of the sector, encoded for one mapping (reduced parity drops its two qubits). */
function encodedStates(h: QubitHamiltonian, states: number[]): number[] {
  const n = h.orbitals;
  if (h.mapping === 'jordan-wigner') return states;
  const beta = encodingMatrix(h.mapping, 2 * n);
  return states.map((f) => {
    const b = applyBinary(beta, f);
    if (h.mapping !== 'parity') return b;
    const low = b & ((1 << (n - 1)) - 1);
    const high = (b >>> n) & ((1 << (n - 1)) - 1);
    return (low | (high << (n - 1))) >>> 0;
  });
}

describe('H2 in STO-3G at 0.7414 Å (Seeley, Richard & Love 2012)', () => {
  const { case: c, space } = psi4Space('h2-sto3g', 0, 2);
  const hamiltonians = qubitHamiltonians(referenceIntegrals(space, c.nuclearRepulsion));
  it('15 strings including the identity under Jordan–Wigner and Bravyi–Kitaev', () => {
    expect(hamiltonians.jordanWigner.length).toBe(15);
    expect(hamiltonians.bravyiKitaev.length).toBe(15);
  });
  it('the Jordan–Wigner strings in block order (qubits 0α 1α 0β 1β) are the identity, four Z, six ZZ and the four pair-pair strings', () => {
    const labels = new Set(Array.from({ length: 15 }, (_, k) => pauliLabel(hamiltonians.jordanWigner.x[k]!, hamiltonians.jordanWigner.z[k]!, 4)));
    for (const label of ['IIII', 'ZIII', 'IZII', 'IIZI', 'IIIZ', 'ZZII', 'ZIZI', 'ZIIZ', 'IZZI', 'IZIZ', 'IIZZ', 'XXXX', 'XXYY', 'YYXX', 'YYYY']) {
      expect(labels.has(label), label).toBe(true);
    }
  });
  it('the reduced parity Hamiltonian acts on 2 qubits', () => {
    expect(hamiltonians.parity.qubits).toBe(2);
    expect(hamiltonians.parity.removedQubits).toEqual([1, 3]);
  });
});

describe('every Jordan–Wigner coefficient against a term-by-term operator expansion (operatorAlgebra.ts)', () => {
  const small = spaces.filter(({ space }) => space.active <= 6);
  it.each(small)('$label', ({ integrals }) => {
    const reference = jordanWignerByExpansion(integrals);
    const jw = qubitHamiltonians(integrals).jordanWigner;
    const qubits = jw.qubits;
    let referenceCount = 0;
    let referenceNorm = 0;
    for (const [label, [re, im]] of reference) {
      expect(Math.abs(im), `imaginary part of ${label}`).toBeLessThan(1e-12);
      if (Math.abs(re) <= COEFFICIENT_THRESHOLD) continue;
      referenceCount++;
      if (label !== 'I'.repeat(qubits)) referenceNorm += Math.abs(re);
    }
    expect(jw.length).toBe(referenceCount);
    for (let k = 0; k < jw.length; k++) {
      const label = pauliLabel(jw.x[k]!, jw.z[k]!, qubits);
      expect(jw.coefficients[k]!, label).toBeCloseTo(reference.get(label)![0], 11);
    }
    expect(oneNorm(jw)).toBeCloseTo(referenceNorm, 10);
    expect(identityCoefficient(jw)).toBeCloseTo(reference.get('I'.repeat(qubits))![0], 11);
  });
});

describe('each mapping represents the fermionic Hamiltonian on its encoded occupation states (fockSpace.ts)', () => {
  const small = spaces.filter(({ space }) => space.active <= 4);
  it.each(small)('$label: every occupation vector, all particle numbers, JW / BK / unreduced parity', ({ integrals }) => {
    const n = integrals.orbitals;
    const all = Array.from({ length: 1 << (2 * n) }, (_, f) => f);
    const fermionic = fermionicMatrix(integrals, all);
    const hamiltonians = qubitHamiltonians(integrals);
    const parity = { ...unreducedParity(integrals), mapping: 'bravyi-kitaev' as const };
    for (const [mapping, sum] of [['jordan-wigner', hamiltonians.jordanWigner], ['bravyi-kitaev', hamiltonians.bravyiKitaev], ['parity', parity]] as const) {
      const beta = encodingMatrix(mapping, 2 * n);
      const { matrix, leak, imaginary } = pauliMatrix(sum, all.map((f) => applyBinary(beta, f)));
      expect(leak).toBe(0);
      expect(imaginary).toBeLessThan(1e-12);
      let max = 0;
      for (let i = 0; i < matrix.length; i++) max = Math.max(max, Math.abs(matrix[i]! - fermionic[i]!));
      expect(max, mapping).toBeLessThan(1e-9);
    }
  });
});

describe('lowest eigenvalue in the (Nα, Nβ) sector equals psi4 CASCI (detci, same active space) to 1e-8 Ha; the mappings share the spectrum', () => {
  it.each(eigenSpaces)('$label', ({ integrals, space }) => {
    const n = integrals.orbitals;
    const states = sectorStates(n, space.electrons.alpha, space.electrons.beta);
    const hamiltonians = qubitHamiltonians(integrals);
    const spectra = [hamiltonians.jordanWigner, hamiltonians.bravyiKitaev, hamiltonians.parity].map((h) => {
      const { matrix, leak, imaginary } = pauliMatrix(h, encodedStates(h, states));
      expect(leak, `${h.mapping}: the sector is invariant`).toBeLessThan(1e-12);
      expect(imaginary).toBeLessThan(1e-12);
      return symmetricEigenvalues(matrix, states.length);
    });
    const [jw, bk, parity] = spectra as [number[], number[], number[]];
    expect(Math.abs(jw[0]! - space.casciEnergy!)).toBeLessThan(1e-8);
    for (let i = 0; i < jw.length; i++) {
      expect(Math.abs(bk[i]! - jw[i]!)).toBeLessThan(1e-9);
      expect(Math.abs(parity[i]! - jw[i]!)).toBeLessThan(1e-9);
    }
  });
});

describe('mappings and limits', () => {
  it('Bravyi–Kitaev and unreduced parity keep the Jordan–Wigner strings count and λ (re-encoding changes only signs)', () => {
    for (const { integrals } of spaces) {
      const h = qubitHamiltonians(integrals);
      expect(h.bravyiKitaev.length).toBe(h.jordanWigner.length);
      expect(oneNorm(h.bravyiKitaev)).toBeCloseTo(oneNorm(h.jordanWigner), 10);
      expect(identityCoefficient(h.bravyiKitaev)).toBe(identityCoefficient(h.jordanWigner));
    }
  });

  it('the Bravyi–Kitaev matrix of 8 modes is the Fenwick tree of Seeley, Richard & Love 2012, Eq. (22), read with qubit 0 first', () => {
    const rows = Array.from(encodingMatrix('bravyi-kitaev', 8), (row) => row.toString(2).padStart(8, '0').split('').reverse().join(''));
    expect(rows).toEqual(['10000000', '11000000', '00100000', '11110000', '00001000', '00001100', '00000010', '11111111']);
  });

  it('labels read qubit 0 first and round-trip', () => {
    expect(parsePauliLabel('XIZY')).toEqual({ x: 0b1001, z: 0b1100 });
    expect(pauliLabel(0b1001, 0b1100, 4)).toBe('XIZY');
    expect(() => parsePauliLabel('XQ')).toThrow(/"Q" at position 1/);
  });

  it('a 17-orbital space is refused with a note that names the fallback', () => {
    expect(canBuildExplicitly(16)).toBe(true);
    expect(canBuildExplicitly(17)).toBe(false);
    const integrals = { orbitals: 17, electrons: { alpha: 1, beta: 1 }, constant: 0, nuclearRepulsion: 0, coreEnergy: 0, oneBody: new Float64Array(289), twoBody: new Float64Array(0) };
    expect(() => qubitHamiltonians(integrals)).toThrow(ActiveSpaceTooLarge);
    expect(() => qubitHamiltonians(integrals)).toThrow(/17 active orbitals need 34 qubits.*falls back to the combinatorial bound/);
  });
});
