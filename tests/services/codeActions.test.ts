/**
 * Quick fixes: for each one, apply its edit to the text, analyse again, and check that the
 * diagnostic it answers is gone and no new error came with it.
 *
 * Geometries are invented test data unless a comment names a source.
 */
import { describe, expect, it } from 'vitest';
import { CodeActionKind, type CodeAction, type Diagnostic as LspDiagnostic } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import type { DiagnosticCode } from '../../server/src/language/diagnostics';
import { doValidation, getCodeActions, toLspDiagnostic } from '../../server/src/services';
import { applyEdits, editsFor, URI } from './service';

/** Water at r(OH) = 0.9572 Å, HOH = 104.52° (Hoy & Bunker, J. Mol. Spectrosc. 74, 1 (1979)), placed as in tests/fixtures/water.ts. */
const WATER = `structure {
  O o 0 0 0
  H h1 0 0.756950 0.585882
  H h2 0 -0.756950 0.585882
}
`;
/** The same water in bohr: each coordinate divided by 0.529177210903 Å (CODATA 2018). */
const WATER_IN_BOHR = `structure {
  O o 0 0 0
  H h1 0 1.430429 1.107157
  H h2 0 -1.430429 1.107157
}
`;
const MEAN_FIELD = 'fragment w { atoms rest; tier mean-field { method rhf } }\n';

interface Applied {
  readonly action: CodeAction;
  readonly text: string;
  readonly before: DiagnosticCode[];
  readonly after: DiagnosticCode[];
}

/** The quick fixes for every diagnostic of `code` in the text, each applied on its own. */
function fixes(text: string, code: DiagnosticCode): Applied[] {
  const analysis = analyzeDocument(text);
  const diagnostics = doValidation(analysis, URI).filter((d) => d.code === code);
  expect(diagnostics.length, `expected a '${code}' diagnostic`).toBeGreaterThan(0);
  return getCodeActions(analysis, URI, diagnostics).map((action) => {
    const fixed = applyEdits(text, editsFor(action.edit));
    return {
      action,
      text: fixed,
      before: analysis.diagnostics.map((d) => d.code),
      after: analyzeDocument(fixed).diagnostics.map((d) => d.code),
    };
  });
}

/** Asserts the fix removed `code` and brought no error or warning the text did not have. */
function expectFixed(applied: Applied, code: DiagnosticCode): void {
  expect(applied.after, applied.text).not.toContain(code);
  for (const after of applied.after) expect(applied.before, `'${after}' after the fix:\n${applied.text}`).toContain(after);
  expect(applied.action.kind).toBe(CodeActionKind.QuickFix);
}

describe('multiplicity', () => {
  it('parity: a doublet of water (10 electrons) becomes a singlet', () => {
    const [fix] = fixes(`multiplicity 2\nbasis sto-3g\n${WATER}${MEAN_FIELD}`, 'multiplicity-parity');
    expect(fix!.action.title).toBe('Set the multiplicity to 1');
    expect(fix!.action.isPreferred).toBe(true);
    expect(fix!.text.startsWith('multiplicity 1\n')).toBe(true);
    expectFixed(fix!, 'multiplicity-parity');
  });

  it('parity: offers both neighbours that fit, 1 and 3 for an even count written as 2 (2S ≤ N, N − 2S even; Szabo & Ostlund 1989)', () => {
    const offered = fixes(`multiplicity 2\nbasis sto-3g\n${WATER}${MEAN_FIELD}`, 'multiplicity-parity');
    expect(offered.map((fix) => fix.action.title)).toEqual(['Set the multiplicity to 1', 'Set the multiplicity to 3']);
    expect(offered.map((fix) => fix.action.isPreferred === true)).toEqual([true, false]);
    expect(offered[1]!.text.startsWith('multiplicity 3\n')).toBe(true);
    expect(offered[1]!.after).not.toContain('multiplicity-parity');
  });

  // O + 2 H = 8 + 2 = 10 electrons (IUPAC periodic table); 2S+1 is valid when 2S ≤ N and N − 2S is
  // even (spin algebra; common practice, no source).
  it('too high: 10 electrons allow at most 10 unpaired, multiplicity 11', () => {
    // The fragment says so too, so that its spin couples to the system's once fixed (angular-momentum addition).
    const [fix] = fixes(`multiplicity 11\nbasis sto-3g\n${WATER}fragment w { atoms rest; multiplicity 13; tier mean-field { method rohf } }\n`, 'multiplicity-too-high');
    expect(fix!.action.title).toBe('Set the multiplicity to 11');
    expectFixed(fix!, 'multiplicity-too-high');
  });

  it('in a fragment: OH, 9 electrons, cannot be a singlet', () => {
    const text = `basis sto-3g\n${WATER}fragment oh {\n  atoms o h1\n  charge 0\n  multiplicity 1\n  tier mean-field { method rohf }\n}\nfragment p { atoms h2; tier mean-field { method rohf } }\n`;
    const [fix] = fixes(text, 'multiplicity-parity');
    expect(fix!.text).toContain('  multiplicity 2\n');
    expectFixed(fix!, 'multiplicity-parity');
  });
});

