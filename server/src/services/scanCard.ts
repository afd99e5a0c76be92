/**
 * The hover card of a `scan` statement: what is scanned (the coordinate and its atoms), the points
 * in scan order with their unit (Å or degrees), and the atoms that move.
 */
import type { DocumentAnalysis } from '../analysis';
import { markdownText } from '../report/format/escape';

/** At most this many values are listed; longer scans show the ends. */
const LISTED_VALUES = 12;

function atomName(analysis: DocumentAnalysis, atom: number): string {
  return analysis.model.atoms[atom]!.label ?? `#${atom + 1}`;
}

/** A scanned value with its unit. */
export function scanValue(value: number, coordinate: 'distance' | 'angle' | 'dihedral'): string {
  const text = Number(value.toFixed(6)).toString();
  return coordinate === 'distance' ? `${text} Å` : `${text}°`;
}

/** The card's section, or undefined when the scan does not resolve (the diagnostics say why). */
export function scanCard(analysis: DocumentAnalysis): string | undefined {
  const scan = analysis.model.scan;
  if (!scan) return undefined;
  const names = scan.atoms.map((atom) => markdownText(atomName(analysis, atom)));
  const what = scan.coordinate === 'angle' ? `angle ${names.join('–')} (vertex ${names[1]})` : `${scan.coordinate} ${names.join('–')}`;
  const values = scan.values;
  const shown = values.length <= LISTED_VALUES ? values : [...values.slice(0, LISTED_VALUES / 2), ...values.slice(-LISTED_VALUES / 2)];
  const list = shown.map((value) => scanValue(value, scan.coordinate));
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
  return lines.join('\n');
}
