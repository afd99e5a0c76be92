/** The figures every part has (system and fragments): atoms, electrons, orbitals, qubits, point group. */
import { formatBytes, formatCount } from '../../chemistry/cost/format';
import type { Magnitude } from '../../chemistry/cost/magnitude';
import type { OrbitalSpace } from '../../chemistry/counting';
import { hillFormula } from '../../chemistry/elements';
import type { OrbitalSymmetry } from '../../chemistry/symmetry';
import type { BigFigure, SpaceFigures } from './types';

export function bigFigure(value: Magnitude, bytes = false): BigFigure {
  return { text: bytes ? formatBytes(value) : formatCount(value), exact: value.exact !== undefined ? value.exact.toString() : null, log10: value.log10 };
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
