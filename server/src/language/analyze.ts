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
import { DiagnosticSink, type Diagnostic, type DiagnosticCode } from './diagnostics';
import { diskFileHost, type FileHost } from './files';
import { interpret } from './interpret';
import { buildModel, type SpecModel } from './model';
import { parseSpec } from './parser';
import type { SyntaxProblem, SyntaxTree } from './syntax';
import { LineIndex } from './text';

export interface AnalyzeOptions {
  /** Absolute path of the spec; needed to resolve `geometry from`. */
  readonly path?: string;
  readonly files?: FileHost;
  /** Mapping for quantum tiers that name none (default jordan-wigner). */
  readonly defaultMapping?: Mapping;
  /** Read plain geometry blocks with the fast reader (default true; tests compare both ways). */
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

export function analyze(text: string, options: AnalyzeOptions = {}): Analysis {
  const sink = new DiagnosticSink();
  const tree = parseSpec(text, options.fastGeometry === false ? { fastGeometry: false } : options.previous ? { previous: options.previous } : {});
  for (const problem of tree.problems) sink.report(SYNTAX_CODES[problem.code], problem.span, problem.message);
  const ast = interpret(tree, sink);
  const model = buildModel(ast, sink, {
    files: options.files ?? diskFileHost,
    ...(options.path ? { path: options.path } : {}),
    ...(options.defaultMapping ? { defaultMapping: options.defaultMapping } : {}),
    ...(options.defaultQubitLimit ? { defaultQubitLimit: options.defaultQubitLimit } : {}),
    ...(options.previous ? { previousContacts: options.previous.model.contacts } : {}),
  });
  const context = { ast, model, sink };
  for (const check of CHECKS) check(context);
  const diagnostics = sink.items.sort((a, b) => a.span.start - b.span.start || a.span.end - b.span.end);
  return { text, path: options.path, lines: new LineIndex(text), tree, ast, model, diagnostics };
}
