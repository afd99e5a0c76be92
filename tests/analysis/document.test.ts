/**
 * The analysis room: one place every figure comes from, computed only when asked for, and the
 * same figure wherever it is shown.
 */
import { describe, expect, it, vi } from 'vitest';
import { analyzeDocument, countText, SYMMETRY_ATOM_LIMIT } from '../../server/src/analysis';
import { countBySymmetry } from '../../server/src/chemistry/estimate/pauliTerms';
import { doHover, getCodeLenses, getInlayHints } from '../../server/src/services';
import { WATER_LINES } from '../fixtures/water';
import { positionOf, readSample } from '../services/service';

/** Water at Hoy & Bunker's structure (1979), placed as in tests/fixtures/water.ts. */
const WATER = `structure {
  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882
}`;

describe('one active-irreps rule for every figure', () => {
  // Water in cc-pVDZ with all four active orbitals in A1 and tapering on: before the rule was
  // shared, the hover card showed 6 tapered qubits and 361 terms and the growth chart 4 and 105.
  const spec = `basis cc-pVDZ\n${WATER}\nfragment w {\n  atoms rest\n  tier quantum { method vqe; mapping jordan-wigner; taper on; active 4e A1=4 }\n}\n`;

  it('gives the growth chart, at the fragment\'s own active space, the figures of its card', () => {
    const analysis = analyzeDocument(spec);
    const card = analysis.fragmentFigures(0);
    const point = analysis.growth(0).find((p) => p.orbitals === card.active!.orbitals)!;
    expect(card.activeIrreps).toEqual({ perIrrep: { A1: 4 }, source: 'given', occupation: 'assumed' });
    expect(point.tapered).toBe(card.qubits!.tapered);
    expect(point.pauliTerms).toBe(card.pauliTerms!.jordanWigner);
    // All four in the totally symmetric irrep: only the two number parities taper, and the terms
    // are those of four orbitals without symmetry (the closed form's C1 count).
    expect(card.qubits!.tapered).toBe(6);
    expect(card.pauliTerms!.jordanWigner).toBe(countBySymmetry([0, 0, 0, 0]));
  });

  it('gives the hover card the figures of the report', () => {
    const analysis = analyzeDocument(spec);
    const hover = doHover(analysis, positionOf(analysis, 'fragment w', 9))!;
    const report = analysis.report();
    expect(JSON.stringify(hover.contents)).toContain(`| tapered | ${report.fragments[0]!.qubits!.tapered} qubits`);
    expect(JSON.stringify(hover.contents)).toContain(`| Pauli terms | ${report.fragments[0]!.pauliTerms!.jordanWigner} counted (identity included) · irreps counted |`);
  });
});

describe('each request computes only what it shows', () => {
  const zinc = () => analyzeDocument(readSample('zn-site-h2s-scan.tess'));

  it('a hover on one fragment estimates that fragment only', () => {
    const analysis = zinc();
    const plan = vi.spyOn(analysis.estimates, 'plan');
    const system = vi.spyOn(analysis.estimates, 'systemSymmetry');
    expect(doHover(analysis, positionOf(analysis, 'fragment guest', 10))).not.toBeNull();
    expect(new Set(plan.mock.calls.map(([index]) => index))).toEqual(new Set([1]));
    expect(system).not.toHaveBeenCalled();
  });

  it('inlay hints estimate the fragments in the visible range only', () => {
    const analysis = zinc();
    const plan = vi.spyOn(analysis.estimates, 'plan');
    const line = positionOf(analysis, 'fragment guest').line;
    const hints = getInlayHints(analysis, { start: { line, character: 0 }, end: { line, character: 0 } });
    expect(hints).toHaveLength(1);
    expect(new Set(plan.mock.calls.map(([index]) => index))).toEqual(new Set([1]));
  });

  it('the code lens needs no point group of the system and no figures of classical fragments', () => {
    const analysis = zinc();
    const system = vi.spyOn(analysis.estimates, 'systemSymmetry');
    const plan = vi.spyOn(analysis.estimates, 'plan');
    expect(getCodeLenses(analysis)).toHaveLength(1);
    expect(system).not.toHaveBeenCalled();
    // Only the quantum-tier fragment (site) is estimated, for the largest qubit count.
    expect(new Set(plan.mock.calls.map(([index]) => index))).toEqual(new Set([0]));
  });

  it('the whole report is built once and then shared', () => {
    const analysis = zinc();
    expect(analysis.report()).toBe(analysis.report());
    expect(analysis.report().fragments[1]).toBe(analysis.fragmentFigures(1));
  });
});

describe('one symmetry size policy for checks and figures', () => {
  function chain(atoms: number): string {
    const lines = Array.from({ length: atoms }, (_, i) => `  H ${(i * 0.9).toFixed(2)} 0 0`);
    return `basis sto-3g\nstructure {\n${lines.join('\n')}\n}\nfragment all { atoms rest; tier mean-field { method rhf } }\n`;
  }

  it('looks for point groups up to the limit', () => {
    const analysis = analyzeDocument(chain(SYMMETRY_ATOM_LIMIT));
    expect(analysis.report().system.fullPointGroup).toBe('D∞h');
  });

  it('counts larger systems and fragments in C1 and says so', () => {
    const analysis = analyzeDocument(chain(SYMMETRY_ATOM_LIMIT + 1));
    const report = analysis.report();
    expect(report.system.pointGroup).toBeNull();
    expect(report.fragments[0]!.pointGroup).toBeNull();
    expect(report.conventions.pointGroup).toContain(`${SYMMETRY_ATOM_LIMIT} atoms`);
  });
});

describe('figures beyond 2^53', () => {
  it('show the magnitude and keep the exact digits, never a double with false digits', () => {
    // 2,000 helium atoms in cc-pVDZ (5 functions each: 2s1p, Dunning 1989) are 10,000 active
    // orbitals without frozen core; over the symmetry limit, so counted in C1: 14,999,000,250,000,001
    // Pauli terms by the closed form (tests/chemistry/estimate/pauliTerms.test.ts).
    const atoms = Array.from({ length: 2000 }, (_, i) => `  He ${(i % 20) * 3} ${(Math.floor(i / 20) % 10) * 3} ${Math.floor(i / 200) * 3}`);
    const analysis = analyzeDocument(`basis cc-pVDZ\nstructure {\n${atoms.join('\n')}\n}\nfragment all { atoms rest; tier mean-field { method rhf } }\n`);
    const report = analysis.report();
    expect(report.system.active!.orbitals).toBe(10_000);
    const terms = report.system.pauliTerms!.jordanWigner;
    expect(typeof terms).toBe('object');
    expect(terms).toMatchObject({ exact: '14999000250000001', text: '1.50 × 10^16' });
    expect(countText(terms)).toBe('1.50 × 10^16');
    expect(JSON.stringify(report)).not.toContain('14999000250000000');
  });
});
