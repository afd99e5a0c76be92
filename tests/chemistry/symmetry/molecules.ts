/**
 * Geometries for the symmetry tests. All but one are invented: idealised shapes built from round
 * bond lengths and angles, not optimised structures, not taken from any publication or program.
 * The exception is water, which is the experimental structure of Hoy & Bunker (1979) in our own
 * placement, shared with the samples (tests/fixtures/water.ts). Every builder states its
 * construction so a reader can check the symmetry by hand.
 */
import { WATER_ROWS } from '../../fixtures/water';

export interface TestMolecule {
  readonly name: string;
  readonly symbols: readonly string[];
  readonly numbers: readonly number[];
  /** Flat x, y, z per atom, Å. */
  readonly coordinates: readonly number[];
}

const Z: Readonly<Record<string, number>> = { H: 1, B: 5, C: 6, N: 7, O: 8, F: 9, S: 16, Cl: 17, Fe: 26, Br: 35, Xe: 54 };

type Atom = readonly [string, number, number, number];

export function molecule(name: string, atoms: readonly Atom[]): TestMolecule {
  return {
    name,
    symbols: atoms.map((atom) => atom[0]),
    numbers: atoms.map((atom) => Z[atom[0]]!),
    coordinates: atoms.flatMap((atom) => [atom[1], atom[2], atom[3]]),
  };
}

const deg = Math.PI / 180;
const PHI = (1 + Math.sqrt(5)) / 2;

/**
 * Water in the yz plane, C2 along z: not invented, the experimental structure of Hoy & Bunker,
 * J. Mol. Spectrosc. 74, 1 (1979), placed as in tests/fixtures/water.ts (the samples' water).
 */
export const water = molecule(
  'water',
  WATER_ROWS.map((row): Atom => [row[0], row[2], row[3], row[4]]),
);

/** Ammonia: N on the z axis, three H at 120° steps around it, 0.38 Å below. */
export const ammonia = molecule('ammonia', [
  ['N', 0, 0, 0.0],
  ...[0, 120, 240].map((angle): Atom => ['H', 0.94 * Math.cos(angle * deg), 0.94 * Math.sin(angle * deg), -0.38]),
]);

/** Methane: H on alternate corners of a cube around C (C–H 1.09 Å). */
const a = 1.09 / Math.sqrt(3);
export const methane = molecule('methane', [
  ['C', 0, 0, 0],
  ['H', a, a, a],
  ['H', -a, -a, a],
  ['H', -a, a, -a],
  ['H', a, -a, -a],
]);

/** Benzene in the xy plane: regular hexagons of C (1.39 Å) and H (2.48 Å), C on the x axis. */
export const benzene = molecule('benzene', [
  ...[0, 60, 120, 180, 240, 300].map((angle): Atom => ['C', 1.39 * Math.cos(angle * deg), 1.39 * Math.sin(angle * deg), 0]),
  ...[0, 60, 120, 180, 240, 300].map((angle): Atom => ['H', 2.48 * Math.cos(angle * deg), 2.48 * Math.sin(angle * deg), 0]),
]);

/** Ethylene in the xy plane with C=C along x (deliberately not the standard orientation). */
export const ethylene = molecule('ethylene', [
  ['C', 0.665, 0, 0],
  ['C', -0.665, 0, 0],
  ['H', 1.23, 0.92, 0],
  ['H', 1.23, -0.92, 0],
  ['H', -1.23, 0.92, 0],
  ['H', -1.23, -0.92, 0],
]);

/** Allene: C=C=C along z; the CH2 planes are xz at one end and yz at the other. */
export const allene = molecule('allene', [
  ['C', 0, 0, 0],
  ['C', 0, 0, 1.31],
  ['C', 0, 0, -1.31],
  ['H', 0.93, 0, 1.87],
  ['H', -0.93, 0, 1.87],
  ['H', 0, 0.93, -1.87],
  ['H', 0, -0.93, -1.87],
]);

