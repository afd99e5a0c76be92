/**
 * The point group at every scan point and the figures counted in it. Groups by definition: water
 * with equal O–H bonds is C2v (an isosceles triangle: the bisector is a C2 axis, the molecular plane
 * and the plane through the bisector normal to it are mirrors), with unequal O–H bonds only the
 * molecular plane remains (Cs). Tapering: each Z2 generator of the abelian group and the two
 * particle-number parities remove one qubit (Bravyi, Gambetta, Mezzacapo, Temme, arXiv:1701.08213
 * (2017)), so water in STO-3G (14 spin orbitals) needs 14 − 2 − 2 = 10 qubits in C2v (as
 * tests/estimate/pipeline.test.ts counts for the structure) and 14 − 1 − 2 = 11 in Cs.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { SCAN_SYMMETRY_BUDGET } from '../../server/src/analysis/scanSymmetry';
import { scanSymmetryText } from '../../server/src/report/format/figures';
import { scanCard } from '../../server/src/services/scanCard';
import { scanChartSvg } from '../../server/src/report/plots';
import { checkSvg } from '../../client/src/views/protocol';

const WATER = `basis sto-3g
frozen-core off
structure {
  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882
}
fragment w { atoms rest; tier quantum { method vqe; mapping jordan-wigner; taper on } }
`;

/** H2O2 (gas phase, from memory: O–O 1.475 Å, O–H 0.950 Å, O–O–H 94.8°, H–O–O–H 111.5°), six decimals. */
const PEROXIDE = `basis sto-3g
structure {
  H h1 0.946668 0.000000 -0.079494
  O o1 0.000000 0.000000 0.000000
  O o2 0.000000 0.000000 1.475000
  H h2 -0.346955 0.880797 1.554494
}
fragment p { atoms rest; tier quantum { method vqe; mapping jordan-wigner; taper on } }
`;

describe('per-point symmetry of a scan', () => {
  it('keeps C2v at every point of a bend (both O–H stay equal, by definition) and 10 qubits needed (Bravyi et al. 2017)', () => {
    const analysis = analyzeDocument(`${WATER}scan angle h1 o h2 from 100 to 120 step 5\n`);
    const symmetry = analysis.report().scan!.symmetry;
    expect(symmetry.notLookedFor).toBeNull();
    expect(symmetry.points.map((point) => point.fullPointGroup)).toEqual(['C2v', 'C2v', 'C2v', 'C2v', 'C2v']);
    expect(symmetry.groupChanges).toBe(false);
    expect(symmetry.points.every((point) => point.fragments[0]!.qubitsRequired === 10)).toBe(true);
    expect(analysis.diagnostics.some((d) => d.code === 'scan-symmetry-change')).toBe(false);
  });

  it('drops to Cs where one O–H is stretched alone and counts 11 qubits there, 10 at the C2v point (Bravyi et al. 2017)', () => {
    const analysis = analyzeDocument(`${WATER}scan distance o h2 from 0.9372 to 0.9772 step 0.02 moving h2\n`);
    const report = analysis.report();
    const points = report.scan!.symmetry.points;
    expect(points.map((point) => point.fullPointGroup)).toEqual(['Cs', 'C2v', 'Cs']);
    expect(points.map((point) => point.pointGroup)).toEqual(['Cs', 'C2v', 'Cs']);
    expect(points.map((point) => point.fragments[0]!.taperedQubits)).toEqual([11, 10, 11]);
    expect(points.map((point) => point.fragments[0]!.qubitsRequired)).toEqual([11, 10, 11]);
    expect(report.scan!.symmetry.groupChanges).toBe(true);
    // The structure itself is C2v (10 qubits); the scan's peak is counted point by point: 11.
    expect(report.fragments[0]!.qubitsRequired).toBe(10);
    expect(report.scan!.totals.peakQubits).toBe(11);
    const note = analysis.diagnostics.find((d) => d.code === 'scan-symmetry-change')!;
    expect(note.message).toContain("tapering follows it: fragment 'w' needs 11 in Cs, then 10 in C2v, then 11 in Cs");
    expect(scanSymmetryText(report.scan!)).toBe('Cs at 0.9372 Å: qubits needed w 11; C2v at 0.9572 Å: qubits needed w 10; Cs at 0.9772 Å: qubits needed w 11');
  });

  it('turns H2O2 through cis (C2v), skew (C2) and trans (C2h), textbook groups (from memory), and tapers 20 spin orbitals to 16, 17, 16 qubits (Bravyi et al. 2017)', () => {
    // STO-3G H2O2: 12 orbitals, the two O 1s frozen by default (common practice): 10 orbitals,
    // 20 spin orbitals; the order-4 groups remove 2 qubits and C2 1, besides the two parities.
    const analysis = analyzeDocument(`${PEROXIDE}scan dihedral h1 o1 o2 h2 from 0 to 180 step 45\n`);
    const points = analysis.report().scan!.symmetry.points;
    expect(points.map((point) => point.fullPointGroup)).toEqual(['C2v', 'C2', 'C2', 'C2', 'C2h']);
    expect(points.map((point) => point.fragments[0]!.qubitsRequired)).toEqual([16, 17, 17, 17, 16]);
  });

  it('names each point\'s group and qubits in the scan chart\'s tooltips, which the view accepts (by construction of the scan above)', () => {
    const svg = scanChartSvg(analyzeDocument(`${WATER}scan distance o h2 from 0.9372 to 0.9772 step 0.02 moving h2\n`).report());
    expect([...svg.matchAll(/<title>([^<]*)<\/title>/g)].map((match) => match[1])).toContain('point 2: 0.9572 Å, C2v; needs w 10 qubits');
    expect(checkSvg(svg).ok).toBe(true);
  });

  it('shows the runs of points in the scan hover (by construction of the scan above)', () => {
    const analysis = analyzeDocument(`${WATER}scan distance o h2 from 0.9372 to 0.9772 step 0.02 moving h2\n`);
    const card = scanCard(analysis)!;
    expect(card).toContain('| 0.9372 Å | 1 | Cs | w: 11 (tapered 11) |');
    expect(card).toContain('| 0.9572 Å | 1 | C2v | w: 10 (tapered 10) |');
  });

  it('says why the points were not looked at beyond the budget (by construction: 3 atoms × 2,000 points)', () => {
    const analysis = analyzeDocument(`${WATER}scan angle h1 o h2 from 100 to 119.99 step 0.01\n`);
    expect(3 * 2_000).toBeGreaterThan(SCAN_SYMMETRY_BUDGET);
    const symmetry = analysis.scanSymmetry()!;
    expect(symmetry.notLookedFor).toContain('2,000 points × 3 atoms');
    expect(symmetry.points).toEqual([]);
  });
});
