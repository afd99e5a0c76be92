/**
 * Diagnostics: every problem Tessera reports has a stable code, a severity, an exact span and a
 * message that states the numbers behind it. The registry below is the single list of codes.
 */
import { safeMessage } from './printable';
import type { Span } from './text';

export type Severity = 'error' | 'warning' | 'information' | 'hint';

export interface RelatedInformation {
  readonly span: Span;
  readonly message: string;
  /** Absolute path of another file (an included XYZ file); absent for the spec itself. */
  readonly file?: string;
  /** For another file: zero-based line of the location. */
  readonly line?: number;
}

export interface Diagnostic {
  readonly code: DiagnosticCode;
  readonly severity: Severity;
  readonly span: Span;
  readonly message: string;
  readonly related?: readonly RelatedInformation[];
  /** Machine-readable details for quick fixes (for example the suggested word). */
  readonly data?: Readonly<Record<string, unknown>>;
}

interface CodeInfo {
  readonly severity: Severity;
  readonly title: string;
}

export const DIAGNOSTIC_CODES = {
  // Reading the text
  'unexpected-character': { severity: 'error', title: 'A character that is not part of the language' },
  'unterminated-string': { severity: 'error', title: 'A string without its closing quote' },
  'unclosed-block': { severity: 'error', title: 'A `{` without its `}`' },
  'unexpected-token': { severity: 'error', title: 'A brace or block where none belongs' },
  // Statements and values
  'unknown-keyword': { severity: 'error', title: 'A keyword the language does not have' },
  'misplaced-keyword': { severity: 'error', title: 'A keyword used in a block where it does not belong' },
  'missing-value': { severity: 'error', title: 'A statement without the value it needs' },
  'invalid-value': { severity: 'error', title: 'A value of the wrong kind (for example a word where a number belongs)' },
  'extra-value': { severity: 'error', title: 'More values than the statement takes' },
  'unexpected-block': { severity: 'error', title: 'A block after a statement that takes none' },
  'missing-block': { severity: 'error', title: 'A statement that needs a block without one' },
  'duplicate-statement': { severity: 'error', title: 'The same setting given twice' },
  'unknown-value': { severity: 'error', title: 'A value that is not one of the allowed words' },
  'unknown-method': { severity: 'error', title: 'A method name Tessera does not know' },
  'method-tier-mismatch': { severity: 'error', title: 'A method that belongs to another tier' },
  'unknown-ansatz': { severity: 'error', title: 'An ansatz name Tessera does not know' },
  'unknown-mapping': { severity: 'error', title: 'A fermion-to-qubit mapping Tessera does not know' },
  'unknown-basis': { severity: 'error', title: 'A basis-set name not in the library' },
  'setting-ignored': { severity: 'warning', title: 'A setting that has no effect in this tier' },
  'missing-tier': { severity: 'warning', title: 'A fragment without a solver tier' },
  // Geometry
  'missing-geometry': { severity: 'error', title: 'No atoms' },
  'unknown-element': { severity: 'error', title: 'An element symbol that does not exist' },
  'invalid-atom': { severity: 'error', title: 'An atom line without exactly three coordinates' },
  'duplicate-label': { severity: 'error', title: 'Two atoms with the same label' },
  'include-outside-folder': { severity: 'error', title: 'An included file outside the spec\'s folder tree' },
  'include-unreadable': { severity: 'error', title: 'An included file that cannot be read' },
  'include-invalid': { severity: 'error', title: 'An included XYZ file or spec that cannot be used as it is (a malformed line, an include cycle, fragments it lacks)' },
  'coordinate-out-of-range': { severity: 'error', title: 'A coordinate beyond ±100,000 Å, which no molecule has' },
  'atoms-too-close': { severity: 'error', title: 'Two atoms closer than 0.5 Å' },
  'units-suspect': { severity: 'warning', title: 'Distances that look typed in the other length unit' },
  'bond-cut': { severity: 'warning', title: 'Covalent bonds cut by a fragment boundary' },
  'near-symmetry': { severity: 'information', title: 'A geometry a small distance away from a higher point group' },
  'scan-symmetry-change': { severity: 'information', title: 'A scan along which the point group (and the figures counted in it) changes' },
  // Basis
  'missing-basis': { severity: 'error', title: 'No basis set chosen' },
  'basis-missing-element': { severity: 'error', title: 'An element the chosen basis does not define' },
  'basis-override-conflict': { severity: 'warning', title: 'Two basis lines of the same kind giving an atom different bases (the later one wins)' },
  'basis-override-unused': { severity: 'warning', title: 'A basis override line that changes no atom\'s basis' },
  // Charge and spin
  'charge-not-integer': { severity: 'error', title: 'A charge that is not a whole number' },
  'multiplicity-invalid': { severity: 'error', title: 'A multiplicity that is not a positive whole number' },
  'multiplicity-parity': { severity: 'error', title: 'A multiplicity whose parity does not fit the electron count' },
  'multiplicity-too-high': { severity: 'error', title: 'More unpaired electrons than electrons' },
  'negative-electrons': { severity: 'error', title: 'A charge that leaves fewer than zero electrons' },
  'fragment-charge-sum': { severity: 'error', title: 'Fragment charges that do not add up to the total charge' },
  'spin-coupling': { severity: 'warning', title: 'Fragment spins that cannot couple to the system\'s multiplicity (angular-momentum addition)' },
  // Fragments
  'duplicate-fragment': { severity: 'error', title: 'Two fragments with the same name' },
  'unknown-atom': { severity: 'error', title: 'A selector naming an atom that does not exist' },
  'invalid-selector': { severity: 'error', title: 'A malformed atom selector' },
  'fragment-empty': { severity: 'error', title: 'A fragment that selects no atoms' },
  'fragment-overlap': { severity: 'error', title: 'Atoms claimed by more than one fragment' },
  'atoms-unassigned': { severity: 'error', title: 'Atoms in no fragment while no fragment claims `rest`' },
  'rest-twice': { severity: 'error', title: 'More than one fragment claims `rest`' },
  // Active space and limits
  'active-space-invalid': { severity: 'error', title: 'An active space that does not fit its fragment' },
  'qubit-limit-exceeded': { severity: 'error', title: 'A quantum-tier fragment that needs more qubits than the limit' },
  'memory-limit-exceeded': { severity: 'warning', title: 'A simulation that needs more memory than the limit' },
  // Variants
  'duplicate-variant': { severity: 'error', title: 'Two variants with the same name' },
  'variant-problem': { severity: 'error', title: 'An error in the spec a variant makes (reported at the variant\'s name)' },
  // Scan
  'invalid-scan': { severity: 'error', title: 'A scan whose range, step or atoms do not work' },
  'scan-bond-change': { severity: 'warning', title: 'A scan point where a bond forms between two fragments' },
  'scan-end-missed': { severity: 'warning', title: 'A scan step that does not land on the end of the range' },
  // Spellings the language no longer uses
  'retired-spelling': { severity: 'error', title: 'An old spelling (`geometry`, `units`, the braced basis block, `within … of`); the quick fix rewrites it' },
  // Tessera itself
  'spec-too-large': { severity: 'error', title: 'A spec or included file beyond the supported size (8 MiB, 100,000 atoms, 1,000,000 words outside plain structure blocks)' },
  'too-many-problems': { severity: 'warning', title: 'More problems than Tessera lists for one file (1,000); says how many more there are' },
  'internal-error': { severity: 'error', title: 'A part of the analysis failed inside Tessera (a bug, not a mistake in the spec)' },
} as const satisfies Record<string, CodeInfo>;