describe('scan end', () => {
  it('offers the two ends a step of -0.25 from 3.0 lands on near 1.8: 2 and 1.75 (arithmetic, by construction)', () => {
    const text = `basis sto-3g\n${WATER}fragment a { atoms o h1; charge -1; tier mean-field { method rhf } }\nfragment b { atoms h2; charge +1; tier mean-field { method rhf } }\nscan distance o h2 from 3.0 to 1.8 step -0.25\n`;
    const offered = fixes(text, 'scan-end-missed');
    expect(offered.map((fix) => fix.action.title)).toEqual(['Change the end to 2', 'Change the end to 1.75']);
    for (const fix of offered) expectFixed(fix, 'scan-end-missed');
  });
});

describe('replacement spelling', () => {
  const cases: { name: string; text: string; code: DiagnosticCode; title: string; expected: string }[] = [
    { name: 'a keyword', text: `bassis sto-3g\n${WATER}${MEAN_FIELD}`, code: 'unknown-keyword', title: "Replace with 'basis'", expected: 'basis sto-3g\n' },
    { name: 'a basis name', text: `basis cc-pvdzz\n${WATER}${MEAN_FIELD}`, code: 'unknown-basis', title: "Replace with 'cc-pVDZ'", expected: 'basis cc-pVDZ\n' },
    { name: 'a mapping', text: `basis sto-3g\n${WATER}fragment w { atoms rest; tier quantum { method vqe; mapping jordan-wigne } }\n`, code: 'unknown-mapping', title: "Replace with 'jordan-wigner'", expected: 'mapping jordan-wigner }' },
    { name: 'a method', text: `basis sto-3g\n${WATER}fragment w { atoms rest; tier quantum { method vqee } }\n`, code: 'unknown-method', title: "Replace with 'vqe'", expected: 'method vqe }' },
    { name: 'a method of another tier', text: `basis sto-3g\n${WATER}fragment w { atoms rest; tier correlated { method vqe } }\n`, code: 'method-tier-mismatch', title: "Replace with 'mp2'", expected: 'method mp2 }' },
    { name: 'an atom label', text: `basis sto-3g\n${WATER}fragment w { atoms o h1 hh2; tier mean-field { method rhf } }\n`, code: 'unknown-atom', title: "Replace with 'h2'", expected: 'atoms o h1 h2;' },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const [fix] = fixes(c.text, c.code);
      expect(fix!.action.title).toBe(c.title);
      expect(fix!.text).toContain(c.expected);
      expectFixed(fix!, c.code);
    });
  }
});

