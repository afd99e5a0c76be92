/**
 * Reuse of a cut: `structure from "base.tess" with fragments` takes another spec's fragments as
 * well as its atoms; this spec's own `fragment` of the same name patches the included one
 * (language/model/includedFragments.ts); hover and go to definition lead to the other file.
 */
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';
import { computeLenses, doHover, findDefinition, getCodeActions, NO_COMPUTE_POLICY, prepareRename, toLspDiagnostic } from '../../server/src/services';
import { markdownOf, positionOf } from '../services/service';
import { memoryFiles } from './fixture';

/** 1 Å in bohr: 1/0.529177210903 (CODATA 2018). */
const BOHR_PER_ANGSTROM = 1 / 0.529177210903;

/**
 * Staggered ethane at its experimental structure, r(C–C) 1.535 Å, r(C–H) 1.094 Å, ∠HCC 111.2°
 * (NIST CCCBDB experimental geometry, from memory), C–C along z; the same construction as
 * tests/analysis/caps.test.ts. `scale` writes the coordinates in another unit.
 */
function ethaneRows(scale = 1): string {
  const half = 1.535 / 2;
  const angle = (111.2 * Math.PI) / 180;
  const rise = -1.094 * Math.cos(angle);
  const radial = 1.094 * Math.sin(angle);
  const row = (element: string, label: string, x: number, y: number, z: number) => `  ${element} ${label} ${(x * scale).toFixed(6)} ${(y * scale).toFixed(6)} ${(z * scale).toFixed(6)}`;
  const lines = [row('C', 'c1', 0, 0, -half), row('C', 'c2', 0, 0, half)];
  for (let k = 0; k < 3; k++) {
    const phi = (2 * Math.PI * k) / 3;
    lines.push(row('H', `a${k + 1}`, radial * Math.cos(phi), radial * Math.sin(phi), -half - rise));
  }
  for (let k = 0; k < 3; k++) {
    const phi = (2 * Math.PI * k) / 3 + Math.PI / 3;
    lines.push(row('H', `b${k + 1}`, radial * Math.cos(phi), radial * Math.sin(phi), half + rise));
  }
  return lines.join('\n');
}

const TIER = 'tier quantum { method vqe; mapping jordan-wigner; active 2e 2o }';
const BASE = `spec "base"
basis sto-3g
structure {
${ethaneRows()}
}
caps hydrogen fixed
fragment left {
  atoms c1 a1 a2 a3
  ${TIER}
}
fragment right {
  atoms c2 b1 b2 b3
  ${TIER}
}
`;
/** The same cut written by distance in bohr: 2.5 bohr (1.32 Å) from a carbon reaches its own hydrogens (1.094 Å) only. */
const BASE_BOHR = `basis sto-3g
structure in bohr {
${ethaneRows(BOHR_PER_ANGSTROM)}
}
fragment left { atoms closer-than 2.5 to c1; tier mean-field { method rhf } }
fragment right { atoms rest; tier mean-field { method rhf } }
`;

const FOLDER = '/work/specs/family';
const FILES = memoryFiles({
  [`${FOLDER}/base.tess`]: BASE,
  [`${FOLDER}/bohr.tess`]: BASE_BOHR,
  [`${FOLDER}/atoms.xyz`]: '2\nhydrogen molecule\nH 0 0 0\nH 0 0 0.7414\n',
  [`${FOLDER}/loop-a.tess`]: 'basis sto-3g\nstructure from "loop-b.tess" with fragments\n',
  [`${FOLDER}/loop-b.tess`]: 'basis sto-3g\nstructure from "loop-a.tess"\n',
  [`${FOLDER}/no-fragments.tess`]: `basis sto-3g\nstructure {\n${ethaneRows()}\n}\n`,
  [`${FOLDER}/broken.tess`]: `basis sto-3g\nstructure {\n${ethaneRows()}\n}\nfragment left { atoms c1 a1 a2 a3; multiplicity many }\n`,
});
const PATH = `${FOLDER}/member.tess`;

function analyse(text: string, path = PATH) {
  return analyzeDocument(text, { path, files: FILES });
}

const member = (rest = '', include = 'base.tess') => `spec "member"\nbasis cc-pVDZ\nstructure from "${include}" with fragments\n${rest}`;

