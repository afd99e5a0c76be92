/**
 * Angle and dihedral scans in the exports and the chart: one XYZ frame and one QCSchema molecule per
 * point, each geometry measuring the requested value (hand-computed: the angle itself, and H···H =
 * 2 r sin(θ/2) by the law of cosines with r = 0.9572 Å, Hoy & Bunker 1979), and the chart's axis in
 * degrees.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { angleOf, dihedralOf, distanceOf } from '../../server/src/chemistry/scan';
import { buildQcSchemaExport } from '../../server/src/report/export/qcschema';
import { buildQcInputExport } from '../../server/src/report/export/qcschemaInput';
import { xyzFrames } from '../../server/src/report/export/xyz';
import { scanChartSvg } from '../../server/src/report/plots';
import { structureData } from '../../server/src/report/structure';

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
const BOHR = 0.529177210903;

const WATER = `spec bend
basis sto-3g
structure {
  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882
}
fragment w { atoms rest; tier mean-field { method rhf } }
scan angle h1 o h2 from 105 to 120 step 5
`;

/** H2O2 (gas phase, from memory: O–O 1.475 Å, O–H 0.950 Å, O–O–H 94.8°, H–O–O–H 111.5°). */
const PEROXIDE = `spec twist
basis sto-3g
structure {
  H h1 0.946668 0.000000 -0.079494
  O o1 0.000000 0.000000 0.000000
  O o2 0.000000 0.000000 1.475000
  H h2 -0.346955 0.880797 1.554494
}
fragment a { atoms h1 o1; tier mean-field { method rhf } }
fragment b { atoms o2 h2; tier mean-field { method rhf } }
scan dihedral h1 o1 o2 h2 from 180 to 0 step -45
`;

describe('exports of an angle scan', () => {
  const analysis = analyzeDocument(WATER);
  const data = structureData(analysis);

  it('writes one XYZ frame per point whose angle is the requested one and whose comment says so in degrees', () => {
    const frames = xyzFrames(data, { title: 'bend', version: 'test' });
    expect(frames).toHaveLength(4);
    frames.forEach((frame, k) => {
      const value = analysis.model.scan!.values[k]!;
      expect(frame.value).toBe(value);
      expect(Math.abs(angleOf(frame.coordinates, 1, 0, 2) - value)).toBeLessThan(1e-9);
      expect(distanceOf(frame.coordinates, 0, 2)).toBeCloseTo(0.9572, 6);
      expect(distanceOf(frame.coordinates, 1, 2)).toBeCloseTo(2 * 0.9572 * Math.sin(((value / 2) * Math.PI) / 180), 5); // the coordinates carry six decimals
      expect(frame.comment).toContain(`scan point ${k + 1} of 4; angle h1-o-h2 ${value.toFixed(6)} degree`);
    });
  });

  it('gives each QCSchema scan molecule its point, value and unit, geometry in bohr', () => {
    const exported = buildQcSchemaExport(analysis, data, { title: 'bend', version: 'test' });
    const scan = exported.scan!;
    expect(scan.coordinate).toBe('angle');
    expect(scan.unit).toBe('degree');
    expect(scan.distances_angstrom).toBeUndefined();
    expect(scan.molecules).toHaveLength(4);
    scan.molecules.forEach((molecule, k) => {
      const geometry = Float64Array.from(molecule.geometry.map((x) => x * BOHR));
      const [first, vertex, last] = scan.atoms as [number, number, number];
      expect(Math.abs(angleOf(geometry, first, vertex, last) - scan.values[k]!)).toBeLessThan(1e-9);
      expect(molecule.extras.tessera.scan_point).toEqual({ point: k + 1, points: 4, coordinate: 'angle', value: scan.values[k], unit: 'degree' });
    });
  });

  it('labels the chart axis and ticks in degrees', () => {
    const svg = scanChartSvg(analysis.report());
    expect(svg).toContain('scanned angle (degrees), in scan order');
    expect(svg).toContain('>105.0°<');
  });
});

describe('exports of a dihedral scan', () => {
  it('writes QCSchema input records per fragment and point, each geometry at the requested dihedral', () => {
    const analysis = analyzeDocument(PEROXIDE);
    expect(analysis.diagnostics.filter((d) => d.severity === 'error').map((d) => d.message)).toEqual([]);
    const data = structureData(analysis);
    const frames = xyzFrames(data, { title: 'twist', version: 'test' });
    expect(frames.map((frame) => frame.value)).toEqual([180, 135, 90, 45, 0]);
    for (const frame of frames) {
      const measured = dihedralOf(frame.coordinates, 0, 1, 2, 3);
      expect(Math.abs(((measured - frame.value! + 540) % 360) - 180)).toBeLessThan(1e-9);
    }
    const inputs = buildQcInputExport(analysis, data, { title: 'twist', version: 'test' });
    expect(inputs.manifest).toHaveLength(10); // 2 fragments × 5 points
    expect(inputs.manifest.map((entry) => entry.scan_value)).toEqual([180, 180, 135, 135, 90, 90, 45, 45, 0, 0]);
    expect(inputs.manifest.every((entry) => entry.scan_unit === 'degree' && entry.distance_angstrom === null)).toBe(true);
  });
});
