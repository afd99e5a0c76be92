/**
 * Scans: different atoms, a range that runs the way the step goes and lands on its end, values the
 * coordinate can take (positive distances, angles between 0° and 180°), a motion that is defined in
 * the structure as written, and the atoms that move — for a distance the second atom's fragment,
 * which must not hold the first, for an angle or dihedral the last atom's side of the molecule, or
 * the atoms a `moving` clause names (then a stretch inside one fragment is fine). Every point is
 * checked as a geometry of its own: no clash, and no bond formed across a fragment boundary (one
 * the structure already has is the bond-cut check's).
 */
import { BOND_TOLERANCE_FACTOR, CLASH_DISTANCE } from '../../chemistry/geometry';
import { ScanMotion, type ScanCoordinate, type ScanGeometry } from '../../chemistry/scan';
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import { claimsOf, defaultScanMoving, MAX_SCAN_POINTS, scanPointCount } from '../model';
import { describeRef } from '../ast';
import type { CheckContext } from './context';

/** A scanned value as messages write it: degrees with their sign, distances as written. */
export function scanValueText(value: number, coordinate: ScanCoordinate): string {
  return coordinate === 'distance' ? `${value}` : `${value}°`;
}

export function checkScan(context: CheckContext): void {
  const { ast, model, sink } = context;
  const scan = ast.scan;
  if (!scan?.from || !scan.to) return;
  const coordinate = scan.kind.value;
  const from = scan.from.value;
  const to = scan.to.value;
  if (coordinate === 'distance' && (from <= 0 || to <= 0)) {
    sink.report('invalid-scan', from <= 0 ? scan.from.span : scan.to.span, 'Scanned distances must be positive.');
    return;
  }
  if (coordinate === 'angle' && !(from > 0 && from <= 180 && to > 0 && to <= 180)) {
    sink.report('invalid-scan', from > 0 && from <= 180 ? scan.to.span : scan.from.span, 'A bond angle lies above 0° and at most 180°.');
    return;
  }
  if (coordinate === 'dihedral' && Math.abs(to - from) > 360) {
    sink.report('invalid-scan', scan.to.span, `A dihedral repeats every 360°; the scan from ${from}° to ${to}° covers ${Math.abs(to - from)}°.`);
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
  if (new Set(resolved.atoms).size < resolved.atoms.length) {
    const count = ['', '', 'two', 'three', 'four'][resolved.atoms.length];
    sink.report('invalid-scan', scan.second!.span, `The scan needs ${count} different atoms.`);
    return;
  }
  const owners = (atom: number) => claimsOf(model, atom);
  if (resolved.moving && scan.moving) {
    if (!resolved.moving.includes(resolved.second)) {
      sink.report('invalid-scan', scan.moving.span, `The moving atoms must include the last scanned atom, ${scan.second ? describeRef(scan.second) : 'the last atom'}: it is the one that moves.`);
      return;
    }
    if (resolved.moving.includes(resolved.first)) {
      sink.report('invalid-scan', scan.moving.span, `The moving atoms must not include the first scanned atom, ${scan.first ? describeRef(scan.first) : 'the first atom'}: the ${coordinate} is measured from it.`);
      return;
    }
  } else if (coordinate === 'distance') {
    const shared = owners(resolved.first).find((fragment) => owners(resolved.second).includes(fragment));
    if (shared !== undefined) {
      const name = model.fragments[shared]!.name;
      sink.report('invalid-scan', scan.statement.keyword.span, `Both scanned atoms are in fragment '${name}'; the second atom's fragment moves as a whole, so the two atoms must be in different fragments, or name the atoms that move: \`moving ${scan.second ? describeRef(scan.second) : '<atom>'} …\`.`);
      return;
    }
  }
  let moving = resolved.moving;
  if (!moving) {
    const side = defaultScanMoving(model, resolved);
    if ('problem' in side) {
      sink.report('invalid-scan', scan.statement.keyword.span, `${side.problem}: name the atoms that turn, \`moving ${scan.second ? describeRef(scan.second) : '<atom>'} …\`.`);
      return;
    }
    // A distance scan without a moving clause moves the second atom's fragment; without fragments there is nothing to check across.
    moving = coordinate === 'distance' && (model.owner[resolved.second] ?? -1) < 0 ? undefined : side.atoms;
  }
  let motion: ScanMotion;
  try {
    motion = new ScanMotion(model.coordinates, resolved);
  } catch (error) {
    sink.report('invalid-scan', scan.statement.keyword.span, (error as Error).message);
    return;
  }
  if (coordinate === 'distance') {
    const shortest = resolved.values.reduce((least, d) => Math.min(least, d), Infinity);
    if (resolved.values.length > 0 && shortest < CLASH_DISTANCE) {
      // Written in the structure's unit; said in ångström, the unit of the clash distance, and in bohr too when the spec uses it.
      const asWritten = model.units === 'bohr' ? ` (${Number((shortest / BOHR_IN_ANGSTROM).toPrecision(6))} bohr, the structure's unit)` : '';
      sink.report('invalid-scan', scan.from.span, `The scan reaches ${shortest.toFixed(3)} Å${asWritten}, closer than ${CLASH_DISTANCE} Å.`);
    }
  }
  if (moving) checkPoints(context, resolved, motion, moving, resolved.values);
}

/** Pairs × points examined at most; beyond, only the two ends of the scan are checked. */
const MAX_POINT_PAIRS = 20_000_000;

/**
 * Each scan point as a geometry: the moving atoms carried by the scan's rigid motion. Reports the
 * first point where a moving atom comes closer than CLASH_DISTANCE to one that stays, and where a
 * bond (d < 1.2 × the sum of covalent radii, as for the structure) forms between two fragments.
 * The moving atoms keep their distances among themselves.
 */
function checkPoints(context: CheckContext, geometry: ScanGeometry & { first: number; second: number }, motion: ScanMotion, moving: readonly number[], values: readonly number[]): void {
  const { ast, model, sink } = context;
  const span = ast.scan!.statement.keyword.span;
  const c = model.coordinates;
  if (values.length === 0) return;
  const { first, second, coordinate } = geometry;
  const isMoving = new Uint8Array(model.atoms.length);
  for (const atom of moving) isMoving[atom] = 1;
  const staying: number[] = [];
  for (let atom = 0; atom < model.atoms.length; atom++) if (!isMoving[atom]) staying.push(atom);
  const pairs = moving.length * staying.length;
  const points = pairs * values.length > MAX_POINT_PAIRS ? [values[0]!, values[values.length - 1]!] : values;
  const radius = (atom: number) => model.atoms[atom]!.element.covalentRadius ?? 1.5;
  const name = (atom: number) => model.atoms[atom]!.label ?? `#${atom + 1}`;
  const fragmentOf = (atom: number) => model.owner[atom] ?? -1;
  const map = new Float64Array(12);
  const moved = new Float64Array(3);
  let clashReported = false;
  const bondsReported = new Set<string>();
  for (const value of points) {
    motion.transform(value, map);
    const at = scanValueText(value, coordinate);
    for (const m of moving) {
      ScanMotion.apply(map, c, m, moved, 0);
      const mx = moved[0]!;
      const my = moved[1]!;
      const mz = moved[2]!;
      for (const s of staying) {
        const d = Math.hypot(mx - c[3 * s]!, my - c[3 * s + 1]!, mz - c[3 * s + 2]!);
        // The scanned pair of a distance scan is checked above, against the shortest distance of the range.
        if (!clashReported && d < CLASH_DISTANCE && !(coordinate === 'distance' && m === second && s === first)) {
          clashReported = true;
          sink.report('invalid-scan', span, `At ${at} the moving ${name(m)} comes within ${d.toFixed(3)} Å of ${name(s)}, closer than ${CLASH_DISTANCE} Å.`);
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
            `At ${at} a bond ${name(m)}–${name(s)} forms between fragments '${model.fragments[fm]!.name}' and '${model.fragments[fs]!.name}' (${d.toFixed(2)} Å, under 1.2 × the sum of covalent radii): at that point the boundary cuts a bond the structure does not have.`,
          );
        }
      }
    }
  }
}
