/**
 * The plan variants of a document (`variant <name> { … }`, language/variants.ts), each analysed as
 * a spec of its own, and their errors reported in the document at the variant's name.
 */
import type { DiagnosticSink } from '../language/diagnostics';
import type { Span } from '../language/text';
import { variantTexts } from '../language/variants';
import type { DocumentAnalysis } from './document';

export interface VariantAnalysis {
  readonly name: string;
  readonly nameSpan: Span;
  readonly analysis: DocumentAnalysis;
}

/** Errors of one variant listed in its report; the rest are counted. */
const LISTED_PROBLEMS = 3;

export function analyseVariants(base: DocumentAnalysis, analyse: (text: string) => DocumentAnalysis): VariantAnalysis[] {
  return variantTexts(base.text, base.tree).map((variant) => ({ name: variant.name, nameSpan: variant.nameSpan, analysis: analyse(variant.text) }));
}

/**
 * Each variant's errors that the spec itself does not have, at the variant's name: a variant is
 * checked like a spec of its own, and the spec's own errors are already reported where they are.
 */
export function reportVariantProblems(base: DocumentAnalysis, sink: DiagnosticSink, baseMessages: ReadonlySet<string>): void {
  for (const variant of base.variants()) {
    const own = variant.analysis.diagnostics.filter((d) => d.severity === 'error' && !baseMessages.has(`${d.code} ${d.message}`));
    if (own.length === 0) continue;
    const listed = own.slice(0, LISTED_PROBLEMS).map((d) => `line ${variant.analysis.lines.positionAt(d.span.start).line + 1} of the variant's spec: ${d.message}`);
    const more = own.length > LISTED_PROBLEMS ? `; and ${own.length - LISTED_PROBLEMS} more` : '';
    sink.report('variant-problem', variant.nameSpan, `Variant '${variant.name}' has ${own.length} error${own.length === 1 ? '' : 's'} as a spec of its own: ${listed.join('; ')}${more}.`);
  }
}
