/**
 * Fragments taken from another spec (`structure from "base.tess" with fragments`): where each is
 * written in the other file, for go to definition and hover. Their syntax has no position in this
 * spec (language/model/includedFragments.ts), so these lead to the other file instead.
 */
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Location } from 'vscode-languageserver-types';
import type { DocumentAnalysis } from '../analysis';
import type { FragmentModel } from '../language/model';
import { markdownText } from '../report/format/escape';

/** The fragment's name (or keyword) in the other spec, when it was taken from one. */
export function includedFragmentLocation(fragment: FragmentModel): Location | undefined {
  const origin = fragment.ast.included;
  if (!origin) return undefined;
  return { uri: pathToFileURL(origin.file).toString(), range: { start: origin.start, end: origin.end } };
}

/** Whether the fragment has no `fragment` statement of its own in this spec. */
export function onlyIncluded(fragment: FragmentModel): boolean {
  return fragment.ast.included !== undefined && !fragment.ast.included.patched;
}

/** The other file as the spec names it, relative to this spec's folder where it can be. */
function shownPath(analysis: DocumentAnalysis, file: string): string {
  return analysis.path ? path.relative(path.dirname(analysis.path), file) : file;
}

/** One line for a hover card: where the fragment comes from, and whether this spec patches it. */
export function includedFragmentNote(analysis: DocumentAnalysis, fragment: FragmentModel): string | undefined {
  const origin = fragment.ast.included;
  if (!origin) return undefined;
  const where = `\`${markdownText(shownPath(analysis, origin.file))}\` line ${origin.start.line + 1}`;
  return origin.patched
    ? `Taken from ${where} (\`with fragments\`) and patched by this spec's \`fragment ${markdownText(fragment.name)}\`: what it states replaces the included statements of the same keyword.`
    : `Taken from ${where} (\`with fragments\`); write \`fragment ${markdownText(fragment.name)} { … }\` here to patch it.`;
}

/** Hover on `with fragments`: the fragments taken, each with its line in the other file. */
export function includedFragmentsCard(analysis: DocumentAnalysis): string | undefined {
  const taken = analysis.model.fragments.filter((fragment) => fragment.ast.included);
  if (taken.length === 0) return undefined;
  const file = shownPath(analysis, taken[0]!.ast.included!.file);
  const rows = taken.map((fragment) => `| \`${markdownText(fragment.name)}\` | ${fragment.ast.included!.start.line + 1} | ${fragment.ast.included!.patched ? 'patched here' : 'as written there'} |`);
  return [`**with fragments** · ${taken.length} fragment${taken.length === 1 ? '' : 's'} from \`${markdownText(file)}\``, '', '| fragment | line there | |', '| --- | --- | --- |', ...rows].join('\n');
}
