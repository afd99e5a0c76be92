/**
 * Character tables of D2h and its subgroups, with the standard irrep labels and operation order of
 * F. A. Cotton, Chemical Applications of Group Theory, 3rd ed., Wiley 1990, Appendix IIA (the same
 * labels as G. Herzberg, Molecular Spectra and Molecular Structure II, Van Nostrand 1945). For
 * C2v, σ(xz) and σ(yz) are Cotton's σv(xz) and σv′(yz): B1 is symmetric under σ(xz) (it holds x),
 * B2 under σ(yz) (it holds y).
 *
 * These groups are all products of two-element groups (Z2^k), so every character is ±1 and an
 * irrep is fixed by its characters on k generators. `mask` has bit g set when the character on
 * generator g is −1; the direct product of two irreps is then the XOR of their masks (characters
 * of a product are products of characters, Cotton §4.3 — section from memory).
 */

export type AbelianGroupName = 'C1' | 'Cs' | 'Ci' | 'C2' | 'C2v' | 'C2h' | 'D2' | 'D2h';

export const ABELIAN_GROUPS: readonly AbelianGroupName[] = ['C1', 'Cs', 'Ci', 'C2', 'C2v', 'C2h', 'D2', 'D2h'];

export type OperationName = 'E' | 'C2(z)' | 'C2(y)' | 'C2(x)' | 'i' | 'σ(xy)' | 'σ(xz)' | 'σ(yz)';

/** Each operation as signs of (x, y, z) in the standard frame: it is diagonal there. */
export const OPERATION_SIGNS: Readonly<Record<OperationName, readonly [number, number, number]>> = {
  E: [1, 1, 1],
  'C2(z)': [-1, -1, 1],
  'C2(y)': [-1, 1, -1],
  'C2(x)': [1, -1, -1],
  i: [-1, -1, -1],
  'σ(xy)': [1, 1, -1],
  'σ(xz)': [1, -1, 1],
  'σ(yz)': [-1, 1, 1],
};

export interface Irrep {
  readonly label: string;
  /** One character per operation, in the table's operation order. */
  readonly characters: readonly number[];
  /** Bit g set when the character on generator g is −1. */
  readonly mask: number;
}

export interface CharacterTable {
  readonly group: AbelianGroupName;
  readonly operations: readonly OperationName[];
  /** Operations whose characters make up an irrep's mask, bit 0 first. */
  readonly generators: readonly OperationName[];
  readonly irreps: readonly Irrep[];
}

type Rows = readonly (readonly [string, readonly number[]])[];

function table(group: AbelianGroupName, operations: readonly OperationName[], generators: readonly OperationName[], rows: Rows): CharacterTable {
  const irreps = rows.map(([label, characters]) => {
    let mask = 0;
    generators.forEach((generator, bit) => {
      if (characters[operations.indexOf(generator)] === -1) mask |= 1 << bit;
    });
    return { label, characters, mask };
  });
  return { group, operations, generators, irreps };
}

// Characters transcribed from Cotton, Appendix IIA.
export const CHARACTER_TABLES: Readonly<Record<AbelianGroupName, CharacterTable>> = {
  C1: table('C1', ['E'], [], [['A', [1]]]),
  Cs: table('Cs', ['E', 'σ(xy)'], ['σ(xy)'], [
    ["A'", [1, 1]],
    ['A"', [1, -1]],
  ]),
  Ci: table('Ci', ['E', 'i'], ['i'], [
    ['Ag', [1, 1]],
    ['Au', [1, -1]],
  ]),
  C2: table('C2', ['E', 'C2(z)'], ['C2(z)'], [
    ['A', [1, 1]],
    ['B', [1, -1]],
  ]),
  C2v: table('C2v', ['E', 'C2(z)', 'σ(xz)', 'σ(yz)'], ['C2(z)', 'σ(xz)'], [
    ['A1', [1, 1, 1, 1]],
    ['A2', [1, 1, -1, -1]],
    ['B1', [1, -1, 1, -1]],
    ['B2', [1, -1, -1, 1]],
  ]),
  C2h: table('C2h', ['E', 'C2(z)', 'i', 'σ(xy)'], ['C2(z)', 'i'], [
    ['Ag', [1, 1, 1, 1]],
    ['Bg', [1, -1, 1, -1]],
    ['Au', [1, 1, -1, -1]],
    ['Bu', [1, -1, -1, 1]],
  ]),
  D2: table('D2', ['E', 'C2(z)', 'C2(y)', 'C2(x)'], ['C2(z)', 'C2(y)'], [
    ['A', [1, 1, 1, 1]],
    ['B1', [1, 1, -1, -1]],
    ['B2', [1, -1, 1, -1]],
    ['B3', [1, -1, -1, 1]],
  ]),
  D2h: table('D2h', ['E', 'C2(z)', 'C2(y)', 'C2(x)', 'i', 'σ(xy)', 'σ(xz)', 'σ(yz)'], ['C2(z)', 'C2(y)', 'i'], [
    ['Ag', [1, 1, 1, 1, 1, 1, 1, 1]],
    ['B1g', [1, 1, -1, -1, 1, 1, -1, -1]],
    ['B2g', [1, -1, 1, -1, 1, -1, 1, -1]],
    ['B3g', [1, -1, -1, 1, 1, -1, -1, 1]],
    ['Au', [1, 1, 1, 1, -1, -1, -1, -1]],
    ['B1u', [1, 1, -1, -1, -1, -1, 1, 1]],
    ['B2u', [1, -1, 1, -1, -1, 1, -1, 1]],
    ['B3u', [1, -1, -1, 1, -1, 1, 1, -1]],
  ]),
};

export function characterTable(group: AbelianGroupName): CharacterTable {
  return CHARACTER_TABLES[group];
}

export function irrepByLabel(group: AbelianGroupName, label: string): Irrep | undefined {
  return CHARACTER_TABLES[group].irreps.find((irrep) => irrep.label === label);
}

/**
 * The irrep a spec names, as users type it: case-insensitive, and with a doubled prime (A'') read as
 * the double-prime character (A").
 */
export function findIrrep(group: AbelianGroupName, written: string): Irrep | undefined {
  const wanted = written.replace(/''$/, '"').toLowerCase();
  return CHARACTER_TABLES[group].irreps.find((irrep) => irrep.label.toLowerCase() === wanted);
}

export function irrepByMask(group: AbelianGroupName, mask: number): Irrep | undefined {
  return CHARACTER_TABLES[group].irreps.find((irrep) => irrep.mask === mask);
}

/** Direct product of two irreps: XOR of their masks. */
export function irrepProduct(group: AbelianGroupName, a: string, b: string): string {
  const first = irrepByLabel(group, a);
  const second = irrepByLabel(group, b);
  if (!first || !second) throw new Error(`unknown irrep of ${group}: ${first ? b : a}`);
  return irrepByMask(group, first.mask ^ second.mask)!.label;
}