function ethane(name: string, bottomOffset: number) {
  return molecule(name, [
    ['C', 0, 0, 0.765],
    ['C', 0, 0, -0.765],
    ...[0, 120, 240].map((angle): Atom => ['H', 1.01 * Math.cos(angle * deg), 1.01 * Math.sin(angle * deg), 1.16]),
    ...[0, 120, 240].map((angle): Atom => ['H', 1.01 * Math.cos((angle + bottomOffset) * deg), 1.01 * Math.sin((angle + bottomOffset) * deg), -1.16]),
  ]);
}
/** Ethane, staggered: the lower methyl turned by 60°. */
export const staggeredEthane = ethane('staggered ethane', 60);
/** Ethane, eclipsed. */
export const eclipsedEthane = ethane('eclipsed ethane', 0);

/** SF6: F at ±1.56 Å along each axis. */
export const sulfurHexafluoride = molecule('SF6', [
  ['S', 0, 0, 0],
  ['F', 1.56, 0, 0],
  ['F', -1.56, 0, 0],
  ['F', 0, 1.56, 0],
  ['F', 0, -1.56, 0],
  ['F', 0, 0, 1.56],
  ['F', 0, 0, -1.56],
]);

/** Even (cyclic) permutations of (x, y, z) with every sign choice of the non-zero entries. */
function cyclicSigned(x: number, y: number, z: number): [number, number, number][] {
  const points: [number, number, number][] = [];
  for (const [p, q, r] of [
    [x, y, z],
    [z, x, y],
    [y, z, x],
  ] as const) {
    for (const sp of p === 0 ? [1] : [1, -1]) for (const sq of q === 0 ? [1] : [1, -1]) for (const sr of r === 0 ? [1] : [1, -1]) points.push([sp * p, sq * q, sr * r]);
  }
  return points;
}

/**
 * Buckminsterfullerene C60 as the truncated icosahedron: the cyclic permutations of
 * (0, ±1, ±3φ), (±1, ±(2+φ), ±2φ) and (±φ, ±2, ±φ³), edge 2, scaled by 0.7 to an edge of 1.4 Å
 * (the construction is from memory; the test checks that every atom has exactly three
 * neighbours at the edge length).
 */
export const c60 = molecule(
  'C60',
  [...cyclicSigned(0, 1, 3 * PHI), ...cyclicSigned(1, 2 + PHI, 2 * PHI), ...cyclicSigned(PHI, 2, PHI ** 3)].map((p): Atom => ['C', 0.7 * p[0], 0.7 * p[1], 0.7 * p[2]]),
);

/** closo-B12H12(2−): B on an icosahedron (cyclic permutations of (0, ±1, ±φ)), H radially outside. */
export const dodecaborate = molecule('B12H12', [
  ...cyclicSigned(0, 1, PHI).map((p): Atom => ['B', 0.85 * p[0], 0.85 * p[1], 0.85 * p[2]]),
  ...cyclicSigned(0, 1, PHI).map((p): Atom => ['H', 1.5 * p[0], 1.5 * p[1], 1.5 * p[2]]),
]);

/** CO2 along a tilted axis (1, 2, 2)/3, to exercise the orientation. */
export const carbonDioxide = molecule('CO2', [
  ['C', 0.2, 0.3, -0.1],
  ['O', 0.2 + 1.16 / 3, 0.3 + 2.32 / 3, -0.1 + 2.32 / 3],
  ['O', 0.2 - 1.16 / 3, 0.3 - 2.32 / 3, -0.1 - 2.32 / 3],
]);

/** HCN along x. */
export const hydrogenCyanide = molecule('HCN', [
  ['H', -1.066, 0, 0],
  ['C', 0, 0, 0],
  ['N', 1.156, 0, 0],
]);

/**
 * Hydrogen peroxide (C2): O–O along x, each H 0.95 Å from its O at an O–O–H angle of 100°,
 * turned 50° out of the xy plane; the second H is the half-turn (x, y, z) → (−x, −y, z) of the first.
 */
const h1 = [-0.7375 + 0.95 * Math.cos(100 * deg) * -1, 0.95 * Math.sin(100 * deg) * Math.cos(50 * deg), 0.95 * Math.sin(100 * deg) * Math.sin(50 * deg)] as const;
export const hydrogenPeroxide = molecule('H2O2', [
  ['O', -0.7375, 0, 0],
  ['O', 0.7375, 0, 0],
  ['H', h1[0], h1[1], h1[2]],
  ['H', -h1[0], -h1[1], h1[2]],
]);

