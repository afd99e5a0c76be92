/**
 * Figures by tier: qubit, Hamiltonian, measurement, ansatz and circuit figures only for quantum
 * tiers; correlated and mean-field tiers get the cost of their classical solver, its time taken at
 * the rate of `limits { rate }`. Check values from the published operation counts named beside each.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { estimateTables } from '../../server/src/report/format/estimateTables';

// Water, experimental geometry (Hoy & Bunker 1979: r 0.9572 Å, angle 104.52°), in STO-3G: 7 basis
// functions (O 1s 2s 2p, H 1s each), 10 electrons; the O 1s frozen (common practice) leaves 8
// electrons in 6 orbitals: o = 4, v = 2 per spin.
const water = (tier: string, limits = '') => `basis sto-3g
structure {
  O o 0.000000 0.000000 0.000000
  H h1 0.000000 0.756950 0.585882
  H h2 0.000000 -0.756950 0.585882
}
fragment w {
  atoms rest
  ${tier}
}
${limits}
`;

describe('a correlated tier', () => {
  const report = analyzeDocument(water('tier correlated { method ccsd(t) }', 'limits { rate 2 Gflops }')).report();
  const fragment = report.fragments[0]!;

  it('has no qubit, Pauli-term, measurement, ansatz or circuit figures', () => {
    expect(fragment.qubits).toBeNull();
    expect(fragment.qubitsRequired).toBeNull();
    expect(fragment.pauliTerms).toBeNull();
    expect(fragment.measurement).toBeNull();
    expect(fragment.ansatzCost).toBeNull();
    expect(fragment.circuit).toBeNull();
    expect(fragment.classical!.statevectorBytes).toBeNull();
  });

  it('costs CCSD(T) as o²v⁴ per CCSD iteration plus o³v⁴ once (Raghavachari et al., Chem. Phys. Lett. 157, 479 (1989))', () => {
    const cost = fragment.solverCost!;
    expect(cost).toMatchObject({ method: 'ccsd(t)', on: 'fragment', occupied: 4, virtual: 2, iterations: 20 });
    expect(cost.scaling.startsWith('N⁷')).toBe(true);
    // 2 flops per multiply–add: 2(o²v⁴ + 2o³v³ + o⁴v²) = 2(256 + 1024 + 1024) = 4608 per iteration;
    // (T) 2·o³v⁴ = 2 × 64 × 16 = 2048 once.
    expect(cost.operationsPerIteration!.exact).toBe('4608');
    expect(cost.operations.exact).toBe(String(20 * 4608 + 2048));
  });

  it('takes the time at the rate of the limits block (2 Gflops as written, by construction; 100 Gflops assumed otherwise, by definition)', () => {
    const cost = fragment.solverCost!;
    expect(cost.time.flopsPerSecond).toBe(2e9);
    expect(cost.time.rateFrom).toBe('limits');
    expect(cost.time.seconds).toBeCloseTo((20 * 4608 + 2048) / 2e9, 15);
    expect(report.limits).toMatchObject({ flopsPerSecond: 2e9, flopsFrom: 'limits' });
    // Without a rate, 100 Gflops is assumed and said so.
    const assumed = analyzeDocument(water('tier correlated { method ccsd(t) }')).report();
    expect(assumed.fragments[0]!.solverCost!.time).toMatchObject({ flopsPerSecond: 1e11, rateFrom: 'default' });
  });

  it('leaves it out of the qubit table and gives it a row of the solver table', () => {
    const tables = estimateTables(report);
    const qubits = tables.find((table) => table.title?.startsWith('Qubits and Hamiltonian'))!;
    expect(qubits.title).toContain('hypothetical');
    expect(qubits.rows.map((row) => row[0])).toEqual(['system (hypothetical)']);
    const solvers = tables.find((table) => table.title?.startsWith('Classical solvers'))!;
    expect(solvers.title).toBe('Classical solvers (time at 2 Gflops)'); // the rate written, by construction
    expect(solvers.rows[0]!.slice(0, 2)).toEqual(['w', 'ccsd(t)']);
  });
});

describe('a mean-field tier', () => {
  const fragment = analyzeDocument(water('tier mean-field { method rhf }')).report().fragments[0]!;
  it('has no active space and no qubits, and the N⁴ cost of Hartree–Fock on its 7 basis functions (Hehre, Stewart & Pople 1969)', () => {
    expect(fragment.active).toBeNull();
    expect(fragment.qubits).toBeNull();
    expect(fragment.solverCost).toMatchObject({ method: 'rhf', on: 'fragment', basisFunctions: 7, occupied: 5, virtual: 2 });
    // Direct SCF (Almlöf, Faegri & Korsell 1982): P = N(N+1)/2 = 28 pairs, P(P+1)/2 = 406 unique
    // integrals, each used for J and K at 2 flops: 4 × 406 = 1624 per iteration.
    expect(fragment.solverCost!.operationsPerIteration!.exact).toBe('1624');
    expect(fragment.solverCost!.scaling.startsWith('N⁴')).toBe(true);
  });
});

describe('a quantum tier', () => {
  const report = analyzeDocument(water('tier quantum { method vqe }')).report();
  it('keeps its qubits and has no solver cost; the system row is labelled hypothetical', () => {
    // 6 active orbitals under Jordan–Wigner: 12 qubits (Jordan & Wigner 1928).
    expect(report.fragments[0]!.qubits!.jordanWigner).toBe(12);
    expect(report.fragments[0]!.solverCost).toBeNull();
    expect(report.system.qubitsScope).toContain('hypothetical');
  });
});
