/**
 * Completion: the keywords of the block at the cursor and no others, singleton keywords left out
 * once given, and after a keyword only the values it takes. Each case is spec text with a `$0`
 * cursor and the expected labels beside it.
 *
 * Geometries are invented test data. Atomic numbers and element names are those of the IUPAC
 * periodic table.
 */
import { describe, expect, it } from 'vitest';
import type { CompletionItem } from 'vscode-languageserver-types';
import { doComplete } from '../../server/src/services';
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
  const TOP = ['spec', 'charge', 'multiplicity', 'basis', 'functions', 'structure', 'frozen-core', 'fragment', 'caps', 'embedding', 'scan', 'limits', 'variant'];
  const cases: { block: string; text: string; expected: string[] }[] = [
    { block: 'top level of an empty spec', text: '$0', expected: TOP },
    // `basis` repeats (a main line and overrides), so it is offered after one.
    { block: 'top level', text: spec('$0\n', 'spec "t"'), expected: TOP.filter((k) => k !== 'spec' && k !== 'structure') },
    { block: 'fragment', text: spec('fragment f {\n  $0\n}\n'), expected: ['charge', 'multiplicity', 'atoms', 'tier', 'caps'] },
    { block: 'tier', text: spec('fragment f {\n  atoms rest\n  tier quantum {\n    $0\n  }\n}\n'), expected: ['frozen-core', 'method', 'ansatz', 'mapping', 'active', 'taper', 'layers'] },
    { block: 'limits', text: spec('limits {\n  $0\n}\n'), expected: ['qubits', 'memory', 'rate'] },
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
    expect(top).toEqual(['multiplicity', 'basis', 'frozen-core', 'fragment', 'caps', 'embedding', 'scan', 'limits', 'variant']);
    expect(labels(spec('fragment f {\n  atoms rest\n  charge 0\n  $0\n}\n'))).toEqual(['multiplicity', 'tier', 'caps']);
    expect(labels(spec('fragment f {\n  atoms rest\n  tier quantum {\n    method vqe\n    taper on\n    $0\n  }\n}\n'))).toEqual(['frozen-core', 'ansatz', 'mapping', 'active', 'layers']);
    expect(labels(spec('limits {\n  qubits 4\n  $0\n}\n'))).toEqual(['memory', 'rate']);
  });

  it('starts a new statement on the line after a closed block', () => {
    const after = (block: string) => labels(spec(`${block}\n$0\n`, 'spec "t"\nbasis def2-svp'));
    const expected = ['charge', 'multiplicity', 'basis', 'functions', 'frozen-core', 'fragment', 'caps', 'embedding', 'scan', 'limits', 'variant'];
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
    { name: 'the coordinate kind', text: scan('$0'), expected: ['distance'] },
    { name: 'the first atom', text: scan('distance $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the second atom', text: scan('distance zn $0'), expected: ['zn', 's', 'h1', 'h2'] },
    { name: 'the range keywords', text: scan('distance zn s $0'), expected: ['from', 'to', 'step', 'points'] },
    { name: 'the range keywords not yet given', text: scan('distance zn s from 2 to 3 $0'), expected: ['step', 'points'] },
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
