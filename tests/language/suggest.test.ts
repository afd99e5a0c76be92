/** "Did you mean": the bounded search against the plain one, and its time on many labels. */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { alignmentDistance, editDistance, suggest, SuggestionIndex, SUGGESTION_WORK_LIMIT } from '../../server/src/language/suggest';
import { analyzeDocument } from '../../server/src/analysis';

/** The optimal-string-alignment distance by its textbook recurrence, in full. */
function referenceDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  const d = Array.from({ length: s.length + 1 }, (_, i) => Array.from({ length: t.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= s.length; i++) {
    for (let j = 1; j <= t.length; j++) {
      d[i]![j] = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + (s[i - 1] === t[j - 1] ? 0 : 1));
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) d[i]![j] = Math.min(d[i]![j]!, d[i - 2]![j - 2]! + 1);
    }
  }
  return d[s.length]![t.length]!;
}

/** The unbounded suggestion rule: every candidate in order, the best score, the first on ties. */
function referenceSuggest(word: string, candidates: readonly string[]): string | undefined {
  if (word.length > 64) return undefined;
  const limit = Math.max(1, Math.min(3, Math.floor(word.length / 3)));
  let best: string | undefined;
  let bestScore = Infinity;
  for (const candidate of candidates) {
    if (candidate.toLowerCase() === word.toLowerCase()) return candidate;
    const distance = referenceDistance(word, candidate);
    const bonus = candidate.toLowerCase().startsWith(word.toLowerCase()) && word.length >= 3 ? -1 : 0;
    if (distance <= limit + (bonus ? 2 : 0) && distance + bonus < bestScore) {
      best = candidate;
      bestScore = distance + bonus;
    }
  }
  return best;
}

const word = fc.string({ unitSize: fc.constantFrom('a', 'b', 'c', 'A', '1', '2', '_'), maxLength: 9 } as never);

describe('suggestions', () => {
  it('measure the same distance as the full recurrence, and stop past the bound', () => {
    fc.assert(
      fc.property(word, word, fc.nat({ max: 4 }), (a, b, max) => {
        const full = referenceDistance(a, b);
        expect(editDistance(a, b)).toBe(full);
        expect(alignmentDistance(a.toLowerCase(), b.toLowerCase(), max)).toBe(Math.min(full, max + 1));
      }),
      { numRuns: 3000 },
    );
  });

  it('suggest what the plain rule suggests', () => {
    fc.assert(
      fc.property(word, fc.array(word, { maxLength: 30 }), (typed, candidates) => {
        expect(suggest(typed, candidates)).toBe(referenceSuggest(typed, candidates));
      }),
      { numRuns: 3000 },
    );
  });

  it('keep the work for one analysis bounded when many labels are unknown among many', () => {
    const labels = Array.from({ length: 10_000 }, (_, i) => `h${i}`);
    const index = new SuggestionIndex(labels);
    expect(index.suggest('h1234x')).toBe('h1234');
    // Hundreds of unknown names: past the work limit the index suggests nothing more.
    const answers = Array.from({ length: 200 }, (_, i) => index.suggest(`q${i}zz`));
    expect(answers.filter((answer) => answer !== undefined).length).toBeLessThan(200);
    expect(SUGGESTION_WORK_LIMIT).toBeLessThanOrEqual(4_000_000);
  });

  it('still suggests a label for a typo in a selector', () => {
    const text = 'basis sto-3g\nstructure {\n  O oxygen 0 0 0\n  H hydrogen1 0 0.756950 0.585882\n  H hydrogen2 0 -0.756950 0.585882\n}\nfragment w { atoms oxygen hydrogn1 hydrogen2 }\n';
    const unknown = analyzeDocument(text).diagnostics.find((d) => d.code === 'unknown-atom')!;
    expect(unknown.message).toContain("Did you mean 'hydrogen1'?");
  });
});
