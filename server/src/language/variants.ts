/**
 * Plan variants: `variant <name> { … }` blocks of a spec, each turned into the text of a spec of its
 * own, which is then analysed like any spec (analysis/variants.ts).
 *
 * A variant's text is the spec's text without its variant blocks, with the variant's statements
 * written over it:
 *
 * - `fragment <name> { … }` naming a fragment of the spec patches it: each statement replaces the
 *   fragment's statement of the same keyword, or is added. A `tier` of the same level patches the
 *   tier the same way (`active`, `mapping`, `taper`, … replaced or added); a tier of another level
 *   replaces the whole tier. A fragment the spec lacks is added as written.
 * - `basis <name> on …` lines are added; every other top-level statement (`caps`, `embedding`,
 *   `frozen-core`, `functions`, `limits`, the main `basis` line) replaces the spec's, or is added.
 *
 * Works on the concrete syntax tree and text spans only: it knows no meaning beyond keyword names.
 */
import type { Statement, SyntaxTree } from './syntax';
import type { Span } from './text';

export interface VariantText {
  readonly name: string;
  /** The span of the variant's name in the spec, where its problems are reported. */
  readonly nameSpan: Span;
  readonly text: string;
}

interface Edit {
  readonly start: number;
  readonly end: number;
  readonly text: string;
}

const REPEATED_TOP = new Set(['fragment']);

function keywordOf(statement: Statement): string {
  return statement.keyword.text;
}

function source(text: string, span: Span): string {
  return text.slice(span.start, span.end);
}

/** A basis line with `on`: an override, which adds rather than replaces. */
function isOverride(statement: Statement): boolean {
  return keywordOf(statement) === 'basis' && statement.args.some((arg) => arg.kind === 'word' && arg.text === 'on');
}

function fragmentName(statement: Statement): string | undefined {
  return keywordOf(statement) === 'fragment' ? statement.args[0]?.text : undefined;
}

/**
 * Edits that write the statements of `patch` (a block's statements) over the block of `target`:
 * same keyword replaced, others inserted before the block's closing brace. `nested` names the
 * keyword whose blocks are patched in turn when their first argument (a level) agrees.
 */
function patchBlock(text: string, target: Statement, patch: readonly Statement[], nested: string | undefined, edits: Edit[]): void {
  const block = target.block;
  // A block left open is reported in the spec itself; the variant leaves it as it is.
  if (!block?.close) return;
  const inserted: string[] = [];
  for (const statement of patch) {
    const keyword = keywordOf(statement);
    const existing = block.statements.find((inner) => keywordOf(inner) === keyword);
    if (existing && nested === keyword && statement.block && existing.block && statement.args[0]?.text === existing.args[0]?.text) {
      patchBlock(text, existing, statement.block.statements, undefined, edits);
    } else if (existing) {
      edits.push({ start: existing.span.start, end: existing.span.end, text: source(text, statement.span) });
    } else {
      inserted.push(source(text, statement.span));
    }
  }
  if (inserted.length > 0) edits.push({ start: block.close.start, end: block.close.start, text: `\n${inserted.join('\n')}\n` });
}

function applyEdits(text: string, edits: readonly Edit[]): string {
  const sorted = [...edits].sort((a, b) => a.start - b.start || a.end - b.end);
  let out = '';
  let at = 0;
  for (const edit of sorted) {
    if (edit.start < at) continue; // overlapping edits cannot come from distinct statements; keep the first
    out += text.slice(at, edit.start) + edit.text;
    at = edit.end;
  }
  return out + text.slice(at);
}

/** The spec text of each variant of a spec (in order; unnamed variants are left out). */
export function variantTexts(text: string, tree: SyntaxTree): VariantText[] {
  const top = tree.statements;
  const variants = top.filter((statement) => keywordOf(statement) === 'variant' && statement.args[0] !== undefined);
  if (variants.length === 0) return [];
  // Every variant block is removed from every variant's text.
  const removals: Edit[] = top.filter((statement) => keywordOf(statement) === 'variant').map((statement) => ({ start: statement.span.start, end: statement.span.end, text: '' }));
  return variants.map((variant) => {
    const edits: Edit[] = [...removals];
    const appended: string[] = [];
    for (const statement of variant.block?.statements ?? []) {
      const keyword = keywordOf(statement);
      const name = fragmentName(statement);
      if (name !== undefined) {
        const target = top.find((candidate) => fragmentName(candidate) === name);
        if (target && statement.block) patchBlock(text, target, statement.block.statements, 'tier', edits);
        else appended.push(source(text, statement.span));
        continue;
      }
      if (isOverride(statement) || REPEATED_TOP.has(keyword)) {
        appended.push(source(text, statement.span));
        continue;
      }
      const target = top.find((candidate) => keywordOf(candidate) === keyword && !isOverride(candidate));
      if (target) edits.push({ start: target.span.start, end: target.span.end, text: source(text, statement.span) });
      else appended.push(source(text, statement.span));
    }
    const body = applyEdits(text, edits);
    const name = variant.args[0]!;
    return { name: name.text, nameSpan: name.span, text: appended.length > 0 ? `${body.replace(/\s*$/, '')}\n${appended.join('\n')}\n` : body };
  });
}
