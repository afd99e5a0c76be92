/** Embedding from the mean field: the DMET bath of a fragment (bath.ts). */
export { DEFAULT_BATH_THRESHOLD, dmetBath, idempotencyError, lowdinDensity, schmidtBath, spinDensity } from './bath';
export type { DmetBath, DmetBathInput, SpinBath } from './bath';
