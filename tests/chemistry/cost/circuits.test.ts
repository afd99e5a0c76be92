/**
 * One Trotter step of UCCSD under Jordan–Wigner (server/src/chemistry/cost/weights.ts, circuits.ts).
 * Constructions: Pauli rotations with CNOT staircases, 2(w−1) CNOTs per string, 2 strings per single
 * and 8 per double (Whitfield, Biamonte, Aspuru-Guzik, Mol. Phys. 109, 735 (2011); Romero et al.,
 * Quantum Sci. Technol. 4, 014008 (2019)); fermionic excitation circuits, 2 + 2m and 13 + 2m CNOTs
 * (Yordanov, Arvidsson-Shukur, Barnes, Phys. Rev. A 102, 062612 (2020)).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { spinOrbitalCounts, uccsdSpinOrbitalCount, uccsdSpinOrbitalCountWithSymmetry, referenceIrreps } from '../../../server/src/chemistry/cost/ansatz';
import { hardwareEfficientCircuit, uccsdFermionicExcitationCircuit, uccsdPauliRotationCircuit } from '../../../server/src/chemistry/cost/circuits';
import { qubitIndex, uccsdExcitationWeights, type RegisterOrder } from '../../../server/src/chemistry/cost/weights';
import { jordanWignerWeight, listExcitations } from './reference';

const h2 = (order: RegisterOrder) => ({ orbitals: 2, alpha: 1, beta: 1, order });

describe('register orders', () => {
  it('interleaved puts α, β of each spatial orbital side by side; blocked puts all α first (by definition of the two orders)', () => {
    expect([0, 1, 2].map((p) => qubitIndex(p, 'alpha', 3, 'interleaved'))).toEqual([0, 2, 4]);
    expect([0, 1, 2].map((p) => qubitIndex(p, 'beta', 3, 'interleaved'))).toEqual([1, 3, 5]);
    expect([0, 1, 2].map((p) => qubitIndex(p, 'beta', 3, 'blocked'))).toEqual([3, 4, 5]);
  });
});

describe('Jordan–Wigner weights of the excitations', () => {
  it('H2, interleaved: singles on qubits (0,2) and (1,3) have weight 3, the double on 0–3 weight 4 (hand count from the Jordan–Wigner strings, Jordan & Wigner 1928)', () => {
    expect(uccsdExcitationWeights(h2('interleaved'))).toEqual({ singles: { count: 2, weightSum: 6 }, doubles: { count: 1, weightSum: 4 }, qubits: 4 });
  });

  it('H2, blocked: singles on (0,1) and (2,3) have weight 2 (hand count from the Jordan–Wigner strings, Jordan & Wigner 1928)', () => {
    expect(uccsdExcitationWeights(h2('blocked')).singles).toEqual({ count: 2, weightSum: 4 });
  });

  it('agree with excitation-by-excitation weights from the mapping\'s definition (random spaces, both orders, with and without irreps)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 7 }), { minLength: 1, maxLength: 6 }),
        fc.integer({ min: 0, max: 6 }),
        fc.integer({ min: 0, max: 6 }),
        fc.constantFrom<RegisterOrder>('interleaved', 'blocked'),
        fc.boolean(),
        (irreps, a, b, order, screened) => {
          const n = irreps.length;
          const alpha = Math.min(n, Math.max(a, b));
          const beta = Math.min(n, Math.min(a, b));
          const listed = listExcitations(n, alpha, beta, order, screened ? irreps : undefined);
          const sum = (kind: 'single' | 'double') =>
            listed.filter((e) => e.kind === kind).reduce((total, e) => total + jordanWignerWeight(e.qubits, 2 * n), 0);
          const weights = uccsdExcitationWeights({ orbitals: n, alpha, beta, order, ...(screened ? { irreps } : {}) });
          expect(weights.singles).toEqual({ count: listed.filter((e) => e.kind === 'single').length, weightSum: sum('single') });
          expect(weights.doubles).toEqual({ count: listed.filter((e) => e.kind === 'double').length, weightSum: sum('double') });
        },
      ),
      { seed: 31337, numRuns: 120 },
    );
  });

  it('50 spatial orbitals with 10 occupied (100 qubits): same counts as the parameter formula, and the same weights as a full enumeration', () => {
    const layout = { orbitals: 50, alpha: 10, beta: 10, order: 'interleaved' as const };
    const weights = uccsdExcitationWeights(layout);
    const parameters = uccsdSpinOrbitalCount(spinOrbitalCounts(50, 10, 10));
    expect(weights.singles.count).toBe(parameters.singles);
    expect(weights.doubles.count).toBe(parameters.doubles);
    let singles = 0;
    let doubles = 0;
    for (const e of listExcitations(50, 10, 10, 'interleaved')) {
      // sorted-gap form of the weight, as counted by hand: Z strings between the outer pairs
      const q = [...e.qubits].sort((x, y) => x - y);
      if (e.kind === 'single') singles += q[1]! - q[0]! + 1;
      else doubles += q[1]! - q[0]! - 1 + (q[3]! - q[2]! - 1) + 4;
    }
    expect(weights.singles.weightSum).toBe(singles);
    expect(weights.doubles.weightSum).toBe(doubles);
  });

  it('screened counts match the screened parameter counts (water in STO-3G, C2v)', () => {
    const irreps = [0, 0, 2, 0, 1, 0, 2];
    const weights = uccsdExcitationWeights({ orbitals: 7, alpha: 5, beta: 5, order: 'interleaved', irreps });
    const parameters = uccsdSpinOrbitalCountWithSymmetry(referenceIrreps(irreps, 5, 5));
    expect([weights.singles.count, weights.doubles.count]).toEqual([parameters.singles, parameters.doubles]);
  });

  it('rejects irreps of the wrong length', () => {
    expect(() => uccsdExcitationWeights({ orbitals: 3, alpha: 1, beta: 1, order: 'blocked', irreps: [0, 0] })).toThrow(RangeError);
  });
});

describe('Pauli-rotation construction (Romero et al. 2019)', () => {
  it('H2, interleaved: 2 singles × 2 strings × 4 CNOTs + 8 strings × 6 CNOTs = 64 CNOTs, 12 rotations (hand count)', () => {
    const cost = uccsdPauliRotationCircuit(h2('interleaved'));
    expect(cost).toMatchObject({ cnots: 64, rotations: 12, basisChanges: 2 * 8 + 64, exact: true });
    // depth: 4 single strings × (4 + 3) + 8 double strings × (6 + 3)
    expect(cost.depth).toBe(4 * 7 + 8 * 9);
  });

  it('H2, blocked: adjacent singles cost 2 CNOTs per string, 56 CNOTs in all (hand count)', () => {
    expect(uccsdPauliRotationCircuit(h2('blocked')).cnots).toBe(8 + 48);
  });

  it('interleaved order is cheaper than blocked for a closed shell of 6 orbitals (JW strings span fewer qubits)', () => {
    const interleaved = uccsdPauliRotationCircuit({ orbitals: 6, alpha: 3, beta: 3, order: 'interleaved' });
    const blocked = uccsdPauliRotationCircuit({ orbitals: 6, alpha: 3, beta: 3, order: 'blocked' });
    expect(interleaved.cnots).toBeLessThan(blocked.cnots);
  });
});

describe('fermionic excitation construction (Yordanov et al. 2020)', () => {
  it('H2, interleaved: two singles with one parity qubit each (2 + 2 CNOTs) and a double without (13): 21 CNOTs (hand count)', () => {
    expect(uccsdFermionicExcitationCircuit(h2('interleaved'))).toMatchObject({ cnots: 21, rotations: undefined, depth: undefined });
  });

  it('costs never exceed the Pauli-rotation construction, excitation by excitation (2w−2 ≤ 4w−4; 2w+5 ≤ 16w−16 for w ≥ 4)', () => {
    for (const order of ['interleaved', 'blocked'] as const) {
      const layout = { orbitals: 8, alpha: 4, beta: 3, order };
      expect(uccsdFermionicExcitationCircuit(layout).cnots).toBeLessThan(uccsdPauliRotationCircuit(layout).cnots);
    }
  });
});

describe('hardware-efficient circuit', () => {
  it('takes its gates from the layout (Kandala et al. 2017, with our CNOT chain): 6 qubits, 2 blocks of CNOT chains = 10 CNOTs, 6·8 = 48 rotations', () => {
    expect(hardwareEfficientCircuit(6, 2, 'euler')).toMatchObject({ cnots: 10, rotations: 48, basisChanges: 0, depth: 2 + 2 * 8 });
  });
});
