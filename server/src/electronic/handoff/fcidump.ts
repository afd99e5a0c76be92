/**
 * Active-space integrals in the integral-dump format of P. J. Knowles, N. C. Handy, Comput. Phys.
 * Commun. 54, 75 (1989): a namelist header, then one integral per line as `value i j k l` with
 * 1-based orbital indices,
 *   (ij|kl) two-electron integrals with i ≥ j, k ≥ l, ij ≥ kl (each symmetry-distinct one once),
 *   h_ij    one-electron integrals as `value i j 0 0` with i ≥ j,
 *   E_core  the core energy as `value 0 0 0 0`, last.
 * Here h is the effective one-body term of the frozen core and E_core the nuclear repulsion plus
 * the frozen-core energy, so that a full CI over the dump gives the CASCI energy.
 *
 * Header fields: NORB (active orbitals), NELEC (active electrons), MS2 (2S_z = Nα − Nβ), ORBSYM
 * (one irrep number per orbital, 1 the totally symmetric one) and ISYM (irrep of the state).
 * Irrep numbers are written as given: the numbering convention of the reader (for example the
 * order of a program's character tables) is the caller's to match; without symmetry every orbital
 * and the state are 1.
 *
 * The writer yields one line at a time (a generator), so a caller can stream a large dump to a
 * file without building it in memory.
 */
import type { ActiveSpaceIntegrals } from '../hamiltonian/activeSpace';
import { pairIndex, pairPairIndex } from '../hamiltonian/pairs';

export interface FcidumpOptions {
  /** Irrep number (1-based) of each active orbital; default all 1. */
  readonly orbitalSymmetries?: readonly number[];
  /** Irrep number of the state; default 1. */
  readonly stateSymmetry?: number;
  /** Integrals with |value| ≤ threshold are left out (the format allows it); default 1e-14. */
  readonly threshold?: number;
}

/** `value` as a Fortran-style E edit descriptor with 17 significant digits: ` -1.2345678901234567E+00`. */
export function formatFortranReal(value: number): string {
  const [mantissa, exponent] = value.toExponential(16).split('e') as [string, string];
  const sign = exponent.startsWith('-') ? '-' : '+';
  const digits = exponent.replace(/^[+-]/, '').padStart(2, '0');
  return `${mantissa}E${sign}${digits}`.padStart(24);
}

function line(value: number, i: number, j: number, k: number, l: number): string {
  return `${formatFortranReal(value)} ${String(i).padStart(4)} ${String(j).padStart(4)} ${String(k).padStart(4)} ${String(l).padStart(4)}`;
}

export function* fcidumpLines(integrals: ActiveSpaceIntegrals, options: FcidumpOptions = {}): Generator<string, void, undefined> {
  const n = integrals.orbitals;
  const symmetries = options.orbitalSymmetries ?? new Array<number>(n).fill(1);
  if (symmetries.length !== n) throw new RangeError(`FCIDUMP: ${symmetries.length} orbital symmetries for ${n} orbitals`);
  for (const [k, irrep] of symmetries.entries()) {
    if (!Number.isInteger(irrep) || irrep < 1 || irrep > 8) throw new RangeError(`FCIDUMP: orbital ${k + 1} has irrep number ${irrep}; the format takes 1 to 8`);
  }
  const stateSymmetry = options.stateSymmetry ?? 1;
  const threshold = options.threshold ?? 1e-14;
  const { alpha, beta } = integrals.electrons;
  yield `&FCI NORB=${n},NELEC=${alpha + beta},MS2=${alpha - beta},`;
  yield `  ORBSYM=${symmetries.join(',')},`;
  yield `  ISYM=${stateSymmetry},`;
  yield '&END';
  const eri = integrals.twoBody;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const ij = pairIndex(i, j);
      for (let k = 0; k <= i; k++) {
        for (let l = 0; l <= k; l++) {
          const kl = pairIndex(k, l);
          if (kl > ij) continue;
          const value = eri[pairPairIndex(ij, kl)]!;
          if (Math.abs(value) > threshold) yield line(value, i + 1, j + 1, k + 1, l + 1);
        }
      }
    }
  }
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const value = integrals.oneBody[i * n + j]!;
      if (Math.abs(value) > threshold) yield line(value, i + 1, j + 1, 0, 0);
    }
  }
  yield line(integrals.constant, 0, 0, 0, 0);
}
