/**
 * The samples shipped in samples/: every one analyses; all but the deliberate-mistakes file are
 * free of errors; and the mistakes file reports exactly what its "mistake:" comments announce,
 * each on the comment's line.
 */
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze, type Analysis } from '../../server/src/language/analyze';
import type { DiagnosticCode } from '../../server/src/language/diagnostics';
import { show } from './fixture';

const SAMPLES = path.resolve(__dirname, '../../samples');
const MISTAKES = path.join(SAMPLES, 'mistakes.tess');

function specsUnder(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) return specsUnder(full);
    return entry.name.endsWith('.tess') ? [full] : [];
  });
}

const specs = specsUnder(SAMPLES).sort();

function analyseFile(file: string): Analysis {
  return analyze(readFileSync(file, 'utf8'), { path: file });
}

describe('samples', () => {
  it('include the deliberate-mistakes file and at least one clean spec', () => {
    expect(specs).toContain(MISTAKES);
    expect(specs.length).toBeGreaterThan(1);
  });

  for (const file of specs) {
    const name = path.relative(SAMPLES, file);
    it(`${name} analyses to a model with atoms and fragments`, () => {
      const analysis = analyseFile(file);
      expect(analysis.model.atoms.length).toBeGreaterThan(0);
      expect(analysis.model.fragments.length).toBeGreaterThan(0);
    });
    if (file === MISTAKES) continue;
    it(`${name} has no errors`, () => {
      const analysis = analyseFile(file);
      const errors = analysis.diagnostics.filter((d) => d.severity === 'error').map((d) => show(analysis, d));
      expect(errors).toEqual([]);
    });
  }
});

describe('sample data provenance', () => {
  // Every sample (and every spec the editor tests open) says where its data comes from in its
  // header comment: "Data: invented…", or "Data:" followed by a source with its year or the sample
  // whose data it shares.
  const EDITOR_SPECS = path.resolve(__dirname, '../e2e/workspace');
  const files = [...specs, ...specsUnder(EDITOR_SPECS).sort()];
  for (const file of files) {
    it(`${path.relative(path.resolve(__dirname, '../..'), file)} labels its data`, () => {
      const header = readFileSync(file, 'utf8')
        .split('\n')
        .filter((line, index, all) => all.slice(0, index + 1).every((l) => l.startsWith('#')))
        .join(' ');
      const label = /Data: (.*)$/.exec(header)?.[1] ?? '';
      expect(label, 'a "Data:" line in the header comment').not.toBe('');
      expect(/^invented|\b(19|20)\d\d\b|\.tess\b/.test(label), label).toBe(true);
    });
  }
});

