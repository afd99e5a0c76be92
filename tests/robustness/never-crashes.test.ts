/**
 * Bad input never crashes or hangs: random text, mutated samples, huge numbers, very long lines and
 * deep nesting all give an analysis with diagnostics. (A hang would show as a test timeout.)
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeDocument } from '../../server/src/analysis';

const samplesFolder = path.resolve(__dirname, '..', '..', 'samples');

function sampleFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const full = path.join(folder, name);
    return statSync(full).isDirectory() ? sampleFiles(full) : name.endsWith('.tess') ? [full] : [];
  });
}

const samples = sampleFiles(samplesFolder).map((file) => readFileSync(file, 'utf8'));

/** Analysis must finish, keep its invariants, and every diagnostic must sit inside the text. */
function analyseSafely(text: string): void {
  const analysis = analyzeDocument(text, { path: path.join(samplesFolder, 'fuzz.tess') });
  for (const diagnostic of analysis.diagnostics) {
    expect(diagnostic.span.start).toBeGreaterThanOrEqual(0);
    expect(diagnostic.span.end).toBeLessThanOrEqual(text.length);
    expect(diagnostic.span.start).toBeLessThanOrEqual(diagnostic.span.end);
    expect(diagnostic.message.length).toBeGreaterThan(0);
  }
  const report = analysis.report();
  expect(() => JSON.stringify(report)).not.toThrow();
}

// The words of the language, and the retired ones (old specs must not make the analysis fail either).
const vocabulary = ['spec', 'structure', 'in', 'bohr', 'angstrom', 'charge', 'multiplicity', 'basis', 'on', 'functions', 'from', 'fragment', 'atoms', 'rest', 'all', 'closer-than', 'units', 'geometry', 'within', 'of', 'tier', 'quantum', 'method', 'vqe', 'ansatz', 'uccsd', 'mapping', 'parity', 'active', 'frozen-core', 'taper', 'on', 'layers', 'embedding', 'dmet', 'scan', 'distance', 'to', 'step', 'points', 'limits', 'qubits', 'memory', 'GiB', 'Zn', 'H', 'O', 'def2-svp', 'sto-3g', '{', '}', ';', '=', '..', '#1', '#2..#3', '6e', '4o', '"x.xyz"', '"', '0', '-1', '2.5', '1e308', '-1e308', '99999999999999999999', '\n', ' ', '#', '@'];

describe('analysis never fails', () => {
  it('random text', () => {
    fc.assert(fc.property(fc.string({ maxLength: 400 }), (text) => analyseSafely(text)), { numRuns: 300 });
  });

  it('random unicode text', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (text) => analyseSafely(text)), { numRuns: 200 });
  });

  it('random sequences of the language\'s own words', () => {
    const word = fc.constantFrom(...vocabulary);
    fc.assert(fc.property(fc.array(word, { maxLength: 120 }), (words) => analyseSafely(words.join(' '))), { numRuns: 400 });
  });

  it('mutated samples: characters deleted, inserted and replaced', () => {
    const mutation = fc.record({
      sample: fc.nat({ max: samples.length - 1 }),
      edits: fc.array(fc.record({ at: fc.nat(), remove: fc.nat({ max: 8 }), insert: fc.constantFrom('', '{', '}', '..', '#', '"', '0', '-', 'e', '\n', 'rest', 'H', '1e999', ' x ') }), { maxLength: 6 }),
    });
    fc.assert(
      fc.property(mutation, ({ sample, edits }) => {
        let text = samples[sample]!;
        for (const edit of edits) {
          const at = edit.at % (text.length + 1);
          text = text.slice(0, at) + edit.insert + text.slice(at + edit.remove);
        }
        analyseSafely(text);
      }),
      { numRuns: 300 },
    );
  });

  it('huge numbers everywhere', () => {
    const huge = ['1e308', '-1e308', '1e999', '9007199254740993', '0', '-0', '1e-320'];
    for (const value of huge) {
      analyseSafely(`charge ${value}\nmultiplicity ${value}\nbasis sto-3g\nstructure {\n H h ${value} 0 0\n H g 0 ${value} 0\n}\nfragment a { atoms closer-than ${value} to h\n tier quantum { active ${value.replace(/[^0-9]/g, '') || '0'}e ${value.replace(/[^0-9]/g, '') || '0'}o; layers ${value} } }\nscan distance h g from 1 to ${value} step ${value}\nlimits { qubits ${value}; memory ${value} TiB }`);
    }
  });

  it('a very long line and a very long word', () => {
    analyseSafely(`spec "${'x'.repeat(200_000)}"`);
    analyseSafely(`${'a'.repeat(200_000)} ${'('.repeat(10_000)}`);
    analyseSafely(`structure { H ${'1 '.repeat(50_000)} }`);
  });

  it('deep nesting', () => {
    const depth = 100_000;
    const analysis = analyzeDocument(`${'{'.repeat(depth)}${'}'.repeat(depth)}\nstructure { H 0 0 0 }`);
    expect(analysis.diagnostics.some((d) => d.message.includes('nested deeper'))).toBe(true);
    expect(analysis.model.atoms).toHaveLength(1);
    analyseSafely(`fragment a ${'{ tier quantum '.repeat(5_000)}`);
  });
});
