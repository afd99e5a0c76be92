/**
 * Semantic tokens (decoded from the LSP delta encoding), folding ranges and selection ranges.
 *
 * Geometries are invented test data.
 */
import { describe, expect, it } from 'vitest';
import { FoldingRangeKind, type Position, type Range, type SelectionRange } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import { getFoldingRanges, getSelectionRanges, getSemanticTokens, semanticTokensEdits, semanticTokensLegend } from '../../server/src/services';
import { SEMANTIC_ATOM_LINE_LIMIT } from '../../server/src/services/semanticTokens';
import { waterBoxSpec } from '../../bench/generate';
import { marked, readSample, SAMPLE_NAMES } from './service';

/** A decoded token: its text, type and modifiers. */
type Token = [text: string, type: string, modifiers?: string];

/**
 * Decodes LSP semantic tokens: five integers per token, the line relative to the previous token,
 * the start character relative to it when on the same line, the length, the type and the modifier bits.
 */
function decode(text: string, data: readonly number[]): (Token & { line?: number })[] {
  const lines = text.split('\n');
  const tokens: Token[] = [];
  let line = 0;
  let character = 0;
  expect(data.length % 5).toBe(0);
  for (let i = 0; i < data.length; i += 5) {
    const [deltaLine, deltaStart, length, type, modifiers] = data.slice(i, i + 5) as [number, number, number, number, number];
    line += deltaLine;
    character = deltaLine === 0 ? character + deltaStart : deltaStart;
    const names = semanticTokensLegend.tokenModifiers.filter((_, bit) => modifiers & (1 << bit));
    const token: Token = [lines[line]!.slice(character, character + length), semanticTokensLegend.tokenTypes[type]!];
    if (names.length > 0) token.push(names.join(','));
    tokens.push(token);
  }
  return tokens;
}

const SPEC = `spec "t"  # name
basis sto-3g
basis def2-svp on all Zn o closer-than 1 to o
basis 3-21G on fragment w
functions cartesian
structure in bohr {
  O o 0 0 0
  H 0 1.8 0
}
fragment w {
  atoms o #2 all H closer-than 2.5 to o rest
  tier quantum { method vqe; mapping parity; active 2e 2o }
}
embedding dmet
scan distance o #2 from 1.0 to 2.0 step 0.5
limits { qubits 4; memory 16 GiB }
`;

const EXPECTED: Token[] = [
  ['spec', 'keyword'], ['"t"', 'string'], ['# name', 'comment'],
  ['basis', 'keyword'], ['sto-3g', 'namespace'],
  ['basis', 'keyword'], ['def2-svp', 'namespace'], ['on', 'keyword'], ['all', 'keyword'], ['Zn', 'type'], ['o', 'variable'], ['closer-than', 'keyword'], ['1', 'number'], ['to', 'keyword'], ['o', 'variable'],
  ['basis', 'keyword'], ['3-21G', 'namespace'], ['on', 'keyword'], ['fragment', 'keyword'], ['w', 'class'],
  ['functions', 'keyword'], ['cartesian', 'enumMember'],
  ['structure', 'keyword'], ['in', 'keyword'], ['bohr', 'unit'],
  ['O', 'type'], ['o', 'variable', 'declaration'], ['0', 'number'], ['0', 'number'], ['0', 'number'],
  ['H', 'type'], ['0', 'number'], ['1.8', 'number'], ['0', 'number'],
  ['fragment', 'keyword'], ['w', 'class', 'declaration'],
  ['atoms', 'keyword'], ['o', 'variable'], ['#2', 'variable'], ['all', 'keyword'], ['H', 'type'], ['closer-than', 'keyword'], ['2.5', 'number'], ['to', 'keyword'], ['o', 'variable'], ['rest', 'keyword'],
  ['tier', 'keyword'], ['quantum', 'enumMember'], ['method', 'keyword'], ['vqe', 'enumMember'], ['mapping', 'keyword'], ['parity', 'enumMember'], ['active', 'keyword'], ['2e', 'number'], ['2o', 'number'],
  ['embedding', 'keyword'], ['dmet', 'enumMember'],
  ['scan', 'keyword'], ['distance', 'enumMember'], ['o', 'variable'], ['#2', 'variable'], ['from', 'keyword'], ['1.0', 'number'], ['to', 'keyword'], ['2.0', 'number'], ['step', 'keyword'], ['0.5', 'number'],
  ['limits', 'keyword'], ['qubits', 'keyword'], ['4', 'number'], ['memory', 'keyword'], ['16', 'number'], ['GiB', 'unit'],
];