/** Planar trans H–O–O–H (C2h): the second H is the inversion image of the first. */
const t1 = [-0.7375 + 0.95 * Math.cos(100 * deg) * -1, 0.95 * Math.sin(100 * deg), 0] as const;
export const transPeroxide = molecule('trans-HOOH', [
  ['O', -0.7375, 0, 0],
  ['O', 0.7375, 0, 0],
  ['H', t1[0], t1[1], t1[2]],
  ['H', -t1[0], -t1[1], -t1[2]],
]);

/** CHFClBr: four different substituents on tetrahedral directions (C1). */
const tetra = [
  [1, 1, 1],
  [-1, -1, 1],
  [-1, 1, -1],
  [1, -1, -1],
].map((v) => v.map((c) => c / Math.sqrt(3)));
export const bromochlorofluoromethane = molecule('CHFClBr', [
  ['C', 0, 0, 0],
  ['H', ...(tetra[0]!.map((c) => 1.09 * c) as [number, number, number])],
  ['F', ...(tetra[1]!.map((c) => 1.35 * c) as [number, number, number])],
  ['Cl', ...(tetra[2]!.map((c) => 1.77 * c) as [number, number, number])],
  ['Br', ...(tetra[3]!.map((c) => 1.94 * c) as [number, number, number])],
]);

/** Hypochlorous acid, bent and planar (Cs, the mirror is the molecular plane, here xz). */
export const hypochlorousAcid = molecule('HOCl', [
  ['O', 0, 0, 0],
  ['H', 0.96, 0, 0],
  ['Cl', 1.69 * Math.cos(103 * deg), 0, 1.69 * Math.sin(103 * deg)],
]);

/** Chlorofluoromethane (Cs): C, F, Cl in the xy plane, the two H mirrored through it. */
export const chlorofluoromethane = molecule('CH2FCl', [
  ['C', 0, 0, 0],
  ['F', 1.35, 0, 0],
  ['Cl', 1.77 * Math.cos(110 * deg), 1.77 * Math.sin(110 * deg), 0],
  ['H', -0.4, -0.55, 0.9],
  ['H', -0.4, -0.55, -0.9],
]);

/**
 * An S4 arrangement (invented): a C atom at the centre and two orbits of the improper rotation
 * S4(z): (x, y, z) → (y, −x, −z), one of C from (1.2, 0.4, 0.5) and one of H from (2.0, 0.9, 1.1).
 */
function s4Orbit(p: readonly [number, number, number]): [number, number, number][] {
  const out: [number, number, number][] = [];
  let q: [number, number, number] = [p[0], p[1], p[2]];
  for (let k = 0; k < 4; k++) {
    out.push(q);
    q = [q[1], -q[0], -q[2]];
  }
  return out;
}
export const s4Example = molecule('S4 example', [
  ['C', 0, 0, 0],
  ...s4Orbit([1.2, 0.4, 0.5]).map((p): Atom => ['C', ...p]),
  ...s4Orbit([2.0, 0.9, 1.1]).map((p): Atom => ['H', ...p]),
]);

/** Signed permutation matrices applied to a point: the orbit under a cubic group given by a filter. */
function cubicOrbit(p: readonly [number, number, number], keep: (permutationEven: boolean, minusSigns: number) => boolean): [number, number, number][] {
  const permutations: [readonly [number, number, number], boolean][] = [
    [[0, 1, 2], true],
    [[1, 2, 0], true],
    [[2, 0, 1], true],
    [[1, 0, 2], false],
    [[0, 2, 1], false],
    [[2, 1, 0], false],
  ];
  const out: [number, number, number][] = [];
  for (const [perm, even] of permutations) {
    for (let signs = 0; signs < 8; signs++) {
      const s = [signs & 1 ? -1 : 1, signs & 2 ? -1 : 1, signs & 4 ? -1 : 1];
      const minus = s.filter((v) => v < 0).length;
      if (!keep(even, minus)) continue;
      out.push([s[0]! * p[perm[0]]!, s[1]! * p[perm[1]]!, s[2]! * p[perm[2]]!]);
    }
  }
  return out;
}

