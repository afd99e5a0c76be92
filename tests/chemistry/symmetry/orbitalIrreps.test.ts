/**
 * Orbital counts per irrep: shell characters against an independent count of functions by parity,
 * textbook and psi4 reference counts, and totals for every sample molecule in several bases.
 */
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { findBasisSet } from '../../../server/src/chemistry/basis/library';
import { functionCount, type FunctionType, type ShellCounts } from '../../../server/src/chemistry/basis/shells';
import { elementByNumber } from '../../../server/src/chemistry/elements';
import {
  detectSymmetry,
  fragmentOrbitalIrreps,
  OPERATION_SIGNS,
  orbitalIrreps,
  orbitalSymmetry,
  rotationCharacter,
  shellCharacter,
  type OperationName,
} from '../../../server/src/chemistry/symmetry';
import { analyze } from '../../../server/src/language/analyze';
import * as M from './molecules';

const OPERATIONS = Object.keys(OPERATION_SIGNS) as OperationName[];

/**
 * Parities of the real spherical harmonics under x → −x, y → −y, z → −z (from their explicit form
 * P_l^m(cos θ)·cos mφ or sin mφ: z flips cos θ, x sends φ → π − φ, y sends φ → −φ; e.g. Helgaker,
 * Jørgensen, Olsen, Molecular Electronic-Structure Theory, §6.4 — from memory).
 */
function realHarmonicParities(l: number): [number, number, number][] {
  const out: [number, number, number][] = [[1, 1, l % 2 === 0 ? 1 : -1]];
  for (let m = 1; m <= l; m++) {
    const z = (l + m) % 2 === 0 ? 1 : -1;
    out.push([m % 2 === 0 ? 1 : -1, 1, z]);
    out.push([m % 2 === 0 ? -1 : 1, -1, z]);
  }
  return out;
}

/** Character of a diagonal operation on a set of functions with known parities. */
function characterFromParities(parities: readonly (readonly number[])[], operation: OperationName): number {
  const signs = OPERATION_SIGNS[operation];
  return parities.reduce((sum, p) => sum + [0, 1, 2].reduce((product, k) => product * (signs[k] === -1 ? p[k]! : 1), 1), 0);
}

/** Cartesian monomials x^a y^b z^c with a + b + c = l, as parities. */
function monomialParities(l: number): number[][] {
  const out: number[][] = [];
  for (let a = l; a >= 0; a--) for (let b = l - a; b >= 0; b--) out.push([(-1) ** a, (-1) ** b, (-1) ** (l - a - b)]);
  return out;
}

describe('shell characters', () => {
  it.each([0, 1, 2, 3, 4, 5, 6])('l = %i: spherical characters equal the count by parity of the real harmonics (2l+1 of them by definition)', (l) => {
    expect(realHarmonicParities(l)).toHaveLength(2 * l + 1);
    for (const operation of OPERATIONS) expect(shellCharacter(l, 'spherical', operation)).toBe(characterFromParities(realHarmonicParities(l), operation));
  });

  it.each([0, 1, 2, 3, 4, 5, 6])('l = %i: cartesian characters equal the count by parity of the monomials ((l+1)(l+2)/2 of them by definition)', (l) => {
    expect(monomialParities(l)).toHaveLength(((l + 1) * (l + 2)) / 2);
    for (const operation of OPERATIONS) expect(shellCharacter(l, 'cartesian', operation)).toBe(characterFromParities(monomialParities(l), operation));
  });

  it('the rotation-group character: 2l+1 at 0, (−1)^l at π; for l = 1 it is 1 + 2 cos θ, 0 at 2π/3 (Tinkham eq. 5-11; from memory)', () => {
    for (let l = 0; l < 8; l++) {
      expect(rotationCharacter(l, 0)).toBe(2 * l + 1);
      expect(rotationCharacter(l, Math.PI)).toBe((-1) ** l);
      expect(rotationCharacter(l, 2 * Math.PI)).toBe(2 * l + 1);
    }
    // l = 1: 1 + 2 cos θ; at 2π/3 that is 0, at π/2 it is 1.
    expect(rotationCharacter(1, (2 * Math.PI) / 3)).toBe(0);
    expect(rotationCharacter(1, Math.PI / 2)).toBe(1);
  });
});

function shellsOf(basis: string, numbers: readonly number[]): (ShellCounts | undefined)[] {
  const set = findBasisSet(basis)!;
  return numbers.map((z) => set.shellsFor(elementByNumber(z)!.symbol));
}