describe('semantic tokens', () => {
  for (const fastGeometry of [true, false]) {
    it(`decode to the expected types (${fastGeometry ? 'fast' : 'general'} geometry reader)`, () => {
      const analysis = analyzeDocument(SPEC, { fastGeometry });
      expect(decode(SPEC, getSemanticTokens(analysis).data)).toEqual(EXPECTED);
    });
  }

  it('mark a misspelt keyword as nothing, and a known keyword in the wrong block as nothing', () => {
    const text = 'bassis sto-3g\nfragment f {\n  method vqe\n}\n';
    const tokens = decode(text, getSemanticTokens(analyzeDocument(text)).data);
    expect(tokens.filter(([word]) => word === 'bassis' || word === 'method')).toEqual([]);
    expect(tokens).toContainEqual(['fragment', 'keyword']);
  });

  it('measure a comment on a CRLF line without its carriage return', () => {
    const text = 'spec "t" # note\r\nfunctions cartesian\r\n';
    expect(decode(text.replace(/\r/g, ''), getSemanticTokens(analyzeDocument(text)).data)).toEqual([
      ['spec', 'keyword'], ['"t"', 'string'], ['# note', 'comment'], ['functions', 'keyword'], ['cartesian', 'enumMember'],
    ]);
  });

  it('are sorted and never overlap on any sample', () => {
    for (const name of SAMPLE_NAMES) {
      const data = getSemanticTokens(analyzeDocument(readSample(name))).data;
      for (let i = 5; i < data.length; i += 5) {
        const sameLine = data[i] === 0;
        if (sameLine) expect(data[i + 1]!, `${name}: token ${i / 5} starts inside the previous one`).toBeGreaterThanOrEqual(data[i - 3]!);
        expect(data[i]!, name).toBeGreaterThanOrEqual(0);
      }
    }
  });
});

describe('semantic token edits', () => {
  /** Applies LSP semantic-token edits to an array, as the editor does. */
  function apply(previous: readonly number[], edits: { start: number; deleteCount: number; data: number[] }[]): number[] {
    const result = [...previous];
    for (const edit of [...edits].sort((a, b) => b.start - a.start)) result.splice(edit.start, edit.deleteCount, ...edit.data);
    return result;
  }

  it('turn the tokens of one version into the next, in a few numbers for a one-line edit', () => {
    const base = waterBoxSpec(300).text;
    const at = base.indexOf('\n', base.indexOf('structure {')) + 1;
    const versions = [base, `${base.slice(0, at)}  C 1.5 2.${base.slice(at - 1)}`, `${base.slice(0, at)}  C c1 1.5 2.5 3.5\n${base.slice(at)}`, base.replace('spec "water-box"', 'spec "water box"')];
    for (let k = 1; k < versions.length; k++) {
      const before = getSemanticTokens(analyzeDocument(versions[k - 1]!)).data;
      const after = getSemanticTokens(analyzeDocument(versions[k]!)).data;
      const edits = semanticTokensEdits(before, after);
      expect(apply(before, edits)).toEqual(after);
      expect(edits.reduce((sum, edit) => sum + edit.data.length, 0)).toBeLessThan(40);
    }
    expect(semanticTokensEdits([1, 2, 3, 4, 5], [1, 2, 3, 4, 5])).toEqual([]);
  });

  it('leave the atom lines of very large geometry blocks to the grammar, but not the rest', () => {
    const big = waterBoxSpec(SEMANTIC_ATOM_LINE_LIMIT + 3).text;
    const tokens = decode(big, getSemanticTokens(analyzeDocument(big)).data);
    expect(tokens.filter(([, type]) => type === 'number').length).toBeLessThan(20);
    expect(tokens).toContainEqual(['probe', 'class', 'declaration']);
    const small = waterBoxSpec(300).text;
    expect(decode(small, getSemanticTokens(analyzeDocument(small)).data).filter(([, type]) => type === 'number').length).toBeGreaterThan(900);
  });
});

