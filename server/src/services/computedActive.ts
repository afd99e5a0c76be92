/**
 * What the editor shows of a fragment's computed active space: the hover section on `active`
 * (the chosen orbitals with energy, occupation or natural occupation, irrep and main atomic
 * character, and how they were chosen), and the quick fix that writes the choice into the spec in
 * the per-irrep form. Both read the late result of the `active-space` job (analysis/computed.ts);
 * nothing here computes.
 */
import { CodeActionKind, type CodeAction, type Range } from 'vscode-languageserver-types';
import { ACTIVE_SPACE_KIND, partAtoms, type ActiveSpaceOutcome, type DocumentAnalysis, type LateResult } from '../analysis';
import { activeIrrepCounts } from '../electronic/activeSpace/selection';
import { toRange } from './positions';

const SHELL_LETTERS = 'spdfghik';

/** How each source chose the orbitals, for the hover. */
const SOURCE_TEXT: Record<ActiveSpaceOutcome['source'], string> = {
  'canonical-window': 'canonical orbitals around the Fermi level (the counts of the spec)',
  'irrep-window': 'canonical orbitals per irrep, each irrep\'s nearest the Fermi level (the counts of the spec)',
  'natural-occupations': 'MP2 natural orbitals whose occupation lies inside the window',
  'atomic-projection': 'orbitals projected onto the named atomic shells (AVAS, Sayfutyarova et al., J. Chem. Theory Comput. 13, 4063 (2017)), made canonical within the occupied and the virtual block',
};

function signed(value: number, decimals: number): string {
  const text = value.toFixed(decimals);
  return text.startsWith('-') ? `−${text.slice(1)}` : text;
}

/** The late result of a fragment's active-space job, or null when it asks for none. */
export function activeSpaceResult(analysis: DocumentAnalysis, fragmentIndex: number): LateResult<ActiveSpaceOutcome> | null {
  const computation = analysis.computation({ kind: 'fragment', index: fragmentIndex });
  if (!computation.activeSpaceKey) return null;
  return analysis.late.get<ActiveSpaceOutcome>(ACTIVE_SPACE_KIND, computation.activeSpaceKey);
}

/** Atom of the spec a part-relative centre is: `o (#1)`. */
function atomName(analysis: DocumentAnalysis, fragmentIndex: number, center: number): string {
  const index = partAtoms(analysis.model, { kind: 'fragment', index: fragmentIndex })[center];
  if (index === undefined) return `atom ${center + 1}`;
  const atom = analysis.model.atoms[index]!;
  return atom.label ? `${atom.label} (#${index + 1})` : `#${index + 1} ${atom.element.symbol}`;
}

/** The hover section under `active`: where the choice stands, or the chosen orbitals. */
export function activeSpaceSection(analysis: DocumentAnalysis, fragmentIndex: number): string | null {
  const fragment = analysis.model.fragments[fragmentIndex];
  const tier = fragment?.tier;
  if (!fragment || !tier?.active) return null;
  const counted = tier.activeSource === 'estimated' ? `Counted until computed (planning estimate): ${tier.active.electrons}e ${tier.active.orbitals}o.` : null;
  const result = activeSpaceResult(analysis, fragmentIndex);
  if (!result) return counted;
  switch (result.state) {
    case 'absent':
      return [counted, 'Orbitals: not computed yet (they follow the mean field of this fragment).'].filter(Boolean).join('\n\n');
    case 'pending':
      return [counted, `Orbitals: computing — ${result.detail ?? 'queued'}.`].filter(Boolean).join('\n\n');
    case 'failed':
      return [counted, `Orbitals: not chosen — ${result.message}`].filter(Boolean).join('\n\n');
    case 'ready':
      break;
  }
  const outcome = result.value;
  const natural = outcome.orbitalKind === 'natural';
  const projected = outcome.source === 'atomic-projection';
  const lines = [
    `**Active orbitals** (computed): ${outcome.electrons.alpha + outcome.electrons.beta}e ${outcome.active.length}o, ${outcome.core.length} frozen below · ${SOURCE_TEXT[outcome.source]}.`,
    '',
    `| # | energy (Ha) | ${natural ? 'natural occupation' : 'electrons'} | irrep (${outcome.pointGroup}) | main character |${projected ? ' in shells |' : ''}`,
    `| --- | --- | --- | --- | --- |${projected ? ' --- |' : ''}`,
    ...outcome.details.map((orbital) => {
      const character = orbital.character ? `${atomName(analysis, fragmentIndex, orbital.character.center)} ${SHELL_LETTERS[orbital.character.l] ?? orbital.character.l} ${orbital.character.weight.toFixed(2)}` : '–';
      const occupation = natural ? orbital.occupation.toFixed(4) : String(orbital.occupation);
      return `| ${orbital.index + 1} | ${orbital.energy === null ? '–' : signed(orbital.energy, 4)} | ${occupation} | ${orbital.irrep ?? '–'} | ${character} |${projected ? ` ${(orbital.projection ?? 0).toFixed(2)} |` : ''}`;
    }),
  ];
  if (outcome.notes.length > 0) lines.push('', ...outcome.notes);
  if (counted) lines.push('', `The spec's figures were counted with ${tier.active.electrons}e ${tier.active.orbitals}o before this result.`);
  lines.push('', `Main character: the atom and l with the largest Mulliken share of the orbital. Chosen in ${outcome.seconds.toFixed(2)} s from this fragment's own mean field (no embedding).`);
  return lines.join('\n');
}

/** `active 6e A1=3 B1=1 B2=2`, or `active 6e 6o` where an orbital has no irrep. */
export function perIrrepText(outcome: ActiveSpaceOutcome): string {
  const electrons = outcome.electrons.alpha + outcome.electrons.beta;
  const counts = activeIrrepCounts(outcome);
  if (!counts || outcome.pointGroup === 'C1') return `active ${electrons}e ${outcome.active.length}o`;
  return `active ${electrons}e ${counts.map(({ label, count }) => `${label}=${count}`).join(' ')}`;
}

/**
 * The quick fix on an `active` statement whose orbitals are computed: writes them as counts per
 * irrep (the form that needs no mean field to read), offered where the cursor's range touches the
 * statement and the written text would differ.
 */
export function activeSpaceActions(analysis: DocumentAnalysis, uri: string, range: Range): CodeAction[] {
  const start = analysis.lines.offsetAt(range.start);
  const end = analysis.lines.offsetAt(range.end);
  const actions: CodeAction[] = [];
  for (const fragment of analysis.model.fragments) {
    const active = fragment.ast.tier?.active;
    if (!active || end < active.span.start || start > active.span.end) continue;
    const result = activeSpaceResult(analysis, fragment.index);
    if (result?.state !== 'ready') continue;
    const text = perIrrepText(result.value);
    if (analysis.text.slice(active.span.start, active.span.end) === text) continue;
    actions.push({
      title: `Write the computed active space of '${fragment.name}' per irrep: ${text}`,
      kind: CodeActionKind.QuickFix,
      edit: { changes: { [uri]: [{ range: toRange(analysis, active.span), newText: text }] } },
    });
  }
  return actions;
}
