/**
 * Sizes of the problem each fragment's solver sees under an embedding.
 *
 * DMET (Knizia, Chan, Phys. Rev. Lett. 109, 186404 (2012); Wouters, Jiménez-Hoyos, Sun, Chan,
 * J. Chem. Theory Comput. 12, 2706 (2016)). The mean field of the whole system is one determinant.
 * Its Schmidt decomposition between the fragment's orbitals A (L of them) and the rest E (M − L)
 * pairs each fragment mode that is partly occupied with exactly one environment mode, the bath
 * orbital; these pairs hold one electron of the spin in question. Per spin σ with Nσ occupied
 * orbitals among M:
 *   the fragment's 1-RDM block D_AA has eigenvalues in [0, 1]; those strictly inside give the bath,
 *   those equal to 1 are fragment orbitals that are fully occupied (in A ∩ occ), those equal to 0
 *   are empty (in A ∩ virt). Hence
 *     bath_σ = L − dim(A ∩ occ_σ) − dim(A ∩ virt_σ) ≤ min(L, M − L, Nσ, M − Nσ)
 *   — at most the fragment, at most the environment (the bath lives in E), at most the occupied
 *   orbitals (rank of D_AA), at most the virtual ones (rank of 1 − D_AA). For a determinant in
 *   general position with respect to the fragment (the usual case with localized fragment
 *   orbitals) dim(A ∩ occ_σ) = max(0, L + Nσ − M) and dim(A ∩ virt_σ) = max(0, L − Nσ), and the bound
 *   is reached. We report that generic size, an upper bound: symmetry or exactly unentangled
 *   fragment orbitals, and thresholds on small singular values, can only make the bath smaller.
 *   The impurity (fragment + bath) holds, per spin,
 *     electrons_σ = bath_σ + max(0, L + Nσ − M)
 *   (one per entangled pair plus the fully occupied fragment orbitals); the other occupied orbitals
 *   stay in the environment's core, outside the correlated problem.
 *   Closed shell: bath = min(L, M − L, N, M − N), impurity L + bath orbitals and 2·bath + 2·max(0,
 *   L + N − M) electrons — 2L orbitals and 2L electrons in the common case L ≤ N ≤ M − L.
 *   Open shell: the construction is done for each spin (spin-unrestricted bath). The impurity has
 *   L + bath_α alpha and L + bath_β beta spin orbitals; we also give L + max(bath_α, bath_β) as the
 *   spatial orbitals needed when one spatial basis must hold both spins.
 *
 * Frozen core: L, M and Nσ are counted outside the frozen core. The frozen-core orbitals stay
 * doubly occupied in the mean field and belong neither to a fragment nor to a bath.
 *
 * Projection-based and subtractive embedding solve each fragment in its own orbitals, so their
 * sizes are the fragment's own (see ownOrbitalSizes).
 */
import { type OrbitalSpace } from '../counting';
import { requireWhole } from './inputs';

export interface EmbeddedSizes {
  readonly embedding: 'dmet' | 'projection' | 'subtractive' | 'none';
  readonly fragmentOrbitals: number;
  /** Bath orbitals per spin (0 without DMET). */
  readonly bath: { readonly alpha: number; readonly beta: number };
  /** Spatial orbitals of the problem the solver sees (for DMET: L + the larger bath). */
  readonly orbitals: number;
  /** Spin orbitals: one qubit each under Jordan–Wigner. */
  readonly spinOrbitals: number;
  readonly alpha: number;
  readonly beta: number;
  readonly electrons: number;
  /** One line naming the convention, for hover cards. */
  readonly convention: string;
}

export interface DmetInput {
  /** L: the fragment's orbitals outside its frozen core. */
  readonly fragmentOrbitals: number;
  /** M: the whole system's orbitals outside the frozen core. */
  readonly systemOrbitals: number;
  /** Nα, Nβ: occupied orbitals of each spin in the system's mean field, outside the frozen core. */
  readonly alpha: number;
  readonly beta: number;
}