export type DiagnosticCode = keyof typeof DIAGNOSTIC_CODES;

export function diagnostic(
  code: DiagnosticCode,
  span: Span,
  message: string,
  extra: { related?: readonly RelatedInformation[]; data?: Readonly<Record<string, unknown>>; severity?: Severity } = {},
): Diagnostic {
  // Messages quote the spec: escaped and shortened here, once, for every place they are shown.
  const result: Diagnostic = { code, severity: extra.severity ?? DIAGNOSTIC_CODES[code].severity, span, message: safeMessage(message) };
  return {
    ...result,
    ...(extra.related && extra.related.length > 0 ? { related: extra.related.map((item) => ({ ...item, message: safeMessage(item.message) })) } : {}),
    ...(extra.data ? { data: extra.data } : {}),
  };
}

/** At most this many diagnostics are shown for one file; a `too-many-problems` note says how many more. */
export const MAX_DIAGNOSTICS_PER_FILE = 1000;
/** Kept while analysing, so that the earliest ones by position survive the cut; further ones are only counted. */
const MAX_COLLECTED = 10 * MAX_DIAGNOSTICS_PER_FILE;

/** Collects diagnostics during one analysis. */
export class DiagnosticSink {
  readonly items: Diagnostic[] = [];
  /** Reports beyond what is kept while analysing: counted, not stored. */
  dropped = 0;
  /** How many of those were errors. */
  droppedErrors = 0;