describe('unassigned atoms', () => {
  it('into a new fragment that takes `atoms rest`', () => {
    const text = `basis sto-3g\n${WATER}fragment w { atoms o h1; tier mean-field { method rhf } }`;
    const [fix] = fixes(text, 'atoms-unassigned');
    expect(fix!.action.title).toBe("Add a fragment 'environment' that takes the 1 unassigned atom (atoms rest)");
    expect(fix!.action.isPreferred).toBe(true);
    expect(fix!.text.endsWith('} }\n\nfragment environment {\n  atoms rest\n  tier mean-field { method rhf }\n}\n')).toBe(true);
    // Cutting the O–H bond between the fragments is a warning the new fragment brings: allowed.
    expect(fix!.after).not.toContain('atoms-unassigned');
    expect(analyzeDocument(fix!.text).diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('under a name not yet taken', () => {
    const text = `basis sto-3g\n${WATER}fragment environment { atoms o h1; tier mean-field { method rhf } }\n`;
    const [fix] = fixes(text, 'atoms-unassigned');
    expect(fix!.text).toContain('fragment environment2 {');
  });

  it('into an existing fragment, after its atoms', () => {
    const text = `basis sto-3g\n${WATER}fragment w { atoms o h1; tier mean-field { method rhf } }\n`;
    const intoW = fixes(text, 'atoms-unassigned').find((fix) => fix.action.title === "Put the unassigned atoms into fragment 'w'")!;
    expect(intoW.text).toContain('fragment w { atoms o h1 h2; tier');
    expectFixed(intoW, 'atoms-unassigned');
  });

  it('names unlabelled atoms by #index ranges', () => {
    const text = `basis sto-3g\nstructure {\n  O o 0 0 0\n  H 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\nfragment w {\n  atoms o\n  tier mean-field { method rohf }\n}\n`;
    const intoW = fixes(text, 'atoms-unassigned').find((fix) => fix.action.title.includes("fragment 'w'"))!;
    expect(intoW.text).toContain('  atoms o #2..#3\n');
    expectFixed(intoW, 'atoms-unassigned');
  });

  it('into a fragment without `atoms`, written over several lines', () => {
    const text = `basis sto-3g\n${WATER}fragment w { atoms o h1; tier mean-field { method rhf } }\nfragment v {\n  tier mean-field { method rohf }\n}\n`;
    const intoV = fixes(text, 'atoms-unassigned').find((fix) => fix.action.title.includes("fragment 'v'"))!;
    expect(intoV.text).toContain('fragment v {\n  atoms h2\n  tier mean-field { method rohf }\n}');
    expect(intoV.after).not.toContain('atoms-unassigned');
    expect(intoV.after).not.toContain('fragment-empty');
  });

  it('into a fragment without `atoms`, written on one line', () => {
    const text = `basis sto-3g\n${WATER}fragment w { atoms o h1; tier mean-field { method rhf } }\nfragment v { tier mean-field { method rohf } }\n`;
    const intoV = fixes(text, 'atoms-unassigned').find((fix) => fix.action.title.includes("fragment 'v'"))!;
    expect(intoV.text).toContain('fragment v { atoms h2; tier mean-field { method rohf } }');
    expect(intoV.after).not.toContain('atoms-unassigned');
    expect(intoV.after).not.toContain('fragment-empty');
    expect(analyzeDocument(intoV.text).diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });
});

describe('basis override for an element the basis lacks', () => {
  /** RbCl: 6-31G stops at Kr, so it lacks Rb (Z = 37) (nwchem-data agrees: tests/fixtures/basis-counts.nwchem.json). */
  const RBCL = `structure {\n  Rb rb 0 0 0\n  Cl cl 0 0 2.79\n}\n${MEAN_FIELD}`;
  const cases: { name: string; basis: string; expected: string; titles: string[] }[] = [
    { name: 'an element line after the main line', basis: 'basis 6-31G', expected: 'basis 6-31G\nbasis STO-3G on all Rb\n', titles: titlesOn('all Rb') },
    {
      name: 'after the last basis line, with a comment on it',
      basis: 'basis 6-31G\nbasis 3-21G on all Cl  # chlorine',
      expected: 'basis 6-31G\nbasis 3-21G on all Cl  # chlorine\nbasis STO-3G on all Rb\n',
      titles: titlesOn('all Rb'),
    },
    // The line that gave rb its basis gives it to no other atom: removing it comes first (rb falls
    // back to the spec's own basis), then the line's name changes to another basis.
    {
      name: 'an element line that lacks the element too: remove it first',
      basis: 'basis def2-svp\nbasis 6-31G on all Rb',
      expected: 'basis def2-svp\nstructure {',
      titles: ['Remove the override `basis 6-31G on all Rb` (Rb takes the spec’s basis def2-SVP)', ...titlesOn('all Rb').slice(0, 2), titlesOn('all Rb')[3]!],
    },
    {
      name: 'a line naming the atom: remove it first',
      basis: 'basis def2-svp\nbasis 6-31G on rb',
      expected: 'basis def2-svp\nstructure {',
      titles: ['Remove the override `basis 6-31G on rb` (Rb takes the spec’s basis def2-SVP)', ...titlesOn('rb').slice(0, 2), titlesOn('rb')[3]!],
    },
    // Without the line naming rb, the element line gives it 3-21G: removal first, then the spec's
    // own basis by renaming the line, then the others.
    {
      name: 'a line naming the atom over an element line: remove it, then the spec’s basis',
      basis: 'basis def2-svp\nbasis 3-21G on all Rb\nbasis 6-31G on rb',
      expected: 'basis def2-svp\nbasis 3-21G on all Rb\nstructure {',
      titles: ['Remove the override `basis 6-31G on rb` (Rb takes 3-21G)', 'Use the spec’s basis def2-SVP for Rb (basis def2-SVP on rb)', titlesOn('rb')[0]!, titlesOn('rb')[3]!],
    },
    // The line gives 6-31G to Cl as well, so it stays: the spec's own basis comes first, on a new
    // line that names rb (a second `all Rb` line would tie with it, a conflict).
    {
      name: 'a line that also gives its basis to other atoms: the spec’s basis first, on a new line',
      basis: 'basis def2-svp\nbasis 6-31G on all Rb all Cl',
      expected: 'basis def2-svp\nbasis 6-31G on all Rb all Cl\nbasis def2-SVP on rb\n',
      titles: ['Use the spec’s basis def2-SVP for Rb (basis def2-SVP on rb)', ...titlesOn('rb').slice(0, 2), titlesOn('rb')[3]!],
    },
  ];
  function titlesOn(target: string): string[] {
    return ['STO-3G', '3-21G', 'def2-SVP', 'def2-SVPD'].map((name) => `Use ${name} for Rb (basis ${name} on ${target})`);
  }
  for (const c of cases) {
    it(c.name, () => {
      const applied = fixes(`${c.basis}\n${RBCL}`, 'basis-missing-element');
      // The bases of the library that define Rb, in library order: STO-3G, 3-21G, def2-SVP, ...
      // (nwchem-data has Rb in these and not in 6-31G, cc-pVDZ or 6-311G**: tests/fixtures/basis-counts.nwchem.json).
      expect(applied.map((fix) => fix.action.title)).toEqual(c.titles);
      expect(applied[0]!.action.isPreferred).toBe(true);
      expect(applied[0]!.text.startsWith(c.expected)).toBe(true);
      for (const fix of applied) expectFixed(fix, 'basis-missing-element');
    });
  }
});

describe('active space that exceeds the qubit limit', () => {
  it('shrinks a given active space to the largest that fits', () => {
    // STO-3G water: O [2s1p] = 5 and H [1s] = 1 each (Hehre, Stewart, Pople, J. Chem. Phys. 51,
    // 2657 (1969)), 7 orbitals; 8 + 2 × 1 = 10 electrons. 8e 6o needs 2 × 6 = 12 qubits under
    // Jordan–Wigner; 8 qubits allow 4 orbitals.
    const text = `basis sto-3g\n${WATER}fragment w { atoms rest; tier quantum { method vqe; active 8e 6o } }\nlimits { qubits 8 }\n`;
    const [fix] = fixes(text, 'qubit-limit-exceeded');
    expect(fix!.action.title).toBe("Shrink the active space of 'w' to 8e 4o");
    expect(fix!.text).toContain('tier quantum { method vqe; active 8e 4o } }');
    expectFixed(fix!, 'qubit-limit-exceeded');
  });

  it('adds an active space where none is given', () => {
    // Frozen core on: 7 − 1 = 6 orbitals and 10 − 2 = 8 electrons outside O 1s (the noble-gas core,
    // common practice), 12 qubits; 6 qubits allow 3 orbitals.
    const text = `basis sto-3g\n${WATER}fragment w {\n  atoms rest\n  tier quantum { method vqe }\n}\nlimits { qubits 6 }\n`;
    const [fix] = fixes(text, 'qubit-limit-exceeded');
    expect(fix!.action.title).toBe("Shrink the active space of 'w' to 4e 3o");
    expect(fix!.text).toContain('tier quantum { active 4e 3o; method vqe }');
    expectFixed(fix!, 'qubit-limit-exceeded');
  });

  it('counts the parity mapping\'s two saved qubits', () => {
    // Parity with the two-qubit reduction needs 2n − 2 qubits (Bravyi, Gambetta, Mezzacapo,
    // Temme, arXiv:1701.08213 (2017)): 6 qubits allow 4 orbitals.
    const text = `basis sto-3g\n${WATER}fragment w { atoms rest; tier quantum { method vqe; mapping parity; active 8e 6o } }\nlimits { qubits 6 }\n`;
    const [fix] = fixes(text, 'qubit-limit-exceeded');
    expect(fix!.text).toContain('active 8e 4o');
    expectFixed(fix!, 'qubit-limit-exceeded');
  });
});

describe('length unit', () => {
  it('names bohr in the structure header for coordinates that look like bohr', () => {
    const [fix] = fixes(`basis sto-3g\n${WATER_IN_BOHR}${MEAN_FIELD}`, 'units-suspect');
    expect(fix!.action.title).toBe('Read the coordinates as bohr');
    expect(fix!.text.startsWith('basis sto-3g\nstructure in bohr {\n')).toBe(true);
    expectFixed(fix!, 'units-suspect');
  });

  it('replaces a header unit that does not fit the coordinates', () => {
    const [fix] = fixes(`basis sto-3g\n${WATER.replace('structure {', 'structure in bohr {')}${MEAN_FIELD}`, 'units-suspect');
    expect(fix!.action.title).toBe('Read the coordinates as angstrom');
    expect(fix!.text.startsWith('basis sto-3g\nstructure in angstrom {\n')).toBe(true);
    expectFixed(fix!, 'units-suspect');
  });
});

describe('diagnostics without a fix, and from elsewhere', () => {
  it('offers nothing for a diagnostic without fix data', () => {
    const analysis = analyzeDocument(`basis sto-3g\nstructure {\n  O o 0 0 0\n  H h 0 0 0.1\n}\n${MEAN_FIELD}`);
    const diagnostics = doValidation(analysis, URI).filter((d) => d.code === 'atoms-too-close');
    expect(diagnostics.length).toBe(1);
    expect(getCodeActions(analysis, URI, diagnostics)).toEqual([]);
  });

  it('ignores diagnostics another tool published', () => {
    const analysis = analyzeDocument(`multiplicity 2\nbasis sto-3g\n${WATER}${MEAN_FIELD}`);
    const own = doValidation(analysis, URI).find((d) => d.code === 'multiplicity-parity')!;
    const foreign: LspDiagnostic = { ...own, source: 'spell-checker' };
    expect(getCodeActions(analysis, URI, [foreign])).toEqual([]);
    expect(getCodeActions(analysis, URI, [own]).length).toBe(2); // multiplicity 1 or 3
  });
});

describe('symmetrize', () => {
  it('makes a nearly symmetric water exactly C2v, and the near-symmetry note goes', () => {
    // One H of water moved 0.02 Å: Cs at the 0.01 Å tolerance, C2v within about 0.01 Å.
    const text = 'basis sto-3g\nstructure {\n  O o 0.000000 0.000000 0.000000\n  H h1 0.000000 0.756950 0.585882\n  H h2 0.000000 -0.756950 0.605882\n}\n';
    const before = analyzeDocument(text);
    const note = before.diagnostics.find((d) => d.code === 'near-symmetry')!;
    expect(note.message).toContain('C2v within');
    const lsp = toLspDiagnostic(before, URI, note);
    const fix = getCodeActions(before, URI, [lsp]).find((action) => action.title === 'Symmetrize the geometry to C2v')!;
    const after = analyzeDocument(applyEdits(text, fix.edit!.changes![URI]!));
    expect(after.diagnostics.map((d) => d.code)).not.toContain('near-symmetry');
    expect(after.report().system.fullPointGroup).toBe('C2v');
    // The two O–H distances are equal again.
    const c = after.model.coordinates;
    const d1 = Math.hypot(c[3]! - c[0]!, c[4]! - c[1]!, c[5]! - c[2]!);
    const d2 = Math.hypot(c[6]! - c[0]!, c[7]! - c[1]!, c[8]! - c[2]!);
    expect(Math.abs(d1 - d2)).toBeLessThan(1e-4);
  });
});

describe('old spellings', () => {
  const OLD = `units bohr
basis sto-3g {
  H = 3-21G
}
geometry {
  O o 0 0 0
  H h1 0 1.430429 1.107157
  H h2 0 -1.430429 1.107157
}
fragment w { atoms within 2 of o; tier mean-field { method rhf } }
`;

  it('rewrites each old statement with one click, the preferred fix of its diagnostic', () => {
    const applied = fixes(OLD, 'retired-spelling');
    const single = applied.filter((fix) => fix.action.title !== 'Rewrite every old spelling in this file');
    expect(single.map((fix) => fix.action.title)).toEqual([
      'Move the unit into the structure header',
      'Rewrite as one-line basis statements',
      'Rewrite as `structure in bohr`',
      'Rewrite as `closer-than 2 to o`',
    ]);
    for (const fix of single) {
      expect(fix.action.isPreferred).toBe(true);
      // Each fix removes its own old statement and adds no other problem.
      expect(fix.after.filter((code) => code === 'retired-spelling').length).toBeLessThan(fix.before.filter((code) => code === 'retired-spelling').length);
      for (const after of fix.after) expect(fix.before).toContain(after);
    }
  });

  it('offers one action that rewrites every old spelling of the file', () => {
    const all = fixes(OLD, 'retired-spelling').filter((fix) => fix.action.title === 'Rewrite every old spelling in this file');
    // One per request, offered with each old statement's diagnostic.
    expect(all.length).toBeGreaterThan(0);
    expect(all[0]!.text).toBe(`basis sto-3g
basis 3-21G on all H
structure in bohr {
  O o 0 0 0
  H h1 0 1.430429 1.107157
  H h2 0 -1.430429 1.107157
}
fragment w { atoms closer-than 2 to o; tier mean-field { method rhf } }
`);
    expect(all[0]!.after).toEqual([]);
  });

  it('offers the file-wide rewrite once per request, however many old statements it covers', () => {
    const analysis = analyzeDocument(OLD);
    const diagnostics = doValidation(analysis, URI).filter((d) => d.code === 'retired-spelling');
    const actions = getCodeActions(analysis, URI, diagnostics);
    expect(actions.filter((action) => action.title === 'Rewrite every old spelling in this file')).toHaveLength(1);
  });
});
