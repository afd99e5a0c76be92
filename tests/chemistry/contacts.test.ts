/**
 * Contacts (bonds, clashes, nearest neighbours): the grid search against a search of every pair,
 * and an update after an edit against a search from scratch.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyseContacts, BOND_TOLERANCE_FACTOR, CLASH_DISTANCE, nearestAtoms, NeighbourGrid } from '../../server/src/chemistry/geometry';

/** Every pair closer than the cutoff, by brute force. */
function bruteForce(coords: number[], cutoff: number): [number, number, number][] {
  const pairs: [number, number, number][] = [];
  const count = coords.length / 3;
  for (let i = 0; i < count; i++) {
    for (let j = i + 1; j < count; j++) {
      const [dx, dy, dz] = [0, 1, 2].map((k) => coords[3 * i + k]! - coords[3 * j + k]!);
      const d = Math.sqrt(dx! * dx! + dy! * dy! + dz! * dz!);
      if (d < cutoff) pairs.push([i, j, d]);
    }
  }
  return pairs;
}

const point = fc.tuple(fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }), fc.double({ min: -6, max: 6, noNaN: true }));

function plainContacts(contacts: ReturnType<typeof analyseContacts>) {
  return { bonds: contacts.bonds, clashes: contacts.clashes, nearestDistance: [...contacts.nearestDistance], nearestAtom: [...contacts.nearestAtom] };
}

describe('the neighbour grid', () => {
  it('finds exactly the pairs a search of every pair finds, in dense and in sparse boxes', () => {
    fc.assert(
      fc.property(fc.array(point, { maxLength: 60 }), fc.constantFrom(1, 100), fc.double({ min: 0.3, max: 3, noNaN: true }), (points, spread, cutoff) => {
        const coords = points.flatMap(([x, y, z]) => [x * spread, y, z]);
        const found: [number, number, number][] = [];
        new NeighbourGrid(coords, cutoff).forEachPairWithin(cutoff, (i, j, d) => found.push([i, j, d]));
        found.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
        expect(found).toEqual(bruteForce(coords, cutoff));
      }),
      { numRuns: 300 },
    );
  });

  it('lists an atom\'s neighbours nearest first, as a scan of every atom does (distances by construction of the coordinates)', () => {
    const coords = [0, 0, 0, 1, 0, 0, 0, 2, 0, 0, 0, 3.5, 5, 5, 5];
    const grid = new NeighbourGrid(coords, 4).neighboursOf(0, 4).map((pair) => [pair.j, pair.distance]);
    expect(grid).toEqual([[1, 1], [2, 2], [3, 3.5]]);
    expect(nearestAtoms(coords, 0, 4, 2).map((pair) => [pair.j, pair.distance])).toEqual([[1, 1], [2, 2]]);
  });
});

describe('contacts after an edit', () => {
  it('are the same whether updated from the previous geometry or found from scratch', () => {
    const radius = fc.constantFrom(0.31, 0.66, 0.76);
    const atoms = fc.array(fc.tuple(point, radius), { minLength: 1, maxLength: 40 });
    const edit = fc.tuple(fc.nat(), fc.nat({ max: 3 }), fc.array(fc.tuple(point, radius), { maxLength: 3 }));
    fc.assert(
      fc.property(atoms, fc.array(edit, { minLength: 1, maxLength: 4 }), (start, edits) => {
        let list = start;
        let contacts = analyseContacts(list.flatMap(([p]) => p), list.map(([, r]) => r));
        for (const [at, remove, inserted] of edits) {
          const position = at % (list.length + 1);
          list = [...list.slice(0, position), ...inserted, ...list.slice(position + remove)];
          const coords = list.flatMap(([p]) => p);
          const radii = list.map(([, r]) => r);
          const updated = analyseContacts(coords, radii, contacts);
          const fresh = analyseContacts(coords, radii);
          expect(plainContacts(updated)).toEqual(plainContacts(fresh));
          contacts = updated;
        }
      }),
      { numRuns: 400 },
    );
  });

  it('calls a pair bonded below 1.2 × the sum of covalent radii and clashing below 0.5 Å (common practice)', () => {
    const contacts = analyseContacts([0, 0, 0, 0, 0, 0.96, 0, 0, 0.3], [0.66, 0.31, 0.31]);
    expect(BOND_TOLERANCE_FACTOR).toBe(1.2);
    expect(CLASH_DISTANCE).toBe(0.5);
    // O–H 0.96 < 1.2 × 0.97, O–H 0.3 < 1.2 × 0.97, H–H 0.66 < 1.2 × 0.62: all three bonded.
    expect(contacts.bonds.map(({ i, j }) => [i, j])).toEqual([[0, 1], [0, 2], [1, 2]]);
    expect(contacts.clashes.map(({ i, j }) => [i, j])).toEqual([[0, 2]]);
  });
});