describe('fragments taken from another spec', () => {
  it('gives the ethane cut of the other spec: two CH4-like fragments of 10 electrons, one cap each', () => {
    const analysis = analyse(member());
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(analysis.model.fragments.map((f) => f.name)).toEqual(['left', 'right']);
    for (const index of [0, 1]) {
      const figures = analysis.fragmentFigures(index);
      // C 6 + 3 H + the cap (the base's top-level `caps hydrogen fixed`): 10 electrons, a singlet.
      expect(figures.electrons).toBe(10);
      expect(figures.multiplicity).toBe(1);
      expect(figures.caps?.count).toBe(1);
      // The member's own basis: cc-pVDZ C [3s2p1d] 14, H [2s1p] 5 (Dunning, J. Chem. Phys. 90, 1007 (1989)): 14 + 4 × 5.
      expect(figures.basisFunctions.spherical).toBe(34);
      // Jordan–Wigner: one qubit per spin orbital, 2 × 2 (Jordan & Wigner, Z. Phys. 47, 631 (1928)).
      expect(figures.qubits?.jordanWigner).toBe(4);
    }
    expect(analysis.model.fragments[0]!.ast.included).toMatchObject({ file: `${FOLDER}/base.tess`, start: { line: 13, character: 9 }, patched: false });
  });

  it('lets a fragment of the same name patch the included one statement by statement, a tier key by key', () => {
    const analysis = analyse(member('fragment left { tier quantum { active 4e 4o } }\n'));
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const left = analysis.model.fragments[0]!;
    // The atoms, the method and the mapping stay the base's; the active space is the member's.
    expect(left.atoms).toEqual([0, 2, 3, 4]);
    expect(left.tier?.method).toBe('vqe');
    expect(left.tier?.mapping).toBe('jordan-wigner');
    expect(left.tier?.active).toEqual({ electrons: 4, orbitals: 4 });
    expect(left.ast.included?.patched).toBe(true);
    // 4 spatial orbitals under Jordan–Wigner: 8 qubits (Jordan & Wigner 1928).
    expect(analysis.fragmentFigures(0).qubits?.jordanWigner).toBe(8);
    expect(analysis.fragmentFigures(1).qubits?.jordanWigner).toBe(4);
  });

  it('replaces a tier of another level whole, and adds fragments of new names after the included ones', () => {
    const analysis = analyse(member('fragment right { tier mean-field { method rhf } }\n'));
    expect(analysis.model.fragments[1]!.tier?.level).toBe('mean-field');
    expect(analysis.model.fragments[1]!.tier?.mapping).toBeUndefined();
    const split = analyse(member('fragment left { atoms c1 a1 a2 }\nfragment tip { atoms a3; tier mean-field { method rhf } }\n'));
    expect(split.model.fragments.map((f) => [f.name, f.atoms])).toEqual([
      ['left', [0, 2, 3]],
      ['right', [1, 5, 6, 7]],
      ['tip', [4]],
    ]);
  });

  it('lets a variant of this spec move the included cut: its fragment patches the included one too', () => {
    const analysis = analyse(member('variant shifted {\n  fragment left { atoms c1 a1 a2 a3 c2 }\n  fragment right { atoms b1 b2 b3 }\n}\n'));
    const shifted = analysis.variants()[0]!.analysis;
    expect(shifted.model.fragments.map((f) => f.atoms)).toEqual([[0, 1, 2, 3, 4], [5, 6, 7]]);
    // Right is now the three hydrogens of c2 (a check of the mechanism, not a cut anyone would plan),
    // each cut from c2 and capped: 3 + 3 electrons.
    expect(shifted.fragmentFigures(1).electrons).toBe(6);
    expect(shifted.fragmentFigures(1).caps?.count).toBe(3);
  });

  it('follows this spec\'s top-level caps line over the other spec\'s', () => {
    const analysis = analyse(member('caps none\n'));
    // Without a cap a methyl group is CH3: 9 electrons, a doublet (lowest multiplicity of an odd count).
    expect(analysis.fragmentFigures(0).electrons).toBe(9);
    expect(analysis.fragmentFigures(0).multiplicity).toBe(2);
  });

  it('reads `closer-than` distances in the other spec\'s unit (bohr, CODATA 2018)', () => {
    const own = analyse(BASE_BOHR, `${FOLDER}/bohr.tess`);
    const analysis = analyse(member('', 'bohr.tess'));
    expect(own.model.fragments[0]!.atoms).toEqual([0, 2, 3, 4]);
    expect(analysis.model.fragments.map((f) => f.atoms)).toEqual(own.model.fragments.map((f) => f.atoms));
  });

  it('reports what cannot be taken at `with fragments`, with the place in the other file', () => {
    const at = (analysis: ReturnType<typeof analyse>) => {
      const d = analysis.diagnostics.find((item) => item.code === 'include-invalid')!;
      return { text: analysis.text.slice(d.span.start, d.span.end), message: d.message, related: d.related };
    };
    const xyz = at(analyse(member('', 'atoms.xyz')));
    expect(xyz.text).toBe('with fragments');
    expect(xyz.message).toMatch(/XYZ file, which holds atoms only/);
    const none = at(analyse(member('', 'no-fragments.tess')));
    expect(none.message).toMatch(/has no fragments to take/);
    const broken = at(analyse(member('', 'broken.tess')));
    expect(broken.text).toBe('with fragments');
    expect(broken.message).toMatch(/^"broken.tess" line 12: The multiplicity must be a number/);
    expect(broken.related?.[0]).toMatchObject({ file: `${FOLDER}/broken.tess`, line: 11 });
  });

  it('names an include cycle and a spec that includes itself', () => {
    const loop = analyse('basis sto-3g\nstructure from "loop-b.tess" with fragments\n', `${FOLDER}/loop-a.tess`);
    expect(loop.diagnostics.find((d) => d.code === 'include-invalid')?.message).toMatch(/the two include each other \(an include cycle\)/);
    const self = analyse('basis sto-3g\nstructure from "no-fragments.tess" with fragments\n', `${FOLDER}/no-fragments.tess`);
    expect(self.diagnostics.find((d) => d.code === 'include-invalid')?.message).toMatch(/is this spec itself/);
  });

  it('keeps problems of included fragments at `with fragments` and offers no edit there', () => {
    // A capped methyl has 10 electrons; the member asks for a doublet, which has the wrong parity.
    const analysis = analyse(member('caps hydrogen fixed\nfragment left { multiplicity 2 }\n'));
    const parity = analysis.diagnostics.find((d) => d.code === 'multiplicity-parity');
    expect(parity).toBeDefined();
    expect(analysis.text.slice(parity!.span.start, parity!.span.end)).toBe('2');
    // The same doublet written in the base is reported at `with fragments`, and no quick fix rewrites those words.
    const files = memoryFiles({ [`${FOLDER}/base.tess`]: BASE.replace('atoms c1 a1 a2 a3', 'atoms c1 a1 a2 a3; multiplicity 2') });
    const included = analyzeDocument(member(), { path: PATH, files });
    const inside = included.diagnostics.find((d) => d.code === 'multiplicity-parity')!;
    expect(included.text.slice(inside.span.start, inside.span.end)).toBe('with fragments');
    const uri = 'file:///work/specs/family/member.tess';
    expect(getCodeActions(included, uri, [toLspDiagnostic(included, uri, inside)])).toEqual([]);
  });
});

