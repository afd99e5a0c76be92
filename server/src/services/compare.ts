/** The plan comparison of a spec and its variants, as Markdown for the editor's comparison panel. */
import { comparePlans, specPlans, type DocumentAnalysis } from '../analysis';
import { renderCompareMarkdown } from '../report/format/compare';

export function compareMarkdown(analysis: DocumentAnalysis, fallbackName: string): string {
  return renderCompareMarkdown(comparePlans(specPlans(analysis, analysis.model.name ?? fallbackName)));
}
