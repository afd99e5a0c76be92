/**
 * Cost plots as standalone SVG: qubits of each fragment under each mapping and after tapering, how
 * qubits and Pauli terms grow with a fragment's active space, and the cumulative cost along a scan.
 * Plain SVG with presentation attributes only (no scripts, no style attributes), so that it embeds
 * in HTML reports and in a webview with a strict content-security policy.
 */
import { countValue, type EstimateReport } from '../analysis';
import { escapeHtml } from './format/escape';
import type { GrowthPoint } from '../analysis';
import type { ScanCoordinate } from '../chemistry/scan';

const WIDTH = 640;
const HEIGHT = 340;
const MARGIN = { left: 64, right: 20, top: 36, bottom: 56 };
/** Series colours from the palette of Okabe & Ito (2008), as for the fragments in structure.ts. */
const SERIES_COLOURS = ['#0072b2', '#e69f00', '#009e73', '#cc79a7'];
const FONT = 'font-family="Helvetica, Arial, sans-serif"';

function escape(text: string): string {
  return escapeHtml(text);
}

/** Round tick values covering [0, max]. */
function niceTicks(max: number, count = 5): number[] {
  if (max <= 0) return [0, 1];
  const raw = max / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((candidate) => candidate >= raw) ?? 10 * power;
  const ticks: number[] = [0];
  while (ticks[ticks.length - 1]! < max) ticks.push(Number((ticks.length * step).toPrecision(12)));
  return ticks;
}

function svgOpen(title: string, width = WIDTH, height = HEIGHT): string {
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${escape(title)}">`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`,
    `<text x="${MARGIN.left}" y="22" ${FONT} font-size="15" font-weight="bold" fill="#222222">${escape(title)}</text>`,
  ].join('');
}

/** Legend entries left to right, spaced by their text length; colours default to the series colours. */
function legend(names: readonly string[], x: number, y: number, colours: readonly string[] = SERIES_COLOURS): string {
  let at = x;
  return names
    .map((name, i) => {
      const entry = `<rect x="${at}" y="${y - 9}" width="10" height="10" fill="${colours[i % colours.length]}"/><text x="${at + 14}" y="${y}" ${FONT} font-size="11" fill="#333333">${escape(name)}</text>`;
      at += 14 + 6.5 * name.length + 24;
      return entry;
    })
    .join('');
}

