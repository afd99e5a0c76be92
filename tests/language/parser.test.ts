/**
 * The spec language reads every construct it documents, gives every node its exact span, and
 * recovers from mistakes so that the rest of the file is still analysed.
 *
 * Geometries here are invented test data unless a comment names a source.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/language/analyze';
import type { SelectorAst } from '../../server/src/language/ast';
import { tokenize } from '../../server/src/language/lexer';
import { parseSpec } from '../../server/src/language/parser';
import { analyzeMarked, codes, expectDiagnostics, memoryFiles, parseMarkers, show } from './fixture';

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
const BOHR = 0.529177210903;

/**
 * Water at the experimental equilibrium structure, r(OH) = 0.9572 Å, HOH = 104.52° (Hoy & Bunker,
 * J. Mol. Spectrosc. 74, 1 (1979)), placed as in tests/fixtures/water.ts, in ångström.
 */
const WATER = `  O  o   0.000000  0.000000  0.000000
  H  h1  0.000000  0.756950  0.585882
  H  h2  0.000000 -0.756950  0.585882`;

function errorsOf(text: string, options = {}): string[] {
  const analysis = analyze(text, options);
  return analysis.diagnostics.filter((d) => d.severity === 'error').map((d) => show(analysis, d));
}

describe('fixture markers', () => {
  it('strips range and cursor markers and reports offsets in the stripped text', () => {
    const marked = parseMarkers('ab⟦cd⟧e$0f⟦g⟧');
    expect(marked.text).toBe('abcdefg');
    expect(marked.ranges).toEqual([
      { start: 2, end: 4 },
      { start: 6, end: 7 },
    ]);
    expect(marked.cursor).toBe(5);
  });

  it('rejects unbalanced markers', () => {
    expect(() => parseMarkers('a⟦b')).toThrow(/never closed/);
    expect(() => parseMarkers('a⟧b')).toThrow(/without/);
    expect(() => parseMarkers('⟦a⟦b⟧⟧')).toThrow(/nested/);
  });

  it('codes() lists the codes in position order', () => {
    // missing-geometry sits on the first statement's keyword, before the unknown function type.
    expect(codes('functions pure\nbasis sto-3g')).toEqual(['missing-geometry', 'unknown-value']);
  });
});

describe('tokens', () => {
  function tokens(text: string): string[] {
    const lexed = tokenize(text);
    expect(lexed.errors).toEqual([]);
    return lexed.tokens.filter((t) => t.tokenType.name !== 'Newline').map((t) => `${t.tokenType.name}:${t.image}`);
  }

  it('reads basis and method names with digits, signs, stars and parentheses as one word', () => {
    expect(tokens('6-31+G* 6-31G(d,p) 6-311++G** def2-TZVP ccsd(t) aug-cc-pVDZ k-upccgsd')).toEqual([
      'Word:6-31+G*',
      'Word:6-31G(d,p)',
      'Word:6-311++G**',
      'Word:def2-TZVP',
      'Word:ccsd(t)',
      'Word:aug-cc-pVDZ',
      'Word:k-upccgsd',
    ]);
  });

  it('tells active-space counts from numbers in scientific notation', () => {
    expect(tokens('6e 6o 6e-1 1.5E+2 -7.5e-1 2.0E0 12e 0o')).toEqual([
      'ElectronCount:6e',
      'OrbitalCount:6o',
      'NumberLiteral:6e-1',
      'NumberLiteral:1.5E+2',
      'NumberLiteral:-7.5e-1',
      'NumberLiteral:2.0E0',
      'ElectronCount:12e',
      'OrbitalCount:0o',
    ]);
  });

  it('tells #index from comments', () => {
    const lexed = tokenize('atoms #3 #3..#9 # 3 is a comment\n#comment too\n');
    expect(lexed.tokens.map((t) => `${t.tokenType.name}:${t.image}`)).toEqual([
      'Word:atoms',
      'IndexRef:#3',
      'IndexRef:#3',
      'RangeDots:..',
      'IndexRef:#9',
      'Newline:\n',
      'Newline:\n',
    ]);
    expect(lexed.comments.map((t) => t.image)).toEqual(['# 3 is a comment', '#comment too']);
  });

  it('splits label ranges and keeps decimals whole', () => {
    expect(tokens('n1..n4 closer-than 3.0 to zn 16GiB')).toEqual([
      'Word:n1',
      'RangeDots:..',
      'Word:n4',
      'Word:closer-than',
      'NumberLiteral:3.0',
      'Word:to',
      'Word:zn',
      'Word:16GiB',
    ]);
  });
});

