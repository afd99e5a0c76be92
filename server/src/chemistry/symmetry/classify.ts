/**
 * From the symmetry elements found to the Schoenflies group and the group's own frame, by the
 * usual decision scheme (F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., Wiley 1990,
 * §3.14, "a systematic procedure for symmetry classification of molecules" — section from memory):
 * several axes of order ≥ 3 → the cubic or icosahedral groups (C5 → I, C4 → O, else T; then
 * inversion or mirrors); otherwise the principal axis Cn with n two-fold axes ⊥ it → Dn, Dnh
 * (σh), Dnd (σd); without them Cnh (σh), Cnv (σv), S2n, Cn; no axis → Cs, Ci, C1.
 *
 * When several axes share the highest order (three C2 axes, as in D2d), each is tried as the
 * principal axis and the largest group wins: D2d's S4 axis gives D2d, its other two-fold axes
 * only D2.
 */
import { cross, dot, identity, perpendicularTowards, type Mat } from './linalg';
import { frameFrom, groupOrder, idealFiveFoldAxis, type PointGroupId } from './pointGroups';
import { hasImproperAxis, type FoundAxis, type FoundElements, type SearchContext } from './search';

export interface Classification {
  readonly id: PointGroupId;
  /** Rows x, y, z: the frame in which the group's ideal operations are built. */
  readonly frame: Mat;
  /** For I and Ih: one five-fold axis in frame coordinates. */
  readonly fiveFoldAxis?: Float64Array;
}

const INPUT_X = [1, 0, 0];
/** |cos| below this: perpendicular; above PARALLEL: parallel (both common practice, no source). */
const PERPENDICULAR = 0.1;
const PARALLEL = 0.995;

function distinctAxes(axes: readonly FoundAxis[]): FoundAxis[] {
  const kept: FoundAxis[] = [];
  for (const axis of axes) {
    const same = kept.findIndex((other) => Math.abs(dot(other.axis, axis.axis)) > 0.95);
    if (same < 0) kept.push(axis);
    else if (axis.order > kept[same]!.order) kept[same] = axis;
  }
  return kept;
}

function perpendicularPartner(axes: readonly FoundAxis[], z: FoundAxis): FoundAxis | undefined {
  let best: FoundAxis | undefined;
  for (const axis of axes) {
    if (axis === z) continue;
    const c = Math.abs(dot(axis.axis, z.axis));
    if (c < PERPENDICULAR && (!best || c < Math.abs(dot(best.axis, z.axis)))) best = axis;
  }
  return best;
}

function cubic(found: FoundElements, high: readonly FoundAxis[]): Classification | undefined {
  const axes = distinctAxes(found.axes);
  const hasFive = high.some((axis) => axis.order === 5);
  const hasFour = high.some((axis) => axis.order === 4);
  const frameAxes = axes.filter((axis) => axis.order === (hasFour ? 4 : 2));
  for (const z of frameAxes) {
    const x = perpendicularPartner(frameAxes, z);
    if (!x) continue;
    const frame = frameFrom(z.axis, x.axis);
    const inverted = found.inversion !== undefined;
    if (hasFive) {
      const five = high.find((axis) => axis.order === 5)!;
      const inFrame = Float64Array.of(dot(five.axis, frame.subarray(0, 3)), dot(five.axis, frame.subarray(3, 6)), dot(five.axis, frame.subarray(6, 9)));
      return { id: { family: inverted ? 'Ih' : 'I', n: 1 }, frame, fiveFoldAxis: idealFiveFoldAxis(inFrame) };
    }
    if (hasFour) return { id: { family: inverted ? 'Oh' : 'O', n: 1 }, frame };
    return { id: { family: inverted ? 'Th' : found.mirrors.length > 0 ? 'Td' : 'T', n: 1 }, frame };
  }
  return undefined;
}

function axial(found: FoundElements, principal: FoundAxis, context: SearchContext): Classification {
  const z = principal.axis;
  const n = principal.order;
  const perpendicular = found.axes.find((axis) => axis !== principal && Math.abs(dot(axis.axis, z)) < PERPENDICULAR);
  const horizontal = found.mirrors.some((mirror) => Math.abs(dot(mirror.normal, z)) > PARALLEL);
  const vertical = found.mirrors.find((mirror) => Math.abs(dot(mirror.normal, z)) < PERPENDICULAR);
  if (perpendicular) {
    const family = horizontal ? 'Dnh' : vertical ? 'Dnd' : 'Dn';
    return { id: { family, n }, frame: frameFrom(z, perpendicular.axis) };
  }
  if (horizontal) return { id: { family: 'Cnh', n }, frame: frameFrom(z, perpendicularTowards(z, INPUT_X)) };
  if (vertical) return { id: { family: 'Cnv', n }, frame: frameFrom(z, cross(vertical.normal, z)) };
  if (hasImproperAxis(context, z, 2 * n)) return { id: { family: 'S2n', n }, frame: frameFrom(z, perpendicularTowards(z, INPUT_X)) };
  return { id: { family: 'Cn', n }, frame: frameFrom(z, perpendicularTowards(z, INPUT_X)) };
}

export function classifyElements(found: FoundElements, context: SearchContext): Classification {
  const high = distinctAxes(found.axes.filter((axis) => axis.order >= 3));
  if (high.length >= 2) {
    const result = cubic(found, high);
    if (result) return result;
  }
  if (found.axes.length === 0) {
    const mirror = found.mirrors[0];
    if (mirror) return { id: { family: 'Cs', n: 1 }, frame: frameFrom(mirror.normal, perpendicularTowards(mirror.normal, INPUT_X)) };
    return { id: { family: found.inversion ? 'Ci' : 'C1', n: 1 }, frame: identity() };
  }
  const highest = Math.max(...found.axes.map((axis) => axis.order));
  let best: Classification | undefined;
  for (const principal of found.axes.filter((axis) => axis.order === highest)) {
    const candidate = axial(found, principal, context);
    if (!best || (groupOrder(candidate.id) ?? 0) > (groupOrder(best.id) ?? 0)) best = candidate;
  }
  return best!;
}

