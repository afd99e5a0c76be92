/**
 * The hover card of a `scan` statement: what is scanned (the coordinate and its atoms), the points
 * in scan order with their unit (Å or degrees), the atoms that move, and the point group along the
 * scan with the qubits each quantum fragment needs in it (runs of points that agree, one row each).
 */
import type { DocumentAnalysis } from '../analysis';
import type { ScanSymmetry } from '../analysis/scanSymmetry';
import { formatScanValue, type ScanCoordinate } from '../chemistry/scan';
import { markdownText } from '../report/format/escape';

/** Rows of the symmetry table at most; longer scans say how many runs are left out. */
const SYMMETRY_ROWS = 12;

/** At most this many values are listed; longer scans show the ends. */
const LISTED_VALUES = 12;

function atomName(analysis: DocumentAnalysis, atom: number): string {
  return analysis.model.atoms[atom]!.label ?? `#${atom + 1}`;
}

/** The point group along the scan, a row per run of points that agree. */
function symmetrySection(symmetry: ScanSymmetry | undefined, values: readonly number[], coordinate: ScanCoordinate): string {
  if (!symmetry) return '';
  if (symmetry.notLookedFor) return `\n\nPoint group per point not looked for: ${symmetry.notLookedFor}; the structure's figures stand for every point.`;
  const rows = symmetry.runs.slice(0, SYMMETRY_ROWS).map((run) => {
    const quantum = run.symmetry.fragments.filter((fragment) => fragment.qubitsRequired !== null || fragment.taperedQubits !== null);
    const qubits = quantum.map((fragment) => `${markdownText(fragment.fragment)}: ${fragment.qubitsRequired ?? '–'} (tapered ${fragment.taperedQubits ?? '–'})`).join(', ') || '–';
    return `| ${formatScanValue(values[run.first]!, coordinate)} | ${run.last - run.first + 1} | ${run.symmetry.fullPointGroup ?? 'C1'} | ${qubits} |`;
  });
  const more = symmetry.runs.length > SYMMETRY_ROWS ? `\n\n… and ${symmetry.runs.length - SYMMETRY_ROWS} more runs (the report lists every point).` : '';
  const lead = symmetry.groupChanges ? 'The point group changes along the scan; each point is counted in its own group.' : 'The point group is the same at every point.';
  return `\n\n${lead}\n\n| from | points | group | qubits needed (quantum tiers) |\n|---|---:|---|---|\n${rows.join('\n')}${more}`;
}

/** The card's section, or undefined when the scan does not resolve (the diagnostics say why). */
export function scanCard(analysis: DocumentAnalysis): string | undefined {
  const scan = analysis.model.scan;
  if (!scan) return undefined;
  const names = scan.atoms.map((atom) => markdownText(atomName(analysis, atom)));
  const what = scan.coordinate === 'angle' ? `angle ${names.join('–')} (vertex ${names[1]})` : `${scan.coordinate} ${names.join('–')}`;
  const values = scan.values;
  const shown = values.length <= LISTED_VALUES ? values : [...values.slice(0, LISTED_VALUES / 2), ...values.slice(-LISTED_VALUES / 2)];
  const list = shown.map((value) => formatScanValue(value, scan.coordinate));
  if (values.length > LISTED_VALUES) list.splice(LISTED_VALUES / 2, 0, '…');
  const moving = analysis.scanMovingAtoms();
  const movingNames = moving.slice(0, 12).map((atom) => markdownText(atomName(analysis, atom))).join(' ') + (moving.length > 12 ? ` … (${moving.length} atoms)` : '');
  const how = scan.coordinate === 'distance' ? 'translated along the line between the two atoms' : scan.coordinate === 'angle' ? 'turned about the vertex, in the plane of the three atoms' : 'turned about the bond between the middle two atoms';
  const lines = [
    `**Scan of the ${what}** · ${values.length} point${values.length === 1 ? '' : 's'}, in scan order`,
    '',
    values.length > 0 ? list.join(', ') : 'no valid points',
    '',
    `Moving (${how}${scan.moving ? ', as `moving` names them' : ', by default'}): ${movingNames}`,
  ];
  return lines.join('\n') + symmetrySection(analysis.scanSymmetry(), values, scan.coordinate);
}
