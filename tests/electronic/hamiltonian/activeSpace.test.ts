/**
 * Active-space integrals against psi4: the constant (nuclear repulsion + frozen-core energy), the
 * effective one-body term and the active (pq|rs) computed by the fixture script with numpy from
 * psi4 1.3.2's matrices (tests/fixtures/hamiltonian.psi4.json, scripts/data/
 * generate_hamiltonian_fixture.py), through both inputs: packed atomic-orbital integrals, and a
 * shell-quartet source with psi4's shell layout, with and without a memory budget small enough to
 * force batches.
 */
import { describe, expect, it } from 'vitest';
import { CancelledError } from '../../../server/src/electronic/contracts';
import { ActiveSpaceError, activeSpaceIntegrals, activeWindow, type ActiveSpaceInput } from '../../../server/src/electronic/hamiltonian/activeSpace';
import { fixtureTwoElectronIntegrals, psi4Cases, type Psi4Case } from '../psi4Fixture';

function input(c: Psi4Case, core: number, active: number, twoElectron: ActiveSpaceInput['twoElectron']): ActiveSpaceInput {
  return {
    hCore: Float64Array.from(c.hCore),
    twoElectron,
    orbitals: { functionCount: c.functions, orbitalCount: c.orbitals, coefficients: Float64Array.from(c.coefficients) },
    nuclearRepulsion: c.nuclearRepulsion,
    core: Array.from({ length: core }, (_, i) => i),
    active: Array.from({ length: active }, (_, i) => core + i),
    electrons: { alpha: c.alpha, beta: c.beta },
  };
}

function packed(c: Psi4Case) {
  return { kind: 'packed' as const, functionCount: c.functions, values: Float64Array.from(c.eri) };
}

function maxDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let max = 0;
  for (let i = 0; i < a.length; i++) max = Math.max(max, Math.abs(a[i]! - b[i]!));
  return max;
}

const spaces = psi4Cases().flatMap((c) => c.spaces.map((space) => ({ label: `${c.name} core ${space.core} active ${space.active}`, c, space })));

describe('active-space integrals against psi4 (numpy on psi4 1.3.2 matrices)', () => {
  it.each(spaces)('$label: packed input', ({ c, space }) => {
    const result = activeSpaceIntegrals(input(c, space.core, space.active, packed(c)));
    expect(result.orbitals).toBe(space.active);
    expect(result.electrons).toEqual(space.electrons);
    expect(Math.abs(result.constant - space.constant)).toBeLessThan(1e-10);
    expect(Math.abs(result.coreEnergy - space.coreEnergy)).toBeLessThan(1e-10);
    expect(maxDifference(result.oneBody, space.h)).toBeLessThan(1e-10);
    expect(maxDifference(result.twoBody, space.eri)).toBeLessThan(1e-10);
  });

  it.each(spaces)('$label: shell quartets in psi4 shells', ({ c, space }) => {
    const result = activeSpaceIntegrals(input(c, space.core, space.active, fixtureTwoElectronIntegrals(c)));
    expect(Math.abs(result.constant - space.constant)).toBeLessThan(1e-10);
    expect(maxDifference(result.oneBody, space.h)).toBeLessThan(1e-10);
    expect(maxDifference(result.twoBody, space.eri)).toBeLessThan(1e-10);
    expect(result.statistics.passes).toBe(1);
  });

  it('a memory budget below one active index per pass gives one pass per index and the same integrals (water 6-31G, 8 active)', () => {
    const c = psi4Cases().find((x) => x.name === 'h2o-631g')!;
    const space = c.spaces.find((s) => s.active === 8)!;
    const aoPairs = (c.functions * (c.functions + 1)) / 2;
    const result = activeSpaceIntegrals({ ...input(c, 1, 8, fixtureTwoElectronIntegrals(c)), memoryBytes: aoPairs * 8 });
    expect(result.statistics.passes).toBe(8);
    expect(maxDifference(result.twoBody, space.eri)).toBeLessThan(1e-10);
  });

  it('Schwarz screening skips quartets whose bound is below the threshold and keeps the rest', () => {
    const c = psi4Cases().find((x) => x.name === 'h2o-631g')!;
    const space = c.spaces.find((s) => s.active === 6)!;
    const loose = activeSpaceIntegrals({ ...input(c, 1, 6, fixtureTwoElectronIntegrals(c)), screening: 1e-3 });
    const tight = activeSpaceIntegrals({ ...input(c, 1, 6, fixtureTwoElectronIntegrals(c)), screening: 1e-12 });
    expect(loose.statistics.screened).toBeGreaterThan(tight.statistics.screened);
    expect(maxDifference(tight.twoBody, space.eri)).toBeLessThan(1e-10);
    // Water is small and compact: a loose bound still moves the integrals only a little.
    expect(maxDifference(loose.twoBody, space.eri)).toBeLessThan(1e-2);
  });

  it('stops with CancelledError when the token turns', () => {
    const c = psi4Cases().find((x) => x.name === 'h2o-631g')!;
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 6, fixtureTwoElectronIntegrals(c)), cancel: { cancelled: true } })).toThrow(CancelledError);
  });
});

describe('active-space input checks', () => {
  const c = psi4Cases().find((x) => x.name === 'h2o-sto3g')!;
  it('names an orbital outside the range', () => {
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 6, packed(c)), active: [1, 2, 3, 4, 5, 9] })).toThrow(/active orbital 9 is not one of the 7 orbitals/);
  });
  it('names an orbital listed twice', () => {
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 6, packed(c)), core: [1] })).toThrow(/orbital 1 is listed twice/);
  });
  it('refuses electrons that do not fit', () => {
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 2, packed(c)) })).toThrow(ActiveSpaceError);
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 2, packed(c)) })).toThrow(/5 alpha electrons do not fit 1 core orbitals plus 2 active orbitals/);
  });
  it('refuses packed integrals of the wrong length', () => {
    expect(() => activeSpaceIntegrals({ ...input(c, 1, 6, { kind: 'packed', functionCount: 7, values: new Float64Array(10) }) })).toThrow(/10 values, but 7 functions need 406/);
  });
});

describe('the command line active window', () => {
  it('closed shell: Ne/2 highest occupied and the lowest virtual orbitals (water, 10 electrons, 4e4o)', () => {
    expect(activeWindow(13, { alpha: 5, beta: 5 }, 4, 4)).toEqual({ core: [0, 1, 2], active: [3, 4, 5, 6] });
  });
  it('open shell: the doubly occupied orbitals below, the singly occupied inside (triplet CH2, 6e6o)', () => {
    expect(activeWindow(7, { alpha: 5, beta: 3 }, 6, 6)).toEqual({ core: [0], active: [1, 2, 3, 4, 5, 6] });
  });
  it('refuses an odd number of electrons left below the window', () => {
    expect(() => activeWindow(13, { alpha: 5, beta: 5 }, 3, 4)).toThrow(/leave 7 below the active space/);
  });
  it('refuses a window above the last orbital', () => {
    expect(() => activeWindow(7, { alpha: 5, beta: 5 }, 4, 6)).toThrow(/6 active orbitals above 3 core orbitals: the part has 7 orbitals/);
  });
});
