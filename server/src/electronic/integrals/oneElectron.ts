/**
 * One-electron integrals over contracted Gaussian shells by the McMurchie–Davidson scheme:
 * L. E. McMurchie and E. R. Davidson, J. Comput. Phys. 26, 218 (1978), in the notation of
 * T. Helgaker, P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory (2000), ch. 9:
 *
 * - Hermite expansion coefficients (eqs. 9.5.6–9.5.7), per cartesian direction,
 *     E^(i+1,j)_t = E^(ij)_(t−1)/(2p) + X_PA E^(ij)_t + (t+1) E^(ij)_(t+1), likewise for j with X_PB,
 *     E^(00)_0 = exp(−μ X_AB²), μ = αβ/p, p = α+β;
 * - overlap S_ij = E^(ij)_0 √(π/p) per direction (eq. 9.5.41);
 * - kinetic energy from −½ ∂²/∂x² acting on the ket (eq. 9.3.11 ff.):
 *     T_ij = −½ [ j(j−1) S_(i,j−2) − 2β(2j+1) S_ij + 4β² S_(i,j+2) ] per direction;
 * - nuclear attraction V = −Σ_C Z_C (2π/p) Σ_tuv E_t E_u E_v R_tuv(p, R_PC) with the Hermite
 *   Coulomb integrals R (eqs. 9.9.18–9.9.20) from the Boys function (boys.ts).
 *
 * Point nuclei with the charge Center.charge (Z less the core electrons of an effective core
 * potential); the potentials themselves are integrated in ecp/ and added by coreHamiltonian.
 */
import type { MolecularBasis, Shell } from '../contracts';
import { cartesianCount, cartesianExponents } from '../basis/cartesian';
import { boys } from './boys';
import { ecpMatrix, type EcpOptions } from './ecp';
import { functionTransform, transformFirstIndex, transformLastIndex } from './transform';

export type OneElectronKind = 'overlap' | 'kinetic' | 'potential';

/** A point charge the electrons are attracted to (bohr, charge in units of e). */
export interface PointCharge {
  readonly charge: number;
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** Scratch space for one shell pair up to momentum lmax each; reused across pairs. */
class OneElectronWorkspace {
  readonly lmax: number;
  /** E coefficients per direction: [(i·(J+1) + j)·(T+1) + t] with J = lmax + 2, T = 2·lmax + 2. */
  readonly ex: Float64Array;
  readonly ey: Float64Array;
  readonly ez: Float64Array;
  readonly jDim: number;
  readonly tDim: number;
  readonly raw: Float64Array;
  readonly half: Float64Array;
  readonly rTable: Float64Array;
  readonly rScratch: Float64Array;
  readonly boysValues = new Float64Array(64);

