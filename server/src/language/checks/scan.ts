/** Scans: two different atoms in different fragments, a range that runs the way the step goes. */
import { CLASH_DISTANCE } from '../../chemistry/geometry';
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import { claimsOf, MAX_SCAN_POINTS, scanPointCount } from '../model';
import type { CheckContext } from './context';

export function checkScan(context: CheckContext): void {
  const { ast, model, sink } = context;
  const scan = ast.scan;
  if (!scan?.from || !scan.to) return;
  const from = scan.from.value;
  const to = scan.to.value;
  if (from <= 0 || to <= 0) {
    sink.report('invalid-scan', from <= 0 ? scan.from.span : scan.to.span, 'Scanned distances must be positive.');
    return;
  }
  if (scan.step) {
    const step = scan.step.value;
    if (step === 0) {
      sink.report('invalid-scan', scan.step.span, 'A step of 0 never reaches the end of the scan.');
      return;
    }
    if ((to - from) * step < 0) {
      sink.report('invalid-scan', scan.step.span, `The scan goes from ${from} to ${to}, so the step must be ${to > from ? 'positive' : 'negative'}; it is ${step}.`);
      return;
    }
    const points = scanPointCount(from, to, step);
    if (points > MAX_SCAN_POINTS) {
      const count = Number.isFinite(points) ? `${points.toLocaleString('en-US')} points` : `more points than can be counted ((${to} − ${from}) / ${step} overflows)`;
      sink.report('invalid-scan', scan.step.span, `Going from ${from} to ${to} in steps of ${step} gives ${count}; at most ${MAX_SCAN_POINTS.toLocaleString('en-US')} are accepted. Is the step mistyped?`);
      return;
    }
    // The last point the step reaches, against the end written (rounded as the model rounds).
    const last = Number((from + (points - 1) * step).toFixed(10));
    if (Math.abs(last - to) > 1e-9 * Math.max(1, Math.abs(to))) {
      const next = Number((last + step).toFixed(10));
      sink.report(
        'scan-end-missed',
        scan.to.span,
        `Going from ${from} in steps of ${step} stops at ${last}, not at ${to}: the next step would pass it (${next}). Change the end to ${last} or ${next}, or the step so that it divides ${Number((to - from).toFixed(10))}.`,
        { data: { ends: [last, next] } },
      );
    }
  } else if (scan.points && scan.points.value > MAX_SCAN_POINTS) {
    sink.report('invalid-scan', scan.points.span, `${scan.points.value.toLocaleString('en-US')} scan points asked for; at most ${MAX_SCAN_POINTS.toLocaleString('en-US')} are accepted.`);
    return;
  }
  const resolved = model.scan;
  if (!resolved) return;
  if (resolved.first === resolved.second) {
    sink.report('invalid-scan', scan.second!.span, 'The scan needs two different atoms.');
    return;
  }
  const owners = (atom: number) => claimsOf(model, atom);
  const shared = owners(resolved.first).find((fragment) => owners(resolved.second).includes(fragment));
  if (shared !== undefined) {
    const name = model.fragments[shared]!.name;
    sink.report('invalid-scan', scan.statement.keyword.span, `Both scanned atoms are in fragment '${name}'; the second atom's fragment moves as a whole, so the two atoms must be in different fragments.`);
  }
  const shortest = resolved.distances.reduce((least, d) => Math.min(least, d), Infinity);
  if (resolved.distances.length > 0 && shortest < CLASH_DISTANCE) {
    // Written in the structure's unit; said in ångström, the unit of the clash distance, and in bohr too when the spec uses it.
    const asWritten = model.units === 'bohr' ? ` (${Number((shortest / BOHR_IN_ANGSTROM).toPrecision(6))} bohr, the structure's unit)` : '';
    sink.report('invalid-scan', scan.from.span, `The scan reaches ${shortest.toFixed(3)} Å${asWritten}, closer than ${CLASH_DISTANCE} Å.`);
  }
}
