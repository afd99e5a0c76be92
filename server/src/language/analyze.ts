/**
 * Analysis of one spec: parse, read, resolve, check. A pure function of the text and the files it
 * includes; never throws on bad input, and always returns whatever could be analysed.
 */
import type { Mapping } from '../chemistry/qubits';
import type { SpecAst } from './ast';
import { checkActiveSpaces } from './checks/activeSpace';
import { checkBasis } from './checks/basis';
import type { Check } from './checks/context';
import { checkFragments } from './checks/fragments';
import { checkGeometry } from './checks/geometry';
import { checkScan } from './checks/scan';
import { checkSpin } from './checks/spin';
import { checkTiers } from './checks/tiers';
import { DiagnosticSink, finishDiagnostics, type Diagnostic, type DiagnosticCode } from './diagnostics';
import { diskFileHost, type FileHost } from './files';
import { interpret } from './interpret';
import { retiredSpellings } from './migrate';
import { buildModel, type ModelOptions, type SpecModel } from './model';
import { parseSpec } from './parser';
import type { SyntaxProblem, SyntaxTree } from './syntax';
import { MAX_ATOMS, MAX_SPEC_CHARACTERS, MAX_WORDS, SUPPORTED_SIZE } from './limits';
import { LineIndex, normalizeLineEnds } from './text';

export interface AnalyzeOptions {
  /** Absolute path of the spec; needed to resolve `structure from`. */
  readonly path?: string;
  readonly files?: FileHost;
  /** Mapping for quantum tiers that name none (default jordan-wigner). */
  readonly defaultMapping?: Mapping;
  /** Read plain structure blocks with the fast reader (default true; tests compare both ways). */
  readonly fastGeometry?: boolean;
  /** Qubit limit for specs that set none in `limits` (an editor setting or a CLI option). */
  readonly defaultQubitLimit?: number;
  /** The previous version of the same document, whose reading the parser may reuse in part. */
  readonly previous?: Pick<Analysis, 'text' | 'tree' | 'model'>;
}

export interface Analysis {
  readonly text: string;
  readonly path: string | undefined;
  readonly lines: LineIndex;
  readonly tree: SyntaxTree;
  readonly ast: SpecAst;
  readonly model: SpecModel;
  /** Sorted by position. */
  readonly diagnostics: Diagnostic[];
}

/** The checks, in the order their findings are most useful to read. */
export const CHECKS: readonly Check[] = [checkGeometry, checkBasis, checkSpin, checkFragments, checkTiers, checkActiveSpaces, checkScan];

const SYNTAX_CODES: Record<SyntaxProblem['code'], DiagnosticCode> = {
  syntax: 'unexpected-token',
  'unexpected-token': 'unexpected-token',
  'unclosed-block': 'unclosed-block',
  'unterminated-string': 'unterminated-string',
  'bad-character': 'unexpected-character',
};

/**
 * Runs one stage of the analysis; when it throws (a bug in Tessera, whatever the input), reports an
 * `internal-error` at the start of the document and returns undefined, so the other stages still run.
 */
export function contained<T>(sink: DiagnosticSink, stage: string, run: () => T): T | undefined {
  try {
    return run();
  } catch (error) {
    sink.report('internal-error', { start: 0, end: 0 }, internalErrorMessage(stage, error));
    return undefined;
  }
}

/** The message of an `internal-error`: what failed and how, and that the spec is not to blame. */
export function internalErrorMessage(stage: string, error: unknown): string {
  const what = error instanceof Error ? `${error.name}: ${error.message}` : String(error);
  return `Tessera failed while ${stage} (${what}). This is a bug in Tessera, not necessarily a mistake in the spec; everything else was still checked. Please report it with the spec.`;
}

function emptyTree(text: string): SyntaxTree {
  return { statements: [], comments: [], problems: [], textLength: text.length };
}

/** How a check is named in an `internal-error`: `checkNearSymmetry` → `running the near symmetry check`. */
export function checkName(check: { readonly name: string }): string {
  const name = check.name.replace(/^check/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
  return name ? `running the ${name} check` : 'running a check';
}

/** The analysis of a spec refused for its size: one `spec-too-large` and nothing else is read. */
function refusedAnalysis(text: string, options: AnalyzeOptions, modelOptions: ModelOptions, message: string): Analysis {
  const sink = new DiagnosticSink();
  sink.report('spec-too-large', { start: 0, end: 0 }, message);
  const ast: SpecAst = { fragments: [], basisOverrides: [], variants: [], statements: [] };
  const model = buildModel(ast, new DiagnosticSink(), modelOptions);
  return { text, path: options.path, lines: new LineIndex(text), tree: emptyTree(text), ast, model, diagnostics: sink.items };
}

function tooLarge(what: string): string {
  return `${what}; Tessera analyses specs of up to ${SUPPORTED_SIZE}, and refuses larger ones so that the editor stays responsive. Split the spec into several.`;
}

export function analyze(original: string, options: AnalyzeOptions = {}): Analysis {
  // Carriage returns alone end lines too (as the editor counts them); same length, same offsets.
  const text = normalizeLineEnds(original);
  const sink = new DiagnosticSink();
  const modelOptions: ModelOptions = {
    files: options.files ?? diskFileHost,
    ...(options.path ? { path: options.path } : {}),
    ...(options.defaultMapping ? { defaultMapping: options.defaultMapping } : {}),
    ...(options.defaultQubitLimit ? { defaultQubitLimit: options.defaultQubitLimit } : {}),
    ...(options.previous ? { previousContacts: options.previous.model.contacts, previousAtoms: options.previous.model.atoms } : {}),
  };
  if (text.length > MAX_SPEC_CHARACTERS) {
    return refusedAnalysis(text, options, modelOptions, tooLarge(`This spec has ${text.length.toLocaleString('en-US')} characters`));
  }
  const read = contained(sink, 'reading the spec', () => {
    const tree = parseSpec(text, { ...(options.fastGeometry === false ? { fastGeometry: false } : options.previous ? { previous: options.previous } : {}), maxWords: MAX_WORDS });
    if (tree.words !== undefined) return { refused: tooLarge(`This spec has about ${tree.words.toLocaleString('en-US')} words outside plain structure blocks`) };
    for (const problem of tree.problems) sink.report(SYNTAX_CODES[problem.code], problem.span, problem.message);
    const ast = interpret(tree, sink);
    const atoms = ast.geometry?.atoms.length ?? 0;
    if (atoms > MAX_ATOMS) return { refused: tooLarge(`This spec has ${atoms.toLocaleString('en-US')} atoms`) };
    return { tree, ast };
  }) ?? { tree: emptyTree(text), ast: { fragments: [], basisOverrides: [], variants: [], statements: [] } };
  if ('refused' in read && read.refused !== undefined) return refusedAnalysis(text, options, modelOptions, read.refused);
  const { tree, ast } = read;
  const model =
    contained(sink, 'building the model (atoms, basis, fragments)', () => buildModel(ast, sink, modelOptions)) ??
    buildModel({ fragments: [], basisOverrides: [], variants: [], statements: [] }, new DiagnosticSink(), modelOptions);
  const context = { ast, model, sink };
  for (const check of CHECKS) contained(sink, checkName(check), () => check(context));
  contained(sink, 'finding retired spellings', () => {
    for (const retired of retiredSpellings(text, tree, model)) sink.report('retired-spelling', retired.span, retired.message, { data: { retired: retired.kind } });
  });
  const diagnostics = finishDiagnostics(sink.items, sink.dropped, sink.droppedErrors);
  return { text, path: options.path, lines: new LineIndex(text), tree, ast, model, diagnostics };
}
