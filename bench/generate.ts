/**
 * Generated benchmark specs (invented data, made here):
 *
 * - a water box: molecules on a jittered cubic lattice at about liquid density (0.1 atoms/Å³);
 * - an organic-like geometry: saturated hydrocarbon chains (CH2 units, CH3 ends) grown as random
 *   walks with tetrahedral angles, C–C 1.54 Å and C–H 1.09 Å (common textbook bond lengths, from
 *   memory), kept 2.5 Å from every atom they are not bonded to, at about 0.02 atoms/Å³ — bonded
 *   like a biomolecule or a polymer, and as sparse as a solvated one.
 *
 * In both the first molecule is a quantum-tier fragment `probe` and the rest one mean-field
 * fragment `bulk`; the first molecule's atoms carry labels.
 */

export type GeometryKind = 'water' | 'organic';

export interface GeneratedSpec {
  readonly kind: GeometryKind;
  readonly text: string;
  /** The same coordinates as JSON: [["O", x, y, z], ...]. */
  readonly json: string;
  readonly atoms: number;
}

function random(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state * 1664525 + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

type Atom = [string, number, number, number];

function specText(name: string, comment: string, atoms: readonly Atom[], probeAtoms: number, probe: string): GeneratedSpec['text'] {
  const lines = atoms.map(([symbol, x, y, z], i) => {
    const label = i < probeAtoms ? ` ${symbol.toLowerCase()}${i + 1}` : '';
    return `  ${symbol}${label} ${x.toFixed(4)} ${y.toFixed(4)} ${z.toFixed(4)}`;
  });
  return [
    `# Generated benchmark spec (invented data): ${comment}.`,
    `spec "${name}"`,
    'basis sto-3g',
    'structure {',
    ...lines,
    '}',
    'fragment probe {',
    `  atoms #1..#${probeAtoms}`,
    `  tier quantum { method vqe; ansatz uccsd; mapping jordan-wigner; active ${probe} }`,
    '}',
    'fragment bulk {',
    '  atoms rest',
    '  tier mean-field { method rhf }',
    '}',
    'limits { qubits 24 }',
    '',
  ].join('\n');
}

function rounded(atoms: readonly Atom[]): string {
  return JSON.stringify(atoms.map(([symbol, x, y, z]) => [symbol, Number(x.toFixed(4)), Number(y.toFixed(4)), Number(z.toFixed(4))]));
}

export function waterBoxSpec(atomTarget: number, seed = 7): GeneratedSpec {
  const molecules = Math.max(1, Math.round(atomTarget / 3));
  const side = Math.ceil(Math.cbrt(molecules));
  const spacing = 3.1; // Å between molecule centres: about 0.1 atoms per Å³
  const next = random(seed);
  const atoms: Atom[] = [];
  for (let m = 0; m < molecules; m++) {
    const cx = (m % side) * spacing + (next() - 0.5) * 0.3;
    const cy = (Math.floor(m / side) % side) * spacing + (next() - 0.5) * 0.3;
    const cz = Math.floor(m / (side * side)) * spacing + (next() - 0.5) * 0.3;
    // The water of the samples (Hoy & Bunker 1979 in tests/fixtures/water.ts), O at the centre.
    atoms.push(['O', cx, cy, cz], ['H', cx, cy + 0.75695, cz + 0.585882], ['H', cx, cy - 0.75695, cz + 0.585882]);
  }
  return { kind: 'water', text: specText('water-box', 'a box of water molecules', atoms, 3, '4e 4o'), json: rounded(atoms), atoms: atoms.length };
}

/** Carbons per chain: C20H42, 62 atoms. */
const CHAIN_CARBONS = 20;
const CC = 1.54;
const CH = 1.09;
const TETRAHEDRAL = (109.5 * Math.PI) / 180;
/** Closest approach of a new carbon to atoms it is not bonded to, Å (keeps hydrogens of neighbouring chains over 1.3 Å apart). */
const CLEARANCE = 3.5;

type Vec = [number, number, number];
const add = (a: Vec, b: Vec, s = 1): Vec => [a[0] + s * b[0], a[1] + s * b[1], a[2] + s * b[2]];
const cross = (a: Vec, b: Vec): Vec => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: Vec): Vec => {
  const n = Math.hypot(a[0], a[1], a[2]) || 1;
  return [a[0] / n, a[1] / n, a[2] / n];
};