  private drop(severity: Severity): void {
    this.dropped++;
    if (severity === 'error') this.droppedErrors++;
  }

  add(item: Diagnostic): void {
    if (this.items.length >= MAX_COLLECTED) {
      this.drop(item.severity);
      return;
    }
    this.items.push(diagnostic(item.code, item.span, item.message, { ...(item.related ? { related: item.related } : {}), ...(item.data ? { data: item.data } : {}), severity: item.severity }));
  }

  report(
    code: DiagnosticCode,
    span: Span,
    message: string,
    extra?: { related?: readonly RelatedInformation[]; data?: Readonly<Record<string, unknown>>; severity?: Severity },
  ): void {
    if (this.items.length >= MAX_COLLECTED) {
      this.drop(extra?.severity ?? DIAGNOSTIC_CODES[code].severity);
      return;
    }
    this.items.push(diagnostic(code, span, message, extra));
  }
}

function byPosition(a: Diagnostic, b: Diagnostic): number {
  return a.span.start - b.span.start || a.span.end - b.span.end;
}

/**
 * The diagnostics of one file as shown: sorted by position, at most MAX_DIAGNOSTICS_PER_FILE, then
 * one `too-many-problems` saying how many more were found, an error when errors are among them
 * (so that a count of errors, or an exit code, never misses them). Diagnostics already finished
 * once (the language's, then those that read estimates) can be finished again with more added.
 */
export function finishDiagnostics(items: readonly Diagnostic[], dropped = 0, droppedErrors = 0): Diagnostic[] {
  let omitted = dropped;
  let omittedErrors = droppedErrors;
  const problems: Diagnostic[] = [];
  for (const item of items) {
    if (item.code === 'too-many-problems') {
      omitted += Number(item.data?.['omitted'] ?? 0);
      omittedErrors += Number(item.data?.['errors'] ?? 0);
    } else problems.push(item);
  }
  problems.sort(byPosition);
  for (let i = MAX_DIAGNOSTICS_PER_FILE; i < problems.length; i++) {
    omitted++;
    if (problems[i]!.severity === 'error') omittedErrors++;
  }
  if (omitted === 0) return problems;
  const kept = problems.slice(0, MAX_DIAGNOSTICS_PER_FILE);
  const after = kept[kept.length - 1]?.span.end ?? 0;
  const errors = omittedErrors > 0 ? ` (${omittedErrors.toLocaleString('en-US')} of them errors)` : '';
  kept.push(
    diagnostic(
      'too-many-problems',
      { start: after, end: after },
      `Tessera lists at most ${MAX_DIAGNOSTICS_PER_FILE.toLocaleString('en-US')} problems per file; ${omitted.toLocaleString('en-US')} more were found after this point${errors} and are not shown. Fix the ones above and check again (or is this not a spec file?).`,
      { data: { omitted, errors: omittedErrors }, ...(omittedErrors > 0 ? { severity: 'error' as const } : {}) },
    ),
  );
  return kept;
}