/**
 * Cubic groups as sets of signed permutation matrices (a standard description, from memory):
 * O = rotations = determinant +1 (even permutation with an even number of minus signs, or odd with
 * an odd number); T = even permutations with an even number of minus signs; Td = any permutation
 * with an even number of minus signs; Th = even permutations with any signs; Oh = all 48.
 */
export const cubicGroups = {
  T: (p: readonly [number, number, number]) => cubicOrbit(p, (even, minus) => even && minus % 2 === 0),
  Td: (p: readonly [number, number, number]) => cubicOrbit(p, (_even, minus) => minus % 2 === 0),
  Th: (p: readonly [number, number, number]) => cubicOrbit(p, (even) => even),
  O: (p: readonly [number, number, number]) => cubicOrbit(p, (even, minus) => even === (minus % 2 === 0)),
  Oh: (p: readonly [number, number, number]) => cubicOrbit(p, () => true),
};

/** A centre atom plus one generic orbit of the group (invented data). */
export function cubicCluster(group: keyof typeof cubicGroups): TestMolecule {
  return molecule(`${group} cluster`, [['S', 0, 0, 0], ...cubicGroups[group]([2.1, 0.7, 0.3]).map((p): Atom => ['H', ...p])]);
}

/** Rotates a molecule rigidly (about the origin) and shifts it, to test orientation independence. */
export function moved(input: TestMolecule, axis: readonly [number, number, number], angle: number, shift: readonly [number, number, number]): TestMolecule {
  const length = Math.hypot(...axis);
  const [x, y, z] = axis.map((c) => c / length) as [number, number, number];
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const t = 1 - c;
  const m = [c + t * x * x, t * x * y - s * z, t * x * z + s * y, t * x * y + s * z, c + t * y * y, t * y * z - s * x, t * x * z - s * y, t * y * z + s * x, c + t * z * z];
  const coordinates: number[] = [];
  for (let i = 0; i < input.numbers.length; i++) {
    const p = input.coordinates.slice(3 * i, 3 * i + 3);
    for (let r = 0; r < 3; r++) coordinates.push(m[3 * r]! * p[0]! + m[3 * r + 1]! * p[1]! + m[3 * r + 2]! * p[2]! + shift[r]!);
  }
  return { ...input, name: `${input.name} (moved)`, coordinates };
}

/** XeF4, square planar in the xy plane, F on the x and y axes. */
export const xenonTetrafluoride = molecule('XeF4', [
  ['Xe', 0, 0, 0],
  ['F', 1.95, 0, 0],
  ['F', -1.95, 0, 0],
  ['F', 0, 1.95, 0],
  ['F', 0, -1.95, 0],
]);

/** SF5Cl: an octahedron with one F replaced by Cl on the z axis. */
export const sulfurChloridePentafluoride = molecule('SF5Cl', [
  ['S', 0, 0, 0],
  ['F', 1.57, 0, 0],
  ['F', -1.57, 0, 0],
  ['F', 0, 1.57, 0],
  ['F', 0, -1.57, 0],
  ['F', 0, 0, -1.57],
  ['Cl', 0, 0, 2.05],
]);

/** Boric acid B(OH)3, planar, the three OH turned the same way round (C3h). */
export const boricAcid = molecule('B(OH)3', [
  ['B', 0, 0, 0],
  ...[0, 120, 240].map((angle): Atom => ['O', 1.37 * Math.cos(angle * deg), 1.37 * Math.sin(angle * deg), 0]),
  ...[0, 120, 240].map((angle): Atom => ['H', 1.37 * Math.cos(angle * deg) + 0.97 * Math.cos((angle + 115) * deg), 1.37 * Math.sin(angle * deg) + 0.97 * Math.sin((angle + 115) * deg), 0]),
]);

