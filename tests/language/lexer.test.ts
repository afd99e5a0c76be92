/**
 * The lexer reads tokens of any length, and its hand-written scanners for strings and words accept
 * exactly what the regular expressions they replace accepted (kept here as the reference).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { StringLiteral, tokenize, UnterminatedString, Word } from '../../server/src/language/lexer';
import { analyze } from '../../server/src/language/analyze';
import { parseSpec } from '../../server/src/language/parser';

/** The patterns of these tokens before the scanners replaced them. */
const REFERENCE = new Map([
  [StringLiteral, /"(?:[^"\\\n]|\\.)*"/y],
  [UnterminatedString, /"(?:[^"\\\r\n]|\\.)*/y],
  [Word, /(?:[A-Za-z_]|[0-9]+(?=[A-Za-z_-]))(?:[A-Za-z0-9_\-+*']|\/(?=[A-Za-z])|\([A-Za-z0-9_,+*' ]*\))*/y],
]);

function scannerMatch(token: typeof Word, text: string, offset: number): string | null {
  const pattern = token.PATTERN as { exec(text: string, offset: number): [string] | null };
  return pattern.exec(text, offset)?.[0] ?? null;
}

function referenceMatch(token: typeof Word, text: string, offset: number): string | null {
  const pattern = REFERENCE.get(token)!;
  pattern.lastIndex = offset;
  return pattern.exec(text)?.[0] ?? null;
}

const ALPHABET = ['a', 'Z', '_', '0', '7', '-', '+', '*', "'", '/', '(', ')', ',', ' ', '"', '\\', '\n', '\r', '\u2028', '.', 'é', '#', '{', 'x'];

describe('the string and word scanners', () => {
  for (const token of [StringLiteral, UnterminatedString, Word]) {
    it(`${token.name}: the same match as its former regular expression, at every offset of random text`, () => {
      fc.assert(
        fc.property(fc.array(fc.constantFrom(...ALPHABET), { maxLength: 40 }), (characters) => {
          const text = characters.join('');
          for (let offset = 0; offset <= text.length; offset++) {
            expect(scannerMatch(token, text, offset), JSON.stringify({ text, offset })).toBe(referenceMatch(token, text, offset));
          }
        }),
        { numRuns: 400 },
      );
    });
  }

  it('examples: basis names, methods, escapes and line ends', () => {
    expect(scannerMatch(Word, '6-31+G(d,p) x', 0)).toBe('6-31+G(d,p)');
    expect(scannerMatch(Word, 'ccsd(t)', 0)).toBe('ccsd(t)');
    expect(scannerMatch(Word, 'ccsd(t', 0)).toBe('ccsd');
    expect(scannerMatch(Word, 'kcal/mol;', 0)).toBe('kcal/mol');
    expect(scannerMatch(Word, 'kcal/ mol', 0)).toBe('kcal');
    expect(scannerMatch(Word, '123 ', 0)).toBeNull();
    expect(scannerMatch(StringLiteral, '"a\\"b" c', 0)).toBe('"a\\"b"');
    expect(scannerMatch(StringLiteral, '"ab\n"', 0)).toBeNull();
    expect(scannerMatch(UnterminatedString, '"ab\r\n', 0)).toBe('"ab');
    expect(scannerMatch(UnterminatedString, '"ab\\\n', 0)).toBe('"ab');
  });
});

describe('tokens of any length', () => {
  const HUGE = 10_000_000;

  it('a 10 MB word, string, number and comment each lex as one token', () => {
    for (const [text, type] of [
      ['a'.repeat(HUGE), 'Word'],
      [`"${'a'.repeat(HUGE)}"`, 'StringLiteral'],
      [`"${'\\"'.repeat(HUGE / 2)}`, 'UnterminatedString'],
      ['1'.repeat(HUGE), 'NumberLiteral'],
    ] as const) {
      const lexed = tokenize(text);
      expect(lexed.tokens.map((token) => token.tokenType.name)).toEqual([type]);
      expect(lexed.tokens[0]!.image.length).toBe(text.length);
    }
    expect(tokenize(`# ${'c'.repeat(HUGE)}`).comments).toHaveLength(1);
  });

  /** Within the supported 8 MiB of a spec. */
  const LARGE = 5_000_000;

  it('a 5 MB fragment name: analysed, and the message quotes it shortened with its length', () => {
    const name = 'f'.repeat(LARGE);
    const analysis = analyze(`basis sto-3g\nstructure {\n  H 0 0 0\n}\nfragment ${name} { atoms rest }\n`);
    const missingTier = analysis.diagnostics.find((d) => d.code === 'missing-tier')!;
    expect(missingTier.message.length).toBeLessThan(400);
    expect(missingTier.message).toContain('…');
    expect(missingTier.message).toContain('(5,000,002 characters)');
    expect(analysis.model.fragments[0]!.name).toBe(name);
  });

  it('a 5 MB coordinate: invalid-value with the number shortened', () => {
    const analysis = analyze(`basis sto-3g\nstructure {\n  H 0 0 ${'9'.repeat(LARGE)}\n}\n`);
    const invalid = analysis.diagnostics.find((d) => d.code === 'invalid-value')!;
    expect(invalid.message).toMatch(/^A coordinate '9{47}…9{15}' \(5,000,002 characters\) is too large to be a number\.$/);
  });

  it('many statements on one line inside a block cost no more than the line (linear)', () => {
    // `spec` opens a top-level statement, so each one makes the parser look back to the line start.
    const tree = parseSpec(`fragment x {\n  atoms a;${'spec;'.repeat(200_000)}}\n`);
    expect(tree.statements).toHaveLength(1);
    expect(tree.statements[0]!.block!.statements).toHaveLength(200_001);
  });
});
