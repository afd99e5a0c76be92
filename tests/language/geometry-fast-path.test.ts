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
import { extractGeometryBodies, readNumber } from '../../server/src/language/geometryFastPath';
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
  it('is used for plain geometry blocks and declines anything else', () => {
    expect(extractGeometryBodies('structure {\n  O o 0 0 0 # oxygen\n  H 0 0 1\n}\n').blocks).toHaveLength(1);
    for (const body of ['H 0 0', 'H "x" 0 0 0', 'H 0 0 0; H 1 1 1', 'H #1 0 0', 'Xx 0 0 0', 'fragment a', 'H 0 0 1e999', 'H 6-31g 0 0 0', '{ }']) {
      expect(extractGeometryBodies(`structure {\n ${body}\n}\n`).blocks, body).toHaveLength(0);
    }
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