describe('every construct parses', () => {
  // Invented data: a zinc ion between two waters 3 Å away (too far for bonds to it).
  const TOUR = `# A tour of the language.
spec "tour"
charge +2
multiplicity 1
frozen-core on
basis def2-SVP
basis def2-TZVP on all Zn
basis 6-31G* on fragment left
basis cc-pVDZ on o2 #6..#7
functions spherical
structure in angstrom {
  Zn zn   0.0000  0.0000  0.0000
  O  o1   3.0000  0.0000  0.0000
  H       3.6000  0.7500  0.0000
  H       3.6000 -0.7500  0.0000
  O  o2  -3.0E0   0.0000  0.0000
  H      -3.6000  0.7500  0.0000
  H      -3.6000 -7.5e-1  0.0000
}
fragment metal {
  atoms zn closer-than 1.0 to zn
  charge +2
  multiplicity 1
  tier quantum { method vqe; ansatz k-upccgsd; mapping bravyi-kitaev; active 6e 6o; frozen-core on; taper on; layers 2 }
}
fragment left {
  atoms o1..#4
  tier correlated { method ccsd(t) }
}
fragment right
{
  atoms #5..#7
  tier mean-field
  {
    method rhf
  }
}
embedding dmet
scan distance zn o2 from 2.6 to 3.4 step 0.2
limits {
  qubits 24
  memory 16 GiB
}
`;
  const tour = analyze(TOUR);

  it('has no diagnostics at all', () => {
    expect(tour.diagnostics.map((d) => show(tour, d))).toEqual([]);
    expect(tour.tree.problems).toEqual([]);
  });

  it('reads the header statements', () => {
    const { ast, model } = tour;
    expect(ast.name?.value).toBe('tour');
    expect(ast.geometry?.unit?.value).toBe('angstrom');
    expect(model.units).toBe('angstrom');
    expect(ast.charge?.value).toBe(2);
    expect(ast.multiplicity?.value).toBe(1);
    expect(ast.frozenCore?.value).toBe(true);
    expect(ast.embedding?.value).toBe('dmet');
    expect(model.name).toBe('tour');
    expect(model.charge).toBe(2);
    expect(model.embedding).toBe('dmet');
  });

  it('reads the main basis, override lines for an element, a fragment and atoms, and the function type', () => {
    const { ast, model } = tour;
    expect(ast.basis?.name?.value).toBe('def2-SVP');
    expect(ast.basisOverrides.map((line) => [line.name?.value, line.targets.map((t) => t.kind)])).toEqual([
      ['def2-TZVP', ['element']],
      ['6-31G*', ['fragment']],
      ['cc-pVDZ', ['label', 'range']],
    ]);
    expect(ast.functions?.value).toBe('spherical');
    expect(model.basis.main?.displayName).toBe('def2-SVP');
    // zn by its element; o1 and its hydrogens by their fragment; o2 and #6..#7 by name.
    expect(model.basis.atomSets.map((set) => set?.displayName)).toEqual(['def2-TZVP', '6-31G*', '6-31G*', '6-31G*', 'cc-pVDZ', 'cc-pVDZ', 'cc-pVDZ']);
    expect([...model.basis.decidedBy]).toEqual([0, 1, 1, 1, 2, 2, 2]);
    expect(model.basis.functionsGiven).toBe(true);
  });

  it('reads labelled and unlabelled atoms with scientific-notation coordinates', () => {
    const { ast, model } = tour;
    const atoms = ast.geometry!.atoms;
    const each = <T>(read: (i: number) => T): T[] => Array.from({ length: atoms.length }, (_, i) => read(i));
    expect(each((i) => atoms.symbol(i))).toEqual(['Zn', 'O', 'H', 'H', 'O', 'H', 'H']);
    expect(each((i) => atoms.label(i))).toEqual(['zn', 'o1', undefined, undefined, 'o2', undefined, undefined]);
    expect([0, 1, 2].map((axis) => atoms.coordinate(4, axis))).toEqual([-3, 0, 0]);
    expect([0, 1, 2].map((axis) => atoms.coordinate(6, axis))).toEqual([-3.6, -0.75, 0]);
    expect(Array.from(model.coordinates.slice(18, 21))).toEqual([-3.6, -0.75, 0]);
    expect([...model.labels.entries()]).toEqual([
      ['zn', 0],
      ['o1', 1],
      ['o2', 4],
    ]);
  });

  it('reads fragments: selectors, charge, multiplicity and tiers in one-line and multi-line blocks', () => {
    const { model } = tour;
    expect(model.fragments.map((f) => [f.name, f.atoms])).toEqual([
      ['metal', [0]],
      ['left', [1, 2, 3]],
      ['right', [4, 5, 6]],
    ]);
    const [metal, left, right] = model.fragments;
    expect(metal!.charge).toBe(2);
    expect(metal!.chargeGiven).toBe(true);
    expect(metal!.multiplicity).toBe(1);
    expect(metal!.tier).toMatchObject({
      level: 'quantum',
      method: 'vqe',
      ansatz: 'k-upccgsd',
      mapping: 'bravyi-kitaev',
      active: { electrons: 6, orbitals: 6 },
      frozenCore: true,
      taper: true,
      layers: 2,
    });
    expect(left!.tier).toMatchObject({ level: 'correlated', method: 'ccsd(t)', methodGiven: true });
    expect(right!.tier).toMatchObject({ level: 'mean-field', method: 'rhf' });
  });

  it('reads the scan and the limits', () => {
    const { model } = tour;
    expect(model.scan?.first).toBe(0);
    expect(model.scan?.second).toBe(4);
    expect(model.scan?.values).toEqual([2.6, 2.8, 3, 3.2, 3.4]);
    expect(model.limits).toEqual({ qubits: 24, qubitsFromSpec: true, memoryBytes: 16 * 1024 ** 3 });
  });

  it('reads `scan ... points n` as n evenly spaced distances', () => {
    const analysis = analyze(TOUR.replace('step 0.2', 'points 3'));
    expect(analysis.ast.scan?.points?.value).toBe(3);
    expect(analysis.model.scan?.values).toEqual([2.6, 3, 3.4]);
    expect(analysis.diagnostics).toEqual([]);
  });

  it('reads a memory size written as one word', () => {
    const analysis = analyze(TOUR.replace('memory 16 GiB', 'memory 512MiB'));
    expect(analysis.model.limits.memoryBytes).toBe(512 * 1024 ** 2);
    expect(analysis.diagnostics).toEqual([]);
  });
});

