/** "Did you mean" suggestions by edit distance (optimal string alignment, case-insensitive). */

export function editDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  const rows = s.length + 1;
  const cols = t.length + 1;
  const d: number[][] = Array.from({ length: rows }, (_, i) => {
    const row = new Array<number>(cols).fill(0);
    row[0] = i;
    return row;
  });
  for (let j = 0; j < cols; j++) d[0]![j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      let best = Math.min(d[i - 1]![j]! + 1, d[i]![j - 1]! + 1, d[i - 1]![j - 1]! + cost);
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) best = Math.min(best, d[i - 2]![j - 2]! + 1);
      d[i]![j] = best;
    }
  }
  return d[s.length]![t.length]!;
}

/** The closest candidate within a distance that grows with the word's length, if any. */
export function suggest(word: string, candidates: Iterable<string>): string | undefined {
  if (word.length > 64) return undefined;
  const limit = Math.max(1, Math.min(3, Math.floor(word.length / 3)));
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const candidate of candidates) {
    if (candidate.toLowerCase() === word.toLowerCase()) return candidate;
    const distance = editDistance(word, candidate);
    const prefixBonus = candidate.toLowerCase().startsWith(word.toLowerCase()) && word.length >= 3 ? -1 : 0;
    const score = distance + prefixBonus;
    if (distance <= limit + (prefixBonus ? 2 : 0) && score < bestDistance) {
      best = candidate;
      bestDistance = score;
    }
  }
  return best;
}

/** " Did you mean 'x'?" or "" — ready to append to a message. */
export function didYouMean(word: string, candidates: Iterable<string>): string {
  const suggestion = suggest(word, candidates);
  return suggestion ? ` Did you mean '${suggestion}'?` : '';
}