function countsOf(molecule: M.TestMolecule, basis: string, functions: FunctionType): Record<string, number> {
  const symmetry = detectSymmetry(molecule.numbers, molecule.coordinates);
  const result = orbitalIrreps(symmetry, shellsOf(basis, molecule.numbers), functions);
  return Object.fromEntries(result.irreps.map((irrep) => [irrep.label, irrep.count]));
}

describe('orbital counts per irrep', () => {
  it('water in STO-3G, in the yz plane: 4 A1 + 0 A2 + 1 B1 + 2 B2 (the textbook minimal-basis result; from memory, and psi4 1.3.2 agrees in tests/fixtures/irreps.psi4.json)', () => {
    expect(countsOf(M.water, 'sto-3g', 'spherical')).toEqual({ A1: 4, A2: 0, B1: 1, B2: 2 });
  });

  it('water in cc-pVDZ: 11 A1, 2 A2, 4 B1, 7 B2 (from memory; psi4 1.3.2 agrees in tests/fixtures/irreps.psi4.json)', () => {
    expect(countsOf(M.water, 'cc-pvdz', 'spherical')).toEqual({ A1: 11, A2: 2, B1: 4, B2: 7 });
  });

  // 6-31G*: C [3s2p1d] = 15 cartesian / 14 spherical (one d set on heavy atoms, Hariharan & Pople 1973),
  // H [2s] = 2 (Ditchfield, Hehre & Pople 1971): 6 × 15 + 6 × 2 = 102 and 6 × 14 + 6 × 2 = 96.
  it('benzene in 6-31G*: the sums are 102 cartesian and 96 spherical functions (samples/molecules/benzene-6-31gs.tess)', () => {
    const cartesian = countsOf(M.benzene, '6-31g*', 'cartesian');
    const spherical = countsOf(M.benzene, '6-31g*', 'spherical');
    expect(Object.values(cartesian).reduce((a, b) => a + b, 0)).toBe(102);
    expect(Object.values(spherical).reduce((a, b) => a + b, 0)).toBe(96);
  });

  it('a single atom: a d shell in D2h splits as 2 Ag + B1g + B2g + B3g, a p shell as B1u + B2u + B3u (Cotton, App. IIA; from memory)', () => {
    const atom = detectSymmetry([26], [0, 0, 0]);
    const d = orbitalIrreps(atom, [[0, 0, 1]], 'spherical');
    expect(Object.fromEntries(d.irreps.map((irrep) => [irrep.label, irrep.count]))).toEqual({ Ag: 2, B1g: 1, B2g: 1, B3g: 1, Au: 0, B1u: 0, B2u: 0, B3u: 0 });
    const p = orbitalIrreps(atom, [[0, 1]], 'spherical');
    expect(Object.fromEntries(p.irreps.map((irrep) => [irrep.label, irrep.count]))).toEqual({ Ag: 0, B1g: 0, B2g: 0, B3g: 0, Au: 0, B1u: 1, B2u: 1, B3u: 1 });
  });

  it('atoms without a basis are reported and contribute nothing (by construction: two atoms without shells, one 2s1p = 2 + 3 functions)', () => {
    const symmetry = detectSymmetry(M.water.numbers, M.water.coordinates);
    const result = orbitalIrreps(symmetry, [[2, 1], undefined, undefined], 'spherical');
    expect(result.atomsWithoutBasis).toBe(2);
    expect(result.total).toBe(5);
  });

  it('rejects shells that differ between equivalent atoms', () => {
    const symmetry = detectSymmetry(M.water.numbers, M.water.coordinates);
    expect(() => orbitalIrreps(symmetry, [[2, 1], [1], [2]], 'spherical')).toThrow();
  });
});

interface Psi4Molecule {
  name: string;
  symbols: string[];
  coordinates: number[];
  fullPointGroup: string;
  pointGroup: string;
  irrepLabels: string[];
  results: { basis: string; nsopi: number[]; nso: number; puream: boolean }[];
}

const psi4 = JSON.parse(readFileSync(path.resolve(__dirname, '../../fixtures/irreps.psi4.json'), 'utf8')) as { origin: { programVersion: string }; molecules: Psi4Molecule[] };

/** psi4's spellings of group and irrep names mapped to ours. */
const PSI4_GROUPS: Record<string, string> = { c1: 'C1', cs: 'Cs', ci: 'Ci', c2: 'C2', c2v: 'C2v', c2h: 'C2h', d2: 'D2', d2h: 'D2h' };
const psi4Irrep = (label: string) => (label === 'Ap' ? "A'" : label === 'App' ? 'A"' : label);
const psi4FullGroup = (name: string) => name.replace('_inf_', '∞');
/**
 * Where psi4's full point group (Molecule.get_full_point_group, with no_reorient) is not the
 * textbook one: it reports D2h for benzene (textbook D6h) and C2v for planar BF3 (textbook D3h).
 * Observed when the fixture was made, not investigated; kept visible so any other difference fails.
 */
