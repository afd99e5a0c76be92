/**
 * Completion: the keywords of the block at the cursor and no others, singleton keywords left out
 * once given, and after a keyword only the values it takes. Each case is spec text with a `$0`
 * cursor and the expected labels beside it.
 *
 * Geometries are invented test data. Atomic numbers and element names are those of the IUPAC
 * periodic table.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CompletionItemKind, InsertTextFormat, type CompletionItem, type MarkupContent } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import { doComplete } from '../../server/src/services';
import { ANSATZE, EMBEDDINGS, KEYWORDS, MAPPING_TERMS, METHODS } from '../../server/src/language/vocabulary';
import { marked } from './service';

function complete(text: string): CompletionItem[] {
  const m = marked(text);
  return doComplete(m.analysis, m.cursor).items;
}

function labels(text: string): string[] {
  return complete(text).map((item) => item.label);
}

/** Items in the order an editor shows them: by sortText, else by label. */
function ranked(items: readonly CompletionItem[]): CompletionItem[] {
  return [...items].sort((a, b) => (a.sortText ?? a.label).localeCompare(b.sortText ?? b.label));
}

/** A zinc site with a hydrogen sulfide: Zn, S and H. */
const GEOMETRY = `structure {
  Zn zn 0 0 0
  S  s  0 0 2.3
  H  h1 0.96 0 2.9
  H  h2 -0.96 0 2.9
}
`;

function spec(body: string, header = 'basis def2-svp'): string {
  return `${header}\n${GEOMETRY}${body}`;
}

describe('keywords valid at the cursor', () => {
  const TOP = ['spec', 'charge', 'multiplicity', 'basis', 'functions', 'structure', 'frozen-core', 'fragment', 'caps', 'accuracy', 'embedding', 'scan', 'limits', 'variant'];
  const cases: { block: string; text: string; expected: string[] }[] = [
    { block: 'top level of an empty spec', text: '$0', expected: TOP },
    // `basis` repeats (a main line and overrides), so it is offered after one.
    { block: 'top level', text: spec('$0\n', 'spec "t"'), expected: TOP.filter((k) => k !== 'spec' && k !== 'structure') },
    { block: 'fragment', text: spec('fragment f {\n  $0\n}\n'), expected: ['charge', 'multiplicity', 'atoms', 'tier', 'caps'] },
    { block: 'tier', text: spec('fragment f {\n  atoms rest\n  tier quantum {\n    $0\n  }\n}\n'), expected: ['frozen-core', 'method', 'ansatz', 'mapping', 'active', 'taper', 'layers', 'accuracy', 'steps'] },
    { block: 'limits', text: spec('limits {\n  $0\n}\n'), expected: ['qubits', 'memory', 'shot-rate', 'rate'] },
  ];
  for (const c of cases) {
    it(`${c.block}: exactly its own keywords`, () => {
      expect(labels(c.text)).toEqual(c.expected);
    });
  }

  it('structure block: element symbols, those in the file first, with name and Z', () => {
    const items = ranked(complete('basis sto-3g\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n  $0\n}\n'));
    expect(items.slice(0, 3).map((item) => item.label)).toEqual(['Zn', 'S', 'H']);
    const helium = items.find((item) => item.label === 'He');
    // Z(He) = 2 (IUPAC periodic table).
    expect(helium?.detail).toBe('Helium, Z = 2');
    expect(items.some((item) => item.label === 'Xe')).toBe(true);
    expect(items.some((item) => item.label === 'basis' || item.label === 'atoms')).toBe(false);
  });

  it('leaves out singleton keywords already given in the block, keeps `fragment`', () => {
    const top = labels(spec('functions cartesian\nfragment a { atoms rest; tier mean-field { method rhf } }\n$0\n', 'spec "t"\ncharge 0\nbasis def2-svp'));
    expect(top).toEqual(['multiplicity', 'basis', 'frozen-core', 'fragment', 'caps', 'accuracy', 'embedding', 'scan', 'limits', 'variant']);
    expect(labels(spec('fragment f {\n  atoms rest\n  charge 0\n  $0\n}\n'))).toEqual(['multiplicity', 'tier', 'caps']);
    expect(labels(spec('fragment f {\n  atoms rest\n  tier quantum {\n    method vqe\n    taper on\n    $0\n  }\n}\n'))).toEqual(['frozen-core', 'ansatz', 'mapping', 'active', 'layers', 'accuracy', 'steps']);
    expect(labels(spec('limits {\n  qubits 4\n  $0\n}\n'))).toEqual(['memory', 'shot-rate', 'rate']);
  });

  it('starts a new statement on the line after a closed block', () => {
    const after = (block: string) => labels(spec(`${block}\n$0\n`, 'spec "t"\nbasis def2-svp'));
    const expected = ['charge', 'multiplicity', 'basis', 'functions', 'frozen-core', 'fragment', 'caps', 'accuracy', 'embedding', 'scan', 'limits', 'variant'];
    expect(after('fragment a {\n  atoms rest\n  tier mean-field { method rhf }\n}')).toEqual(expected);
    expect(after('limits { qubits 4 }')).toEqual(expected.filter((k) => k !== 'limits'));
  });

  it('counts the keyword being typed as not yet given', () => {
    expect(labels(spec('fragment f {\n  atoms rest\n  ch$0\n}\n'))).toEqual(['charge', 'multiplicity', 'tier', 'caps']);
  });
});