describe('single constructs', () => {
  const water = (rest: string, header = 'basis sto-3g') => `${header}\nstructure {\n${WATER}\n}\n${rest}\n`;

  it('reads a geometry without labels', () => {
    const analysis = analyze('basis sto-3g\nstructure {\n  H 0 0 0\n  H 0 0 0.74\n}\nfragment h2 { atoms #1..#2; tier mean-field { method rhf } }\n');
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.atoms.map((a) => [a.element.symbol, a.label])).toEqual([
      ['H', undefined],
      ['H', undefined],
    ]);
    expect(Array.from(analysis.model.coordinates)).toEqual([0, 0, 0, 0, 0, 0.74]);
  });

  it('reads `structure from "file.xyz"` relative to the spec folder', () => {
    const files = memoryFiles({ '/work/specs/data/water.xyz': '3\nwater\nO 0 0 0\nH 0 0.756950 0.585882\nH 0 -0.756950 0.585882\n' });
    const analysis = analyze('basis sto-3g\nstructure from "data/water.xyz"\nfragment w { atoms rest; tier mean-field { method rhf } }\n', {
      path: '/work/specs/water.tess',
      files,
    });
    expect(analysis.diagnostics.map((d) => show(analysis, d))).toEqual([]);
    expect(analysis.ast.geometry?.include?.value).toBe('data/water.xyz');
    expect(analysis.model.includes).toEqual(['/work/specs/data/water.xyz']);
    expect(analysis.model.atoms.map((a) => a.element.symbol)).toEqual(['O', 'H', 'H']);
    expect(analysis.model.atoms[1]!.source).toEqual({ file: '/work/specs/data/water.xyz', line: 3 });
    expect(analysis.model.fragments[0]!.atoms).toEqual([0, 1, 2]);
  });

  it('converts coordinates given in bohr to ångström', () => {
    const analysis = analyze('basis sto-3g\nstructure in bohr {\n  H a 0 0 0\n  H b 0 0 1.4\n}\nfragment h2 { atoms a b; tier mean-field { method rhf } }\n');
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.units).toBe('bohr');
    expect(analysis.model.coordinates[5]).toBeCloseTo(1.4 * BOHR, 12);
  });

  it('reads the basis names people write: 6-31+G*, 6-31G(d,p), ccpvdz, def2svp', () => {
    // 6-31G(d,p) is the same basis as 6-31G** (common practice, no source).
    const cases: [string, string][] = [
      ['6-31+G*', '6-31+G*'],
      ['6-31G(d,p)', '6-31G**'],
      ['6-31G(d)', '6-31G*'],
      ['ccpvdz', 'cc-pVDZ'],
      ['def2svp', 'def2-SVP'],
      ['STO-3G', 'STO-3G'],
    ];
    for (const [written, canonical] of cases) {
      const analysis = analyze(water('fragment w { atoms rest; tier mean-field { method rhf } }', `basis ${written}`));
      expect(analysis.ast.basis?.name?.value, written).toBe(written);
      expect(analysis.model.basis.main?.displayName, written).toBe(canonical);
      expect(errorsOf(analysis.text), written).toEqual([]);
    }
  });

  it('reads every tier level and method name, including ccsd(t)', () => {
    const analysis = analyze(
      water(`fragment a { atoms o; charge -2; tier correlated { method ccsd(t) } }
fragment b { atoms h1; charge +1; tier mean-field { method uhf } }
fragment c { atoms h2; charge +1; tier quantum { method qpe; mapping parity } }`),
    );
    expect(analysis.model.fragments.map((f) => [f.tier?.level, f.tier?.method, f.tier?.mapping])).toEqual([
      ['correlated', 'ccsd(t)', undefined],
      ['mean-field', 'uhf', undefined],
      ['quantum', 'qpe', 'parity'],
    ]);
    expect(errorsOf(analysis.text)).toEqual([]);
  });

  it('fills tier defaults: vqe with uccsd and jordan-wigner, ccsd, rhf/rohf', () => {
    const analysis = analyze(
      water(`fragment a { atoms o h1; charge -1; tier quantum { } }
fragment b { atoms h2; charge +1; tier correlated { } }`),
    );
    const [a, b] = analysis.model.fragments;
    expect(a!.tier).toMatchObject({ method: 'vqe', methodGiven: false, ansatz: 'uccsd', mapping: 'jordan-wigner', taper: false, layers: 1, frozenCore: true });
    expect(b!.tier).toMatchObject({ method: 'ccsd', ansatz: undefined, mapping: undefined });
    const open = analyze(water('fragment w { atoms rest; charge +1; multiplicity 2; tier mean-field { } }', 'basis sto-3g\ncharge +1\nmultiplicity 2'));
    expect(open.model.fragments[0]!.tier?.method).toBe('rohf');
  });

  it('accepts `frozen-core off` at the top and in a tier', () => {
    const analysis = analyze(water('fragment w { atoms rest; tier quantum { frozen-core off; active 4e 4o } }', 'basis sto-3g\nfrozen-core off'));
    expect(analysis.model.frozenCore).toBe(false);
    expect(analysis.model.fragments[0]!.tier?.frozenCore).toBe(false);
    expect(errorsOf(analysis.text)).toEqual([]);
  });

  it('accepts every embedding and both units', () => {
    for (const embedding of ['dmet', 'projection', 'subtractive', 'none']) {
      const analysis = analyze(water(`fragment w { atoms rest; tier mean-field { } }\nembedding ${embedding}`));
      expect(analysis.model.embedding).toBe(embedding);
      expect(analysis.diagnostics).toEqual([]);
    }
  });

  describe('atom selectors', () => {
    // Invented chain along x: atoms 1 Å apart, far enough that no two clash.
    const CHAIN = `basis sto-3g
structure {
  C  c1  0 0 0
  C  c2  1.5 0 0
  C  c3  3.0 0 0
  H  h1  4.0 0 0
  H      -1.0 0 0
  O  o   6.0 0 0
}`;
    const cases: [string, number[]][] = [
      ['c2', [1]],
      ['c1 c3', [0, 2]],
      ['c1..c3', [0, 1, 2]],
      ['#3', [2]],
      ['#2..#4', [1, 2, 3]],
      ['c2..#5', [1, 2, 3, 4]],
      ['all H', [3, 4]],
      ['all C', [0, 1, 2]],
      ['closer-than 1.6 to c2', [0, 1, 2]],
      // Strictly closer: the neighbours 1.5 Å away are not selected at 1.5.
      ['closer-than 1.5 to c2', [1]],
      ['closer-than 0.5 to o', [5]],
      ['closer-than 0 to o', []],
      ['c1 c1 #1', [0]],
    ];
    for (const [selector, atoms] of cases) {
      it(`atoms ${selector}`, () => {
        const analysis = analyze(`${CHAIN}\nfragment probe { atoms ${selector}; tier mean-field { } }\nfragment others { atoms rest; tier mean-field { } }\n`);
        const errors = analysis.diagnostics.filter((d) => d.code !== 'bond-cut' && d.code !== 'multiplicity-parity');
        expect(errors.map((d) => show(analysis, d)).filter((line) => atoms.length > 0 || !line.includes('fragment-empty'))).toEqual([]);
        expect(analysis.model.fragments[0]!.atoms).toEqual(atoms);
        const rest = [0, 1, 2, 3, 4, 5].filter((atom) => !atoms.includes(atom));
        expect(analysis.model.fragments[1]!.atoms).toEqual(rest);
        expect(analysis.model.fragments[1]!.claimsRest).toBe(true);
      });
    }

    it('reads selector kinds and spans', () => {
      const { text, ranges } = parseMarkers(`${CHAIN}\nfragment f { atoms ⟦c1⟧ ⟦c2..#4⟧ ⟦#5⟧ ⟦all O⟧ ⟦closer-than 2 to c1⟧ ⟦rest⟧ }\n`);
      const selectors: SelectorAst[] = analyze(text).ast.fragments[0]!.atoms!.selectors;
      expect(selectors.map((s) => s.kind)).toEqual(['label', 'range', 'index', 'element', 'closer-than', 'rest']);
      expect(selectors.map((s) => s.span)).toEqual(ranges);
      expect(selectors[4]).toMatchObject({ kind: 'closer-than', distance: 2, inclusive: false, to: { kind: 'label', name: 'c1' } });
    });

    it('measures `closer-than` in the structure\'s unit', () => {
      const inBohr = CHAIN.replace('structure {', 'structure in bohr {');
      const bohr = analyze(`${inBohr}\nfragment probe { atoms closer-than 1.6 to c2; tier mean-field { } }\nfragment others { atoms rest; tier mean-field { } }\n`);
      // In bohr the neighbours are 1.5 bohr away: still inside 1.6 bohr.
      expect(bohr.model.fragments[0]!.atoms).toEqual([0, 1, 2]);
      const tight = analyze(`${inBohr}\nfragment probe { atoms closer-than 1.4 to c2; tier mean-field { } }\nfragment others { atoms rest; tier mean-field { } }\n`);
      expect(tight.model.fragments[0]!.atoms).toEqual([1]);
    });
  });

  it('reads one-line blocks separated by `;` the same as multi-line blocks', () => {
    const oneLine = analyze(water('fragment w { atoms rest; charge 0; tier quantum { method vqe; mapping parity; active 4e 4o } }'));
    const multiLine = analyze(
      water(`fragment w
{
  atoms rest
  charge 0
  tier quantum
  {
    method vqe
    mapping parity
    active 4e 4o
  }
}`),
    );
    for (const analysis of [oneLine, multiLine]) {
      expect(analysis.diagnostics).toEqual([]);
      expect(analysis.model.fragments[0]).toMatchObject({ atoms: [0, 1, 2], charge: 0, chargeGiven: true });
      expect(analysis.model.fragments[0]!.tier).toMatchObject({ level: 'quantum', method: 'vqe', mapping: 'parity', active: { electrons: 4, orbitals: 4 } });
    }
  });

  it('keeps a comment at the end of a line out of the statement, and #index in it', () => {
    const analysis = analyze(water('fragment w { atoms #1 #2..#3 # every atom, #1 to #3\n tier mean-field { } }'));
    expect(analysis.diagnostics).toEqual([]);
    expect(analysis.model.fragments[0]!.atoms).toEqual([0, 1, 2]);
    expect(analysis.tree.comments.map((c) => c.text)).toEqual(['# every atom, #1 to #3']);
  });
});