/** A unit vector at the tetrahedral angle to `back`, turned by `phi` about it. */
function tetrahedralFrom(back: Vec, phi: number): Vec {
  const b = unit(back);
  const helper: Vec = Math.abs(b[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const u = unit(cross(b, helper));
  const v = cross(b, u);
  const c = Math.cos(Math.PI - TETRAHEDRAL);
  const s = Math.sin(Math.PI - TETRAHEDRAL);
  return unit(add(add([-b[0] * c, -b[1] * c, -b[2] * c], u, s * Math.cos(phi)), v, s * Math.sin(phi)));
}

/** Chains stick out of their lattice cell; a tighter lattice brings the whole geometry to about 0.02 atoms/Å³. */
const SPACING_FACTOR = 0.7;

/** Hash grid of placed atoms, to keep unbonded atoms apart. */
class Grid {
  private readonly cells = new Map<string, Vec[]>();
  private cell(p: Vec, axis: number): number {
    return Math.floor(p[axis]! / CLEARANCE);
  }
  add(p: Vec): void {
    const key = `${this.cell(p, 0)},${this.cell(p, 1)},${this.cell(p, 2)}`;
    const list = this.cells.get(key);
    if (list) list.push(p);
    else this.cells.set(key, [p]);
  }
  clear(p: Vec): boolean {
    const [i, j, k] = [this.cell(p, 0), this.cell(p, 1), this.cell(p, 2)];
    for (let a = -1; a <= 1; a++)
      for (let b = -1; b <= 1; b++)
        for (let c = -1; c <= 1; c++) {
          for (const q of this.cells.get(`${i + a},${j + b},${k + c}`) ?? []) {
            if (Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) < CLEARANCE) return false;
          }
        }
    return true;
  }
}

/** Hydrogens of a carbon with the given carbon neighbours (sp3: CH4, CH3 or CH2). */
function hydrogensOf(carbon: Vec, neighbours: readonly Vec[]): Vec[] {
  if (neighbours.length === 0) {
    const t = 1 / Math.sqrt(3);
    return ([[t, t, t], [t, -t, -t], [-t, t, -t], [-t, -t, t]] as Vec[]).map((d) => add(carbon, d, CH));
  }
  if (neighbours.length === 1) {
    const back = add(neighbours[0]!, carbon, -1);
    return [0, 1, 2].map((k) => add(carbon, tetrahedralFrom(back, (2 * Math.PI * k) / 3), CH));
  }
  const a = unit(add(carbon, neighbours[0]!, -1));
  const b = unit(add(carbon, neighbours[1]!, -1));
  const bisector = unit(add(a, b));
  const normal = unit(cross(a, b));
  const half = TETRAHEDRAL / 2;
  return [1, -1].map((sign) => add(carbon, unit(add([bisector[0] * Math.cos(half), bisector[1] * Math.cos(half), bisector[2] * Math.cos(half)], normal, sign * Math.sin(half))), CH));
}

export function organicSpec(atomTarget: number, seed = 11): GeneratedSpec {
  const perChain = 3 * CHAIN_CARBONS + 2;
  // Chains the walk cuts short leave fewer atoms: the lattice has spare slots, and chains are
  // added until the target is reached.
  const side = Math.ceil(Math.cbrt((1.5 * atomTarget) / perChain));
  // Lattice spacing of the chains' first carbons for about 0.02 atoms per Å³.
  const spacing = SPACING_FACTOR * Math.cbrt(perChain / 0.02);
  const next = random(seed);
  const grid = new Grid();
  const atoms: Atom[] = [];
  let firstChain = 0;
  for (let m = 0; m < side ** 3 && atoms.length < atomTarget; m++) {
    const corner: Vec = [(m % side) * spacing, (Math.floor(m / side) % side) * spacing, Math.floor(m / (side * side)) * spacing];
    let start: Vec | undefined;
    for (let attempt = 0; attempt < 50 && !start; attempt++) {
      const p = add(corner, [next() - 0.5, next() - 0.5, next() - 0.5], spacing);
      if (grid.clear(p)) start = p;
    }
    if (!start) continue;
    const carbons: Vec[] = [start];
    let direction = unit([next() - 0.5, next() - 0.5, next() - 0.5]);
    for (let c = 1; c < CHAIN_CARBONS; c++) {
      const previous = carbons[c - 1]!;
      let placed: Vec | undefined;
      for (let attempt = 0; attempt < 60 && !placed; attempt++) {
        const step = c === 1 ? unit([next() - 0.5, next() - 0.5, next() - 0.5]) : tetrahedralFrom([-direction[0], -direction[1], -direction[2]], 2 * Math.PI * next());
        const p = add(previous, step, CC);
        // The chain's own last two carbons are bonded or 1–3 neighbours; everything else keeps clear.
        const own = carbons.slice(0, Math.max(0, c - 2));
        if (grid.clear(p) && own.every((q) => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) >= CLEARANCE)) {
          placed = p;
          direction = step;
        }
      }
      if (!placed) break;
      carbons.push(placed);
    }
    const hydrogens = carbons.flatMap((carbon, c) => hydrogensOf(carbon, [carbons[c - 1], carbons[c + 1]].filter((p): p is Vec => p !== undefined)));
    for (const p of [...carbons, ...hydrogens]) grid.add(p);
    for (const p of carbons) atoms.push(['C', ...p]);
    for (const p of hydrogens) atoms.push(['H', ...p]);
    if (m === 0) firstChain = atoms.length;
  }
  const text = specText('organic-chains', 'saturated hydrocarbon chains, bonded, at about 0.02 atoms per cubic ångström', atoms, firstChain, '6e 6o');
  return { kind: 'organic', text, json: rounded(atoms), atoms: atoms.length };
}

export function generatedSpec(kind: GeometryKind, atoms: number): GeneratedSpec {
  return kind === 'water' ? waterBoxSpec(atoms) : organicSpec(atoms);
}
