/** The scan's atoms and its values: distances in ångström, angles and dihedrals in degrees. */
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { SpecAst } from '../ast';
import type { SelectorResolver } from './selectors';
import { bondedGroup, bondedSide } from '../../chemistry/scan';
import type { ScanModel, SpecModel } from './types';

/** Largest number of scan points accepted (a guard against typing mistakes such as step 0.0001). */
export const MAX_SCAN_POINTS = 10_000;

/** Points from `from` to `to` in steps of `step`, both ends included (a step that never arrives gives 0). */
export function scanPointCount(from: number, to: number, step: number): number {
  if (step === 0 || (to - from) * step < 0) return 0;
  return Math.floor((to - from) / step + 1e-9) + 1;
}

export function resolveScan(ast: SpecAst, resolver: SelectorResolver, units: LengthUnit): ScanModel | undefined {
  const scan = ast.scan;
  if (!scan?.first || !scan.second || !scan.from || !scan.to || (!scan.step && !scan.points)) return undefined;
  const atoms = scan.atoms.map((ref) => resolver.ref(ref));
  if (atoms.some((atom) => atom === undefined)) return undefined;
  const resolved = atoms as number[];
  const first = resolved[0]!;
  const second = resolved[resolved.length - 1]!;
  const coordinate = scan.kind.value;
  // Angles are in degrees whatever the structure's length unit.
  const convert = (value: number) => (coordinate === 'distance' ? toAngstrom(value, units) : value);
  const from = scan.from.value;
  const to = scan.to.value;
  let count: number;
  let step: number;
  if (scan.step) {
    step = scan.step.value;
    count = scanPointCount(from, to, step);
  } else {
    count = scan.points!.value;
    step = count > 1 ? (to - from) / (count - 1) : 0;
  }
  const moving = scan.moving ? [...new Set(scan.moving.atoms.map((ref) => resolver.ref(ref)).filter((atom): atom is number => atom !== undefined))].sort((a, b) => a - b) : undefined;
  const named = moving ? { moving } : {};
  const head = { coordinate, atoms: resolved, first, second };
  if (count > MAX_SCAN_POINTS) return { ...head, values: [], ...named };
  // Rounded to 10 decimals so that 2.3 + 2 × 0.2 prints as 2.7, not 2.6999999999999997.
  const values = Array.from({ length: count }, (_, i) => convert(Number((from + i * step).toFixed(10))));
  return { ...head, values, ...named };
}

/**
 * The atoms a scan moves when no `moving` clause names them. A distance: the second atom's fragment,
 * or its bonded group without fragments (the second atom alone when that group holds the first).
 * An angle A–B–C: C's side of the molecule, reached through bonds without passing the vertex B.
 * A dihedral A–B–C–D: C's side without passing B (C is on the axis and stays), and D. Undefined,
 * with the reason, when the side that would turn also holds the first atom (a ring).
 */
export function defaultScanMoving(model: Pick<SpecModel, 'atoms' | 'owner' | 'fragments' | 'contacts'>, scan: Pick<ScanModel, 'coordinate' | 'atoms'>): { atoms: number[] } | { problem: string } {
  const count = model.atoms.length;
  const bonds = model.contacts.bonds;
  const [a, b, c, d] = scan.atoms as [number, number, number, number];
  if (scan.coordinate === 'distance') {
    const owner = model.owner[b] ?? -1;
    return { atoms: owner >= 0 ? [...model.fragments[owner]!.atoms] : bondedGroup(count, bonds, a, b) };
  }
  const side = bondedSide(count, bonds, c, b);
  if (scan.coordinate === 'dihedral' && !side.includes(d)) side.push(d);
  if (side.includes(a)) {
    const name = (atom: number) => model.atoms[atom]!.label ?? `#${atom + 1}`;
    return { problem: `${name(a)} and ${name(c)} are joined by bonds that do not pass ${name(b)} (a ring), so no side of the molecule turns alone` };
  }
  return { atoms: side.sort((x, y) => x - y) };
}