describe('exact spans', () => {
  it('spans whole statements, from the keyword to the last argument or the closing brace', () => {
    const { text, ranges } = parseMarkers(`⟦spec "spans"⟧  # a comment is not part of it
⟦functions cartesian⟧;⟦charge -1⟧
⟦basis sto-3g⟧
⟦basis 3-21G on all H⟧
⟦structure in bohr
{
  H a 0 0 0
}⟧
`);
    const tree = parseSpec(text);
    expect(tree.problems).toEqual([]);
    expect(tree.statements.map((s) => s.span)).toEqual(ranges);
  });

  it('spans keywords, arguments and braces', () => {
    const { text, ranges } = parseMarkers('⟦fragment⟧ ⟦w⟧ ⟦{⟧ ⟦atoms⟧ ⟦a⟧⟦..⟧⟦#2⟧ ⟦"quoted \\" text"⟧ ⟦}⟧');
    const tree = parseSpec(text);
    const fragment = tree.statements[0]!;
    const atoms = fragment.block!.statements[0]!;
    expect([fragment.keyword.span, fragment.args[0]!.span, fragment.block!.open, atoms.keyword.span, ...atoms.args.map((a) => a.span), fragment.block!.close]).toEqual(ranges);
    expect(atoms.args.map((a) => [a.kind, a.text])).toEqual([
      ['word', 'a'],
      ['range', '..'],
      ['index', '#2'],
      ['string', 'quoted " text'],
    ]);
  });

  it('spans the typed nodes: name, override, atom parts, active space, scan values', () => {
    const { text, ranges } = parseMarkers(`spec ⟦"s"⟧
basis sto-3g
basis 3-21G ⟦on all H⟧
structure {
  ⟦H⟧ ⟦a⟧ 0 0 ⟦0⟧
  H 0 0 0.74
}
fragment f { atoms a; tier quantum { ⟦active 1e 1o⟧ } }
fragment g { atoms #2; tier mean-field { } }
scan distance a #2 from ⟦1.0⟧ to ⟦2.0⟧ step ⟦0.5⟧
`);
    const { ast, tree, diagnostics } = analyze(text);
    // The two hydrogens are bonded and split into two fragments: that warning only.
    expect(diagnostics.map((d) => d.code)).toEqual(['bond-cut']);
    const atoms = ast.geometry!.atoms;
    const atomLine = tree.statements[3]!.block!.statements[0]!;
    expect([
      ast.name!.span,
      ast.basisOverrides[0]!.onSpan,
      atoms.elementSpan(0),
      atoms.labelSpan(0),
      atomLine.args[3]!.span,
      ast.fragments[0]!.tier!.active!.span,
      ast.scan!.from!.span,
      ast.scan!.to!.span,
      ast.scan!.step!.span,
    ]).toEqual(ranges);
    // An atom spans its whole line, element to last coordinate; an unlabelled atom has no label span.
    expect(atoms.span(0)).toEqual({ start: ranges[2]!.start, end: ranges[4]!.end });
    expect(atomLine.span).toEqual(atoms.span(0));
    expect(atoms.labelSpan(1)).toBeUndefined();
  });

  it('spans a block whose `{` is on the next line from the keyword to the `}`', () => {
    const text = 'fragment w\n\n{\n  atoms rest\n}\n';
    const statement = parseSpec(text).statements[0]!;
    expect(statement.span).toEqual({ start: 0, end: text.lastIndexOf('}') + 1 });
    expect(statement.block!.open).toEqual({ start: text.indexOf('{'), end: text.indexOf('{') + 1 });
    expect(statement.block!.span).toEqual({ start: text.indexOf('{'), end: text.lastIndexOf('}') + 1 });
  });
});

