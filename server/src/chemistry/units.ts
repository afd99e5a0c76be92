/** Length units and the conversion between them. */

/** Bohr radius in ångström, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). */
export const BOHR_IN_ANGSTROM = 0.529177210903;

export type LengthUnit = 'angstrom' | 'bohr';

export const LENGTH_UNITS: readonly LengthUnit[] = ['angstrom', 'bohr'];

export function toAngstrom(value: number, unit: LengthUnit): number {
  return unit === 'bohr' ? value * BOHR_IN_ANGSTROM : value;
}

export function fromAngstrom(value: number, unit: LengthUnit): number {
  return unit === 'bohr' ? value / BOHR_IN_ANGSTROM : value;
}

/** Memory sizes: binary multiples (IEC 80000-13) and decimal ones. */
/** Units of a computing rate: floating-point operations per second with SI prefixes (lower case accepted). */
export const RATE_UNITS: Readonly<Record<string, number>> = {
  flops: 1,
  kflops: 1e3,
  mflops: 1e6,
  gflops: 1e9,
  tflops: 1e12,
  pflops: 1e15,
};

export const MEMORY_UNITS: Readonly<Record<string, number>> = {
  B: 1,
  KiB: 1024,
  MiB: 1024 ** 2,
  GiB: 1024 ** 3,
  TiB: 1024 ** 4,
  PiB: 1024 ** 5,
  kB: 1e3,
  KB: 1e3,
  MB: 1e6,
  GB: 1e9,
  TB: 1e12,
  PB: 1e15,
};
