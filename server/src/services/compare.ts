/** The plan comparison of a spec and its variants, for the editor's comparison panel. */
import { comparePlans, specPlans, type DocumentAnalysis } from '../analysis';
import { compareChartSvg, compareMarkdownSections, renderCompareMarkdown } from '../report/format/compare';

export function compareMarkdown(analysis: DocumentAnalysis, fallbackName: string): string {
  return renderCompareMarkdown(comparePlans(specPlans(analysis, analysis.model.name ?? fallbackName)));
}

/**
 * The answer to `tessera/compare`: the whole Markdown (as the command line writes it), the same in
 * two parts, and between them the chart of the HTML output (one renderer, `compareChartSvg`: SVG
 * with presentation attributes only, no style attribute, which the panel's policy would refuse).
 */
export interface CompareAnswer {
  readonly markdown: string;
  readonly cost: string;
  readonly inputs: string;
  readonly chart: string;
}

export function compareAnswer(analysis: DocumentAnalysis, fallbackName: string): CompareAnswer {
  const comparison = comparePlans(specPlans(analysis, analysis.model.name ?? fallbackName));
  const sections = compareMarkdownSections(comparison);
  return { markdown: renderCompareMarkdown(comparison), cost: sections.cost, inputs: sections.inputs, chart: compareChartSvg(comparison) };
}