const PSI4_FULL_GROUP_DIFFERENCES: Record<string, { psi4: string; textbook: string }> = {
  benzene: { psi4: 'D2h', textbook: 'D6h' },
  'boron trifluoride': { psi4: 'C2v', textbook: 'D3h' },
};

describe(`against psi4 ${psi4.origin.programVersion} (tests/fixtures/irreps.psi4.json, made by scripts/data/generate_irreps_fixture.py)`, () => {
  it('covers every abelian group but C1 and Ci, and more than 40 (molecule, basis) pairs', () => {
    expect(new Set(psi4.molecules.map((molecule) => molecule.pointGroup))).toEqual(new Set(['cs', 'c2', 'c2v', 'c2h', 'd2', 'd2h']));
    expect(psi4.molecules.reduce((sum, molecule) => sum + molecule.results.length, 0)).toBeGreaterThan(40);
  });

  for (const molecule of psi4.molecules) {
    const numbers = molecule.symbols.map(elementBySymbolOrThrow);
    it(`${molecule.name}: same full group, abelian group and orientation (the geometry is in the standard frame)`, () => {
      const result = detectSymmetry(numbers, molecule.coordinates);
      const difference = PSI4_FULL_GROUP_DIFFERENCES[molecule.name];
      if (difference) {
        expect(psi4FullGroup(molecule.fullPointGroup)).toBe(difference.psi4);
        expect(result.fullGroup).toBe(difference.textbook);
      } else {
        expect(result.fullGroup).toBe(psi4FullGroup(molecule.fullPointGroup));
      }
      expect(result.abelianGroup).toBe(PSI4_GROUPS[molecule.pointGroup]);
      result.frame.axes.forEach((axis, k) => expect(Math.abs(axis[k]!)).toBeCloseTo(1, 9));
    });
    for (const entry of molecule.results) {
      it(`${molecule.name} ${entry.basis} (${entry.puream ? 'spherical' : 'cartesian'}): functions per irrep`, () => {
        const result = detectSymmetry(numbers, molecule.coordinates);
        const counts = orbitalIrreps(result, shellsOf(entry.basis, numbers), entry.puream ? 'spherical' : 'cartesian');
        const ours = Object.fromEntries(counts.irreps.map((irrep) => [irrep.label, irrep.count]));
        const theirs = Object.fromEntries(molecule.irrepLabels.map((label, k) => [psi4Irrep(label), entry.nsopi[k]]));
        expect(ours).toEqual(theirs);
        expect(counts.total).toBe(entry.nso);
      });
    }
  }
});

function elementBySymbolOrThrow(symbol: string): number {
  const z = { H: 1, B: 5, C: 6, N: 7, O: 8, F: 9, S: 16, Cl: 17 }[symbol];
  if (z === undefined) throw new Error(`no atomic number for ${symbol} in this test`);
  return z;
}

const SAMPLES = path.resolve(__dirname, '../../../samples');
function specsUnder(folder: string): string[] {
  return readdirSync(folder, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) return specsUnder(full);
    return entry.name.endsWith('.tess') && entry.name !== 'mistakes.tess' ? [full] : [];
  });
}

describe('every sample molecule: counts summed over irreps equal the function count', () => {
  const BASES = ['sto-3g', '6-31g*', 'cc-pvdz', 'def2-svp', 'def2-tzvp'];
  const specs = specsUnder(SAMPLES).sort();

  it('finds the sample specs', () => {
    expect(specs.length).toBeGreaterThan(3);
  });

  for (const file of specs) {
    it(`${path.relative(SAMPLES, file)}: whole molecule and each fragment, ${BASES.join(', ')}, both function types`, () => {
      const { model } = analyze(readFileSync(file, 'utf8'), { path: file });
      const numbers = model.atoms.map((atom) => atom.element.z);
      const symbols = model.atoms.map((atom) => atom.element.symbol);
      let checked = 0;
      for (const basis of BASES) {
        const set = findBasisSet(basis)!;
        if (!symbols.every((symbol) => set.shellsFor(symbol))) continue;
        const shells = symbols.map((symbol) => set.shellsFor(symbol));
        for (const functions of ['spherical', 'cartesian'] as const) {
          const expected = shells.reduce((sum, counts) => sum + functionCount(counts!, functions), 0);
          const whole = orbitalIrreps(detectSymmetry(numbers, model.coordinates), shells, functions);
          expect(whole.irreps.reduce((sum, irrep) => sum + irrep.count, 0)).toBe(expected);
          for (const fragment of model.fragments) {
            const part = fragmentOrbitalIrreps(numbers, model.coordinates, fragment.atoms, shells, functions);
            const partExpected = fragment.atoms.reduce((sum, atom) => sum + functionCount(shells[atom]!, functions), 0);
            expect(part.orbitals.irreps.reduce((sum, irrep) => sum + irrep.count, 0)).toBe(partExpected);
          }
          checked++;
        }
      }
      expect(checked).toBeGreaterThan(0);
    });
  }
});

