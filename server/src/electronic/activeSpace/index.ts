/** Choosing the active space of a part from its mean field (and its MP2 natural orbitals). */
export { activeIrrepCounts, activeSpinOrbitals, ActiveSelectionError } from './selection';
export type { ActiveOrbital, ActiveSelection, AtomicCharacter, OrbitalKind, SelectionSource } from './selection';
export { canonicalOrbitals } from './reference';
export type { CanonicalOrbitals, RestrictedWavefunction, SelectionReference } from './reference';
export { characterText, mainCharacters, shellLetter } from './character';
export { canonicalWindow, irrepWindow } from './windows';
export type { IrrepCount } from './windows';
export { atomicProjectionSelection, DEFAULT_PROJECTION_THRESHOLD, minimalShells, REFERENCE_MINIMAL_BASIS } from './atomicProjection';
export type { AtomicProjectionOptions, ShellTarget } from './atomicProjection';
export { DEFAULT_OCCUPATION_WINDOW, naturalOccupationSelection } from './naturalOccupations';
export type { NaturalOccupationOptions } from './naturalOccupations';
export { fitToOrbitalLimit } from './fit';
export { DEGENERACY_TOLERANCE, degenerateSplitNote, degenerateSplits } from './degenerate';
export type { DegenerateSplit } from './degenerate';
