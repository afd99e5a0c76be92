/**
 * Scans: two different atoms, a range that runs the way the step goes and lands on its end, and
 * the atoms that move — the second atom's fragment, which must not hold the first, or the atoms a
 * `moving` clause names (then a stretch inside one fragment is fine). Every point is checked as a
 * geometry of its own: no clash, and no bond formed across a fragment boundary (one the structure
 * already has is the bond-cut check's).
 */
import { BOND_TOLERANCE_FACTOR, CLASH_DISTANCE } from '../../chemistry/geometry';
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import { claimsOf, MAX_SCAN_POINTS, scanPointCount } from '../model';
import { describeRef } from '../ast';
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
  if (resolved.moving && scan.moving) {
    if (!resolved.moving.includes(resolved.second)) {
      sink.report('invalid-scan', scan.moving.span, `The moving atoms must include the second scanned atom, ${scan.second ? describeRef(scan.second) : 'the second atom'}: it is the one that moves.`);
      return;
    }
    if (resolved.moving.includes(resolved.first)) {
      sink.report('invalid-scan', scan.moving.span, `The moving atoms must not include the first scanned atom, ${scan.first ? describeRef(scan.first) : 'the first atom'}: the distance is measured from it.`);
      return;
    }
  } else {
    const shared = owners(resolved.first).find((fragment) => owners(resolved.second).includes(fragment));
    if (shared !== undefined) {
      const name = model.fragments[shared]!.name;
      sink.report('invalid-scan', scan.statement.keyword.span, `Both scanned atoms are in fragment '${name}'; the second atom's fragment moves as a whole, so the two atoms must be in different fragments, or name the atoms that move: \`moving ${scan.second ? describeRef(scan.second) : '<atom>'} …\`.`);
      return;
    }
  }
  const shortest = resolved.distances.reduce((least, d) => Math.min(least, d), Infinity);
  if (resolved.distances.length > 0 && shortest < CLASH_DISTANCE) {
    // Written in the structure's unit; said in ångström, the unit of the clash distance, and in bohr too when the spec uses it.
    const asWritten = model.units === 'bohr' ? ` (${Number((shortest / BOHR_IN_ANGSTROM).toPrecision(6))} bohr, the structure's unit)` : '';
    sink.report('invalid-scan', scan.from.span, `The scan reaches ${shortest.toFixed(3)} Å${asWritten}, closer than ${CLASH_DISTANCE} Å.`);
  }
  const moving = resolved.moving ?? movingFragment(context, resolved.second);
  if (moving) checkPoints(context, resolved.first, resolved.second, moving, resolved.distances);
}

/** The atoms of the second atom's fragment, which move by default; undefined when no fragment holds it. */
function movingFragment(context: CheckContext, second: number): readonly number[] | undefined {
  const owner = context.model.owner[second] ?? -1;
  return owner >= 0 ? context.model.fragments[owner]!.atoms : undefined;
}

/** Pairs × points examined at most; beyond, only the two ends of the scan are checked. */
const MAX_POINT_PAIRS = 20_000_000;

/**
 * Each scan point as a geometry: the moving atoms translated along the line from the first atom to
 * the second. Reports the first point where a moving atom comes closer than CLASH_DISTANCE to one
 * that stays, and where a bond (d < 1.2 × the sum of covalent radii, as for the structure) forms
 * between two fragments. The moving atoms keep their distances among themselves.
 */
function checkPoints(context: CheckContext, first: number, second: number, moving: readonly number[], distances: readonly number[]): void {
  const { ast, model, sink } = context;
  const span = ast.scan!.statement.keyword.span;
  const c = model.coordinates;
  const dx = c[3 * second]! - c[3 * first]!;
  const dy = c[3 * second + 1]! - c[3 * first + 1]!;
  const dz = c[3 * second + 2]! - c[3 * first + 2]!;
  const current = Math.hypot(dx, dy, dz);
  if (current === 0 || distances.length === 0) return;
  const ux = dx / current;
  const uy = dy / current;
  const uz = dz / current;
  const isMoving = new Uint8Array(model.atoms.length);
  for (const atom of moving) isMoving[atom] = 1;
  const staying: number[] = [];
  for (let atom = 0; atom < model.atoms.length; atom++) if (!isMoving[atom]) staying.push(atom);
  const pairs = moving.length * staying.length;
  const points = pairs * distances.length > MAX_POINT_PAIRS ? [distances[0]!, distances[distances.length - 1]!] : distances;
  const radius = (atom: number) => model.atoms[atom]!.element.covalentRadius ?? 1.5;
  const name = (atom: number) => model.atoms[atom]!.label ?? `#${atom + 1}`;
  const fragmentOf = (atom: number) => model.owner[atom] ?? -1;
  let clashReported = false;
  const bondsReported = new Set<string>();
  for (const distance of points) {
    const shift = distance - current;
    for (const m of moving) {
      const mx = c[3 * m]! + shift * ux;
      const my = c[3 * m + 1]! + shift * uy;
      const mz = c[3 * m + 2]! + shift * uz;
      for (const s of staying) {
        const d = Math.hypot(mx - c[3 * s]!, my - c[3 * s + 1]!, mz - c[3 * s + 2]!);
        // The scanned pair itself is checked above, against the shortest distance of the range.
        if (!clashReported && d < CLASH_DISTANCE && !(m === second && s === first)) {
          clashReported = true;
          sink.report('invalid-scan', span, `At ${distance} the moving ${name(m)} comes within ${d.toFixed(3)} Å of ${name(s)}, closer than ${CLASH_DISTANCE} Å.`);
        }
        const fm = fragmentOf(m);
        const fs = fragmentOf(s);
        if (fm < 0 || fs < 0 || fm === fs) continue;
        const limit = BOND_TOLERANCE_FACTOR * (radius(m) + radius(s));
        const before = Math.hypot(c[3 * m]! - c[3 * s]!, c[3 * m + 1]! - c[3 * s + 1]!, c[3 * m + 2]! - c[3 * s + 2]!) < limit;
        const now = d < limit;
        const key = `${m}:${s}`;
        // A bond across the boundary in the structure is the bond-cut check's; one that only a
        // scan point makes changes what the fragments are there.
        if (now && !before && !bondsReported.has(key)) {
          bondsReported.add(key);
          sink.report(
            'scan-bond-change',
            span,
            `At ${distance} a bond ${name(m)}–${name(s)} forms between fragments '${model.fragments[fm]!.name}' and '${model.fragments[fs]!.name}' (${d.toFixed(2)} Å, under 1.2 × the sum of covalent radii): at that point the boundary cuts a bond the structure does not have.`,
          );
        }
      }
    }
  }
}