interface Frame {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

function frame(width = WIDTH, height = HEIGHT): Frame {
  return { x0: MARGIN.left, x1: width - MARGIN.right, y0: height - MARGIN.bottom, y1: MARGIN.top + 14 };
}

function yAxis(f: Frame, ticks: readonly number[], toY: (value: number) => number, label: string, format: (value: number) => string = String): string {
  const lines = ticks.map((tick) => {
    const y = toY(tick).toFixed(1);
    return `<line x1="${f.x0}" y1="${y}" x2="${f.x1}" y2="${y}" stroke="#e5e5e5"/><text x="${f.x0 - 6}" y="${y}" ${FONT} font-size="10" fill="#555555" text-anchor="end" dominant-baseline="middle">${escape(format(tick))}</text>`;
  });
  const middle = ((f.y0 + f.y1) / 2).toFixed(1);
  return `${lines.join('')}<line x1="${f.x0}" y1="${f.y0}" x2="${f.x0}" y2="${f.y1}" stroke="#888888"/><text x="14" y="${middle}" ${FONT} font-size="11" fill="#333333" text-anchor="middle" transform="rotate(-90 14 ${middle})">${escape(label)}</text>`;
}

function xAxisLabel(f: Frame, label: string, height = HEIGHT): string {
  return `<line x1="${f.x0}" y1="${f.y0}" x2="${f.x1}" y2="${f.y0}" stroke="#888888"/><text x="${((f.x0 + f.x1) / 2).toFixed(1)}" y="${height - 10}" ${FONT} font-size="11" fill="#333333" text-anchor="middle">${escape(label)}</text>`;
}

function emptyChart(title: string, message: string): string {
  return `${svgOpen(title)}<text x="${WIDTH / 2}" y="${HEIGHT / 2}" ${FONT} font-size="13" fill="#777777" text-anchor="middle">${escape(message)}</text></svg>`;
}

/** A label with a white halo, so that a line drawn beneath it never strikes through the text. */
function haloText(x: number, y: number, size: number, fill: string, anchor: string, text: string): string {
  return `<text x="${x.toFixed(1)}" y="${y.toFixed(1)}" ${FONT} font-size="${size}" fill="${fill}" text-anchor="${anchor}" stroke="#ffffff" stroke-width="3" stroke-linejoin="round" paint-order="stroke">${escape(text)}</text>`;
}

/**
 * Grouped bars: qubits of each quantum-tier fragment under Jordan–Wigner, Bravyi–Kitaev, parity,
 * and tapered. Classical tiers have no qubits and no bars. The limit line is drawn beneath the
 * bars and their labels (which carry a halo), so it never strikes through a number.
 */
export function qubitsChartSvg(report: EstimateReport): string {
  const title = 'Qubits per fragment (planning estimate)';
  const fragments = report.fragments.filter((fragment) => fragment.tier === 'quantum' && fragment.qubits !== null);
  if (fragments.length === 0) return emptyChart(title, 'No quantum-tier fragment to size: classical tiers need no qubits.');
  const series = ['Jordan–Wigner', 'Bravyi–Kitaev', 'parity (2q reduced)', 'tapered'];
  const values = fragments.map((fragment) => [fragment.qubits!.jordanWigner, fragment.qubits!.bravyiKitaev, fragment.qubits!.parity, fragment.qubits!.tapered ?? 0]);
  const limit = report.limits.qubits;
  const max = values.reduce((most, row) => row.reduce((m, value) => Math.max(m, value), most), Math.max(limit ?? 0, 1));
  const f = frame();
  const ticks = niceTicks(max);
  const top = ticks[ticks.length - 1]!;
  const toY = (value: number) => f.y0 - ((f.y0 - f.y1) * value) / top;
  const groupWidth = (f.x1 - f.x0) / fragments.length;
  const barWidth = Math.min(26, (groupWidth * 0.8) / series.length);
  const parts = [svgOpen(title), yAxis(f, ticks, toY, 'qubits'), `<line x1="${f.x0}" y1="${f.y0}" x2="${f.x1}" y2="${f.y0}" stroke="#888888"/>`];
  if (limit !== null) {
    const y = toY(limit);
    parts.push(`<line x1="${f.x0}" y1="${y.toFixed(1)}" x2="${f.x1}" y2="${y.toFixed(1)}" stroke="#d55e00" stroke-dasharray="6 4"/>`);
  }
  const labels: string[] = [];
  fragments.forEach((fragment, g) => {
    const start = f.x0 + g * groupWidth + (groupWidth - barWidth * series.length) / 2;
    values[g]!.forEach((value, s) => {
      const x = start + s * barWidth;
      const y = toY(value);
      parts.push(`<rect x="${x.toFixed(1)}" y="${y.toFixed(1)}" width="${(barWidth - 2).toFixed(1)}" height="${(f.y0 - y).toFixed(1)}" fill="${SERIES_COLOURS[s]}"><title>${escape(`${fragment.name}, ${series[s]}: ${value}`)}</title></rect>`);
      labels.push(haloText(x + barWidth / 2 - 1, y - 3, 9, '#333333', 'middle', String(value)));
    });
    labels.push(`<text x="${(f.x0 + (g + 0.5) * groupWidth).toFixed(1)}" y="${f.y0 + 16}" ${FONT} font-size="11" fill="#222222" text-anchor="middle">${escape(fragment.name)}</text>`);
  });
  parts.push(...labels);
  if (limit !== null) parts.push(haloText(f.x1, toY(limit) - 4, 10, '#d55e00', 'end', `limit ${limit} qubits`));
  parts.push(legend(series, f.x0, HEIGHT - 16), '</svg>');
  return parts.join('');
}

function polyline(points: readonly [number, number][], colour: string, dashed = false): string {
  const path = points.map(([x, y]) => `${x.toFixed(1)},${y.toFixed(1)}`).join(' ');
  return `<polyline points="${path}" fill="none" stroke="${colour}" stroke-width="2"${dashed ? ' stroke-dasharray="5 3"' : ''}/>`;
}

function xTicks(f: Frame, ticks: readonly number[], toX: (value: number) => number, format: (value: number) => string = String): string {
  return ticks.map((tick) => `<text x="${toX(tick).toFixed(1)}" y="${f.y0 + 14}" ${FONT} font-size="10" fill="#555555" text-anchor="middle">${escape(format(tick))}</text>`).join('');
}

/** Two panels: qubits (and tapered) against active orbitals; Pauli terms on a log scale. */
export function growthChartSvg(points: readonly GrowthPoint[], fragmentName: string): string {
  const title = `Cost against active-space size: ${fragmentName} (planning estimate)`;
  if (points.length === 0) return emptyChart(title, 'This fragment has no sized quantum or correlated problem.');
  const width = WIDTH;
  const parts = [svgOpen(title, width, HEIGHT)];
  const half = (width - MARGIN.left - MARGIN.right) / 2;
  const maxN = points[points.length - 1]!.orbitals;
  const xTicksValues = niceTicks(maxN, 4).filter((tick) => tick <= maxN);
  // Left panel: qubits.
  const left: Frame = { x0: MARGIN.left, x1: MARGIN.left + half - 30, y0: HEIGHT - MARGIN.bottom, y1: MARGIN.top + 30 };
  const qubitTicks = niceTicks(points.reduce((most, p) => Math.max(most, p.qubits), -Infinity));
  const qTop = qubitTicks[qubitTicks.length - 1]!;
  const toXLeft = (n: number) => left.x0 + ((left.x1 - left.x0) * n) / maxN;
  const toYLeft = (q: number) => left.y0 - ((left.y0 - left.y1) * q) / qTop;
  parts.push(yAxis(left, qubitTicks, toYLeft, 'qubits'), xAxisLabel(left, 'active orbitals'), xTicks(left, xTicksValues, toXLeft));
  parts.push(polyline(points.map((p) => [toXLeft(p.orbitals), toYLeft(p.qubits)]), SERIES_COLOURS[0]!), polyline(points.map((p) => [toXLeft(p.orbitals), toYLeft(p.tapered)]), SERIES_COLOURS[3]!, true));
  // Right panel: Pauli terms, log10.
  const right: Frame = { x0: MARGIN.left + half + 40, x1: width - MARGIN.right, y0: HEIGHT - MARGIN.bottom, y1: MARGIN.top + 30 };
  const logMax = Math.ceil(Math.log10(points.reduce((most, p) => Math.max(most, p.pauliTerms), 10)));
  const logTicks = Array.from({ length: logMax + 1 }, (_, k) => k);
  const toXRight = (n: number) => right.x0 + ((right.x1 - right.x0) * n) / maxN;
  const toYRight = (log: number) => right.y0 - ((right.y0 - right.y1) * log) / logMax;
  parts.push(yAxis(right, logTicks, toYRight, '', (k) => `10^${k}`), xAxisLabel(right, 'active orbitals'), xTicks(right, xTicksValues, toXRight));
  parts.push(`<text x="${right.x0}" y="${right.y1 - 6}" ${FONT} font-size="11" fill="#333333">Pauli terms (log scale)</text>`);
  parts.push(polyline(points.map((p) => [toXRight(p.orbitals), toYRight(Math.log10(Math.max(1, p.pauliTerms)))]), SERIES_COLOURS[1]!));
  parts.push(legend(['qubits (Jordan–Wigner)', 'tapered', 'Pauli terms'], MARGIN.left, HEIGHT - 28, [SERIES_COLOURS[0]!, SERIES_COLOURS[3]!, SERIES_COLOURS[1]!]));
  parts.push('</svg>');
  return parts.join('');
}

/** The x axis of the scan chart, by coordinate. */
const SCAN_AXIS_LABELS: Readonly<Record<ScanCoordinate, string>> = {
  distance: 'scanned distance (Å), in scan order',
  angle: 'scanned angle (degrees), in scan order',
  dihedral: 'scanned dihedral (degrees), in scan order',
};

/** A point's tooltip: its value, its point group and the qubits each quantum fragment needs there. */
function pointTitle(scan: NonNullable<EstimateReport['scan']>, k: number): string {
  const value = scan.values[k]!;
  const text = scan.coordinate === 'distance' ? `${Number(value.toFixed(6))} Å` : `${Number(value.toFixed(6))}°`;
  const point = scan.symmetry.points[k];
  if (!point) return `point ${k + 1}: ${text}`;
  const qubits = point.fragments.filter((fragment) => fragment.qubitsRequired !== null).map((fragment) => `${fragment.fragment} ${fragment.qubitsRequired} qubits`);
  return `point ${k + 1}: ${text}, ${point.fullPointGroup ?? 'C1'}${qubits.length > 0 ? `; needs ${qubits.join(', ')}` : ''}`;
}

/** Cumulative measurement circuits along the scan, one point per scanned value. */
export function scanChartSvg(report: EstimateReport): string {
  const title = 'Cumulative cost along the scan (planning estimate)';
  const scan = report.scan;
  if (!scan || scan.points === 0) return emptyChart(title, 'This spec has no scan.');
  const perPointCalculations = scan.totals.fragmentCalculations / scan.points;
  const circuits = countValue(scan.totals.measurementCircuits);
  const perPointCircuits = circuits / scan.points;
  const f = frame();
  // Scan order left to right: the first distance at the left edge, also for a descending scan.
  const values = scan.values;
  const first = values[0]!;
  const span = values[values.length - 1]! - first || 1;
  const toX = (d: number) => f.x0 + ((f.x1 - f.x0) * (d - first)) / span;
  const ticks = niceTicks(Math.max(circuits, 1));
  const yTop = ticks[ticks.length - 1]!;
  const toY = (value: number) => f.y0 - ((f.y0 - f.y1) * value) / yTop;
  const cumulative = values.map((value, k) => [toX(value), toY((k + 1) * perPointCircuits)] as [number, number]);
  const step = Math.ceil(scan.points / 12);
  return [
    svgOpen(title),
    yAxis(f, ticks, toY, 'measurement circuits'),
    xAxisLabel(f, SCAN_AXIS_LABELS[scan.coordinate]),
    xTicks(f, values.filter((_, k) => k % step === 0), toX, scan.coordinate === 'distance' ? (d) => d.toFixed(2) : (d) => `${d.toFixed(1)}°`),
    polyline(cumulative, SERIES_COLOURS[0]!),
    ...cumulative.map(([x, y], k) => `<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="3" fill="${SERIES_COLOURS[0]}"><title>${escapeHtml(pointTitle(scan, k))}</title></circle>`),
    `<text x="${f.x0 + 8}" y="${f.y1 + 4}" ${FONT} font-size="11" fill="#333333">per point: ${perPointCalculations} fragment calculations, ${perPointCircuits} measurement circuits per energy evaluation; ${scan.points} points</text>`,
    '</svg>',
  ].join('');
}

/** One active-space size of the shots plot: computed figures, or why there are none. */
export interface ShotPoint {
  readonly orbitals: number;
  readonly electrons: number;
  /** (λ/ε)² from the computed λ: an upper bound for any state; null when not computed. */
  readonly bound: number | null;
  /** QWC groups with reference-state variances from the computed strings: an estimate; null when not computed. */
  readonly grouped: number | null;
}

/**
 * Shots per energy evaluation against active-space size for one fragment, log scale: the (λ/ε)²
 * bound and the grouped estimate, both from Hamiltonians computed on the fragment's own mean field
 * (canonical windows); sizes without a computed Hamiltonian are marked on the axis as not computed.
 */
export function shotsChartSvg(points: readonly ShotPoint[], fragmentName: string, epsilonText: string, emptyMessage = 'No Hamiltonian of this fragment is computed yet: its shots need its mean field.'): string {
  const title = `Shots against active-space size: ${fragmentName} (computed Hamiltonians)`;
  const computed = points.filter((p) => p.bound !== null);
  if (computed.length === 0) return emptyChart(title, emptyMessage);
  const f = frame();
  const maxN = points.reduce((most, p) => Math.max(most, p.orbitals), 1);
  const toX = (n: number) => f.x0 + ((f.x1 - f.x0) * n) / maxN;
  const values = computed.flatMap((p) => [p.bound!, p.grouped ?? p.bound!]).filter((v) => v > 0);
  const logMin = Math.floor(Math.log10(Math.min(...values)));
  const logMax = Math.max(logMin + 1, Math.ceil(Math.log10(Math.max(...values))));
  const logTicks = Array.from({ length: logMax - logMin + 1 }, (_, k) => logMin + k);
  const toY = (value: number) => f.y0 - ((f.y0 - f.y1) * (Math.log10(Math.max(value, 10 ** logMin)) - logMin)) / (logMax - logMin);
  const series = (pick: (p: ShotPoint) => number | null, colour: string, dashed: boolean) => {
    const xy = computed.flatMap((p) => (pick(p) !== null ? [[toX(p.orbitals), toY(pick(p)!)] as [number, number]] : []));
    return [polyline(xy, colour, dashed), ...xy.map(([x, y]) => `<circle cx="${x.toFixed(1)}" cy="${y.toFixed(1)}" r="3" fill="${colour}"/>`)].join('');
  };
  const missing = points.filter((p) => p.bound === null);
  const parts = [
    svgOpen(title),
    yAxis(f, logTicks, (log) => toY(10 ** log), 'shots (log scale)', (k) => `10^${k}`),
    xAxisLabel(f, 'active orbitals (canonical window, about half filled)'),
    xTicks(f, niceTicks(maxN, 4).filter((tick) => tick <= maxN), toX),
    series((p) => p.bound, SERIES_COLOURS[0]!, true),
    series((p) => p.grouped, SERIES_COLOURS[1]!, false),
    ...missing.map((p) => `<text x="${toX(p.orbitals).toFixed(1)}" y="${(f.y0 - 6).toFixed(1)}" ${FONT} font-size="10" fill="#555555" text-anchor="middle">×</text>`),
    `<text x="${f.x0 + 8}" y="${f.y1 + 4}" ${FONT} font-size="11" fill="#333333">${escape(`at ε = ${epsilonText}${missing.length > 0 ? `; × not computed (${missing.map((p) => p.orbitals).join(', ')} orbitals)` : ''}`)}</text>`,
    legend(['(λ/ε)² bound, any state (computed λ)', 'QWC groups, reference-state variances (estimate)'], MARGIN.left, HEIGHT - 28, [SERIES_COLOURS[0]!, SERIES_COLOURS[1]!]),
    '</svg>',
  ];
  return parts.join('');
}
