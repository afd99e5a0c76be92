/**
 * Text from a spec made safe to show: control and reordering characters escaped, long quotes
 * shortened, and every diagnostic message passed through it.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/language/analyze';
import { escapeControl, hasControl, safeMessage, shortenRuns } from '../../server/src/language/printable';

describe('escapeControl', () => {
  it('writes C0, DEL, C1, bidirectional and separator characters as visible escapes', () => {
    expect(escapeControl('a\u001b]0;title\u0007b\u0000c\u007fd\u009be\u202ef\u2028g\ufeffh')).toBe('a\\x1b]0;title\\x07b\\x00c\\x7fd\\x9be\\u202ef\\u2028g\\ufeffh');
    expect(escapeControl('tab\tline\nreturn\r')).toBe('tab\\x09line\\x0areturn\\x0d');
    expect(escapeControl('two\nlines', true)).toBe('two\nlines');
  });

  it('leaves ordinary text, accents, Greek and emoji alone', () => {
    const text = 'ångström α/β Jordan–Wigner ≈ 1.23 × 10^45 😀';
    expect(escapeControl(text)).toBe(text);
    expect(hasControl(text)).toBe(false);
    expect(hasControl('a\u001bb')).toBe(true);
  });
});

describe('shortenRuns and safeMessage', () => {
  it('shortens runs beyond 80 characters to head … tail and the length, keeping the words around', () => {
    const quoted = `'${'x'.repeat(1000)}'`;
    const shortened = shortenRuns(`Unknown keyword ${quoted} at the top level.`);
    expect(shortened).toBe(`Unknown keyword '${'x'.repeat(47)}…${'x'.repeat(15)}' (1,002 characters) at the top level.`);
    expect(shortenRuns(`short 'words' stay`)).toBe(`short 'words' stay`);
  });

  it('never cuts a surrogate pair', () => {
    const shortened = shortenRuns('😀'.repeat(100));
    expect(shortened).not.toMatch(/[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/);
  });

  it('caps a message at 2,000 characters', () => {
    expect(safeMessage('word '.repeat(1000)).length).toBeLessThanOrEqual(2000);
  });
});

describe('diagnostics quote the spec safely', () => {
  it('a string with ESC and NUL reaches no message raw', () => {
    const analysis = analyze('basis "\u001b[2J\u0000"\nstructure {\n  H 0 0 0\n}\n');
    const invalid = analysis.diagnostics.find((d) => d.code === 'invalid-value')!;
    expect(invalid.message).toContain('the string "\\x1b[2J\\x00"');
    for (const d of analysis.diagnostics) expect(hasControl(d.message)).toBe(false);
  });

  it('a raw escape character outside a string is named, escaped', () => {
    const analysis = analyze('spec "x" \u001b[31m\nbasis sto-3g\nstructure {\n  H 0 0 0\n}\n');
    const bad = analysis.diagnostics.find((d) => d.code === 'unexpected-character')!;
    expect(bad.message).toContain("'\\x1b['");
    expect(hasControl(bad.message)).toBe(false);
  });
});
