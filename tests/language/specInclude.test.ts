/**
 * Reuse: `structure from "other.tess"` takes the atoms of another spec's structure block, labels
 * included, so a family of specs shares one structure; confined like XYZ includes.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { memoryFiles } from './fixture';

/** Water at Hoy & Bunker's structure (1979), placed as in tests/fixtures/water.ts. */
const WATER_ROWS = ['O  o    0.000000   0.000000   0.000000', 'H  h1   0.000000   0.756950   0.585882', 'H  h2   0.000000  -0.756950   0.585882'];
const BASE = `spec "base"\nbasis sto-3g\nstructure {\n${WATER_ROWS.map((row) => `  ${row}`).join('\n')}\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`;
/** 1 Å in bohr: 1/0.529177210903 (CODATA 2018). */
const BOHR_PER_ANGSTROM = 1 / 0.529177210903;
const IN_BOHR = `basis sto-3g\nstructure in bohr {\n  O o 0 0 0\n  H h1 0 ${(0.75695 * BOHR_PER_ANGSTROM).toFixed(9)} ${(0.585882 * BOHR_PER_ANGSTROM).toFixed(9)}\n  H h2 0 ${(-0.75695 * BOHR_PER_ANGSTROM).toFixed(9)} ${(0.585882 * BOHR_PER_ANGSTROM).toFixed(9)}\n}\n`;

const FILES = memoryFiles({
  '/work/specs/family/base.tess': BASE,
  '/work/specs/family/bohr.tess': IN_BOHR,
  '/work/specs/family/nested.tess': 'basis sto-3g\nstructure from "base.tess"\n',
  '/work/specs/family/broken.tess': 'basis sto-3g\nstructure {\n  O o 0 0\n  H h1 0 0.75695 0.585882\n}\n',
  '/work/outside.tess': BASE,
});

const member = (include: string, fragments = 'fragment a { atoms o h1; charge -1; tier quantum { active 2e 2o } }\nfragment b { atoms h2; charge +1; tier mean-field { method rhf } }') =>
  `spec "member"\nbasis cc-pvdz\nstructure from "${include}"\n${fragments}\n`;

function analyse(text: string) {
  return analyzeDocument(text, { path: '/work/specs/family/member.tess', files: FILES });
}

describe('structure from another spec', () => {
  it('takes the atoms with their labels, so the member selects them by label', () => {
    const analysis = analyse(member('base.tess'));
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.model.atoms.map((atom) => atom.label)).toEqual(['o', 'h1', 'h2']);
    expect(Array.from(analysis.model.coordinates)).toEqual([0, 0, 0, 0, 0.75695, 0.585882, 0, -0.75695, 0.585882]);
    expect(analysis.model.includes).toEqual(['/work/specs/family/base.tess']);
    // The member's own basis and fragments: OH⁻ in cc-pVDZ, 10 electrons (8 + 1 + 1).
    expect(analysis.fragmentFigures(0).electrons).toBe(10);
    expect(analysis.model.atoms[0]!.source).toEqual({ file: '/work/specs/family/base.tess', line: 3 });
  });

  it('converts a structure given in bohr to ångström (CODATA 2018 bohr radius)', () => {
    const analysis = analyse(member('bohr.tess'));
    expect(analysis.model.coordinates[4]).toBeCloseTo(0.75695, 8);
    expect(analysis.model.coordinates[5]).toBeCloseTo(0.585882, 8);
  });

  it('refuses a spec outside the folder tree, a nested include and a broken structure, saying where', () => {
    const outside = analyse(member('../../outside.tess'));
    expect(outside.diagnostics.some((d) => d.code === 'include-outside-folder')).toBe(true);
    const nested = analyse(member('nested.tess', 'fragment w { atoms rest; tier mean-field { method rhf } }'));
    expect(nested.diagnostics.find((d) => d.code === 'include-invalid')?.message).toMatch(/takes its own atoms from "base.tess"/);
    const broken = analyse(member('broken.tess', 'fragment w { atoms rest; tier mean-field { method rhf } }'));
    expect(broken.diagnostics.find((d) => d.code === 'include-invalid')?.message).toMatch(/"broken.tess" line 3:/);
    const missing = analyse(member('absent.tess'));
    expect(missing.diagnostics.some((d) => d.code === 'include-unreadable')).toBe(true);
  });
});
