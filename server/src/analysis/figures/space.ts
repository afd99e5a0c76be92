/** The figures every part has (system and fragments): atoms, electrons, orbitals, qubits, point group. */
import { formatBytes, formatCount } from '../../chemistry/cost/format';
import { estimatedMagnitude, exactMagnitude, type Magnitude } from '../../chemistry/cost/magnitude';
import type { OrbitalSpace } from '../../chemistry/counting';
import { hillFormula } from '../../chemistry/elements';
import type { OrbitalSymmetry } from '../../chemistry/symmetry';
import type { BigFigure, Count, SpaceFigures } from './types';

export function bigFigure(value: Magnitude, bytes = false): BigFigure {
  return { text: bytes ? formatBytes(value) : formatCount(value), exact: value.exact !== undefined ? value.exact.toString() : null, log10: value.log10 };
}

/** An exactly known count: a number up to 2^53, its magnitude with exact digits beyond. */
export function exactCount(value: bigint): Count {
  return value <= BigInt(Number.MAX_SAFE_INTEGER) ? Number(value) : bigFigure(exactMagnitude(value));
}

/** A count computed in doubles: itself while it is a safe integer, beyond 2^53 only its magnitude (an estimate). */
export function approximateCount(value: number): Count {
  return Number.isSafeInteger(value) ? value : bigFigure(estimatedMagnitude(Math.log10(Math.max(1, value))));
}

/** How a count is shown: its digits, or three significant digits beyond 2^53. */
export function countText(count: Count): string {
  return typeof count === 'number' ? String(count) : count.text;
}

/** A count as a double, for sums, comparisons and plots. */
export function countValue(count: Count): number {
  return typeof count === 'number' ? count : count.exact !== null ? Number(count.exact) : 10 ** count.log10;
}

function irrepRecord(symmetry: OrbitalSymmetry | undefined): Record<string, number> | null {
  if (!symmetry) return null;
  return Object.fromEntries(symmetry.orbitals.irreps.map((irrep) => [irrep.label, irrep.count]));
}

export function spaceFigures(space: OrbitalSpace, symbols: readonly string[], symmetry: OrbitalSymmetry | undefined): SpaceFigures {
  return {
    atoms: space.atomCount,
    formula: hillFormula(symbols),
    charge: space.charge,
    multiplicity: space.multiplicity,
    electrons: space.electrons,
    alpha: space.spin?.alpha ?? null,
    beta: space.spin?.beta ?? null,
    ecpCoreElectrons: space.ecpCoreElectrons,
    functions: space.functions,
    basisFunctions: { ...space.basisFunctions },
    atomsWithoutBasis: space.atomsWithoutBasis,
    orbitals: space.orbitals,
    occupied: space.occupied ?? null,
    virtual: space.virtual ?? null,
    frozenCore: { ...space.frozenCore },
    active: {
      electrons: space.active.electrons,
      orbitals: space.active.orbitals,
      alpha: space.active.alpha ?? null,
      beta: space.active.beta ?? null,
      source: space.active.source,
    },
    qubits: { ...space.qubits, tapered: null },
    pointGroup: symmetry?.group ?? null,
    fullPointGroup: symmetry?.symmetry.fullGroup ?? null,
    orbitalsPerIrrep: irrepRecord(symmetry),
    pauliTerms: null,
  };
}
