/**
 * Atomic subshells for planning active spaces before any orbital is computed: which shell "d"
 * means on an atom, and how many electrons the free neutral atom has in a subshell.
 *
 * Occupations follow the aufbau (Madelung n + l, then n) order of the ground configuration; the
 * known exceptions (Cr, Cu, Nb, Mo, Ru, Rh, Pd, Ag, Pt, Au, lanthanides and actinides) are not
 * modelled, so a figure counted from them is a planning estimate (from memory: the textbook
 * Madelung rule, e.g. Atkins, Physical Chemistry, §9).
 *
 * The valence shell of an l, when a spec names l alone, is the highest subshell of that l in a
 * minimal basis for the atom's period P (the period of its outermost s shell): s and p → n = P
 * (p only from P = 2), d → P − 1 (from P = 4), f → P − 2 (from P = 6). This is the naming the
 * active-space projection uses (electronic/activeSpace/atomicProjection.ts).
 */

/** Subshells (n, l) in Madelung order. */
const MADELUNG: readonly (readonly [number, number])[] = (() => {
  const out: [number, number][] = [];
  // Within one n + l, lower n first (2p before 3s, 3d before 4p).
  for (let sum = 1; sum <= 8; sum++) for (let l = Math.min(3, sum - 1); l >= 0; l--) {
    const n = sum - l;
    if (l < n) out.push([n, l]);
  }
  return out;
})();

/** Electrons of the neutral atom in subshell (n, l) by the aufbau order. */
export function aufbauOccupation(z: number, n: number, l: number): number {
  let left = z;
  for (const [sn, sl] of MADELUNG) {
    const capacity = 2 * (2 * sl + 1);
    const here = Math.min(left, capacity);
    if (sn === n && sl === l) return here;
    left -= here;
    if (left <= 0) return 0;
  }
  return 0;
}

/** Period of an element (row of the periodic table). */
export function period(z: number): number {
  const ends = [2, 10, 18, 36, 54, 86, 118];
  const index = ends.findIndex((end) => z <= end);
  return index < 0 ? 7 : index + 1;
}

/** The valence subshell of angular momentum l, or undefined when a minimal basis has none. */
export function valenceShell(z: number, l: number): number | undefined {
  const p = period(z);
  const n = l === 0 ? p : l === 1 ? (p >= 2 ? p : undefined) : l === 2 ? (p >= 4 ? p - 1 : undefined) : l === 3 ? (p >= 6 ? p - 2 : undefined) : undefined;
  return n;
}

/** Valence electrons and orbitals of a neutral atom in a minimal basis (ns np, plus (n−1)d from period 4 and (n−2)f from 6). */
export function minimalValence(z: number): { electrons: number; orbitals: number } {
  let electrons = 0;
  let orbitals = 0;
  for (let l = 0; l <= 3; l++) {
    const n = valenceShell(z, l);
    if (n === undefined) continue;
    orbitals += 2 * l + 1;
    electrons += aufbauOccupation(z, n, l);
  }
  return { electrons, orbitals };
}