describe('folding ranges', () => {
  it('fold each multi-line block up to the line before its `}`, and runs of comment lines', () => {
    const text = `# a comment
# over three
# lines
spec "t"
structure {
  H 0 0 0
}
# a lone comment
fragment w {
  atoms rest
  tier quantum {
    method vqe
  }
}
limits { qubits 4 }
functions cartesian  # trailing
# two comment
# lines at the end
`;
    const ranges = getFoldingRanges(analyzeDocument(text));
    expect(ranges).toEqual([
      { startLine: 4, endLine: 5 },
      { startLine: 8, endLine: 12 },
      { startLine: 10, endLine: 11 },
      { startLine: 0, endLine: 2, kind: FoldingRangeKind.Comment },
      { startLine: 16, endLine: 17, kind: FoldingRangeKind.Comment },
    ]);
  });

  it('fold a geometry block without looking inside it', () => {
    const ranges = getFoldingRanges(analyzeDocument(readSample('molecules/water-cc-pvdz.tess')));
    // Lines (0-based): comments 0–4, geometry 9–13, fragment 15–23 with its tier 17–22.
    expect(ranges).toEqual([
      { startLine: 9, endLine: 12 },
      { startLine: 15, endLine: 22 },
      { startLine: 17, endLine: 21 },
      { startLine: 0, endLine: 4, kind: FoldingRangeKind.Comment },
    ]);
  });

  it('fold an unclosed block to its last line of content', () => {
    expect(getFoldingRanges(analyzeDocument('fragment w {\n  atoms rest\n  tier mean-field {\n    method rhf\n\n'))).toEqual([
      { startLine: 0, endLine: 3 },
      { startLine: 2, endLine: 3 },
    ]);
  });
});

describe('selection ranges', () => {
  const TEXT = `spec "t"  # na$Ame
structure {
  O o 0 0 0
  H h$B1 0 0.96 0
}
fragment w {
  atoms o h1
  tier quantum { method v$Cqe; mapping parity }
}
`;

  function chain(marker: string): string[] {
    const m = marked(TEXT.replace(marker, '$0').replace(/\$[A-Z]/g, ''));
    const [selection] = getSelectionRanges(m.analysis, [m.cursor]);
    return texts(m.analysis.text, selection!, m.cursor);
  }

  it('grow token → statement → block → statement with its block → document in a tier', () => {
    const whole = TEXT.replace(/\$[A-Z]/g, '');
    expect(chain('$C')).toEqual([
      'vqe',
      'method vqe',
      ' method vqe; mapping parity ',
      'tier quantum { method vqe; mapping parity }',
      '\n  atoms o h1\n  tier quantum { method vqe; mapping parity }\n',
      'fragment w {\n  atoms o h1\n  tier quantum { method vqe; mapping parity }\n}',
      whole,
    ]);
  });

  it('grow from an atom label in a geometry block', () => {
    const whole = TEXT.replace(/\$[A-Z]/g, '');
    expect(chain('$B')).toEqual(['h1', 'H h1 0 0.96 0', '\n  O o 0 0 0\n  H h1 0 0.96 0\n', 'structure {\n  O o 0 0 0\n  H h1 0 0.96 0\n}', whole]);
  });

  it('contain the position even in a trailing comment', () => {
    const whole = TEXT.replace(/\$[A-Z]/g, '');
    expect(chain('$A')).toEqual([whole]);
  });

  it('answer one chain per position', () => {
    const m = marked(TEXT.replace(/\$[A-Z]/g, ''));
    const positions: Position[] = [{ line: 0, character: 1 }, { line: 3, character: 4 }, { line: 9, character: 0 }];
    const selections = getSelectionRanges(m.analysis, positions);
    expect(selections.length).toBe(3);
    selections.forEach((selection, i) => expect(texts(m.analysis.text, selection, positions[i]!)[0]).toBe(['spec', 'h1', m.analysis.text][i]));
  });
});

/** The text of each range of a selection chain, innermost first, checking each contains the last. */
function texts(text: string, selection: SelectionRange, position: Position): string[] {
  const analysis = analyzeDocument(text);
  const out: string[] = [];
  let previous: Range = { start: position, end: position };
  for (let current: SelectionRange | undefined = selection; current; current = current.parent) {
    const start = analysis.lines.offsetAt(current.range.start);
    const end = analysis.lines.offsetAt(current.range.end);
    expect(start <= analysis.lines.offsetAt(previous.start) && analysis.lines.offsetAt(previous.end) <= end, `${JSON.stringify(current.range)} contains ${JSON.stringify(previous)}`).toBe(true);
    out.push(text.slice(start, end));
    previous = current.range;
  }
  return out;
}