describe('recovery', () => {
  // Two waters 5 Å apart (the water of tests/fixtures/water.ts), each with its own fragment; mistakes are scattered around them.
  const BROKEN = `spec ⟦"recovery⟧
basis sto-3g
structure {
  O  o   0.000000  0.000000  0.000000
  H  h1  0.000000  0.756950  0.585882
  H  h2  0.000000 -0.756950  0.585882
  O  o2  5.000000  0.000000  0.000000
  H  h3  5.000000  0.756950  0.585882
  H  h4  5.000000 -0.756950  0.585882
}
⟦}⟧
fragment first ⟦{⟧
  atoms o h1 h2
  tier mean-field { method rhf ⟦@⟧ }
  ⟦42⟧ atoms
fragment second {
  atoms o2 h3 h4
  tier quantum {
    ⟦mehtod⟧ vqe
    active 4e 4o
  }
}
⟦fragmnt⟧ third { atoms rest }
limits { qubits 8 }
`;

  it('reports each mistake once, on its exact range, and nothing else', () => {
    expectDiagnostics(BROKEN, [
      'unterminated-string',
      'unexpected-token',
      'unclosed-block',
      'unexpected-character',
      'invalid-value',
      'unknown-keyword',
      'unknown-keyword',
    ]);
  });

  it('gives the same ranges with CRLF line endings', () => {
    const analysis = expectDiagnostics(BROKEN.replace(/\n/g, '\r\n'), [
      'unterminated-string',
      'unexpected-token',
      'unclosed-block',
      'unexpected-character',
      'invalid-value',
      'unknown-keyword',
      'unknown-keyword',
    ]);
    expect(analysis.ast.name?.value).toBe('recovery');
    expect(analysis.model.fragments[1]!.atoms).toEqual([3, 4, 5]);
  });

  it('still analyses the statements around the mistakes', () => {
    const { model, ast } = analyzeMarked(BROKEN);
    // The unterminated string still names the spec.
    expect(ast.name?.value).toBe('recovery');
    expect(model.atoms).toHaveLength(6);
    expect(model.basis.main?.displayName).toBe('STO-3G');
    // The unclosed fragment ends where the next top-level keyword starts a line.
    expect(model.fragments.map((f) => f.name)).toEqual(['first', 'second']);
    const [first, second] = model.fragments;
    expect(first!.atoms).toEqual([0, 1, 2]);
    expect(first!.tier).toMatchObject({ level: 'mean-field', method: 'rhf' });
    // The fragment after the broken part gets its atoms and counts: water in STO-3G has 10
    // electrons and 7 basis functions (O 1s 2s 2p = 5, H 1s = 1 each; the minimal STO-3G basis of Hehre, Stewart & Pople 1969).
    expect(second!.atoms).toEqual([3, 4, 5]);
    expect(second!.space.electrons).toBe(10);
    expect(second!.space.orbitals).toBe(7);
    expect(second!.space.active).toMatchObject({ electrons: 4, orbitals: 4, alpha: 2, beta: 2 });
    expect(second!.space.qubits.jordanWigner).toBe(8);
    // The misspelt method is skipped, so the tier's default method applies.
    expect(second!.tier).toMatchObject({ level: 'quantum', method: 'vqe', methodGiven: false });
    expect(model.limits.qubits).toBe(8);
  });

  it('skips a block that follows no statement, with one error on its brace', () => {
    const analysis = expectDiagnostics(
      `basis sto-3g
structure { H a 0 0 0; H b 0 0 0.74 }
⟦{⟧ H c 0 0 3 }
fragment h2 { atoms a b; tier mean-field { } }
`,
      ['unexpected-token'],
    );
    expect(analysis.model.fragments[0]!.atoms).toEqual([0, 1]);
  });

  it('ends an unclosed block at the end of the file', () => {
    const analysis = expectDiagnostics('basis sto-3g\nstructure { H a 0 0 0; H b 0 0 0.74 }\nfragment h2 ⟦{⟧\n  atoms a b\n  tier mean-field { }\n', ['unclosed-block']);
    expect(analysis.model.fragments[0]!.atoms).toEqual([0, 1]);
    expect(analysis.tree.statements[2]!.span.end).toBe(analysis.text.lastIndexOf('}') + 1);
  });

  it('merges a run of unreadable characters into one diagnostic', () => {
    const analysis = expectDiagnostics('basis sto-3g ⟦@@!⟧\nstructure { H a 0 0 0; H b 0 0 0.74 }\nfragment h2 { atoms a b; tier mean-field { } }\n', ['unexpected-character']);
    expect(analysis.diagnostics[0]!.message).toContain("'@@!'");
  });

  it('never throws, whatever the input', () => {
    const inputs = ['', '{', '}', '"', '..', '=', '#', '#1', '6e', 'fragment', 'tier { { { ', '}}}{{{', 'structure from', 'scan distance', 'atoms ..', '\u0000\u00ff'];
    for (const input of inputs) {
      expect(() => analyze(input), JSON.stringify(input)).not.toThrow();
    }
  });
});
