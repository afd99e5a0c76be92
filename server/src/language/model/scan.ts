/** The scan's two atoms and its distances in ångström. */
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { SpecAst } from '../ast';
import type { SelectorResolver } from './selectors';
import type { ScanModel } from './types';

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
  const first = resolver.ref(scan.first);
  const second = resolver.ref(scan.second);
  if (first === undefined || second === undefined) return undefined;
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
  if (count > MAX_SCAN_POINTS) return { first, second, distances: [], ...named };
  // Rounded to 10 decimals so that 2.3 + 2 × 0.2 prints as 2.7, not 2.6999999999999997.
  const distances = Array.from({ length: count }, (_, i) => toAngstrom(Number((from + i * step).toFixed(10)), units));
  return { first, second, distances, ...named };
}
