/**
 * Molecular point-group symmetry: detection (detect.ts), the abelian subgroup and its standard
 * frame (abelian.ts), character tables (characterTables.ts), orbital counts per irrep
 * (orbitalIrreps.ts) and symmetrisation (symmetrize.ts).
 */
export { DEFAULT_NEAR_TOLERANCE, DEFAULT_TOLERANCE, detectSymmetry } from './detect';
export type { GroupDescription, GroupGenerator, NearSymmetry, SymmetryFrame, SymmetryOperation, SymmetryOptions, SymmetryResult } from './detect';
export { symmetrize } from './symmetrize';
export { ABELIAN_GROUPS, CHARACTER_TABLES, characterTable, findIrrep, irrepByLabel, irrepByMask, irrepProduct, OPERATION_SIGNS } from './characterTables';
export type { AbelianGroupName, CharacterTable, Irrep, OperationName } from './characterTables';
export { fragmentOrbitalIrreps, orbitalIrreps, rotationCharacter, shellCharacter, sphericalShellCharacter } from './orbitalIrreps';
export type { FragmentIrreps, IrrepCount, IrrepSymmetry, OrbitalIrreps } from './orbitalIrreps';
export { groupName, groupOrder } from './pointGroups';
export { embeddedOrbitalSymmetry, orbitalSymmetry, type OrbitalSymmetry, type SymmetryAtoms } from './orbitalSymmetry';
export type { GroupFamily, PointGroupId } from './pointGroups';
