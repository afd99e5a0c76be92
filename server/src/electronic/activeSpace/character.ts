/**
 * Main atomic character of an orbital: the atom and angular momentum whose basis functions carry
 * the largest Mulliken gross population of the orbital, q_μ = c_μ (S c)_μ (R. S. Mulliken,
 * J. Chem. Phys. 23, 1833 (1955)), summed over the functions of one atom and one l. The shares add
 * up to 1 for a normalised orbital; a share can exceed 1 or be negative in diffuse bases, which is
 * the known weakness of Mulliken's partition — good enough to name an orbital "O p" or "Fe d".
 */
import type { MolecularBasis } from '../contracts';
import type { AtomicCharacter } from './selection';

export const SHELL_LETTERS = 'spdfghik';

export function shellLetter(l: number): string {
  return SHELL_LETTERS[l] ?? `l=${l}`;
}

/** "O p 0.93": the character as text. */
export function characterText(character: AtomicCharacter | null): string {
  return character ? `${character.symbol} ${shellLetter(character.l)} ${character.weight.toFixed(2)}` : '—';
}

/**
 * The main character of each listed column of `coefficients` (N × M, row-major).
 */
export function mainCharacters(basis: MolecularBasis, overlap: Float64Array, coefficients: Float64Array, orbitalCount: number, columns: readonly number[]): (AtomicCharacter | null)[] {
  const N = basis.functionCount;
  const M = orbitalCount;
  let lmax = 0;
  for (let mu = 0; mu < N; mu++) lmax = Math.max(lmax, basis.functionL[mu]!);
  const groups = basis.centers.length * (lmax + 1);
  const shares = new Float64Array(groups);
  const column = new Float64Array(N);
  return columns.map((p) => {
    for (let mu = 0; mu < N; mu++) column[mu] = coefficients[mu * M + p]!;
    shares.fill(0);
    for (let mu = 0; mu < N; mu++) {
      const row = mu * N;
      let sc = 0;
      for (let nu = 0; nu < N; nu++) sc += overlap[row + nu]! * column[nu]!;
      shares[basis.functionCenter[mu]! * (lmax + 1) + basis.functionL[mu]!]! += column[mu]! * sc;
    }
    let best = -1;
    for (let g = 0; g < groups; g++) if (best < 0 || shares[g]! > shares[best]!) best = g;
    if (best < 0) return null;
    const center = Math.floor(best / (lmax + 1));
    return { center, symbol: basis.centers[center]!.symbol, l: best % (lmax + 1), weight: shares[best]! };
  });
}
