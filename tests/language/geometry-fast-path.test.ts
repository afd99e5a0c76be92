/**
 * The fast reader of plain geometry blocks must give exactly what the general chevrotain parser
 * gives: the same statements, comments, problems, and the same analysis.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { waterBoxSpec } from '../../bench/generate';
import { analyze } from '../../server/src/language/analyze';
import { changedRange, extractGeometryBodies, readNumber, rereadChangedLines } from '../../server/src/language/geometryFastPath';
import { parseSpec } from '../../server/src/language/parser';
import type { Statement } from '../../server/src/language/syntax';

const samplesFolder = path.resolve(__dirname, '..', '..', 'samples');
function sampleFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const full = path.join(folder, name);
    return statSync(full).isDirectory() ? sampleFiles(full) : name.endsWith('.tess') ? [full] : [];
  });
}

/** Plain data of statements, reading lazily built blocks too. */
function plain(statements: readonly Statement[]): unknown[] {
  return statements.map((statement) => ({
    keyword: statement.keyword,
    args: statement.args,
    span: statement.span,
    block: statement.block && { open: statement.block.open, close: statement.block.close, span: statement.block.span, statements: plain(statement.block.statements) },
  }));
}

function expectSameReading(text: string): void {
  const fast = parseSpec(text);
  const general = parseSpec(text, { fastGeometry: false });
  expect(plain(fast.statements)).toEqual(plain(general.statements));
  expect(fast.comments).toEqual(general.comments);
  expect(fast.problems).toEqual(general.problems);
  const fastAnalysis = analyze(text);
  const generalAnalysis = analyze(text, { fastGeometry: false });
  expect(fastAnalysis.diagnostics).toEqual(generalAnalysis.diagnostics);
  expect(fastAnalysis.model.system).toEqual(generalAnalysis.model.system);
  expect([...fastAnalysis.model.coordinates]).toEqual([...generalAnalysis.model.coordinates]);
  expect(fastAnalysis.model.atoms).toEqual(generalAnalysis.model.atoms);
}

