/**
 * Rewrites every retired spelling of a spec (migrate.ts has the rules). Rewrites can touch the same
 * text (a `units bohr` line converts a distance inside a `within` selector that is rewritten too),
 * so they are applied in rounds: each round applies every rewrite that does not overlap an earlier
 * one, analyses the result again, and stops when nothing is left to rewrite.
 */
import { analyze, type AnalyzeOptions } from './analyze';
import { retiredSpellings, type RetiredSpelling, type TextChange } from './migrate';

const MAX_ROUNDS = 8;

export interface Rewritten {
  readonly text: string;
  /** Retired spellings that could not be rewritten (their messages say what to do by hand). */
  readonly remaining: readonly RetiredSpelling[];
}

/** Whether two changes touch the same text; an insertion touches a span it stands in or at the edge of. */
function overlaps(a: TextChange, b: TextChange): boolean {
  const insertIn = (insert: TextChange, other: TextChange) => insert.span.start === insert.span.end && other.span.start <= insert.span.start && insert.span.start <= other.span.end;
  return Math.max(a.span.start, b.span.start) < Math.min(a.span.end, b.span.end) || insertIn(a, b) || insertIn(b, a);
}

const same = (a: TextChange, b: TextChange) => a.span.start === b.span.start && a.span.end === b.span.end && a.newText === b.newText;

/** Applies non-overlapping changes to a text. */
export function applyChanges(text: string, changes: readonly TextChange[]): string {
  const sorted = [...changes].sort((a, b) => b.span.start - a.span.start || b.span.end - a.span.end);
  let out = text;
  for (const change of sorted) out = out.slice(0, change.span.start) + change.newText + out.slice(change.span.end);
  return out;
}

export function rewriteRetiredSpellings(text: string, options: AnalyzeOptions = {}): Rewritten {
  let current = text;
  for (let round = 0; round < MAX_ROUNDS; round++) {
    const analysis = analyze(current, options);
    const items = retiredSpellings(current, analysis.tree, analysis.model);
    const chosen: TextChange[] = [];
    for (const item of items) {
      if (item.changes.length === 0) continue;
      const fresh = item.changes.filter((change) => !chosen.some((taken) => same(taken, change)));
      if (fresh.some((change) => chosen.some((taken) => overlaps(taken, change)))) continue;
      chosen.push(...fresh);
    }
    if (chosen.length === 0) return { text: current, remaining: items };
    current = applyChanges(current, chosen);
  }
  const analysis = analyze(current, options);
  return { text: current, remaining: retiredSpellings(current, analysis.tree, analysis.model) };
}
