/**
 * Computed active spaces as the command line prints them: the `activeSpace` object of a fragment in
 * the JSON estimate (with `--mean-field`), and a table of the chosen orbitals. Beside what was
 * computed stands what the plan counted (`counted`), each named, so a reader sees which figure came
 * from where.
 */
import type { ActiveSpaceOutcome } from '../../analysis';
import { renderMarkdownTable, renderTextTable, type Table } from './table';

/** What became of one fragment's active-space choice. */
export type PartActiveSpace =
  | { readonly state: 'computed'; readonly outcome: ActiveSpaceOutcome; readonly counted: { readonly electrons: number; readonly orbitals: number; readonly source: string } }
  | { readonly state: 'failed'; readonly code: string; readonly message: string };

export interface ActiveSpacePart {
  /** `fragment <name>`. */
  readonly label: string;
  readonly activeSpace: PartActiveSpace;
}

const SHELL_LETTERS = 'spdfghik';

/** Active orbitals per irrep, or null when one has no irrep. */
function perIrrep(outcome: ActiveSpaceOutcome): Record<string, number> | null {
  const counts: Record<string, number> = {};
  for (const orbital of outcome.details) {
    if (orbital.irrep === null) return null;
    counts[orbital.irrep] = (counts[orbital.irrep] ?? 0) + 1;
  }
  return counts;
}

/** The `activeSpace` object of one fragment in the JSON estimate (keys in README, "Computed active space"). */
export function activeSpaceJson(part: PartActiveSpace): Record<string, unknown> {
  if (part.state === 'failed') return { computed: false, error: { code: part.code, message: part.message } };
  const o = part.outcome;
  return {
    computed: true,
    source: o.source,
    orbitalKind: o.orbitalKind,
    electrons: o.electrons.alpha + o.electrons.beta,
    alpha: o.electrons.alpha,
    beta: o.electrons.beta,
    orbitals: o.active.length,
    coreOrbitals: o.core.length,
    pointGroup: o.pointGroup,
    perIrrep: perIrrep(o),
    counted: part.counted,
    active: o.details.map((d) => ({
      index: d.index + 1,
      energy: d.energy,
      occupation: d.occupation,
      irrep: d.irrep,
      character: d.character ? { atom: d.character.center + 1, element: d.character.symbol, l: SHELL_LETTERS[d.character.l] ?? d.character.l, weight: d.character.weight } : null,
      ...(d.projection !== undefined ? { projection: d.projection } : {}),
    })),
    notes: o.notes,
    seconds: o.seconds,
  };
}

export function activeSpaceTable(parts: readonly ActiveSpacePart[]): Table {
  const rows: string[][] = [];
  for (const { label, activeSpace } of parts) {
    if (activeSpace.state === 'failed') {
      rows.push([label, 'not computed', '', '', '', activeSpace.message]);
      continue;
    }
    const o = activeSpace.outcome;
    for (const d of o.details) {
      const character = d.character ? `${d.character.symbol} (atom ${d.character.center + 1}) ${SHELL_LETTERS[d.character.l] ?? d.character.l} ${d.character.weight.toFixed(2)}` : '–';
      rows.push([label, String(d.index + 1), d.energy === null ? '–' : d.energy.toFixed(4), o.orbitalKind === 'natural' ? d.occupation.toFixed(4) : String(d.occupation), d.irrep ?? '–', character]);
    }
  }
  return { title: 'Computed active orbitals', headers: ['part', 'orbital', 'energy (Ha)', 'occupation', 'irrep', 'main character'], rows, numeric: [false, true, true, true, false, false] };
}

export const ACTIVE_SPACE_NOTE =
  "Computed from each fragment's own restricted mean field (ROHF for open shells; no embedding): a result. The plan's figures above count the active space (`counted` in JSON); main character is the atom (numbered in the part's order) and l with the largest Mulliken share.";

export function renderActiveSpaceText(parts: readonly ActiveSpacePart[]): string {
  return [renderTextTable(activeSpaceTable(parts)), ACTIVE_SPACE_NOTE, ''].join('\n');
}

export function renderActiveSpaceMarkdown(parts: readonly ActiveSpacePart[], heading = '###'): string {
  return [renderMarkdownTable(activeSpaceTable(parts), heading), '', `_${ACTIVE_SPACE_NOTE}_`, ''].join('\n');
}
