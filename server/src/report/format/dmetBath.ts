/**
 * Computed DMET baths as the command line prints them: the `dmetBath` object of a fragment in the
 * JSON estimate, and a table of every fragment's bath with the counting rule's size beside it.
 * The bath is computed from the system's mean field; the plan's figures count it. Both appear here,
 * each named: "computed" or "counted".
 */
import type { DmetBathSummary, SpinBathSummary } from '../../analysis';
import { markdownText, plainText } from './escape';
import { renderMarkdownTable, renderTextTable, type Table } from './table';

/** What became of one fragment's bath. */
export type PartBath = { readonly state: 'computed'; readonly summary: DmetBathSummary } | { readonly state: 'failed'; readonly code: string; readonly message: string };

export interface BathPart {
  /** `fragment <name>`. */
  readonly label: string;
  readonly bath: PartBath;
}

export const BATH_NOTE =
  "DMET bath computed from the system's mean field: Schmidt decomposition (singular values of the environment–fragment block) of each spin's density in the fragment's orthogonalised orbitals (Löwdin's, or intrinsic atomic orbitals where the table says so; all electrons), bath orbitals where a singular value exceeds the threshold (Knizia & Chan 2012; Wouters et al. 2016). Counted: the planning rule min(L, M − L, Nσ, M − Nσ) on the same orbitals, an upper bound.";

/** Which orthogonalised orbitals the fragment's are, in words. */
export function orbitalsText(summary: DmetBathSummary): string {
  return summary.orbitals === 'iao' ? `intrinsic atomic orbitals (minimal basis ${summary.minimalBasis ?? '?'}; Knizia 2013)` : 'Löwdin-orthogonalised atomic orbitals';
}

function spinJson(spin: SpinBathSummary): Record<string, unknown> {
  return {
    singularValues: spin.singularValues,
    bathOrbitals: spin.bathOrbitals,
    countedBathOrbitals: spin.countedBathOrbitals,
    countedImpurityElectrons: spin.countedImpurityElectrons,
    impurityElectrons: spin.impurityElectrons,
    occupiedFragmentOrbitals: spin.occupiedFragmentOrbitals,
    idempotencyError: spin.idempotencyError,
  };
}

/** The `dmetBath` object of one fragment in the JSON estimate (keys in README, "Computed DMET bath"). */
export function bathJson(bath: PartBath): Record<string, unknown> {
  if (bath.state === 'failed') return { computed: false, error: { code: bath.code, message: bath.message } };
  const s = bath.summary;
  return {
    computed: true,
    source: 'system mean field',
    reference: s.reference,
    orbitals: s.orbitals,
    minimalBasis: s.minimalBasis,
    threshold: s.threshold,
    fragmentOrbitals: s.fragmentOrbitals,
    systemOrbitals: s.systemOrbitals,
    bath: {
      computed: { alpha: s.alpha.bathOrbitals, beta: s.beta.bathOrbitals },
      counted: { alpha: s.alpha.countedBathOrbitals, beta: s.beta.countedBathOrbitals },
    },
    impurity: {
      orbitals: s.impurityOrbitals,
      electrons: s.impurityElectrons,
      alpha: s.alpha.impurityElectrons,
      beta: s.beta.impurityElectrons,
      countedElectrons: s.alpha.countedImpurityElectrons + s.beta.countedImpurityElectrons,
    },
    coreElectrons: s.coreElectrons,
    alpha: spinJson(s.alpha),
    beta: s.restricted ? null : spinJson(s.beta),
    restricted: s.restricted,
    seconds: s.seconds,
  };
}

/** Bath orbitals per spin as one cell: `10` or `10 α / 9 β`. */
export function perSpin(alpha: number, beta: number): string {
  return alpha === beta ? String(alpha) : `${alpha} α / ${beta} β`;
}

/** Electrons to six decimals: `20.000000` (never `-0.000000` for a rounding residue). */
export function electronsText(value: number): string {
  return (Math.abs(value) < 5e-7 ? 0 : value).toFixed(6);
}

/** Singular values for reading: three significant digits, the ones under the threshold counted, not listed. */
export function singularValuesText(values: readonly number[], threshold: number, most = 12): string {
  const kept = values.filter((value) => value > threshold);
  const shown = kept.slice(0, most).map((value) => value.toPrecision(3));
  const more = kept.length > most ? `, … (${kept.length - most} more)` : '';
  const below = values.length - kept.length;
  return `${shown.join(', ') || 'none'}${more}${below > 0 ? `; ${below} below ${threshold.toExponential(0)}` : ''}`;
}

export function bathTable(parts: readonly BathPart[]): Table {
  return {
    title: 'DMET bath (computed from the system mean field; counted beside it)',
    headers: ['fragment', 'orbitals', 'fragment orbitals', 'bath computed', 'bath counted', 'impurity orbitals', 'impurity electrons', 'core electrons', 'largest σ'],
    numeric: [false, false, true, true, true, true, true, true, true],
    rows: parts.map(({ label, bath }) => {
      if (bath.state === 'failed') return [label, '–', '–', 'not computed', '–', '–', '–', '–', '–'];
      const s = bath.summary;
      return [
        label,
        s.orbitals === 'iao' ? `IAO (${s.minimalBasis ?? '?'})` : 'Löwdin',
        String(s.fragmentOrbitals),
        perSpin(s.alpha.bathOrbitals, s.beta.bathOrbitals),
        perSpin(s.alpha.countedBathOrbitals, s.beta.countedBathOrbitals),
        String(s.impurityOrbitals),
        electronsText(s.impurityElectrons),
        electronsText(s.coreElectrons),
        s.alpha.singularValues.length > 0 ? s.alpha.singularValues[0]!.toPrecision(3) : '–',
      ];
    }),
  };
}

export function bathNotes(parts: readonly BathPart[]): string[] {
  const notes: string[] = [];
  for (const { label, bath } of parts) {
    if (bath.state === 'failed') {
      notes.push(`${label}: bath not computed: ${bath.message}`);
      continue;
    }
    const s = bath.summary;
    const spins = s.restricted ? [['σ', s.alpha] as const] : ([['σ (α)', s.alpha], ['σ (β)', s.beta]] as const);
    for (const [name, spin] of spins) notes.push(`${label}: ${name} = ${singularValuesText(spin.singularValues, s.threshold)}`);
  }
  return notes;
}

export function renderBathText(parts: readonly BathPart[]): string {
  return [renderTextTable(bathTable(parts)), ...bathNotes(parts).map(plainText), BATH_NOTE, ''].join('\n');
}

export function renderBathMarkdown(parts: readonly BathPart[], heading = '###'): string {
  return [renderMarkdownTable(bathTable(parts), heading), '', ...bathNotes(parts).map((note) => `- ${markdownText(note)}`), '', `_${markdownText(BATH_NOTE)}_`, ''].join('\n');
}
