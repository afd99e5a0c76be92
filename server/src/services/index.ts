/**
 * The editor-agnostic language service: one facade of plain functions over an analysed document,
 * each implemented in its own module. The LSP server in server/src/lsp is a thin adapter over it.
 */
export { doComplete, basisItems } from './completion';
export { getCodeActions } from './codeActions';
export { activeSpaceActions, activeSpaceSection } from './computedActive';
export { doValidation, toLspDiagnostic, fileUri, type UriOf } from './diagnostics';
export { format, formatText, formatLines, type FormatOptions } from './format';
export { doHover, atomCard, basisCard } from './hover';
export { getCodeLenses, getInlayHints, largestQubitCount, fragmentCostLabel } from './hints';
export { findDefinition, findDocumentHighlights, findReferences, prepareRename, rename } from './navigation';
export { encodeSemanticTokens, getSemanticTokens, plainNumbers, semanticTokensEdits, semanticTokensLegend } from './semanticTokens';
export { getFoldingRanges, getSelectionRanges } from './structure';
export { findDocumentSymbols, findWorkspaceSymbols } from './symbols';
export { fragmentCard } from './cards';
export { reportMarkdown } from './report';
export { compareAnswer, compareMarkdown, type CompareAnswer } from './compare';
export { costPlots, costsAnswer, growthFragments, structureAnswer, structureOf, viewTargetAt, VIEW_LIMITS, type CostPlots, type StructureView, type ViewUnavailable } from './views';
export {
  computeLenses,
  COMPUTE_COMMAND,
  COMPUTED_NOTE,
  LEVELS_COMMAND,
  levelsView,
  meanFieldSection,
  meanFieldState,
  NO_COMPUTE_POLICY,
  partArgument,
  partFromArgument,
  partLenses,
  STOP_COMMAND,
  type ComputePolicy,
  type LevelsView,
  type MeanFieldState,
} from './computed';
