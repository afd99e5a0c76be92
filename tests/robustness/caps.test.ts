/**
 * What scales with hostile input is capped and says so: clash and bond pairs of atoms piled on one
 * spot, and the formatter's output on deep nesting and long lines.
 */
import { describe, expect, it } from 'vitest';
import { analyseContacts, MAX_STORED_BONDS, MAX_STORED_CLASHES } from '../../server/src/chemistry/geometry';
import { analyze } from '../../server/src/language/analyze';
import { MAX_BLOCK_DEPTH } from '../../server/src/language/parser';
import { formatLines, formatText } from '../../server/src/services/format';

function pile(count: number): string {
  return `basis sto-3g\nstructure {\n${'  H 0 0 0\n'.repeat(count)}}\n`;
}

describe('coincident atoms', () => {
  it('5,000 atoms at one spot: 50 clashes reported and how many more, pairs stored within the caps', () => {
    const analysis = analyze(pile(5000));
    const contacts = analysis.model.contacts;
    const pairs = (5000 * 4999) / 2;
    expect(contacts.complete).toBe(true);
    expect(contacts.clashCount).toBe(pairs);
    expect(contacts.bondCount).toBe(pairs);
    expect(contacts.clashes).toHaveLength(MAX_STORED_CLASHES);
    expect(contacts.bonds).toHaveLength(MAX_STORED_BONDS);
    const clashes = analysis.diagnostics.filter((d) => d.code === 'atoms-too-close');
    expect(clashes).toHaveLength(51);
    expect(clashes.some((d) => d.message === `${(pairs - 50).toLocaleString('en-US')} more pairs of atoms are closer than 0.5 Å.`)).toBe(true);
  });

  it('20,000 atoms at one spot: the search stops and the count is a lower bound, said so', () => {
    const analysis = analyze(pile(20_000));
    expect(analysis.model.contacts.complete).toBe(false);
    const summary = analysis.diagnostics.find((d) => d.code === 'atoms-too-close' && d.message.includes('more pairs'))!;
    expect(summary.message).toMatch(/^[\d,]+ more pairs of atoms are closer than 0\.5 Å \(at least: the search stopped after examining 50,000,000 pairs of atoms/);
    expect(analysis.diagnostics.some((d) => d.code === 'units-suspect')).toBe(false);
  });

  it('an ordinary geometry is complete and keeps every pair', () => {
    const contacts = analyseContacts(Float64Array.of(0, 0, 0, 0, 0, 0.74, 0, 0, 0.3), Float64Array.of(0.31, 0.31, 0.31));
    expect(contacts.complete).toBe(true);
    expect(contacts.clashCount).toBe(2);
    expect(contacts.clashes).toHaveLength(2);
  });
});

describe('the formatter is linear', () => {
  it('13,000 nested blocks, one brace per line: indentation stops at the parser\'s depth limit', () => {
    const lines = formatLines('{\n'.repeat(13_000));
    expect(lines).toHaveLength(13_001);
    const widest = lines.reduce((most, line) => Math.max(most, line.length), 0);
    expect(widest).toBe(2 * MAX_BLOCK_DEPTH + 1);
    expect(formatText(formatText('{\n'.repeat(13_000)))).toBe(formatText('{\n'.repeat(13_000)));
  });

  it('a comment of a million characters ending in spaces, and a line of 100,000 words, format', () => {
    const comment = `spec "x"  # ${'word '.repeat(200_000)}   \n`;
    expect(formatText(comment)).toBe(`spec "x"  # ${'word '.repeat(200_000).trimEnd()}\n`);
    expect(formatText(`spec ${'a '.repeat(100_000)}\n`)).toBe(`spec ${'a '.repeat(100_000).trimEnd()}\n`);
  });

  it('a structure block of 50,000 atoms (150,000 numbers) aligns without overflowing the stack', () => {
    const text = `structure {\n${Array.from({ length: 50_000 }, (_, i) => ` H ${i} 0 0`).join('\n')}\n}\n`;
    const lines = formatLines(text);
    expect(lines[1]).toBe('  H      0.0000      0.0000      0.0000');
    expect(lines[50_000]).toBe('  H  49999.0000      0.0000      0.0000');
  });
});
