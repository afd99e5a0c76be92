/** Embedding from the mean field: the DMET bath of a fragment (bath.ts) in Löwdin or intrinsic atomic orbitals (iao.ts, minimalBasis.ts). */
export { DEFAULT_BATH_THRESHOLD, dmetBath, idempotencyError, lowdinDensity, schmidtBath, spinDensity } from './bath';
export type { DmetBath, DmetBathInput, FragmentOrbitalKind, SpinBath } from './bath';
export { DEFAULT_MINIMAL_BASIS, iaoDensity, intrinsicAtomicOrbitals, symmetricOrthonormalize } from './iao';
export { minimalBasisOverlaps, type MinimalBasisOverlaps } from './minimalBasis';