describe('fragments', () => {
  it('a fragment takes its own group: two adjacent CH units of benzene are C2v, not D6h', () => {
    const shells = shellsOf('sto-3g', M.benzene.numbers);
    const fragment = fragmentOrbitalIrreps(M.benzene.numbers, M.benzene.coordinates, [0, 1, 6, 7], shells, 'spherical');
    expect(detectSymmetry(M.benzene.numbers, M.benzene.coordinates).fullGroup).toBe('D6h');
    expect(fragment.symmetry.fullGroup).toBe('C2v');
    // By hand with the C2v table (Cotton 1990) (the fragment lies in the yz plane, C2 along z through the C–C midpoint): the two
    // 1s, 2s and H 1s give a symmetric and an antisymmetric pair each (3 A1 + 3 B2); the in-plane
    // p's along z and y give one pair each (pz: A1 + B2, py: B2 + A1); the out-of-plane px pair
    // gives B1 + A2. Total A1 5, A2 1, B1 1, B2 5 = 12 functions.
    const counts = Object.fromEntries(fragment.orbitals.irreps.map((irrep) => [irrep.label, irrep.count]));
    expect(counts).toEqual({ A1: 5, A2: 1, B1: 1, B2: 5 });
  });

  it('a fragment can be more symmetric than its molecule: one water of a water pair is C2v, with the STO-3G counts of water above (psi4 1.3.2 in tests/fixtures/irreps.psi4.json)', () => {
    const pair = M.molecule('water pair', [
      ['O', 0, 0, 0],
      ['H', 0, 0.75695, 0.585882],
      ['H', 0, -0.75695, 0.585882],
      ['O', 2.1, 1.3, 0.4],
      ['H', 2.9, 1.1, 0.9],
      ['H', 1.6, 1.9, 0.9],
    ]);
    expect(detectSymmetry(pair.numbers, pair.coordinates).fullGroup).toBe('C1');
    const fragment = fragmentOrbitalIrreps(pair.numbers, pair.coordinates, [0, 1, 2], shellsOf('sto-3g', pair.numbers), 'spherical');
    expect(fragment.symmetry.fullGroup).toBe('C2v');
    expect(Object.fromEntries(fragment.orbitals.irreps.map((irrep) => [irrep.label, irrep.count]))).toEqual({ A1: 4, A2: 0, B1: 1, B2: 2 });
  });
});

describe('a basis that breaks the symmetry of the geometry', () => {
  // Two copies of the water, the second moved 3 Å along x (by construction): a C2 axis and a mirror
  // exchange the two molecules, so the geometry is C2v (Cotton 1990, ch. 3) with o1 and o2 equivalent.
  const pair = M.molecule('water pair', [
    ...M.water.symbols.map((symbol, i): [string, number, number, number] => [symbol, M.water.coordinates[3 * i]!, M.water.coordinates[3 * i + 1]!, M.water.coordinates[3 * i + 2]!]),
    ...M.water.symbols.map((symbol, i): [string, number, number, number] => [symbol, M.water.coordinates[3 * i]! + 3, M.water.coordinates[3 * i + 1]!, M.water.coordinates[3 * i + 2]!]),
  ]);
  const atoms = (shells: (ShellCounts | undefined)[]) => ({ numbers: pair.numbers, positions: pair.coordinates, shells, coreShells: undefined, functions: 'spherical' as const });

  it('keeps the point group when the equivalent atoms have the same basis', () => {
    expect(orbitalSymmetry(atoms(shellsOf('cc-pvdz', pair.numbers)))?.group).toBe('C2v');
  });

  it('counts without symmetry when one oxygen has another basis (the operations that swap the oxygens are no symmetry of the basis)', () => {
    const shells = shellsOf('cc-pvdz', pair.numbers);
    shells[0] = findBasisSet('cc-pvtz')!.shellsFor('O');
    expect(orbitalSymmetry(atoms(shells))).toBeUndefined();
  });
});
