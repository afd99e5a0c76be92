/**
 * Capped fragments: hydrogen link atoms on the bonds a fragment boundary cuts count in the
 * fragment's electrons, functions, qubits and point group, and show in hover, the structure view
 * and the QCSchema export.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import Ajv from 'ajv-draft-04';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { buildQcSchemaExport } from '../../server/src/report/export/qcschema';
import { structureData } from '../../server/src/report/structure';
import { BOHR_IN_ANGSTROM } from '../../server/src/chemistry/units';
import { doHover } from '../../server/src/services';
import { positionOf } from '../services/service';

/**
 * Staggered ethane at its experimental structure, r(C–C) 1.535 Å, r(C–H) 1.094 Å, ∠HCC 111.2°
 * (NIST CCCBDB experimental geometry, from memory), C–C along z.
 */
function ethane(): string {
  const half = 1.535 / 2;
  const angle = (111.2 * Math.PI) / 180;
  const rise = -1.094 * Math.cos(angle);
  const radial = 1.094 * Math.sin(angle);
  const lines = ['  C c1 0 0 ' + (-half).toFixed(6), '  C c2 0 0 ' + half.toFixed(6)];
  for (let k = 0; k < 3; k++) {
    const phi = (2 * Math.PI * k) / 3;
    lines.push(`  H a${k + 1} ${(radial * Math.cos(phi)).toFixed(6)} ${(radial * Math.sin(phi)).toFixed(6)} ${(-half - rise).toFixed(6)}`);
  }
  for (let k = 0; k < 3; k++) {
    const phi = (2 * Math.PI * k) / 3 + Math.PI / 3;
    lines.push(`  H b${k + 1} ${(radial * Math.cos(phi)).toFixed(6)} ${(radial * Math.sin(phi)).toFixed(6)} ${(half + rise).toFixed(6)}`);
  }
  return `structure {\n${lines.join('\n')}\n}\n`;
}

const TIER = 'tier quantum { method vqe; mapping jordan-wigner; active 2e 2o }';
const spec = (caps: string) =>
  `spec ethane\nbasis cc-pVDZ\n${ethane()}${caps}\nfragment left {\n  atoms c1 a1 a2 a3\n  ${TIER}\n}\nfragment right {\n  atoms c2 b1 b2 b3\n  ${TIER}\n}\n`;