/** Ferrocene: Fe between two C5H5 rings 1.66 Å above and below; the lower ring turned by `turn` degrees. */
function ferrocene(name: string, turn: number): TestMolecule {
  const ring = (height: number, offset: number, radius: number, symbol: string) =>
    [0, 72, 144, 216, 288].map((angle): Atom => [symbol, radius * Math.cos((angle + offset) * deg), radius * Math.sin((angle + offset) * deg), height]);
  return molecule(name, [['Fe', 0, 0, 0], ...ring(1.66, 0, 1.22, 'C'), ...ring(1.66, 0, 2.29, 'H'), ...ring(-1.66, turn, 1.22, 'C'), ...ring(-1.66, turn, 2.29, 'H')]);
}
export const eclipsedFerrocene = ferrocene('eclipsed ferrocene', 0);
export const staggeredFerrocene = ferrocene('staggered ferrocene', 36);

/**
 * An S6 arrangement (invented): a centre atom and two orbits of S6(z), rotation by 60° followed by
 * z → −z, from the points (1.5, 0.2, 0.6) (C) and (2.4, 0.9, 1.0) (H).
 */
function s6Orbit(p: readonly [number, number, number]): [number, number, number][] {
  return [0, 1, 2, 3, 4, 5].map((k) => {
    const angle = (k * 60 * Math.PI) / 180;
    return [p[0] * Math.cos(angle) - p[1] * Math.sin(angle), p[0] * Math.sin(angle) + p[1] * Math.cos(angle), k % 2 === 0 ? p[2] : -p[2]];
  });
}
export const s6Example = molecule('S6 example', [['C', 0, 0, 0], ...s6Orbit([1.5, 0.2, 0.6]).map((p): Atom => ['C', ...p]), ...s6Orbit([2.4, 0.9, 1.0]).map((p): Atom => ['H', ...p])]);

/**
 * A chiral icosahedral (I) arrangement (invented): a centre atom and the orbit of one generic point
 * under the 60 rotations generated by C5 about (0, 1, φ) and C3 about (1, 1, 1) (the rotation
 * group of the icosahedron with vertices at the cyclic permutations of (0, ±1, ±φ); from memory),
 * built here by closing the two generators under multiplication.
 */
function rotationMatrix(axis: readonly number[], angle: number): number[] {
  const length = Math.hypot(...axis);
  const [x, y, z] = axis.map((c) => c / length) as [number, number, number];
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const t = 1 - c;
  return [c + t * x * x, t * x * y - s * z, t * x * z + s * y, t * x * y + s * z, c + t * y * y, t * y * z - s * x, t * x * z - s * y, t * y * z + s * x, c + t * z * z];
}
function product(a: readonly number[], b: readonly number[]): number[] {
  return [0, 1, 2].flatMap((r) => [0, 1, 2].map((c) => a[3 * r]! * b[c]! + a[3 * r + 1]! * b[3 + c]! + a[3 * r + 2]! * b[6 + c]!));
}
export function icosahedralRotations(): number[][] {
  const generators = [rotationMatrix([0, 1, PHI], (2 * Math.PI) / 5), rotationMatrix([1, 1, 1], (2 * Math.PI) / 3)];
  const key = (m: readonly number[]) => m.map((v) => Math.round(v * 1e5)).join(',');
  const group = new Map<string, number[]>([[key([1, 0, 0, 0, 1, 0, 0, 0, 1]), [1, 0, 0, 0, 1, 0, 0, 0, 1]]]);
  let frontier = [...group.values()];
  while (frontier.length > 0) {
    const next: number[][] = [];
    for (const m of frontier) {
      for (const g of generators) {
        const p = product(g, m);
        if (!group.has(key(p))) {
          group.set(key(p), p);
          next.push(p);
        }
      }
    }
    frontier = next;
  }
  return [...group.values()];
}
export const chiralIcosahedral = molecule('I cluster', [
  ['C', 0, 0, 0],
  ...icosahedralRotations().map((m): Atom => {
    const p = [2.3, 0.7, 0.4];
    return ['H', m[0]! * p[0]! + m[1]! * p[1]! + m[2]! * p[2]!, m[3]! * p[0]! + m[4]! * p[1]! + m[5]! * p[2]!, m[6]! * p[0]! + m[7]! * p[1]! + m[8]! * p[2]!];
  }),
]);
