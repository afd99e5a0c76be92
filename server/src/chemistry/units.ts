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

/**
 * Hartree per unit of an energy tolerance, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93,
 * 025010 (2021)): 1 Eh = 627.5094740631 kcal/mol = 2625.4996394799 kJ/mol = 27.211386245988 eV.
 */
export const ENERGY_UNITS_IN_HARTREE = {
  Ha: 1,
  mHa: 1e-3,
  'kcal/mol': 1 / 627.5094740631,
  'kJ/mol': 1 / 2625.4996394799,
  eV: 1 / 27.211386245988,
} as const;

export type EnergyUnit = keyof typeof ENERGY_UNITS_IN_HARTREE;

/** Chemical accuracy, 1.6 mHa (common practice: 1 kcal/mol ≈ 1.594 mHa), the default target accuracy. */
export const CHEMICAL_ACCURACY_HARTREE = 1.6e-3;
