/** Measurement budgets and fault-tolerant costs of an active-space qubit Hamiltonian. */
export { activeSpaceFigures, figuresAtAccuracy, SPIN_ORBITAL_ORDER, type ActiveSpaceFigures, type ActiveSpaceTooLargeFigures, type FigureOptions, type MappingFigures } from './figures';
export { QUBITIZATION_FORMULA, QUBITIZATION_REFERENCES, qubitizedPhaseEstimation, type QubitizationEstimate, type QubitizationInput } from './qubitization';
export { encodedReference, referenceOccupation } from './referenceState';
export {
  accuracyInHartree,
  budgetAtAccuracy,
  CHEMICAL_ACCURACY,
  ENERGY_UNITS_IN_HARTREE,
  groupedShots,
  groupVariances,
  measurementBudget,
  separateMeasurementBound,
  SHOT_CONVENTION,
  vqeRun,
  type AccuracyUnit,
  type MeasurementBudget,
  type VqeRun,
  type VqeRunInput,
} from './shots';
