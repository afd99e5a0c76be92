/**
 * Fixture-style helpers for language tests. Spec text carries its expectations inline:
 *
 *   ⟦ ... ⟧  the exact text a diagnostic must cover (several pairs allowed, not nested);
 *   $0       a cursor position, for service tests (at most one).
 *
 * The markers are removed before the text is analysed, and every offset is reported in the
 * stripped text.
 */
import { expect } from 'vitest';
import { analyzeDocument, type AnalysisOptions as AnalyzeOptions, type DocumentAnalysis as Analysis } from '../../server/src/analysis';
import type { Diagnostic, DiagnosticCode } from '../../server/src/language/diagnostics';
import type { FileHost, FileRead } from '../../server/src/language/files';
import type { Span } from '../../server/src/language/text';

export const RANGE_OPEN = '⟦';
export const RANGE_CLOSE = '⟧';
export const CURSOR = '$0';

export interface MarkedText {
  /** The text with every marker removed. */
  readonly text: string;
  /** The marked ranges, in the order they appear. */
  readonly ranges: Span[];
  /** Offset of `$0`, if present. */
  readonly cursor: number | undefined;
}

/** Removes the markers and returns where they were, as offsets into the stripped text. */
export function parseMarkers(marked: string): MarkedText {
  let text = '';
  const ranges: Span[] = [];
  let open: number | undefined;
  let cursor: number | undefined;
  for (let i = 0; i < marked.length; ) {
    if (marked.startsWith(RANGE_OPEN, i)) {
      if (open !== undefined) throw new Error(`fixture: nested '${RANGE_OPEN}' at marked offset ${i}`);
      open = text.length;
      i += RANGE_OPEN.length;
    } else if (marked.startsWith(RANGE_CLOSE, i)) {
      if (open === undefined) throw new Error(`fixture: '${RANGE_CLOSE}' without '${RANGE_OPEN}' at marked offset ${i}`);
      ranges.push({ start: open, end: text.length });
      open = undefined;
      i += RANGE_CLOSE.length;
    } else if (marked.startsWith(CURSOR, i)) {
      if (cursor !== undefined) throw new Error('fixture: more than one cursor marker');
      cursor = text.length;
      i += CURSOR.length;
    } else {
      text += marked[i];
      i++;
    }
  }
  if (open !== undefined) throw new Error(`fixture: '${RANGE_OPEN}' is never closed`);
  return { text, ranges, cursor };
}

/** Analyses text that may carry markers (they are stripped first); every diagnostic, the estimate checks' included. */
export function analyzeMarked(marked: string, options: AnalyzeOptions = {}): Analysis & { marks: MarkedText } {
  const marks = parseMarkers(marked);
  return Object.assign(analyzeDocument(marks.text, options), { marks });
}

/** A compact, readable form of a diagnostic for assertion messages and equality checks. */
export function show(analysis: Pick<Analysis, 'text'>, d: Diagnostic): string {
  return `${d.code} [${d.span.start},${d.span.end}] «${analysis.text.slice(d.span.start, d.span.end)}»`;
}

/**
 * Strips the markers, analyses, and asserts exactly one diagnostic of `code` whose span is the
 * single marked range. Returns that diagnostic (for checks on its message and data) and the analysis.
 */
export function expectDiagnostic(
  marked: string,
  code: DiagnosticCode,
  options: AnalyzeOptions = {},
): { diagnostic: Diagnostic; analysis: Analysis } {
  const analysis = analyzeMarked(marked, options);
  const { ranges } = analysis.marks;
  if (ranges.length !== 1) throw new Error(`expectDiagnostic needs exactly one marked range, found ${ranges.length}`);
  const expected = ranges[0]!;
  const found = analysis.diagnostics.filter((d) => d.code === code);
  const shown = analysis.diagnostics.map((d) => show(analysis, d));
  expect(found.length, `expected one '${code}', got: ${shown.join('; ') || 'no diagnostics'}`).toBe(1);
  expect(found[0]!.span, `span of '${code}' («${analysis.text.slice(expected.start, expected.end)}» expected)`).toEqual(expected);
  return { diagnostic: found[0]!, analysis };
}

/**
 * Asserts that the diagnostics are exactly the given codes on the marked ranges, paired in order
 * of appearance (the i-th range with the i-th code), and nothing else.
 */
export function expectDiagnostics(marked: string, expectedCodes: readonly DiagnosticCode[], options: AnalyzeOptions = {}): Analysis {
  const analysis = analyzeMarked(marked, options);
  const { ranges } = analysis.marks;
  if (ranges.length !== expectedCodes.length) {
    throw new Error(`expectDiagnostics: ${ranges.length} marked ranges but ${expectedCodes.length} codes`);
  }
  const expected = expectedCodes.map((code, i) => `${code} [${ranges[i]!.start},${ranges[i]!.end}] «${analysis.text.slice(ranges[i]!.start, ranges[i]!.end)}»`);
  const actual = analysis.diagnostics.map((d) => show(analysis, d));
  expect([...actual].sort()).toEqual([...expected].sort());
  return analysis;
}

/** Asserts that `code` is not reported, and returns the analysis. */
export function expectNoDiagnostic(text: string, code: DiagnosticCode, options: AnalyzeOptions = {}): Analysis {
  const analysis = analyzeMarked(text, options);
  const found = analysis.diagnostics.filter((d) => d.code === code).map((d) => show(analysis, d));
  expect(found, `'${code}' should not be reported`).toEqual([]);
  return analysis;
}

/** The codes of every diagnostic of the (marker-free or marked) text, in position order. */
export function codes(text: string, options: AnalyzeOptions = {}): DiagnosticCode[] {
  return analyzeMarked(text, options).diagnostics.map((d) => d.code);
}

/** A file host serving fixed texts by absolute path; anything else is "no such file". */
export function memoryFiles(files: Readonly<Record<string, string>>, links: Readonly<Record<string, string>> = {}): FileHost {
  return {
    readFile(absolutePath: string): FileRead {
      const text = files[absolutePath];
      return text === undefined ? { ok: false, reason: 'no such file' } : { ok: true, text };
    },
    realPath(absolutePath: string): string {
      return links[absolutePath] ?? absolutePath;
    },
  };
}