describe('fast geometry reader', () => {
  it('reads plain lines, leaves other lines to the general parser, and declines blocks whose structure needs it', () => {
    expect(extractGeometryBodies('structure {\n  O o 0 0 0 # oxygen\n  H 0 0 1\n}\n').blocks).toHaveLength(1);
    for (const body of ['H 0 0', 'H 0 0 0; H 1 1 1', 'H #1 0 0', 'Xx 0 0 0', 'H 0 0 1e999', 'H 6-31g 0 0 0', 'H 1 2 3 4 5 6']) {
      const text = `structure {\n  O 0 0 0\n ${body}\n  H 0 0 1\n}\n`;
      const { blocks, masked } = extractGeometryBodies(text);
      expect(blocks, body).toHaveLength(1);
      expect(blocks[0]!.table.count, body).toBe(2);
      expect(blocks[0]!.handedOver.map((line) => text.slice(line.start, line.end).trim()), body).toEqual([body]);
      // Only the handed-over line is left for the general parser, on a line of its own.
      expect(masked.replace(/\s+/g, ' ')).toBe(`structure { ${body} } `);
    }
    for (const body of ['H "x" 0 0 0', 'fragment a', '{ }']) {
      expect(extractGeometryBodies(`structure {\n ${body}\n}\n`).blocks, body).toHaveLength(0);
    }
  });

  it('costs one line for one bad line: the other lines stay in the table', () => {
    const spec = waterBoxSpec(300).text;
    const broken = spec.replace('\n  H ', '\n  C 1.5 2.5\n  H ');
    const block = parseSpec(broken).statements.find((statement) => statement.keyword.text === 'structure')!.block!;
    expect(block.atomTable!.count).toBe(waterBoxSpec(300).atoms);
    expect(block.otherStatements!.map((statement) => broken.slice(statement.span.start, statement.span.end))).toEqual(['C 1.5 2.5']);
    expectSameReading(broken);
  });

  it('reads every sample exactly as the general parser does', () => {
    const files = sampleFiles(samplesFolder);
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) expectSameReading(readFileSync(file, 'utf8'));
  });

  it('reads a generated 1,000-atom spec exactly as the general parser does', () => {
    expectSameReading(waterBoxSpec(1000).text);
  });

  it('agrees on random geometry blocks, plain or not', () => {
    const element = fc.constantFrom('H', 'He', 'C', 'O', 'Zn', 'zn', 'ZN', 'S', 'Xx', 'geometry', 'fragment', 'all');
    const number = fc.oneof(
      fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((value) => String(value)),
      fc.constantFrom('0', '-0', '+1.5', '.5', '1.', '1e-3', '2E+4', '1e999', '-', '1.2.3', '00012.500', '123456789012345678', '0.1234567890123456789'),
    );
    const label = fc.constantFrom('', 'a', 'h1', 'n_2', '1a', 'x-y', '"q"');
    const line = fc.tuple(element, label, fc.array(number, { minLength: 0, maxLength: 4 }), fc.constantFrom('', ' # note', '  #1', ';', ' }')).map(
      ([symbol, name, numbers, tail]) => `  ${symbol} ${name} ${numbers.join(' ')}${tail}`,
    );
    fc.assert(
      fc.property(fc.array(line, { maxLength: 12 }), fc.constantFrom('}', '', '}\nfragment f { atoms rest }'), (lines, end) => {
        expectSameReading(`basis sto-3g\nstructure {\n${lines.join('\n')}\n${end}\n`);
      }),
      { numRuns: 400 },
    );
  });

  it('reads numbers exactly as Number() does', () => {
    const text = '0 -0 1. .5 +.5 -12.000 3.14159 0.1 0.2 0.30000000000000004 123456789012345 1234567890123456 9007199254740993 1e-7 6.02214076e23';
    let position = 0;
    for (const field of text.split(' ')) {
      const start = text.indexOf(field, position);
      expect(Object.is(readNumber(text, start, start + field.length), Number(field)), field).toBe(true);
      position = start + field.length;
    }
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer({ min: 0, max: 20 }), (value, digits) => {
        const field = value.toFixed(digits);
        expect(Object.is(readNumber(field, 0, field.length), Number(field))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });
});

describe('reading only what changed', () => {
  /** The tree parsed from scratch and the tree parsed with the previous version's reading agree. */
  function expectSameIncremental(before: string, after: string): void {
    const previous = { text: before, tree: parseSpec(before) };
    const incremental = parseSpec(after, { previous });
    const fresh = parseSpec(after);
    expect(plain(incremental.statements)).toEqual(plain(fresh.statements));
    expect(incremental.comments).toEqual(fresh.comments);
    expect(incremental.problems).toEqual(fresh.problems);
    const tables = (tree: typeof fresh) => tree.geometryBlocks?.map((block) => ({ ...block, table: { ...block.table, labels: [...block.table.labels] } }));
    expect(tables(incremental)).toEqual(tables(fresh));
  }

  it('reuses the rows before and after an edited line', () => {
    const base = waterBoxSpec(60).text;
    const digit = base.indexOf('\n', base.indexOf('structure {') + 40) - 1;
    // A digit other than the one there, so that the text really changes.
    const edited = `${base.slice(0, digit)}${base[digit] === '7' ? '8' : '7'}${base.slice(digit + 1)}`;
    expect(changedRange(base, edited)).toEqual({ start: digit, oldEnd: digit + 1, newEnd: digit + 1 });
    // The edit is inside the block: only its line is read again.
    expect(rereadChangedLines(edited, { text: base, blocks: parseSpec(base).geometryBlocks! })).toBeDefined();
    expectSameIncremental(base, edited);
    // An edit outside the block reads everything again.
    expect(rereadChangedLines(base.replace('basis sto-3g', 'basis sto-6g'), { text: base, blocks: parseSpec(base).geometryBlocks! })).toBeUndefined();
    // A new line typed character by character, through malformed states.
    const line = '\n  C c9 1.5 -2.25 3e-1 # new';
    const at = base.indexOf('\n', base.indexOf('structure {'));
    let before = base;
    for (let k = 1; k <= line.length; k++) {
      const after = `${base.slice(0, at)}${line.slice(0, k)}${base.slice(at)}`;
      expectSameIncremental(before, after);
      before = after;
    }
  });

  it('agrees with a fresh reading after random edits anywhere', () => {
    const base = `basis sto-3g\nstructure {\n  O o 0 0 0 # oxygen\n  H 0 0.75695 0.585882\n  H 0 -0.75695 0.585882\n  C 1 2 3\n}\nfragment f { atoms rest }\n`;
    const insert = fc.constantFrom('1', '.', '-', ' ', '\n', '\n  H 0 0 0', '#', '#3', ';', '}', '{', '"', 'structure {', 'fragment x', 'Xx', 'e5', '');
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.nat(), fc.nat({ max: 4 }), insert), { minLength: 1, maxLength: 6 }), (edits) => {
        let text = base;
        for (const [position, remove, inserted] of edits) {
          const at = position % (text.length + 1);
          const next = `${text.slice(0, at)}${inserted}${text.slice(Math.min(text.length, at + remove))}`;
          expectSameIncremental(text, next);
          text = next;
        }
      }),
      { numRuns: 500 },
    );
  });
});