  constructor(lmax: number) {
    this.lmax = lmax;
    this.jDim = lmax + 3;
    this.tDim = 2 * lmax + 4;
    const size = (lmax + 1) * this.jDim * this.tDim;
    this.ex = new Float64Array(size);
    this.ey = new Float64Array(size);
    this.ez = new Float64Array(size);
    const nc = cartesianCount(lmax);
    this.raw = new Float64Array(nc * nc);
    this.half = new Float64Array(nc * nc);
    const L = 2 * lmax + 1;
    this.rTable = new Float64Array((L + 1) ** 3);
    this.rScratch = new Float64Array((L + 1) * (L + 1) ** 3);
  }
}

/** Fills E^(ij)_t for i ≤ imax, j ≤ jmax of one direction. */
function hermiteCoefficients(e: Float64Array, jDim: number, tDim: number, imax: number, jmax: number, p: number, pa: number, pb: number, e00: number): void {
  const inv2p = 0.5 / p;
  // Clear the blocks that will be read (t up to i+j+1 is read as zero).
  for (let i = 0; i <= imax; i++) for (let j = 0; j <= jmax; j++) e.fill(0, (i * jDim + j) * tDim, (i * jDim + j + 1) * tDim);
  e[0] = e00;
  for (let i = 0; i <= imax; i++) {
    if (i > 0) {
      const dst = i * jDim * tDim;
      const src = (i - 1) * jDim * tDim;
      for (let t = 0; t <= i; t++) {
        e[dst + t] = (t > 0 ? inv2p * e[src + t - 1]! : 0) + pa * e[src + t]! + (t + 1) * e[src + t + 1]!;
      }
    }
    for (let j = 1; j <= jmax; j++) {
      const dst = (i * jDim + j) * tDim;
      const src = dst - tDim;
      for (let t = 0; t <= i + j; t++) {
        e[dst + t] = (t > 0 ? inv2p * e[src + t - 1]! : 0) + pb * e[src + t]! + (t + 1) * e[src + t + 1]!;
      }
    }
  }
}

/**
 * −½ ∂²/∂x² on the ket in one direction: −½ [ j(j−1) S_(i,j−2) − 2β(2j+1) S_ij + 4β² S_(i,j+2) ], with
 * S_(i,j±2) = E^(i,j±2)_0 √(π/p) stored tDim·2 away from E^(ij)_0 at `index`.
 */
function kineticFactor(e: Float64Array, index: number, tDim: number, j: number, beta: number, s: number, s1: number): number {
  const lower = j > 1 ? j * (j - 1) * e[index - 2 * tDim]! * s1 : 0;
  return -0.5 * (lower - 2 * beta * (2 * j + 1) * s + 4 * beta * beta * e[index + 2 * tDim]! * s1);
}

/** Hermite Coulomb integrals R^0_tuv for t+u+v ≤ L into out[(t·(L+1) + u)·(L+1) + v]. */
function hermiteCoulomb(L: number, p: number, x: number, y: number, z: number, w: OneElectronWorkspace): void {
  const dim = L + 1;
  const cube = dim * dim * dim;
  const r = w.rScratch;
  const f = w.boysValues;
  boys(L, p * (x * x + y * y + z * z), f);
  let factor = 1;
  for (let n = 0; n <= L; n++) {
    r[n * cube] = factor * f[n]!;
    factor *= -2 * p;
  }
  // R^n_(t,u,v) from R^(n+1): raise v, then u, then t (Helgaker eqs. 9.9.18–9.9.20).
  for (let total = 1; total <= L; total++) {
    for (let n = 0; n <= L - total; n++) {
      const base = n * cube;
      const up = (n + 1) * cube;
      for (let t = 0; t <= total; t++) {
        for (let u = 0; u <= total - t; u++) {
          const v = total - t - u;
          const idx = (t * dim + u) * dim + v;
          let value: number;
          if (t > 0) {
            value = x * r[up + ((t - 1) * dim + u) * dim + v]!;
            if (t > 1) value += (t - 1) * r[up + ((t - 2) * dim + u) * dim + v]!;
          } else if (u > 0) {
            value = y * r[up + (t * dim + u - 1) * dim + v]!;
            if (u > 1) value += (u - 1) * r[up + (t * dim + u - 2) * dim + v]!;
          } else {
            value = z * r[up + (t * dim + u) * dim + v - 1]!;
            if (v > 1) value += (v - 1) * r[up + (t * dim + u) * dim + v - 2]!;
          }
          r[base + idx] = value;
        }
      }
    }
  }
  for (let k = 0; k < cube; k++) w.rTable[k] = r[k]!;
}

/**
 * Cartesian integrals of one shell pair into w.raw ([cartesians of a][cartesians of b]), every
 * component with the radial normalisation of x^l.
 */
function cartesianPair(kind: OneElectronKind, a: Shell, b: Shell, charges: readonly PointCharge[], w: OneElectronWorkspace): void {
  const la = a.l;
  const lb = b.l;
  const na = cartesianCount(la);
  const nb = cartesianCount(lb);
  const ea = cartesianExponents(la);
  const eb = cartesianExponents(lb);
  const raw = w.raw;
  raw.fill(0, 0, na * nb);
  const abx = a.x - b.x;
  const aby = a.y - b.y;
  const abz = a.z - b.z;
  const ab2 = abx * abx + aby * aby + abz * abz;
  const jExtra = kind === 'kinetic' ? 2 : 0;
  const { ex, ey, ez, jDim, tDim } = w;
  const L = la + lb;
  const dim = L + 1;
  for (let i = 0; i < a.exponents.length; i++) {
    const alpha = a.exponents[i]!;
    for (let j = 0; j < b.exponents.length; j++) {
      const beta = b.exponents[j]!;
      const p = alpha + beta;
      const mu = (alpha * beta) / p;
      const px = (alpha * a.x + beta * b.x) / p;
      const py = (alpha * a.y + beta * b.y) / p;
      const pz = (alpha * a.z + beta * b.z) / p;
      const coef = a.coefficients[i]! * b.coefficients[j]!;
      hermiteCoefficients(ex, jDim, tDim, la, lb + jExtra, p, px - a.x, px - b.x, Math.exp(-mu * ab2));
      hermiteCoefficients(ey, jDim, tDim, la, lb + jExtra, p, py - a.y, py - b.y, 1);
      hermiteCoefficients(ez, jDim, tDim, la, lb + jExtra, p, pz - a.z, pz - b.z, 1);
      if (kind === 'overlap' || kind === 'kinetic') {
        const s1 = Math.sqrt(Math.PI / p);
        for (let ca = 0; ca < na; ca++) {
          const ax = ea[3 * ca]!;
          const ay = ea[3 * ca + 1]!;
          const az = ea[3 * ca + 2]!;
          for (let cb = 0; cb < nb; cb++) {
            const bx = eb[3 * cb]!;
            const by = eb[3 * cb + 1]!;
            const bz = eb[3 * cb + 2]!;
            const ix = (ax * jDim + bx) * tDim;
            const iy = (ay * jDim + by) * tDim;
            const iz = (az * jDim + bz) * tDim;
            const sx = ex[ix]! * s1;
            const sy = ey[iy]! * s1;
            const sz = ez[iz]! * s1;
            let value: number;
            if (kind === 'overlap') {
              value = sx * sy * sz;
            } else {
              const tx = kineticFactor(ex, ix, tDim, bx, beta, sx, s1);
              const ty = kineticFactor(ey, iy, tDim, by, beta, sy, s1);
              const tz = kineticFactor(ez, iz, tDim, bz, beta, sz, s1);
              value = tx * sy * sz + sx * ty * sz + sx * sy * tz;
            }
            raw[ca * nb + cb]! += coef * value;
          }
        }
      } else {
        for (const c of charges) {
          hermiteCoulomb(L, p, px - c.x, py - c.y, pz - c.z, w);
          const scale = (-c.charge * 2 * Math.PI * coef) / p;
          const r = w.rTable;
          for (let ca = 0; ca < na; ca++) {
            const ax = ea[3 * ca]!;
            const ay = ea[3 * ca + 1]!;
            const az = ea[3 * ca + 2]!;
            for (let cb = 0; cb < nb; cb++) {
              const bx = eb[3 * cb]!;
              const by = eb[3 * cb + 1]!;
              const bz = eb[3 * cb + 2]!;
              const exBase = (ax * jDim + bx) * tDim;
              const eyBase = (ay * jDim + by) * tDim;
              const ezBase = (az * jDim + bz) * tDim;
              let sum = 0;
              for (let t = 0; t <= ax + bx; t++) {
                const et = ex[exBase + t]!;
                if (et === 0) continue;
                for (let u = 0; u <= ay + by; u++) {
                  const eu = et * ey[eyBase + u]!;
                  if (eu === 0) continue;
                  const rBase = (t * dim + u) * dim;
                  for (let v = 0; v <= az + bz; v++) sum += eu * ez[ezBase + v]! * r[rBase + v]!;
                }
              }
              raw[ca * nb + cb]! += scale * sum;
            }
          }
        }
      }
    }
  }
}

function maxL(basis: MolecularBasis): number {
  let lmax = 0;
  for (const shell of basis.shells) lmax = Math.max(lmax, shell.l);
  return lmax;
}

function nucleiOf(basis: MolecularBasis): PointCharge[] {
  return basis.centers.map((c) => ({ charge: c.charge, x: c.x, y: c.y, z: c.z }));
}

/** Integrals of one shell pair into out[functions of p][functions of q]; reuses the workspace. */
function pairBlock(kind: OneElectronKind, basis: MolecularBasis, p: number, q: number, charges: readonly PointCharge[], w: OneElectronWorkspace, out: Float64Array): void {
  const a = basis.shells[p]!;
  const b = basis.shells[q]!;
  cartesianPair(kind, a, b, charges, w);
  const ta = functionTransform(a.l, basis.kind);
  const tb = functionTransform(b.l, basis.kind);
  transformFirstIndex(ta, w.raw, tb.cartesians, w.half);
  transformLastIndex(tb, w.half, ta.functions, out);
}

/**
 * One block of a one-electron operator over shells p and q: out[i·size_q + j] for the functions of
 * the two shells. 'potential' is the attraction to the basis's nuclei (point charges Center.charge).
 */
export function oneElectronBlock(kind: OneElectronKind, basis: MolecularBasis, p: number, q: number, out: Float64Array): void {
  const w = new OneElectronWorkspace(maxL(basis));
  pairBlock(kind, basis, p, q, nucleiOf(basis), w, out);
}

/** The full symmetric matrix (functionCount², row-major) of a one-electron operator. */
export function oneElectronMatrix(kind: OneElectronKind, basis: MolecularBasis, charges?: readonly PointCharge[]): Float64Array {
  const n = basis.functionCount;
  const matrix = new Float64Array(n * n);
  const w = new OneElectronWorkspace(maxL(basis));
  const block = new Float64Array(cartesianCount(w.lmax) ** 2);
  const centres = charges ?? nucleiOf(basis);
  const shells = basis.shells;
  for (let p = 0; p < shells.length; p++) {
    const a = shells[p]!;
    for (let q = 0; q <= p; q++) {
      const b = shells[q]!;
      pairBlock(kind, basis, p, q, centres, w, block);
      for (let i = 0; i < a.size; i++) {
        for (let j = 0; j < b.size; j++) {
          const value = block[i * b.size + j]!;
          matrix[(a.offset + i) * n + b.offset + j] = value;
          matrix[(b.offset + j) * n + a.offset + i] = value;
        }
      }
    }
  }
  return matrix;
}

/** Overlap matrix S. */
export function overlapMatrix(basis: MolecularBasis): Float64Array {
  return oneElectronMatrix('overlap', basis);
}

/** Kinetic-energy matrix T. */
export function kineticMatrix(basis: MolecularBasis): Float64Array {
  return oneElectronMatrix('kinetic', basis);
}

/**
 * Nuclear-attraction matrix V of the basis's nuclei, with the charges the electrons feel
 * (Center.charge: Z less the core an effective core potential replaces; the potential itself is
 * not in V but in ecpMatrix, and coreHamiltonian adds both). With `charges`, the attraction to
 * those point charges instead (for embedding).
 */
export function nuclearAttractionMatrix(basis: MolecularBasis, charges?: readonly PointCharge[]): Float64Array {
  return oneElectronMatrix('potential', basis, charges);
}

/**
 * Core Hamiltonian H = T + V + U_ECP (the effective core potentials of the basis, ecp/). Throws
 * UnsupportedEcpError, naming the element, for a potential the ECP integrals cannot handle.
 */
export function coreHamiltonian(basis: MolecularBasis, options: EcpOptions = {}): Float64Array {
  const h = kineticMatrix(basis);
  const v = nuclearAttractionMatrix(basis);
  for (let k = 0; k < h.length; k++) h[k]! += v[k]!;
  if (basis.ecps.length > 0) {
    const u = ecpMatrix(basis, options);
    for (let k = 0; k < h.length; k++) h[k]! += u[k]!;
  }
  return h;
}

/**
 * Nuclear repulsion Σ_(A<B) Z_A Z_B / R_AB with the charges the electrons feel (Center.charge).
 * Throws when two nuclei coincide.
 */
export function nuclearRepulsionEnergy(basis: MolecularBasis): number {
  let energy = 0;
  const c = basis.centers;
  for (let i = 0; i < c.length; i++) {
    for (let j = 0; j < i; j++) {
      const dx = c[i]!.x - c[j]!.x;
      const dy = c[i]!.y - c[j]!.y;
      const dz = c[i]!.z - c[j]!.z;
      const r = Math.sqrt(dx * dx + dy * dy + dz * dz);
      if (r === 0) throw new Error(`Atoms ${j + 1} (${c[j]!.symbol}) and ${i + 1} (${c[i]!.symbol}) are at the same position.`);
      energy += (c[i]!.charge * c[j]!.charge) / r;
    }
  }
  return energy;
}
