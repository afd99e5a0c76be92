/**
 * Hydrogen link atoms on cut bonds (server/src/chemistry/capping.ts): the two placement rules.
 */
import { describe, expect, it } from 'vitest';
import { capScaleFactor, fixedCapLength, placeCap } from '../../server/src/chemistry/capping';

describe('cap placement', () => {
  it('puts a fixed cap at the typical X–H length of the kept atom, on the line to its partner', () => {
    // C–H 1.09 Å, the sp3 C–H length of organic groups (common practice); O–H 0.9572 Å in water
    // (Hoy & Bunker 1979), rounded to 0.96 (common practice).
    expect(fixedCapLength(6)).toBe(1.09);
    expect(fixedCapLength(8)).toBe(0.96);
    const placed = placeCap('fixed', 6, [0, 0, 0], 6, [0, 0, 1.535])!;
    expect(placed.length).toBe(1.09);
    expect(placed.position[0]).toBe(0);
    expect(placed.position[1]).toBe(0);
    expect(placed.position[2]).toBeCloseTo(1.09, 12);
  });

  it('scales a cap by the covalent-radius ratio g = (r_X + r_H)/(r_X + r_Y)', () => {
    // Cordero et al., Dalton Trans. 2008, 2832: r(C sp3) 0.76 Å, r(H) 0.31 Å, r(N) 0.71 Å.
    expect(capScaleFactor(6, 6)).toBeCloseTo((0.76 + 0.31) / (0.76 + 0.76), 12);
    expect(capScaleFactor(6, 7)).toBeCloseTo((0.76 + 0.31) / (0.76 + 0.71), 12);
    // A stretched bond stretches its cap in proportion.
    const near = placeCap('scaled', 6, [0, 0, 0], 6, [1.5, 0, 0])!;
    const far = placeCap('scaled', 6, [0, 0, 0], 6, [3, 0, 0])!;
    expect(far.length / near.length).toBeCloseTo(2, 12);
    expect(near.position[0]).toBeCloseTo(1.5 * (1.07 / 1.52), 12);
  });

  it('places no cap when the two atoms coincide or a coordinate is not finite', () => {
    expect(placeCap('fixed', 6, [1, 1, 1], 6, [1, 1, 1])).toBeUndefined();
    expect(placeCap('scaled', 6, [0, 0, 0], 6, [Number.NaN, 0, 0])).toBeUndefined();
  });
});
