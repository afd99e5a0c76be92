/**
 * Every numeric check value in the chemistry tests names its source nearby (the rule is in
 * tests/support/checkValueSources.ts and DEVELOPERS.md, "Check values and their sources").
 */
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { unsourcedCheckValues } from '../support/checkValueSources';

const ROOT = path.resolve(__dirname, '../..');
/** The folders whose tests check chemistry against outside values. */
const CHEMISTRY_TESTS = ['tests/chemistry', 'tests/estimate'];

function testFiles(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) return testFiles(full);
    return entry.name.endsWith('.test.ts') ? [full] : [];
  });
}

describe('check values name their source', () => {
  const files = CHEMISTRY_TESTS.flatMap((folder) => testFiles(path.join(ROOT, folder))).sort();

  it('finds the chemistry tests', () => {
    expect(files.length).toBeGreaterThan(10);
  });

  for (const file of files) {
    const name = path.relative(ROOT, file);
    it(name, () => {
      const unsourced = unsourcedCheckValues(readFileSync(file, 'utf8')).map((value) => `${name}:${value.line}: ${value.text}`);
      expect(unsourced).toEqual([]);
    });
  }
});

describe('the lint itself', () => {
  it('flags a number without a source and accepts one with a source in the title, a comment or the describe', () => {
    const bare = `describe('counts', () => {\n  it('water', () => {\n    expect(count()).toBe(24);\n  });\n});\n`;
    expect(unsourcedCheckValues(bare)).toEqual([{ line: 3, text: 'expect(count()).toBe(24);' }]);
    expect(unsourcedCheckValues(bare.replace("it('water'", "it('water (Dunning 1989)'"))).toEqual([]);
    expect(unsourcedCheckValues(bare.replace('toBe(24);', 'toBe(24); // from memory'))).toEqual([]);
    expect(unsourcedCheckValues(bare.replace("describe('counts'", "describe('counts (tests/fixtures/basis-counts.nwchem.json)'"))).toEqual([]);
    expect(unsourcedCheckValues(`// Dunning, J. Chem. Phys. 90, 1007 (1989)\n${bare}`)).toEqual([]);
  });

  it('ignores matchers without a number and reads multi-line arguments', () => {
    expect(unsourcedCheckValues(`it('x', () => {\n  expect(f()).toBe('C2v');\n  expect(g()).toEqual(expected);\n});\n`)).toEqual([]);
    expect(unsourcedCheckValues(`it('x', () => {\n  expect(f()).toEqual({\n    a: 1,\n  });\n});\n`)).toHaveLength(1);
  });

  it('reads only the value of toBeCloseTo, not its precision', () => {
    expect(unsourcedCheckValues(`it('x', () => {\n  expect(f()).toBeCloseTo(expected, 12);\n});\n`)).toEqual([]);
  });

  it('does not take a source from a sibling test', () => {
    const text = `describe('d', () => {\n  it('a (Cotton 1990)', () => {});\n  it('b', () => {\n    expect(f()).toBe(4);\n  });\n});\n`;
    expect(unsourcedCheckValues(text)).toHaveLength(1);
  });
});
