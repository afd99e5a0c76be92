/**
 * "Did you mean" suggestions by edit distance (optimal string alignment, case-insensitive).
 *
 * Bounded work: only candidates whose length could be within the accepted distance are compared;
 * each comparison stops as soon as every alignment is past that distance, in row buffers reused
 * from one comparison to the next; and an index over many candidates (the labels of a large
 * geometry) stops suggesting once it has done a fixed amount of work for one analysis.
 */

let previousRow = new Int32Array(64);
let currentRow = new Int32Array(64);
let beforeRow = new Int32Array(64);

function ensureRows(length: number): void {
  if (previousRow.length >= length) return;
  const size = Math.max(length, 2 * previousRow.length);
  previousRow = new Int32Array(size);
  currentRow = new Int32Array(size);
  beforeRow = new Int32Array(size);
}

/** Cells the last alignmentDistance computed (its work). */
export let lastAlignmentCells = 0;

/**
 * The optimal-string-alignment distance of two strings (compared as given: lower-case them first
 * for a case-insensitive distance), or `max + 1` as soon as it is certain to exceed `max`. Only
 * the band of cells within `max` of the diagonal is computed.
 */
export function alignmentDistance(s: string, t: string, max = Infinity): number {
  lastAlignmentCells = 0;
  if (Math.abs(s.length - t.length) > max) return max + 1;
  const cols = t.length + 1;
  ensureRows(cols + 1);
  const big = Number.isFinite(max) ? max + 1 : 1 << 30;
  const band = Number.isFinite(max) ? max : s.length + cols;
  let before = beforeRow;
  let previous = previousRow;
  let current = currentRow;
  for (let j = 0; j < cols; j++) previous[j] = j <= band ? j : big;
  previous[cols] = big;
  for (let i = 1; i <= s.length; i++) {
    const lo = Math.max(1, i - band);
    const hi = Math.min(t.length, i + band);
    current[0] = i <= band ? i : big;
    if (lo > 1) current[lo - 1] = big;
    let rowMinimum = lo === 1 ? current[0]! : big;
    const si = s.charCodeAt(i - 1);
    for (let j = lo; j <= hi; j++) {
      const tj = t.charCodeAt(j - 1);
      let best = Math.min(previous[j]! + 1, current[j - 1]! + 1, previous[j - 1]! + (si === tj ? 0 : 1));
      if (i > 1 && j > 1 && si === t.charCodeAt(j - 2) && s.charCodeAt(i - 2) === tj) best = Math.min(best, before[j - 2]! + 1);
      if (best > big) best = big;
      current[j] = best;
      if (best < rowMinimum) rowMinimum = best;
    }
    // The cell right of the band is out of reach for the next row.
    current[hi + 1] = big;
    lastAlignmentCells += hi - lo + 1;
    if (rowMinimum > max) return max + 1;
    const spare = before;
    before = previous;
    previous = current;
    current = spare;
  }
  const distance = previous[t.length]!;
  return distance > max ? max + 1 : distance;
}

export function editDistance(a: string, b: string): number {
  return alignmentDistance(a.toLowerCase(), b.toLowerCase());
}

/**
 * Cells an index computes at most for one analysis (a few tens of milliseconds); past it, it suggests
 * nothing more, so a spec with hundreds of unknown labels among thousands still analyses quickly.
 */
export const SUGGESTION_WORK_LIMIT = 4_000_000;

/** Candidates lower-cased once and grouped by length, for many suggestions over the same list. */
export class SuggestionIndex {
  private readonly byLength = new Map<number, { original: string; lower: string; position: number }[]>();
  private work = 0;

  constructor(candidates: Iterable<string>) {
    let position = 0;
    for (const original of candidates) {
      const lower = original.toLowerCase();
      const entry = { original, lower, position: position++ };
      const bucket = this.byLength.get(lower.length);
      if (bucket) bucket.push(entry);
      else this.byLength.set(lower.length, [entry]);
    }
  }

  /** The closest candidate within a distance that grows with the word's length, if any. */
  suggest(word: string): string | undefined {
    if (word.length > 64 || this.work > SUGGESTION_WORK_LIMIT) return undefined;
    const lower = word.toLowerCase();
    const limit = Math.max(1, Math.min(3, Math.floor(word.length / 3)));
    // A candidate that starts with the word (of three letters or more) may be two edits further.
    const reach = limit + (word.length >= 3 ? 2 : 0);
    let best: string | undefined;
    let bestScore = Infinity;
    // Equal scores go to the candidate listed first.
    let bestPosition = Infinity;
    for (let length = Math.max(0, lower.length - reach); length <= lower.length + reach; length++) {
      for (const candidate of this.byLength.get(length) ?? []) {
        if (candidate.lower === lower) return candidate.original;
        const prefixBonus = word.length >= 3 && candidate.lower.startsWith(lower) ? -1 : 0;
        const allowed = limit + (prefixBonus ? 2 : 0);
        const distance = alignmentDistance(lower, candidate.lower, allowed);
        this.work += lastAlignmentCells + 1;
        const score = distance + prefixBonus;
        if (distance <= allowed && (score < bestScore || (score === bestScore && candidate.position < bestPosition))) {
          best = candidate.original;
          bestScore = score;
          bestPosition = candidate.position;
        }
      }
    }
    return best;
  }
}

/** The closest candidate within a distance that grows with the word's length, if any. */
export function suggest(word: string, candidates: Iterable<string>): string | undefined {
  return new SuggestionIndex(candidates).suggest(word);
}

/** " Did you mean 'x'?" or "" — ready to append to a message. */
export function didYouMean(word: string, candidates: Iterable<string>): string {
  const suggestion = suggest(word, candidates);
  return suggestion ? ` Did you mean '${suggestion}'?` : '';
}