describe('values after a keyword', () => {
  const FRAGMENT = (inner: string) => spec(`fragment f {\n  atoms rest\n  ${inner}\n}\n`);
  const cases: { name: string; text: string; expected: string[] }[] = [
    { name: 'the structure header', text: 'structure $0', expected: ['in', 'from'] },
    { name: 'the structure\'s unit', text: 'structure in $0', expected: ['angstrom', 'bohr'] },
    { name: '`with` after another spec\'s name', text: 'structure from "base.tess" $0', expected: ['with'] },
    { name: '`fragments` after `with`', text: 'structure from "base.tess" with $0', expected: ['fragments'] },
    { name: 'nothing after an XYZ file', text: 'structure from "atoms.xyz" $0', expected: [] },
    { name: 'functions', text: spec('functions $0\n'), expected: ['spherical', 'cartesian'] },
    { name: '`on` after the basis name', text: spec('basis def2-tzvp $0\n'), expected: ['on'] },
    { name: 'frozen-core', text: spec('frozen-core $0\n'), expected: ['on', 'off'] },
    { name: 'embedding', text: spec('embedding $0\n'), expected: ['dmet', 'projection', 'subtractive', 'none'] },
    { name: 'tier levels', text: FRAGMENT('tier $0'), expected: ['quantum', 'correlated', 'mean-field'] },
    { name: 'methods of a quantum tier', text: FRAGMENT('tier quantum { method $0 }'), expected: ['vqe', 'qpe'] },
    { name: 'methods of a correlated tier', text: FRAGMENT('tier correlated {\n    method $0\n  }'), expected: ['mp2', 'ccsd', 'ccsd(t)', 'casci', 'casscf', 'fci'] },
    { name: 'methods of a mean-field tier', text: FRAGMENT('tier mean-field { method $0 }'), expected: ['rhf', 'rohf', 'uhf', 'pbe', 'pbe0', 'b3lyp', 'tpss'] },
    { name: 'no methods for an unknown tier', text: FRAGMENT('tier classical { method $0 }'), expected: [] },
    { name: 'ansatz', text: FRAGMENT('tier quantum { ansatz $0 }'), expected: ['uccsd', 'k-upccgsd', 'hardware-efficient'] },
    { name: 'mappings', text: FRAGMENT('tier quantum { mapping $0 }'), expected: ['jordan-wigner', 'bravyi-kitaev', 'parity'] },
    { name: 'memory units after the amount', text: spec('limits { memory 16 $0 }\n'), expected: ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB', 'kB', 'KB', 'MB', 'GB', 'TB', 'PB'] },
    { name: 'nothing for the memory amount', text: spec('limits { memory $0 }\n'), expected: [] },
    { name: 'nothing in the coordinates of an atom line', text: 'basis sto-3g\nstructure {\n  Zn zn $0\n}\n', expected: [] },
  ];
  for (const c of cases) {
    it(c.name, () => {
      expect(labels(c.text)).toEqual(c.expected);
    });
  }
});

describe('atom selectors', () => {
  const LABELS = ['zn', 's', 'h1', 'h2'];
  it('offers the labels and the selector words after `atoms`', () => {
    const items = complete(spec('fragment f {\n  atoms $0\n}\n'));
    expect(items.map((item) => item.label)).toEqual([...LABELS, 'rest', 'all', 'closer-than']);
    expect(items[0]!.detail).toBe('atom #1 Zn');
  });

  it('offers the labels after other selectors', () => {
    expect(labels(spec('fragment f {\n  atoms zn all H $0\n}\n'))).toEqual([...LABELS, 'rest', 'all', 'closer-than']);
  });

  it('offers only the labels after `closer-than 2 to`', () => {
    expect(labels(spec('fragment f {\n  atoms closer-than 2 to $0\n}\n'))).toEqual(LABELS);
  });

  it('offers `to` after `closer-than 2`, and nothing after `closer-than`', () => {
    expect(labels(spec('fragment f {\n  atoms closer-than 2 $0\n}\n'))).toEqual(['to']);
    expect(labels(spec('fragment f {\n  atoms closer-than $0\n}\n'))).toEqual([]);
  });

  it('offers labels, `all`, `closer-than` and `fragment` (not `rest`) after `on` in a basis line', () => {
    expect(labels(spec('basis def2-tzvp on $0\n'))).toEqual([...LABELS, 'all', 'closer-than', 'fragment']);
    expect(labels(spec('basis def2-tzvp on all $0\n'))).toEqual(['Zn', 'S', 'H']);
  });

  it('offers the fragment names after `on fragment`', () => {
    const text = spec('fragment site { atoms zn; tier quantum { method vqe } }\nfragment guest { atoms rest; tier mean-field { method rhf } }\nbasis sto-3g on fragment $0\n');
    expect(labels(text)).toEqual(['site', 'guest']);
  });

  it('offers the elements of the file after `all`', () => {
    expect(labels(spec('fragment f {\n  atoms all $0\n}\n'))).toEqual(['Zn', 'S', 'H']);
  });
});

describe('multiplicities valid for the electron count', () => {
  // Valid 2S+1: 2S ≤ N and N − 2S even (spin algebra; common practice, no source), at most 9 offered.
  it('for the system: Zn + S + 2 H = 30 + 16 + 2 = 48 electrons', () => {
    expect(labels(spec('multiplicity $0\n'))).toEqual(['1', '3', '5', '7', '9']);
  });

  it('for the system with a charge: 48 − 1 = 47 electrons', () => {
    expect(labels(spec('charge +1\nmultiplicity $0\n'))).toEqual(['2', '4', '6', '8']);
  });

  it('for a fragment of one hydrogen atom: 1 electron', () => {
    expect(labels(spec('fragment f {\n  atoms h1\n  multiplicity $0\n}\n'))).toEqual(['2']);
  });

  it('for a fragment of two hydrogen atoms: 2 electrons', () => {
    expect(labels(spec('fragment f {\n  atoms h1 h2\n  multiplicity $0\n}\n'))).toEqual(['1', '3']);
  });

  it('for a charged fragment: SH⁻, 16 + 1 + 1 = 18 electrons', () => {
    expect(labels(spec('fragment f {\n  atoms s h1\n  charge -1\n  multiplicity $0\n}\n'))).toEqual(['1', '3', '5', '7', '9']);
  });
});

describe('scan', () => {
  const scan = (rest: string) => spec(`fragment f { atoms rest; tier mean-field { method rhf } }\nscan ${rest}\n`);
  const cases: { name: string; text: string; expected: string[] }[] = [
    { name: 'the coordinate kind', text: scan('$0'), expected: ['distance', 'angle', 'dihedral'] },
    { name: 'the first atom', text: scan('distance $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the second atom', text: scan('distance zn $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the range keywords', text: scan('distance zn s $0'), expected: ['from', 'to', 'step', 'points', 'moving'] },
    { name: 'the range keywords not yet given', text: scan('distance zn s from 2 to 3 $0'), expected: ['step', 'points', 'moving'] },
    { name: 'no `points` once a step is given', text: scan('distance zn s from 2 to 3 step 0.5 $0'), expected: ['moving'] },
    { name: 'the atoms after `moving`, then the clauses left', text: scan('distance zn s from 2 to 3 step 0.5 moving $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the third atom of an angle', text: scan('angle h1 s $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the fourth atom of a dihedral', text: scan('dihedral h1 s zn $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the range keywords after a dihedral\'s four atoms', text: scan('dihedral h1 s zn h2 $0'), expected: ['from', 'to', 'step', 'points', 'moving'] },
    { name: 'more moving atoms, or the range', text: scan('angle h1 s h2 moving h2 $0'), expected: ['zn', 's', 'h1', 'h2', 'from', 'to', 'step', 'points'] },
    { name: 'nothing where a number belongs', text: scan('distance zn s from $0'), expected: [] },
  ];
  for (const c of cases) {
    it(c.name, () => {
      expect(labels(c.text)).toEqual(c.expected);
    });
  }
});

describe('basis names ranked by coverage of the file\'s elements', () => {
  /** Zn, S and H: every basis of the library that defines Zn defines S and H too. */
  function basisRanking(text: string): { covering: string[]; lacking: Map<string, string> } {
    const items = ranked(complete(text));
    const covering: string[] = [];
    const lacking = new Map<string, string>();
    let seenLacking = false;
    for (const item of items) {
      if (item.detail?.startsWith('lacks ')) {
        seenLacking = true;
        lacking.set(item.label, item.detail);
      } else {
        expect(seenLacking, `${item.label} covers every element but is ranked after one that does not`).toBe(false);
        covering.push(item.label);
      }
    }
    return { covering, lacking };
  }

  it('puts the bases that define Zn, S and H first; one without Zn goes down and says so', () => {
    const { covering, lacking } = basisRanking(`basis $0\n${GEOMETRY}`);
    // cc-pVDZ and def2-SVP define Zn; 6-311G** and 6-31+G* do not (nwchem-data agrees:
    // tests/fixtures/basis-counts.nwchem.json has no Zn entry for either).
    expect(covering).toContain('cc-pVDZ');
    expect(covering).toContain('def2-SVP');
    expect(lacking.get('6-311G**')).toBe('lacks Zn');
    expect(lacking.get('6-31+G*')).toBe('lacks Zn');
  });

  it('pushes cc-pVDZ down once an element it lacks is present', () => {
    // cc-pVDZ stops at Kr: no Rb (Z = 37) in nwchem-data or psi4-data; def2-SVP defines it.
    const { covering, lacking } = basisRanking(`basis $0\n${GEOMETRY.replace('}', '  Rb rb 5 5 5\n}')}`);
    expect(lacking.get('cc-pVDZ')).toBe('lacks Rb');
    expect(covering).toContain('def2-SVP');
    expect(covering).not.toContain('cc-pVDZ');
  });

  it('ranks an override\'s basis by the elements of the atoms it selects', () => {
    // The override selects only the hydrogens: a basis that lacks Zn is no worse here.
    const forHydrogen = basisRanking(`basis sto-3g\nbasis 6$0 on all H\n${GEOMETRY}`);
    expect(forHydrogen.covering).toContain('6-31++G**');
    const forZinc = basisRanking(`basis sto-3g\nbasis d$0 on zn\n${GEOMETRY}`);
    expect(forZinc.covering).toContain('def2-TZVP');
    expect(forZinc.lacking.get('6-31++G**')).toBe('lacks Zn');
  });
});

describe('textEdit replaces the word being typed', () => {
  const cases: { name: string; text: string; pick: string }[] = [
    { name: 'a basis name', text: `basis ⟦6-31$0⟧\n${GEOMETRY}`, pick: '6-31G*' },
    { name: 'a method', text: spec('fragment f {\n  atoms rest\n  tier correlated { method ⟦cc$0⟧ }\n}\n'), pick: 'ccsd(t)' },
    { name: 'a keyword', text: spec('fragment f {\n  ⟦ato$0⟧\n}\n'), pick: 'atoms' },
    { name: 'a label', text: spec('fragment f {\n  atoms zn ⟦h$0⟧\n}\n'), pick: 'h2' },
    { name: 'a multiplicity', text: spec('multiplicity ⟦1$0⟧\n'), pick: '3' },
  ];
  for (const c of cases) {
    it(c.name, () => {
      const m = marked(c.text);
      const item = doComplete(m.analysis, m.cursor).items.find((candidate) => candidate.label === c.pick);
      expect(item?.textEdit).toEqual({ range: m.ranges[0], newText: c.pick });
    });
  }

  it('replaces the element being typed after `all` in a basis line', () => {
    const m = marked(spec('basis def2-tzvp on all ⟦Z$0⟧\n'));
    const item = doComplete(m.analysis, m.cursor).items.find((candidate) => candidate.label === 'Zn');
    expect(item?.textEdit).toEqual({ range: m.ranges[0], newText: 'Zn' });
  });

  it('carries no textEdit when nothing is typed yet', () => {
    const items = complete(spec('fragment f {\n  atoms rest\n  tier quantum { mapping $0 }\n}\n'));
    expect(items.length).toBe(3);
    expect(items.every((item) => item.textEdit === undefined)).toBe(true);
  });
});

describe('accepting a completion does not glue words together', () => {
  const SAMPLE = path.resolve(__dirname, '../../samples/zn-site-h2s-scan.tess');
  const text = readFileSync(SAMPLE, 'utf8');
  const analysis = analyzeDocument(text, { path: SAMPLE });

  it('every textEdit replaces only the word at the cursor, on the cursor’s line (at the end of every word of a sample)', () => {
    let edits = 0;
    for (const match of text.matchAll(/[A-Za-z0-9_.#*()+-]+/g)) {
      const end = match.index! + match[0].length;
      const cursor = analysis.lines.positionAt(end);
      for (const item of doComplete(analysis, cursor).items) {
        const edit = item.textEdit;
        if (!edit || !('range' in edit)) continue;
        edits++;
        const { start, end: stop } = edit.range;
        expect(start.line).toBe(cursor.line);
        expect(stop.line).toBe(cursor.line);
        expect(start.character).toBeLessThanOrEqual(cursor.character);
        expect(stop.character).toBeGreaterThanOrEqual(cursor.character);
        const replaced = text.slice(analysis.lines.offsetAt(start), analysis.lines.offsetAt(stop));
        expect(replaced).not.toMatch(/\s/);
      }
    }
    expect(edits).toBeGreaterThan(100);
  });

  it('a space typed where a statement starts (indentation) opens no list, so Enter then makes a new line', () => {
    const m = marked(spec('fragment f {\n  atoms rest\n   $0\n}\n'));
    expect(doComplete(m.analysis, m.cursor, { triggerCharacter: ' ' }).items).toEqual([]);
    // Asked for (Ctrl+Space), the same place offers the block's keywords.
    expect(doComplete(m.analysis, m.cursor).items.map((item) => item.label)).toContain('tier');
    // After a keyword, a space still opens its values.
    const after = marked(spec('fragment f {\n  atoms rest\n  tier quantum { mapping $0 }\n}\n'));
    expect(doComplete(after.analysis, after.cursor, { triggerCharacter: ' ' }).items).toHaveLength(3);
  });

  it('in VS Code, Enter ends the line and Tab accepts (the language default in the manifest)', () => {
    // Enter accepting a suggestion that only repeats or recases the word typed (`def2-svp` →
    // `def2-SVP`) leaves the cursor on that line, and the next statement is typed onto it.
    const manifest = JSON.parse(readFileSync(path.resolve(__dirname, '../../package.json'), 'utf8'));
    expect(manifest.contributes.configurationDefaults['[tessera]']['editor.acceptSuggestionOnEnter']).toBe('off');
  });
});

describe('snippets only where a statement starts', () => {
  const withSnippets = (text: string) => {
    const m = marked(text);
    return doComplete(m.analysis, m.cursor, { snippets: true }).items.filter((item) => item.kind === CompletionItemKind.Snippet);
  };

  it('a new spec and a new fragment in an empty file', () => {
    expect(withSnippets('$0').map((item) => item.label)).toEqual(['new spec', 'new fragment']);
    expect(withSnippets('fr$0').map((item) => item.label)).toEqual(['new spec', 'new fragment']);
  });

  it('a new fragment (not a new spec) at the start of a top-level line of a spec', () => {
    expect(withSnippets(spec('$0\n')).map((item) => item.label)).toEqual(['new fragment']);
    expect(withSnippets(spec('  frag$0\n')).map((item) => item.label)).toEqual(['new fragment']);
  });

  it('none after other text on the line, in a value position, inside a block, or for an editor without snippets', () => {
    expect(withSnippets(spec('charge 0; $0\n'))).toEqual([]);
    expect(withSnippets(spec('basis $0\n'))).toEqual([]);
    expect(withSnippets(spec('basis def2-svp on $0\n'))).toEqual([]);
    expect(withSnippets(spec('fragment f {\n  $0\n}\n'))).toEqual([]);
    expect(withSnippets(spec('fragment f {\n  atoms rest\n  tier quantum {\n    $0\n  }\n}\n'))).toEqual([]);
    expect(withSnippets(spec('limits {\n  $0\n}\n'))).toEqual([]);
    const m = marked('$0');
    expect(doComplete(m.analysis, m.cursor).items.some((item) => item.kind === CompletionItemKind.Snippet)).toBe(false);
  });

  it('expand, with their defaults, to text the language reads without a syntax or vocabulary error', () => {
    for (const item of withSnippets('$0')) {
      expect(item.insertTextFormat).toBe(InsertTextFormat.Snippet);
      const expanded = item.insertText!.replace(/\$\{\d+\|([^,|]*)[^}]*\}/g, '$1').replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\d+/g, '');
      const text = item.label === 'new fragment' ? spec(expanded) : expanded;
      const codes = analyzeDocument(text).diagnostics.map((d) => d.code);
      expect(codes.filter((code) => /^(unknown|syntax|unexpected|missing-value|misplaced)/.test(code)), `${item.label}:\n${text}`).toEqual([]);
    }
  });
});

describe('documentation for every word offered', () => {
  const documentation = (item: CompletionItem): string => (typeof item.documentation === 'string' ? item.documentation : ((item.documentation as MarkupContent | undefined)?.value ?? ''));
  /** Places that offer keywords and the vocabulary's words: every block, every tier, every keyword's values. */
  const places = [
    '$0',
    spec('$0\n'),
    spec('fragment f {\n  $0\n}\n'),
    spec('limits {\n  $0\n}\n'),
    spec('variant v {\n  $0\n}\n'),
    ...['quantum', 'correlated', 'mean-field'].flatMap((level) => [spec(`fragment f {\n  atoms rest\n  tier ${level} {\n    $0\n  }\n}\n`), spec(`fragment f {\n  atoms rest\n  tier ${level} { method $0 }\n}\n`)]),
    spec('fragment f {\n  atoms rest\n  tier $0\n}\n'),
    spec('fragment f {\n  atoms rest\n  tier quantum { ansatz $0 }\n}\n'),
    spec('fragment f {\n  atoms rest\n  tier quantum { mapping $0 }\n}\n'),
    spec('fragment f {\n  atoms rest\n  tier quantum { active $0 }\n}\n'),
    spec('fragment f {\n  atoms rest\n  tier quantum { taper $0 }\n}\n'),
    spec('embedding $0\n'),
    spec('functions $0\n'),
    spec('caps $0\n'),
    spec('accuracy 1 $0\n'),
    spec('structure $0\n'),
    spec('basis def2-svp on $0\n'),
    spec('basis def2-svp $0\n'),
    spec('fragment f { atoms $0 }\n'),
    spec('fragment f { atoms rest; tier mean-field { method rhf } }\nscan $0\n'),
    spec('fragment f { atoms rest; tier mean-field { method rhf } }\nscan distance zn s $0\n'),
  ];

  it('every keyword, method, embedding and other word of the vocabulary offered has documentation', () => {
    let seen = 0;
    for (const place of places) {
      for (const item of complete(place)) {
        if (item.kind !== CompletionItemKind.Keyword && item.kind !== CompletionItemKind.EnumMember && item.kind !== CompletionItemKind.Unit) continue;
        seen++;
        expect(documentation(item).trim(), `'${item.label}' at ${JSON.stringify(place.slice(-60))}`).not.toBe('');
      }
    }
    expect(seen).toBeGreaterThan(80);
  });

  it('takes it from the vocabulary table: summary, scaling and reference of each method; syntax and summary of each keyword', () => {
    // The first offer of each word (a keyword first offered where it starts a statement, before
    // `fragment` after `on` in a basis line, which is a word of another table).
    const offered = new Map<string, CompletionItem>();
    for (const place of places) for (const item of complete(place)) if (!offered.has(`${item.kind}:${item.label}`)) offered.set(`${item.kind}:${item.label}`, item);
    for (const method of METHODS) {
      const item = offered.get(`${CompletionItemKind.EnumMember}:${method.name}`);
      expect(item, `method ${method.name} offered`).toBeDefined();
      const doc = documentation(item!);
      expect(doc).toContain(method.summary);
      if (method.scaling) expect(doc).toContain(method.scaling);
      if (method.reference) expect(doc).toContain(method.reference);
    }
    for (const term of [...EMBEDDINGS, ...ANSATZE, ...MAPPING_TERMS]) expect(documentation(offered.get(`${CompletionItemKind.EnumMember}:${term.name}`)!)).toContain(term.summary);
    for (const keyword of KEYWORDS) {
      const item = offered.get(`${CompletionItemKind.Keyword}:${keyword.name}`);
      expect(item, `keyword ${keyword.name} offered somewhere`).toBeDefined();
      expect(documentation(item!)).toContain(keyword.summary);
    }
  });
});
