/**
 * Helpers shared by the language-service tests: spec text with the fixture markers of
 * tests/language/fixture.ts (`⟦ ⟧` ranges, `$0` cursor), turned into LSP positions and ranges,
 * and edits applied the way an editor applies them.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { MarkupContent, Position, Range, TextEdit, WorkspaceEdit } from 'vscode-languageserver-types';
import type { AnalysisOptions as AnalyzeOptions, DocumentAnalysis as Analysis } from '../../server/src/analysis';
import type { Span } from '../../server/src/language/text';
import { analyzeMarked, type MarkedText } from '../language/fixture';

export const ROOT = path.resolve(__dirname, '..', '..');
export const URI = 'file:///work/specs/test.tess';

/** Every sample spec, relative to samples/. */
export const SAMPLE_NAMES = [
  'mistakes.tess',
  'zn-site-h2s-scan.tess',
  'launch/ethane-capped-methyls.tess',
  'launch/ethane-plan-variants.tess',
  'molecules/benzene-6-31gs.tess',
  'molecules/dinitrogen-bases.tess',
  'molecules/water-cc-pvdz.tess',
  'molecules/water-sto-3g.tess',
  'open-shell/copper-aqua-doublet.tess',
  'open-shell/dioxygen-triplet.tess',
] as const;

export function readSample(name: string): string {
  return readFileSync(path.join(ROOT, 'samples', name), 'utf8');
}

export interface Marked {
  readonly analysis: Analysis;
  readonly marks: MarkedText;
  /** The `$0` cursor as an LSP position (throws when the text has none). */
  readonly cursor: Position;
  /** The marked ranges `⟦ ⟧` as LSP ranges, in order. */
  readonly ranges: Range[];
}

/** Analyses marked text; the cursor and ranges come back as LSP positions in the stripped text. */
export function marked(text: string, options: AnalyzeOptions = {}): Marked {
  const analysis = analyzeMarked(text, options);
  const { marks } = analysis;
  return {
    analysis,
    marks,
    get cursor(): Position {
      if (marks.cursor === undefined) throw new Error('marked text has no $0 cursor');
      return analysis.lines.positionAt(marks.cursor);
    },
    ranges: marks.ranges.map((span) => rangeOf(analysis, span)),
  };
}

export function rangeOf(analysis: Pick<Analysis, 'lines'>, span: Span): Range {
  return analysis.lines.rangeOf(span);
}

/** The position of the `occurrence`-th `needle` in the text, moved `delta` characters on. */
export function positionOf(analysis: Pick<Analysis, 'text' | 'lines'>, needle: string, delta = 0, occurrence = 0): Position {
  let index = -1;
  for (let i = 0; i <= occurrence; i++) {
    index = analysis.text.indexOf(needle, index + 1);
    if (index < 0) throw new Error(`'${needle}' (occurrence ${occurrence}) not in the text`);
  }
  return analysis.lines.positionAt(index + delta);
}

/** The range of the `occurrence`-th `needle` in the text. */
export function rangeOfText(analysis: Pick<Analysis, 'text' | 'lines'>, needle: string, occurrence = 0): Range {
  const start = positionOf(analysis, needle, 0, occurrence);
  return { start, end: { line: start.line, character: start.character + needle.length } };
}

/** Applies text edits as an editor does (all ranges refer to the original text). */
export function applyEdits(text: string, edits: readonly TextEdit[]): string {
  return TextDocument.applyEdits(TextDocument.create(URI, 'tessera', 1, text), [...edits]);
}

/** The edits of a workspace edit for one document. */
export function editsFor(edit: WorkspaceEdit | undefined, uri = URI): TextEdit[] {
  const edits = edit?.changes?.[uri];
  if (!edits) throw new Error(`the workspace edit has no changes for ${uri}`);
  return edits;
}

/** The Markdown of a hover (hovers here always carry MarkupContent). */
export function markdownOf(contents: unknown): string {
  return (contents as MarkupContent).value;
}
