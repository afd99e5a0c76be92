/**
 * Geometries along a distance scan: the moving group of atoms is translated along the line from
 * the first scanned atom to the second, so that their distance takes each value in turn.
 */

export interface ScanFrame {
  /** The scanned distance of this frame, Å. */
  readonly distance: number;
  /** x, y, z of every atom, Å. */
  readonly coordinates: Float64Array;
}

/**
 * Frames of a distance scan. `moving` lists the atoms that move with the second atom (its fragment);
 * everything else stays. Throws when the two atoms coincide, since the direction is then undefined.
 */
export function scanFrames(coordinates: Float64Array, first: number, second: number, moving: readonly number[], distances: readonly number[]): ScanFrame[] {
  return [...eachScanFrame(coordinates, first, second, moving, distances)];
}

/**
 * The same frames one at a time, each made when it is asked for: a scan of many points over many
 * atoms is written out with one frame in memory (exports stream them). Throws as scanFrames does,
 * before the first frame.
 */
export function eachScanFrame(coordinates: Float64Array, first: number, second: number, moving: readonly number[], distances: readonly number[]): Iterable<ScanFrame> {
  const dx = coordinates[3 * second]! - coordinates[3 * first]!;
  const dy = coordinates[3 * second + 1]! - coordinates[3 * first + 1]!;
  const dz = coordinates[3 * second + 2]! - coordinates[3 * first + 2]!;
  const current = Math.hypot(dx, dy, dz);
  if (current === 0) throw new RangeError('The two scanned atoms sit on the same point, so the scan has no direction.');
  const unit = [dx / current, dy / current, dz / current];
  return (function* frames(): Generator<ScanFrame> {
    for (const distance of distances) {
      const frame = Float64Array.from(coordinates);
      const shift = distance - current;
      for (const atom of moving) {
        for (let k = 0; k < 3; k++) frame[3 * atom + k] = coordinates[3 * atom + k]! + shift * unit[k]!;
      }
      yield { distance, coordinates: frame };
    }
  })();
}

/**
 * The atoms that move with `second` when no fragment says: its bonded component, unless that
 * component also holds `first` (then the second atom moves alone).
 */
export function bondedGroup(atomCount: number, bonds: readonly { i: number; j: number }[], first: number, second: number): number[] {
  const neighbours: number[][] = Array.from({ length: atomCount }, () => []);
  for (const { i, j } of bonds) {
    neighbours[i]!.push(j);
    neighbours[j]!.push(i);
  }
  const seen = new Uint8Array(atomCount);
  const stack = [second];
  seen[second] = 1;
  const group: number[] = [];
  while (stack.length > 0) {
    const atom = stack.pop()!;
    group.push(atom);
    for (const next of neighbours[atom]!) {
      if (!seen[next]) {
        seen[next] = 1;
        stack.push(next);
      }
    }
  }
  return seen[first] ? [second] : group.sort((a, b) => a - b);
}
