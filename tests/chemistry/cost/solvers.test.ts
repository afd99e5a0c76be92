/**
 * Classical solver costs: the powers each method's work grows with (the formal scalings of the
 * literature), the counts behind them checked by hand on small cases, and the time at a rate.
 */
import { describe, expect, it } from 'vitest';
import { exactMagnitude } from '../../../server/src/chemistry/cost/magnitude';
import { ASSUMED_ITERATIONS, connectedDeterminants, DEFAULT_FLOPS, solverCost, solverTime, uniqueIntegrals } from '../../../server/src/chemistry/cost/solvers';

const space = (N: number, n: number, alpha: number, beta = alpha, atoms = 3) => ({ basisFunctions: N, orbitals: n, alpha, beta, atoms });
const ops = (method: string, s: ReturnType<typeof space>) => solverCost(method, s)!.operations.exact!;

describe('the perturbative triples of CCSD(T) (Raghavachari, Trucks, Pople, Head-Gordon, Chem. Phys. Lett. 157, 479 (1989))', () => {
  it('add o³v⁴ multiply–adds once to CCSD: 2 o³v⁴ floating-point operations (o = 5, v = 19: by hand)', () => {
    const s = space(24, 24, 5);
    expect(ops('ccsd(t)', s) - ops('ccsd', s)).toBe(2n * 5n ** 3n * 19n ** 4n);
  });

  it('grow as o³ and v⁴: doubling the virtuals multiplies the triples by 16, doubling the occupied by 8 (Raghavachari et al. 1989)', () => {
    const triples = (o: number, v: number) => ops('ccsd(t)', space(o + v, o + v, o)) - ops('ccsd', space(o + v, o + v, o));
    expect(triples(5, 40) / triples(5, 20)).toBe(16n);
    expect(triples(10, 20) / triples(5, 20)).toBe(8n);
  });

  it('makes the formal scaling N⁷ against CCSD\'s N⁶ (Raghavachari et al. 1989; Scuseria, Janssen, Schaefer 1988)', () => {
    expect(solverCost('ccsd(t)', space(40, 40, 10))!.scaling).toMatch(/^N⁷/);
    expect(solverCost('ccsd', space(40, 40, 10))!.scaling).toMatch(/^N⁶/);
  });
});

describe('CCSD per iteration (Scuseria, Janssen & Schaefer, J. Chem. Phys. 89, 7382 (1988): o²v⁴ leading)', () => {
  it('is 2(o²v⁴ + 2o³v³ + o⁴v²) for o = 2, v = 3: 2(324 + 432 + 144) = 1800 (by hand)', () => {
    expect(solverCost('ccsd', space(5, 5, 2))!.operationsPerIteration!.exact).toBe(1800n);
    expect(solverCost('ccsd', space(5, 5, 2))!.operations.exact).toBe(1800n * BigInt(ASSUMED_ITERATIONS));
  });

  it('grows as v⁴ for many virtuals: ×16 ± 15 % when v doubles from 200 to 400 at o = 5 (Scuseria et al. 1988)', () => {
    const ratio = Number(solverCost('ccsd', space(405, 405, 5))!.operationsPerIteration!.exact!) / Number(solverCost('ccsd', space(205, 205, 5))!.operationsPerIteration!.exact!);
    expect(Math.abs(ratio - 16) / 16).toBeLessThan(0.15);
  });

  it('counts open shells with the larger occupied and virtual counts, an upper estimate (by definition: o = Nα, v = n − Nβ)', () => {
    expect(solverCost('ccsd', space(10, 10, 5, 3))!.sizes).toMatchObject({ o: 5, v: 7 });
  });
});

describe('Hartree–Fock and Kohn–Sham per iteration (direct SCF: Almlöf, Faegri, Korsell 1982)', () => {
  it('visits P(P+1)/2 unique integrals, P = N(N+1)/2: 406 for the 7 functions of water in STO-3G (by hand: P = 28)', () => {
    expect(uniqueIntegrals(7)).toBe(406n);
  });

  it('grows as N⁴: ×16 within 1 % when N doubles from 400 to 800 (formal N⁴, Almlöf et al. 1982)', () => {
    const ratio = Number(solverCost('rhf', space(800, 800, 10))!.operationsPerIteration!.exact!) / Number(solverCost('rhf', space(400, 400, 10))!.operationsPerIteration!.exact!);
    expect(Math.abs(ratio - 16) / 16).toBeLessThan(0.01);
  });

  it('a pure functional skips exact exchange: PBE does half the integral work of PBE0 before the grid (by definition of a hybrid)', () => {
    const s = space(50, 50, 5, 5, 1);
    const grid = 2n * 10_000n * 1n * 50n * 50n;
    expect(solverCost('pbe', s)!.operationsPerIteration!.exact! - grid).toBe((solverCost('pbe0', s)!.operationsPerIteration!.exact! - grid) / 2n);
  });
});

describe('MP2 (Head-Gordon, Pople & Frisch 1988, from memory: o·N⁴ first quarter, formally N⁵)', () => {
  it('grows as N⁵ when o, v and N grow together: ×32 ± 20 % from N = 100 to 200 (o = N/10)', () => {
    const ratio = Number(ops('mp2', space(200, 200, 20))) / Number(ops('mp2', space(100, 100, 10)));
    expect(Math.abs(ratio - 32) / 32).toBeLessThan(0.2);
  });
});

describe('configuration interaction (Slater–Condon rules, Szabo & Ostlund 1989 §2.3; Davidson 1975)', () => {
  it('H2 in a minimal basis: every one of the C(2,1)² = 4 determinants couples to all 4 (by hand)', () => {
    expect(connectedDeterminants(2, 1, 1)).toBe(4n);
    expect(solverCost('fci', space(2, 2, 1))!.sizes.determinants!.exact).toBe(4n);
    expect(solverCost('fci', space(2, 2, 1))!.operationsPerIteration!.exact).toBe(2n * 4n * 4n);
  });

  it('water in STO-3G without frozen core: 441 determinants (C(7,5)², Sherrill & Schaefer 1999) and 3 vectors of them in memory (common practice)', () => {
    const cost = solverCost('fci', space(7, 7, 5))!;
    expect(cost.sizes.determinants!.exact).toBe(441n);
    expect(cost.memoryBytes.exact).toBe(3n * 441n * 8n);
  });
});

describe('time at a rate', () => {
  it('is operations ÷ rate: 10^12 operations at the default 10^11 per second take 10 s (by definition)', () => {
    expect(DEFAULT_FLOPS).toBe(1e11);
    const time = solverTime(exactMagnitude(10n ** 12n), DEFAULT_FLOPS);
    expect(time.seconds).toBeCloseTo(10, 9);
    expect(time.text).toBe('10 s');
  });

  it('reads in the unit that fits, and in powers of ten beyond a million years (by definition)', () => {
    expect(solverTime(exactMagnitude(36n * 10n ** 14n), 1e11).text).toBe('10 h');
    expect(solverTime(exactMagnitude(10n ** 40n), 1e11).text).toBe('10^21 years');
  });
});
