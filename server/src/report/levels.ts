/**
 * The orbital energy levels of one part as a standalone SVG: each orbital a short bar at its
 * energy, coloured by its irrep in the part's abelian point group, degenerate orbitals side by side,
 * electrons marked as arrows (up α, down β), the active window shaded, HOMO and LUMO labelled.
 * One column for restricted references (RHF, ROHF), an α and a β column for UHF. The energy axis
 * shows the orbitals around the Fermi level (1 hartree either side of the gap, widened to take in
 * the active window) and says how many lie beyond it. Plain SVG with presentation attributes
 * only, as the cost plots (plots.ts), so that it embeds under a strict content-security policy.
 */
import { CHARACTER_TABLES, type AbelianGroupName } from '../chemistry/symmetry/characterTables';

export interface LevelDiagramInput {
  readonly title: string;
  /** A second line: reference, basis functions, convergence. */
  readonly subtitle: string;
  readonly reference: 'rhf' | 'uhf' | 'rohf';
  readonly pointGroup: AbelianGroupName;
  readonly energies: { readonly alpha: readonly number[]; readonly beta: readonly number[] };
  readonly occupations: { readonly alpha: readonly number[]; readonly beta: readonly number[] };
  readonly irreps: { readonly alpha: readonly (string | null)[]; readonly beta: readonly (string | null)[] };
  /** The active orbitals (restricted orbital indices in energy order), shaded; null for none. */
  readonly active: { readonly first: number; readonly count: number; readonly label: string } | null;
  readonly note: string;
}

const WIDTH = 640;
const HEIGHT = 520;
const MARGIN = { left: 74, right: 150, top: 62, bottom: 54 };
const FONT = 'font-family="Helvetica, Arial, sans-serif"';
/** Hartree either side of the HOMO–LUMO gap shown by default. */
const WINDOW_HARTREE = 1;
/** Orbitals closer than this (hartree) are drawn side by side as one degenerate level. */
const DEGENERATE = 1e-4;
/**
 * Irrep colours, ours: eight hues spaced around the colour wheel at similar lightness, so that no
 * irrep stands out; an orbital without a label is grey.
 */
export const IRREP_COLOURS = ['#2364aa', '#d1495b', '#3e8914', '#8e5ba6', '#c78200', '#1b998b', '#a35d2f', '#5a6b8c'] as const;
const UNLABELLED = '#8a8a8a';
const ACTIVE_FILL = '#f2e6a0';

function escape(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** The colour of each irrep label of a group, in the order of its character table. */
export function irrepColours(group: AbelianGroupName): Map<string, string> {
  return new Map(CHARACTER_TABLES[group].irreps.map((irrep, k) => [irrep.label, IRREP_COLOURS[k % IRREP_COLOURS.length]!]));
}

interface Column {
  readonly name: string;
  readonly energies: readonly number[];
  /** Electrons per orbital: 0, 1 or 2, and which arrows: 'up', 'down' or 'pair'. */
  readonly marks: readonly ('none' | 'up' | 'down' | 'pair')[];
  readonly irreps: readonly (string | null)[];
}

function columnsOf(input: LevelDiagramInput): Column[] {
  const { alpha, beta } = input.occupations;
  if (input.reference === 'uhf') {
    return [
      { name: 'α', energies: input.energies.alpha, marks: alpha.map((o) => (o > 0.5 ? 'up' : 'none')), irreps: input.irreps.alpha },
      { name: 'β', energies: input.energies.beta, marks: beta.map((o) => (o > 0.5 ? 'down' : 'none')), irreps: input.irreps.beta },
    ];
  }
  return [
    {
      name: input.reference === 'rohf' ? 'orbitals (ROHF)' : 'orbitals',
      energies: input.energies.alpha,
      marks: alpha.map((o, k) => (o > 0.5 && (beta[k] ?? 0) > 0.5 ? 'pair' : o > 0.5 ? 'up' : 'none')),
      irreps: input.irreps.alpha,
    },
  ];
}

function ticks(low: number, high: number, count = 6): number[] {
  const raw = (high - low) / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * power).find((candidate) => candidate >= raw) ?? 10 * power;
  const values: number[] = [];
  for (let value = Math.ceil(low / step) * step; value <= high + 1e-12; value += step) values.push(Number(value.toPrecision(10)));
  return values;
}