describe('included fragment names in the editor', () => {
  const text = member('fragment left { tier quantum { active 4e 4o } }\nbasis cc-pVTZ on fragment right\n');
  const analysis = analyse(text);
  const uri = 'file:///work/specs/family/member.tess';

  it('leads from a patching fragment and from a basis line to the fragment in the other file', () => {
    const fromPatch = findDefinition(analysis, uri, positionOf(analysis, 'left', 1));
    expect(fromPatch).toEqual({ uri: 'file:///work/specs/family/base.tess', range: { start: { line: 13, character: 9 }, end: { line: 13, character: 13 } } });
    const fromBasis = findDefinition(analysis, uri, positionOf(analysis, 'fragment right', 10));
    expect(fromBasis).toEqual({ uri: 'file:///work/specs/family/base.tess', range: { start: { line: 17, character: 9 }, end: { line: 17, character: 14 } } });
    expect(prepareRename(analysis, positionOf(analysis, 'fragment right', 10))).toMatchObject({ ok: false, message: expect.stringMatching(/rename it there/) });
  });

  it('names the fragment in the lenses that share the `with fragments` line, not in those of a patching fragment', () => {
    const lenses = computeLenses(analysis, uri, NO_COMPUTE_POLICY).map((lens) => ({ line: lens.range.start.line, title: lens.command?.title ?? '' }));
    const includeLine = positionOf(analysis, 'with fragments').line;
    const onInclude = lenses.filter((lens) => lens.line === includeLine);
    expect(onInclude.map((lens) => /mean field of (\w+)/.exec(lens.title)?.[1])).toEqual(['right']);
    const patchLine = positionOf(analysis, 'fragment left').line;
    expect(lenses.find((lens) => lens.line === patchLine)?.title).toMatch(/^Compute the mean field \(/);
  });

  it('hovers with the fragment card and where it comes from', () => {
    const right = markdownOf(doHover(analysis, positionOf(analysis, 'fragment right', 10))?.contents);
    expect(right).toMatch(/Taken from `base\.tess` line 18/);
    const left = markdownOf(doHover(analysis, positionOf(analysis, 'left', 1))?.contents);
    expect(left).toMatch(/patched by this spec's `fragment left`/);
    const list = markdownOf(doHover(analysis, positionOf(analysis, 'with fragments', 6))?.contents);
    expect(list).toMatch(/2 fragments from `base\.tess`/);
    expect(list).toMatch(/\| `left` \| 14 \| patched here \|/);
  });
});
