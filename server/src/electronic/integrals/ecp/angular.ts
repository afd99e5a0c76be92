/**
 * Angular factors of the semi-local ECP integrals, computed exactly once per angular momentum.
 *
 * - Real spherical harmonics Y_lm on the unit sphere (∫ Y_lm Y_l'm' dΩ = δ δ), as homogeneous
 *   polynomials of degree l in x̂, ŷ, ẑ: the real solid harmonics of basis/solidHarmonics.ts
 *   (Helgaker, Jørgensen & Olsen, eqs. 6.4.47–6.4.50) rescaled to unit norm on the sphere. Any
 *   orthonormal real set would do: every formula below uses each harmonic twice.
 * - Integrals of monomials over the sphere: ∫ x̂^a ŷ^b ẑ^c dΩ = 4π (a−1)!!(b−1)!!(c−1)!!/(a+b+c+1)!!
 *   for even a, b, c, else 0.
 * - Ω(ijk; λσ; lm) = ∫ x̂^i ŷ^j ẑ^k Y_λσ Y_lm dΩ, the angular integrals of the type-2 (semi-local)
 *   terms in the notation of L. E. McMurchie and E. R. Davidson, J. Comput. Phys. 44, 289 (1981),
 *   and R. Flores-Moreno, R. J. Alvarez-Mendez, A. Vela, A. M. Köster, J. Comput. Chem. 27, 1009
 *   (2006), eq. 12: non-zero only when i+j+k+λ+l is even and |λ − l| ≤ i+j+k.
 */
import { cartesianCount, cartesianCountUpTo, cartesianExponents } from '../../basis/cartesian';
import { sphericalTransform } from '../../basis/solidHarmonics';

function doubleFactorial(n: number): number {
  let value = 1;
  for (let k = n; k > 1; k -= 2) value *= k;
  return value;
}

/** ∫ x̂^a ŷ^b ẑ^c dΩ over the unit sphere. */
export function sphereMonomialIntegral(a: number, b: number, c: number): number {
  if (a % 2 === 1 || b % 2 === 1 || c % 2 === 1) return 0;
  return (4 * Math.PI * doubleFactorial(a - 1) * doubleFactorial(b - 1) * doubleFactorial(c - 1)) / doubleFactorial(a + b + c + 1);
}

const unitHarmonics: Float64Array[] = [];

/**
 * Coefficients of Y_lm (rows m = −l … l) over the monomials of degree l in the cartesian order
 * of basis/cartesian.ts, normalised on the unit sphere.
 */
export function unitSphereHarmonics(l: number): Float64Array {
  const cached = unitHarmonics[l];
  if (cached) return cached;
  const nc = cartesianCount(l);
  const exps = cartesianExponents(l);
  const source = sphericalTransform(l);
  const out = new Float64Array((2 * l + 1) * nc);
  for (let m = 0; m < 2 * l + 1; m++) {
    let norm = 0;
    for (let p = 0; p < nc; p++) {
      const cp = source[m * nc + p]!;
      if (cp === 0) continue;
      for (let q = 0; q < nc; q++) {
        const cq = source[m * nc + q]!;
        if (cq === 0) continue;
        norm += cp * cq * sphereMonomialIntegral(exps[3 * p]! + exps[3 * q]!, exps[3 * p + 1]! + exps[3 * q + 1]!, exps[3 * p + 2]! + exps[3 * q + 2]!);
      }
    }
    const scale = 1 / Math.sqrt(norm);
    for (let p = 0; p < nc; p++) out[m * nc + p] = source[m * nc + p]! * scale;
  }
  unitHarmonics[l] = out;
  return out;
}

/** Y_lm(x̂, ŷ, ẑ) for m = −l … l into out[offset …]; (x̂, ŷ, ẑ) a unit vector. */
export function evaluateHarmonics(l: number, ux: number, uy: number, uz: number, out: Float64Array, offset: number): void {
  const coefficients = unitSphereHarmonics(l);
  const exps = cartesianExponents(l);
  const nc = cartesianCount(l);
  for (let m = 0; m < 2 * l + 1; m++) out[offset + m] = 0;
  for (let p = 0; p < nc; p++) {
    const monomial = ux ** exps[3 * p]! * uy ** exps[3 * p + 1]! * uz ** exps[3 * p + 2]!;
    for (let m = 0; m < 2 * l + 1; m++) out[offset + m]! += coefficients[m * nc + p]! * monomial;
  }
}

/**
 * Ω(ijk; λσ; lm) for one projector momentum l, every monomial x̂^i ŷ^j ẑ^k of degree N ≤ nMax
 * (flat index cartesianCountUpTo(N−1) + cartesianIndex) and λ ≤ nMax + l.
 * Layout: values[((monomial · (λmax+1)² + λ² + σ) · (2l+1)) + m], σ and m counted from 0.
 */
export class ProjectorAngularTable {
  readonly l: number;
  readonly nMax: number;
  readonly lambdaMax: number;
  readonly values: Float64Array;

  constructor(l: number, nMax: number) {
    this.l = l;
    this.nMax = nMax;
    this.lambdaMax = nMax + l;
    const monomials = cartesianCountUpTo(nMax);
    const lambdaBlock = (this.lambdaMax + 1) ** 2;
    const mCount = 2 * l + 1;
    this.values = new Float64Array(monomials * lambdaBlock * mCount);
    const yl = unitSphereHarmonics(l);
    const expsL = cartesianExponents(l);
    const ncL = cartesianCount(l);
    let monomial = 0;
    for (let n = 0; n <= nMax; n++) {
      const expsN = cartesianExponents(n);
      for (let c = 0; c < cartesianCount(n); c++, monomial++) {
        const i = expsN[3 * c]!;
        const j = expsN[3 * c + 1]!;
        const k = expsN[3 * c + 2]!;
        for (let lambda = 0; lambda <= this.lambdaMax; lambda++) {
          if ((n + lambda + l) % 2 === 1 || Math.abs(lambda - l) > n) continue;
          const yLambda = unitSphereHarmonics(lambda);
          const expsLambda = cartesianExponents(lambda);
          const ncLambda = cartesianCount(lambda);
          for (let sigma = 0; sigma < 2 * lambda + 1; sigma++) {
            for (let m = 0; m < mCount; m++) {
              let sum = 0;
              for (let p = 0; p < ncLambda; p++) {
                const cp = yLambda[sigma * ncLambda + p]!;
                if (cp === 0) continue;
                for (let q = 0; q < ncL; q++) {
                  const cq = yl[m * ncL + q]!;
                  if (cq === 0) continue;
                  sum +=
                    cp *
                    cq *
                    sphereMonomialIntegral(i + expsLambda[3 * p]! + expsL[3 * q]!, j + expsLambda[3 * p + 1]! + expsL[3 * q + 1]!, k + expsLambda[3 * p + 2]! + expsL[3 * q + 2]!);
                }
              }
              this.values[((monomial * lambdaBlock + lambda * lambda + sigma) * mCount) + m] = sum;
            }
          }
        }
      }
    }
  }
}

const tables = new Map<string, ProjectorAngularTable>();

/** The cached table for projector momentum l and monomial degrees up to nMax. */
export function projectorAngularTable(l: number, nMax: number): ProjectorAngularTable {
  const key = `${l}:${nMax}`;
  let table = tables.get(key);
  if (!table) {
    table = new ProjectorAngularTable(l, nMax);
    tables.set(key, table);
  }
  return table;
}