export function dmetSizes(input: DmetInput): EmbeddedSizes {
  const { fragmentOrbitals: L, systemOrbitals: M, alpha, beta } = input;
  requireWhole('fragment orbitals', L);
  requireWhole('system orbitals', M);
  requireWhole('alpha electrons', alpha);
  requireWhole('beta electrons', beta);
  if (L > M) throw new RangeError(`A fragment of ${L} orbitals does not fit in a system of ${M}.`);
  if (alpha > M || beta > M) throw new RangeError(`${alpha} alpha and ${beta} beta electrons do not fit in ${M} orbitals.`);
  const bathAlpha = bathSize(L, M, alpha);
  const bathBeta = bathSize(L, M, beta);
  const electronsAlpha = bathAlpha + Math.max(0, L + alpha - M);
  const electronsBeta = bathBeta + Math.max(0, L + beta - M);
  const orbitals = L + Math.max(bathAlpha, bathBeta);
  const bathText = bathAlpha === bathBeta ? `${bathAlpha} bath` : `${bathAlpha} α / ${bathBeta} β bath`;
  return {
    embedding: 'dmet',
    fragmentOrbitals: L,
    bath: { alpha: bathAlpha, beta: bathBeta },
    orbitals,
    spinOrbitals: 2 * L + bathAlpha + bathBeta,
    alpha: electronsAlpha,
    beta: electronsBeta,
    electrons: electronsAlpha + electronsBeta,
    convention: `DMET impurity: ${L} fragment + ${bathText} orbitals, ${electronsAlpha + electronsBeta} electrons; bath ≤ min(fragment, environment, occupied, virtual) per spin, from the Schmidt decomposition of the mean field; frozen core outside (Knizia & Chan 2012; Wouters et al. 2016)`,
  };
}

/** bath_σ = min(L, M − L, Nσ, M − Nσ): the generic size, an upper bound. */
export function bathSize(fragmentOrbitals: number, systemOrbitals: number, occupied: number): number {
  return Math.max(0, Math.min(fragmentOrbitals, systemOrbitals - fragmentOrbitals, occupied, systemOrbitals - occupied));
}

/**
 * DMET sizes from the orbital spaces counted for the whole system and for the fragment's atoms
 * (counting.ts): M and Nσ are the system's orbitals and occupations less its frozen core, L the
 * fragment's orbitals less its own frozen core. Any active space chosen for the fragment is not
 * used: DMET builds the bath from the whole fragment. Undefined when the system's spin is invalid.
 */
export function dmetSizesForSpaces(system: OrbitalSpace, fragment: OrbitalSpace): EmbeddedSizes | undefined {
  if (system.occupied === undefined || system.doublyOccupied === undefined) return undefined;
  const frozen = system.frozenCore.orbitals;
  const M = system.orbitals - frozen;
  const L = Math.min(M, Math.max(0, fragment.orbitals - fragment.frozenCore.orbitals));
  return dmetSizes({
    fragmentOrbitals: L,
    systemOrbitals: M,
    alpha: Math.max(0, system.occupied - frozen),
    beta: Math.max(0, system.doublyOccupied - frozen),
  });
}

export interface OwnOrbitals {
  /** Spatial orbitals of the fragment's own problem (its active space when one is chosen). */
  readonly orbitals: number;
  readonly alpha: number;
  readonly beta: number;
}

/**
 * Projection-based embedding (Manby, Stella, Goodpaster, Miller, J. Chem. Theory Comput. 8, 2564
 * (2012)), subtractive (ONIOM-like, Svensson et al., J. Phys. Chem. 100, 19357 (1996)) and no
 * embedding: the fragment is solved in its own orbitals and its own electrons, so the sizes are
 * the fragment's. For projection-based embedding that means the virtual space truncated to the
 * fragment's basis functions (Bennie, Stella, Miller, Manby, J. Chem. Phys. 143, 024105 (2015));
 * without that truncation the fragment's problem keeps the whole system's virtual orbitals.
 * Link atoms that cap cut bonds are not counted.
 */
export function ownOrbitalSizes(embedding: 'projection' | 'subtractive' | 'none', fragment: OwnOrbitals): EmbeddedSizes {
  requireWhole('orbitals', fragment.orbitals);
  requireWhole('alpha electrons', fragment.alpha);
  requireWhole('beta electrons', fragment.beta);
  const text = {
    projection: 'Projection-based embedding: the fragment in its own orbitals (virtual space truncated to its basis functions), the environment frozen (Manby et al. 2012)',
    subtractive: 'Subtractive embedding: the fragment computed alone in its own orbitals, link atoms not counted (Svensson et al. 1996)',
    none: 'No embedding: the fragment in its own orbitals',
  }[embedding];
  return {
    embedding,
    fragmentOrbitals: fragment.orbitals,
    bath: { alpha: 0, beta: 0 },
    orbitals: fragment.orbitals,
    spinOrbitals: 2 * fragment.orbitals,
    alpha: fragment.alpha,
    beta: fragment.beta,
    electrons: fragment.alpha + fragment.beta,
    convention: `${text}: ${fragment.orbitals} orbitals, ${fragment.alpha + fragment.beta} electrons`,
  };
}
