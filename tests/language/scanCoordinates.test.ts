/**
 * Angle and dihedral scans in the language: reading, the model's values (degrees, never converted
 * by the length unit), the atoms that turn by default, and the checks at every point. Geometry
 * values are hand-computed (law of cosines on water; see tests/chemistry/scanGeometry.test.ts).
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { WATER_ROWS } from '../fixtures/water';
import { expectDiagnostic, expectNoDiagnostic } from './fixture';

const WATER = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${x.toFixed(6)} ${y.toFixed(6)} ${z.toFixed(6)}`).join('\n');
const ONE = 'fragment w { atoms rest; tier mean-field { method rhf } }';
const SPLIT = `fragment a { atoms o h1; charge -1; tier mean-field { method rhf } }
fragment b { atoms h2; charge +1; tier mean-field { method rhf } }`;

function water(scan: string, fragments = ONE, header = 'structure'): string {
  return `basis sto-3g\n${header} {\n${WATER}\n}\n${fragments}\n${scan}\n`;
}

/** H2O2 (gas phase, from memory: O–O 1.475 Å, O–H 0.950 Å, O–O–H 94.8°, H–O–O–H 111.5°), rounded to six decimals. */
const PEROXIDE = `basis sto-3g
structure {
  H h1 0.946668 0.000000 -0.079494
  O o1 0.000000 0.000000 0.000000
  O o2 0.000000 0.000000 1.475000
  H h2 -0.346955 0.880797 1.554494
}
fragment p { atoms rest; tier mean-field { method rhf } }
`;

describe('reading angle and dihedral scans', () => {
  it('reads `scan angle` as three atoms and values in degrees (104.5 to 120 by 0.5: 32 points, by construction)', () => {
    const analysis = analyzeDocument(water('scan angle h1 o h2 from 104.5 to 120 step 0.5'));
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const scan = analysis.model.scan!;
    expect(scan.coordinate).toBe('angle');
    expect(scan.atoms).toEqual([1, 0, 2]);
    expect(scan.values).toHaveLength(32);
    expect(scan.values[0]).toBe(104.5);
    expect(scan.values[31]).toBe(120);
    expect(analysis.scanMovingAtoms()).toEqual([2]);
  });

  it('keeps degrees as written in a structure in bohr (an angle has no length unit)', () => {
    const bohr = WATER_ROWS.map(([element, label, x, y, z]) => `  ${element} ${label} ${(x / 0.529177210903).toFixed(6)} ${(y / 0.529177210903).toFixed(6)} ${(z / 0.529177210903).toFixed(6)}`).join('\n');
    const analysis = analyzeDocument(`basis sto-3g\nstructure in bohr {\n${bohr}\n}\n${ONE}\nscan angle h1 o h2 from 100 to 110 points 3\n`);
    expect(analysis.model.scan!.values).toEqual([100, 105, 110]);
  });

  it('turns the fourth atom\'s side about the middle bond by default (H2O2: o2 and h2)', () => {
    const analysis = analyzeDocument(`${PEROXIDE}scan dihedral h1 o1 o2 h2 from 111.5 to 180 step 17.125\n`);
    expect(analysis.diagnostics.filter((d) => d.severity === 'error').map((d) => d.message)).toEqual([]);
    expect(analysis.model.scan!.coordinate).toBe('dihedral');
    expect(analysis.scanMovingAtoms()).toEqual([2, 3]);
  });

  it('says how many atoms an angle names when too few are given', () => {
    const { diagnostic } = expectDiagnostic(water('scan angle h1 ⟦o⟧ from 100 to 110 step 5'), 'invalid-selector');
    expect(diagnostic.message).toContain('names three atoms');
  });
});

describe('checking angle and dihedral scans', () => {
  it('refuses angles outside (0°, 180°]', () => {
    expect(expectDiagnostic(water('scan angle h1 o h2 from 100 to ⟦190⟧ step 10'), 'invalid-scan').diagnostic.message).toContain('at most 180°');
    expect(expectDiagnostic(water('scan angle h1 o h2 from ⟦0⟧ to 90 step 10'), 'invalid-scan').diagnostic.message).toContain('above 0°');
  });

  it('refuses a dihedral range wider than a turn', () => {
    expect(expectDiagnostic(`${PEROXIDE}scan dihedral h1 o1 o2 h2 from -180 to ⟦200⟧ step 10\n`, 'invalid-scan').diagnostic.message).toContain('repeats every 360°');
  });

  it('refuses the same atom twice', () => {
    expect(expectDiagnostic(water('scan angle h1 o ⟦h1⟧ from 100 to 110 step 5'), 'invalid-scan').diagnostic.message).toContain('three different atoms');
  });

  it('refuses an angle that starts linear (its plane is undefined)', () => {
    const linear = 'basis sto-3g\nstructure {\n  O o1 -1.16 0 0\n  C c 0 0 0\n  O o2 1.16 0 0\n}\nfragment m { atoms rest; tier mean-field { method rhf } }\n⟦scan⟧ angle o1 c o2 from 170 to 180 step 5\n';
    expect(expectDiagnostic(linear, 'invalid-scan').diagnostic.message).toContain('one line');
  });

  it('warns when the step misses the end, in degrees', () => {
    expect(expectDiagnostic(water('scan angle h1 o h2 from 100 to ⟦111⟧ step 5'), 'scan-end-missed').diagnostic.message).toContain('stops at 110');
  });

  it('reports the first point where the turning H clashes with the other: H···H = 2 r sin(θ/2) < 0.5 Å below 30.3° (law of cosines, r = 0.9572 Å)', () => {
    // 2 × 0.9572 × sin(15°) = 0.49548 Å at 30°; 0.51160 Å at 31° (hand-computed).
    const { diagnostic } = expectDiagnostic(water('⟦scan⟧ angle h1 o h2 from 40 to 30 step -1'), 'invalid-scan');
    expect(diagnostic.message).toMatch(/^At 30° the moving h2 comes within 0\.495 Å of h1/);
    expectNoDiagnostic(water('scan angle h1 o h2 from 40 to 31 step -1'), 'invalid-scan');
  });

  it('warns where a bond forms across a fragment boundary: H–H under 1.2 × (0.31 + 0.31) Å = 0.744 Å first at 45° (Cordero radii; law of cosines)', () => {
    // d(45°) = 2 × 0.9572 × sin(22.5°) = 0.7326 Å; d(50°) = 0.8091 Å (hand-computed).
    const { diagnostic } = expectDiagnostic(water('⟦scan⟧ angle h1 o h2 from 60 to 45 step -5', SPLIT), 'scan-bond-change');
    expect(diagnostic.message).toMatch(/^At 45° a bond h2–h1 forms/);
  });

  it('refuses moving atoms that hold the first atom, and a ring with no side to turn', () => {
    expect(expectDiagnostic(water('scan angle h1 o h2 from 100 to 110 step 5 ⟦moving h2 h1⟧'), 'invalid-scan').diagnostic.message).toContain('must not include the first scanned atom');
    // Cyclopropane-like C3 ring (equilateral, 1.51 Å): every C is joined to every other.
    const ring = 'basis sto-3g\nstructure {\n  C c1 0 0 0\n  C c2 1.51 0 0\n  C c3 0.755 1.307698 0\n}\nfragment m { atoms rest; tier mean-field { method rhf } }\n⟦scan⟧ angle c1 c2 c3 from 60 to 70 step 5\n';
    expect(expectDiagnostic(ring, 'invalid-scan').diagnostic.message).toContain('a ring');
  });
});
