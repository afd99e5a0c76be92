/** Contracted-shell structure of one element in one basis, and the functions it gives. */

export type FunctionType = 'spherical' | 'cartesian';

export const FUNCTION_TYPES: readonly FunctionType[] = ['spherical', 'cartesian'];

export const ANGULAR_LETTERS = 'spdfghik';

/** Number of contracted shells per angular momentum l (index 0 = s, 1 = p, ...). */
export type ShellCounts = readonly number[];

/** Parses the compact notation of contracted shells, for example `3s2p1d`. */
export function parseShellNotation(notation: string): ShellCounts {
  const counts: number[] = [];
  const pattern = /(\d+)([spdfghik])/g;
  let match: RegExpExecArray | null;
  while ((match = pattern.exec(notation)) !== null) {
    const l = ANGULAR_LETTERS.indexOf(match[2]!);
    while (counts.length <= l) counts.push(0);
    counts[l]! += Number(match[1]);
  }
  return counts;
}

export function formatShellNotation(counts: ShellCounts): string {
  return counts
    .map((count, l) => (count > 0 ? `${count}${ANGULAR_LETTERS[l]}` : ''))
    .join('');
}

/** Functions of one shell of angular momentum l: 2l+1 spherical, (l+1)(l+2)/2 cartesian. */
export function functionsPerShell(l: number, type: FunctionType): number {
  return type === 'spherical' ? 2 * l + 1 : ((l + 1) * (l + 2)) / 2;
}

export function functionCount(counts: ShellCounts, type: FunctionType): number {
  let total = 0;
  for (let l = 0; l < counts.length; l++) total += counts[l]! * functionsPerShell(l, type);
  return total;
}