/** The energies shown: around the gap of the occupied and virtual orbitals of every column, and the active window. */
function energyWindow(input: LevelDiagramInput, columns: readonly Column[]): { low: number; high: number } {
  let homo = -Infinity;
  let lumo = Infinity;
  let lowest = Infinity;
  let highest = -Infinity;
  for (const column of columns) {
    column.energies.forEach((energy, k) => {
      lowest = Math.min(lowest, energy);
      highest = Math.max(highest, energy);
      if (column.marks[k] !== 'none') homo = Math.max(homo, energy);
      else lumo = Math.min(lumo, energy);
    });
  }
  if (!Number.isFinite(lowest)) return { low: -1, high: 1 };
  let low = Number.isFinite(homo) ? homo - WINDOW_HARTREE : lowest;
  let high = Number.isFinite(lumo) ? lumo + WINDOW_HARTREE : highest;
  if (input.active) {
    const energies = input.energies.alpha;
    const first = energies[input.active.first];
    const last = energies[input.active.first + input.active.count - 1];
    if (first !== undefined) low = Math.min(low, first - 0.05);
    if (last !== undefined) high = Math.max(high, last + 0.05);
  }
  low = Math.max(low, lowest - 0.05);
  high = Math.min(high, highest + 0.05);
  if (high - low < 0.2) {
    const middle = (high + low) / 2;
    return { low: middle - 0.1, high: middle + 0.1 };
  }
  return { low, high };
}

function arrows(mark: 'none' | 'up' | 'down' | 'pair', x: number, y: number, colour: string): string {
  const arrow = (at: number, up: boolean) =>
    up
      ? `<path d="M${at} ${y + 6} L${at} ${y - 7} M${at - 3} ${y - 3} L${at} ${y - 7} L${at + 3} ${y - 3}" stroke="${colour}" stroke-width="1.4" fill="none"/>`
      : `<path d="M${at} ${y - 6} L${at} ${y + 7} M${at - 3} ${y + 3} L${at} ${y + 7} L${at + 3} ${y + 3}" stroke="${colour}" stroke-width="1.4" fill="none"/>`;
  if (mark === 'pair') return arrow(x - 4, true) + arrow(x + 4, false);
  if (mark === 'up') return arrow(x, true);
  if (mark === 'down') return arrow(x, false);
  return '';
}