describe('samples/mistakes.tess', () => {
  /**
   * The code each "mistake:" comment announces, keyed by the comment's text. A comment in the file
   * without an entry here (or an entry without its comment) fails the test below, so the table
   * follows the file.
   */
  const ANNOUNCED: Readonly<Record<string, DiagnosticCode>> = {
    '11 electrons (O and three H) cannot make a triplet': 'multiplicity-parity',
    'no such basis (did you mean cc-pVDZ?)': 'unknown-basis',
    'sits on top of h2': 'atoms-too-close',
    'not an element': 'unknown-element',
    'only two coordinates': 'invalid-atom',
    'no atom is labelled hx': 'unknown-atom',
    'unknown method': 'unknown-method',
    'unknown mapping': 'unknown-mapping',
    '9 electrons do not fit 4 orbitals': 'active-space-invalid',
    'h2 is in two fragments': 'fragment-overlap',
    'misspelt keyword': 'unknown-keyword',
    'vqe is a quantum-tier method': 'method-tier-mismatch',
  };

  /**
   * Further diagnostics the file gives on a mistake line that its comment does not announce, each
   * with the reason it appears. They are listed so that the comparison stays exact.
   */
  const ALSO_REPORTED: Readonly<Record<string, readonly { code: DiagnosticCode; reason: string }[]>> = {
    'h2 is in two fragments': [
      { code: 'bond-cut', reason: 'h3 sits on h2, so it is bonded to o, which is in the other fragment' },
    ],
  };

  const text = readFileSync(MISTAKES, 'utf8');
  const lines = text.split('\n');
  // A mistake is announced by a comment that starts with `mistake:`; the header line that
  // explains the convention mentions "mistake:" in quotes and is no announcement.
  const mistakes = lines.flatMap((line, index) => {
    const match = /#\s*mistake:\s*(.*?)\s*$/.exec(line);
    return match ? [{ line: index, comment: match[1]! }] : [];
  });
  const analysis = analyze(text, { path: MISTAKES });
  const reportedOn = (line: number) =>
    analysis.diagnostics
      .filter((d) => analysis.lines.positionAt(d.span.start).line === line)
      .map((d) => d.code)
      .sort();

  it('announces its mistakes in comments that this test knows', () => {
    expect(mistakes.length).toBeGreaterThan(0);
    expect(mistakes.map((m) => m.comment).sort()).toEqual(Object.keys(ANNOUNCED).sort());
  });

  for (const { line, comment } of mistakes) {
    it(`line ${line + 1}: ${comment}`, () => {
      const expected = [ANNOUNCED[comment]!, ...(ALSO_REPORTED[comment] ?? []).map((extra) => extra.code)].sort();
      expect(reportedOn(line)).toEqual(expected);
    });
  }

  it('reports nothing on the lines without a mistake comment', () => {
    const marked = new Set(mistakes.map((m) => m.line));
    const elsewhere = analysis.diagnostics.filter((d) => !marked.has(analysis.lines.positionAt(d.span.start).line));
    expect(elsewhere.map((d) => `line ${analysis.lines.positionAt(d.span.start).line + 1}: ${show(analysis, d)}`)).toEqual([]);
  });

  it('reports the announced set of codes, no more and no fewer', () => {
    const announced = new Set([...Object.values(ANNOUNCED), ...Object.values(ALSO_REPORTED).flat().map((extra) => extra.code)]);
    expect(new Set(analysis.diagnostics.map((d) => d.code))).toEqual(announced);
  });
});

describe('figures the samples state in their comments', () => {
  const byName = (name: string) => analyseFile(path.join(SAMPLES, name));

  it('water in STO-3G: 7 basis functions and 10 electrons', () => {
    // Minimal basis: O 1s 2s 2p = 5 functions, H 1s = 1 (STO-3G, Hehre, Stewart & Pople, J. Chem. Phys. 51, 2657 (1969)).
    const { model } = byName('molecules/water-sto-3g.tess');
    expect(model.system.orbitals).toBe(7);
    expect(model.system.electrons).toBe(10);
  });

  it('water in cc-pVDZ: 24 basis functions', () => {
    // O 3s2p1d = 14, H 2s1p = 5 (Dunning, J. Chem. Phys. 90, 1007 (1989); from memory).
    expect(byName('molecules/water-cc-pvdz.tess').model.system.basisFunctions.spherical).toBe(24);
  });

  it('benzene in 6-31G*: 102 cartesian and 96 spherical functions', () => {
    // C 3s2p1d: 15 cartesian, 14 spherical; H 2s: 2 (Hariharan & Pople, Theor. Chim. Acta 28, 213 (1973); from memory).
    const { model } = byName('molecules/benzene-6-31gs.tess');
    expect(model.system.basisFunctions).toEqual({ cartesian: 102, spherical: 96 });
    expect(model.basis.functions).toBe('cartesian');
  });

  it('dioxygen triplet: 16 electrons, 9 alpha and 7 beta', () => {
    // Ground-state O2 is a triplet (textbook molecular-orbital theory; from memory).
    const { model } = byName('open-shell/dioxygen-triplet.tess');
    expect(model.system.electrons).toBe(16);
    expect(model.system.spin).toEqual({ alpha: 9, beta: 7, unpaired: 2 });
  });
});