describe('ethane cut into two methyl groups', () => {
  const analysis = analyzeDocument(spec('caps hydrogen fixed'));

  it('gives two CH4-like fragments of 10 electrons, singlets, one cap each (the check value of the plan)', () => {
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    for (const index of [0, 1]) {
      const figures = analysis.fragmentFigures(index);
      expect(figures.formula).toBe('CH4');
      // C 6 + 3 H + the cap: 10 electrons, a closed shell.
      expect(figures.electrons).toBe(10);
      expect(figures.multiplicity).toBe(1);
      expect(figures.caps?.count).toBe(1);
      expect(figures.atoms).toBe(4);
      // cc-pVDZ: C [3s2p1d] 14 functions, H [2s1p] 5 (Dunning, J. Chem. Phys. 90, 1007 (1989)): 14 + 4 × 5.
      expect(figures.basisFunctions.spherical).toBe(34);
      // The cap lies on the C3 axis of the methyl group: C3v, counted in its abelian subgroup Cs.
      expect(figures.fullPointGroup).toBe('C3v');
      expect(figures.pointGroup).toBe('Cs');
    }
    const left = analysis.fragmentFigures(0).caps!.list[0]!;
    expect(left).toMatchObject({ host: 1, partner: 2, element: 'H' });
    expect(left.length).toBe(1.09);
    // On the C–C line (z axis), 1.09 Å from c1 towards c2.
    expect(left.position[2]).toBeCloseTo(-1.535 / 2 + 1.09, 6);
  });

  it('counts the uncapped methyl radicals differently: 9 electrons, doublets', () => {
    const open = analyzeDocument(spec(''));
    expect(open.fragmentFigures(0).electrons).toBe(9);
    expect(open.fragmentFigures(0).multiplicity).toBe(2);
    expect(open.fragmentFigures(0).caps).toBeNull();
    // The cut is warned about without caps, told about with them.
    const cut = (a: typeof analysis) => a.diagnostics.find((d) => d.code === 'bond-cut');
    expect(cut(open)?.severity).toBe('warning');
    expect(cut(analysis)?.severity).toBe('information');
  });

  it('places scaled caps at g · d(C–C), g = (r_C + r_H)/(2 r_C) with Cordero radii', () => {
    const scaled = analyzeDocument(spec('caps hydrogen scaled'));
    // Cordero et al., Dalton Trans. 2008, 2832: r(C sp3) 0.76 Å, r(H) 0.31 Å.
    expect(scaled.fragmentFigures(1).caps!.list[0]!.length).toBeCloseTo((1.07 / 1.52) * 1.535, 5);
  });

  it('lets a fragment override the spec-wide choice', () => {
    const mixed = analyzeDocument(spec('caps hydrogen fixed').replace('atoms c2 b1 b2 b3', 'atoms c2 b1 b2 b3\n  caps none'));
    expect(mixed.fragmentFigures(0).caps?.count).toBe(1);
    expect(mixed.fragmentFigures(1).caps).toBeNull();
    expect(mixed.fragmentFigures(1).electrons).toBe(9);
  });

  it('reports a caps line it cannot read, with where', () => {
    const bad = analyzeDocument(spec('caps hydrogen sideways'));
    const problem = bad.diagnostics.find((d) => d.severity === 'error');
    expect(problem?.message).toMatch(/sideways/);
    const missing = analyzeDocument(spec('caps hydrogen'));
    expect(missing.diagnostics.some((d) => d.code === 'missing-value' && /fixed/.test(d.message))).toBe(true);
  });

  it('lists the caps in the hover card of the fragment', () => {
    const hover = doHover(analysis, positionOf(analysis, 'fragment left', 10))!;
    const text = (hover.contents as { value: string }).value;
    expect(text).toMatch(/\| caps \| 1 hydrogen link atom \(fixed/);
    expect(text).toMatch(/H on c1 \(#1\) toward c2 \(#2\), 1\.090 Å/);
  });

  it('draws the caps in the structure data and exports them in the fragment molecules', () => {
    const data = structureData(analysis);
    expect(data.caps.map((cap) => [cap.fragment, cap.host, cap.partner])).toEqual([
      [0, 0, 1],
      [1, 1, 0],
    ]);
    const exported = buildQcSchemaExport(analysis, data, { title: 'ethane', version: 'test' });
    const left = exported.fragments[0]!;
    expect(left.symbols).toEqual(['C', 'H', 'H', 'H', 'H']);
    expect(left.atom_labels[4]).toBe('cap');
    expect(left.geometry[14]! * BOHR_IN_ANGSTROM).toBeCloseTo(-1.535 / 2 + 1.09, 6);
    expect(left.extras.tessera.caps).toEqual([{ host_atom: 1, partner_atom: 2, rule: 'fixed', length_angstrom: 1.09 }]);
    expect(left.extras.tessera.atom_basis).toHaveLength(5);
    // Still a valid QCSchema molecule (the schema QCElemental publishes).
    const schema = JSON.parse(readFileSync(path.join(__dirname, '..', 'fixtures', 'qcschema-molecule.schema.json'), 'utf8')) as object;
    const ajv = new Ajv({ allErrors: true, strict: true });
    ajv.addKeyword({ keyword: 'shape' });
    ajv.addKeyword({ keyword: 'units' });
    const validate = ajv.compile(schema);
    expect(validate(left), JSON.stringify(validate.errors)).toBe(true);
    // The system molecule has no caps.
    expect(exported.system.symbols).toHaveLength(8);
  });
});