export function levelDiagramSvg(input: LevelDiagramInput): string {
  const columns = columnsOf(input);
  const colours = irrepColours(input.pointGroup);
  const { low, high } = energyWindow(input, columns);
  const y0 = HEIGHT - MARGIN.bottom;
  const y1 = MARGIN.top;
  const x0 = MARGIN.left;
  const x1 = WIDTH - MARGIN.right;
  const yOf = (energy: number) => y0 - ((energy - low) / (high - low)) * (y0 - y1);
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${WIDTH}" height="${HEIGHT}" viewBox="0 0 ${WIDTH} ${HEIGHT}" role="img" aria-label="${escape(input.title)}">`,
    `<rect x="0" y="0" width="${WIDTH}" height="${HEIGHT}" fill="#ffffff"/>`,
    `<text x="${x0}" y="22" ${FONT} font-size="15" font-weight="bold" fill="#222222">${escape(input.title)}</text>`,
    `<text x="${x0}" y="40" ${FONT} font-size="11" fill="#555555">${escape(input.subtitle)}</text>`,
  ];
  // The active window, shaded behind the levels.
  if (input.active) {
    const energies = input.energies.alpha;
    const first = energies[input.active.first];
    const last = energies[input.active.first + input.active.count - 1];
    if (first !== undefined && last !== undefined) {
      const top = Math.max(y1, yOf(last) - 9);
      const bottom = Math.min(y0, yOf(first) + 9);
      parts.push(`<rect x="${x0 + 1}" y="${top.toFixed(1)}" width="${x1 - x0 - 2}" height="${Math.max(2, bottom - top).toFixed(1)}" fill="${ACTIVE_FILL}" data-active="${input.active.first}-${input.active.first + input.active.count - 1}"/>`);
      parts.push(`<text x="${x1 - 6}" y="${(top + 12).toFixed(1)}" text-anchor="end" ${FONT} font-size="10" fill="#6b5a00">${escape(input.active.label)}</text>`);
    }
  }
  // Axis and ticks.
  parts.push(`<line x1="${x0}" y1="${y1}" x2="${x0}" y2="${y0}" stroke="#444444" stroke-width="1"/>`);
  for (const value of ticks(low, high)) {
    const y = yOf(value).toFixed(1);
    parts.push(`<line x1="${x0 - 4}" y1="${y}" x2="${x0}" y2="${y}" stroke="#444444"/><text x="${x0 - 7}" y="${Number(y) + 4}" text-anchor="end" ${FONT} font-size="10" fill="#333333">${value.toFixed(2).replace('-', '−')}</text>`);
  }
  parts.push(`<text x="16" y="${(y0 + y1) / 2}" transform="rotate(-90 16 ${(y0 + y1) / 2})" text-anchor="middle" ${FONT} font-size="11" fill="#333333">orbital energy (hartree)</text>`);
  // Columns of levels.
  const width = (x1 - x0) / columns.length;
  let hidden = { below: 0, above: 0 };
  columns.forEach((column, c) => {
    const centre = x0 + width * (c + 0.5);
    parts.push(`<text x="${centre}" y="${y0 + 18}" text-anchor="middle" ${FONT} font-size="11" fill="#333333">${escape(column.name)}</text>`);
    // Group degenerate orbitals into levels.
    const levels: number[][] = [];
    column.energies.forEach((energy, k) => {
      if (energy < low || energy > high) {
        if (energy < low) hidden = { ...hidden, below: hidden.below + 1 };
        else hidden = { ...hidden, above: hidden.above + 1 };
        return;
      }
      const last = levels[levels.length - 1];
      if (last && Math.abs(column.energies[last[0]!]! - energy) < DEGENERATE) last.push(k);
      else levels.push([k]);
    });
    const bar = Math.min(46, (width - 24) / 3);
    for (const level of levels) {
      const y = yOf(column.energies[level[0]!]!);
      const span = level.length * bar + (level.length - 1) * 6;
      level.forEach((k, i) => {
        const left = centre - span / 2 + i * (bar + 6);
        const colour = colours.get(column.irreps[k] ?? '') ?? UNLABELLED;
        parts.push(
          `<line x1="${left.toFixed(1)}" y1="${y.toFixed(1)}" x2="${(left + bar).toFixed(1)}" y2="${y.toFixed(1)}" stroke="${colour}" stroke-width="3" data-orbital="${k}" data-irrep="${escape(column.irreps[k] ?? '')}"/>`,
          arrows(column.marks[k]!, left + bar / 2, y, '#222222'),
        );
      });
    }
    // HOMO and LUMO of the column.
    let homo = -1;
    let lumo = -1;
    column.marks.forEach((mark, k) => {
      if (mark !== 'none' && (homo < 0 || column.energies[k]! > column.energies[homo]!)) homo = k;
      if (mark === 'none' && (lumo < 0 || column.energies[k]! < column.energies[lumo]!)) lumo = k;
    });
    for (const [k, name] of [
      [homo, 'HOMO'],
      [lumo, 'LUMO'],
    ] as const) {
      const energy = column.energies[k];
      if (k < 0 || energy === undefined || energy < low || energy > high) continue;
      parts.push(`<text x="${(centre + width / 2 - 4).toFixed(1)}" y="${(yOf(energy) + 4).toFixed(1)}" text-anchor="end" ${FONT} font-size="10" fill="#555555">${name} ${energy.toFixed(3).replace('-', '−')}</text>`);
    }
  });
  // Legend: the irreps present, then the marks.
  const present = [...colours.keys()].filter((label) => columns.some((column) => column.irreps.includes(label)));
  if (columns.some((column) => column.irreps.includes(null))) present.push('');
  let y = MARGIN.top + 4;
  parts.push(`<text x="${x1 + 16}" y="${y}" ${FONT} font-size="11" font-weight="bold" fill="#333333">irrep (${escape(input.pointGroup)})</text>`);
  for (const label of present) {
    y += 17;
    parts.push(`<line x1="${x1 + 16}" y1="${y - 4}" x2="${x1 + 40}" y2="${y - 4}" stroke="${colours.get(label) ?? UNLABELLED}" stroke-width="3"/><text x="${x1 + 46}" y="${y}" ${FONT} font-size="11" fill="#333333">${escape(label || 'no label')}</text>`);
  }
  y += 26;
  parts.push(`${arrows('up', x1 + 28, y - 4, '#222222')}<text x="${x1 + 46}" y="${y}" ${FONT} font-size="11" fill="#333333">${input.reference === 'uhf' ? 'α electron' : 'electron'}</text>`);
  if (input.reference === 'uhf') {
    y += 20;
    parts.push(`${arrows('down', x1 + 28, y - 4, '#222222')}<text x="${x1 + 46}" y="${y}" ${FONT} font-size="11" fill="#333333">β electron</text>`);
  }
  if (input.active) {
    y += 20;
    parts.push(`<rect x="${x1 + 16}" y="${y - 10}" width="24" height="12" fill="${ACTIVE_FILL}"/><text x="${x1 + 46}" y="${y}" ${FONT} font-size="11" fill="#333333">active window</text>`);
  }
  const beyond = [hidden.below > 0 ? `${hidden.below} orbital${hidden.below === 1 ? '' : 's'} below ${low.toFixed(2).replace('-', '−')} Ha` : '', hidden.above > 0 ? `${hidden.above} above ${high.toFixed(2).replace('-', '−')} Ha` : '']
    .filter(Boolean)
    .join(' and ');
  parts.push(`<text x="${x0}" y="${HEIGHT - 22}" ${FONT} font-size="10" fill="#555555">${escape(beyond ? `Not drawn: ${beyond}.` : 'Every orbital is drawn.')}</text>`);
  parts.push(`<text x="${x0}" y="${HEIGHT - 8}" ${FONT} font-size="10" fill="#555555">${escape(input.note)}</text>`);
  parts.push('</svg>');
  return parts.join('');
}
