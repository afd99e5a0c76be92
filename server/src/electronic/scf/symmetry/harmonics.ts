/**
 * How the functions of one shell transform under a rotation or reflection R (an orthogonal 3×3
 * matrix): (O_R φ_μ)(r) = φ_μ(R⁻¹ r) = Σ_ν φ_ν(r) D[ν][μ], with the image function centred on the
 * image of the atom. Function order and normalisation are those of contracts.ts (p: x, y, z;
 * cartesian l ≥ 2 in lexicographic order, unit norm; spherical l ≥ 2 the real solid harmonics
 * m = −l … l, unit norm).
 *
 * - Cartesian monomials: x^a y^b z^c at Rᵀr expands into monomials of the same degree (a product
 *   of linear forms); unit-norm functions carry n_abc ∝ 1/√((2a−1)!!(2b−1)!!(2c−1)!!), so
 *   D[ν][μ] = D_monomial[ν][μ]·n_μ/n_ν.
 * - Real solid harmonics S_lm = Σ C_abc x^a y^b z^c with the coefficients of T. Helgaker,
 *   P. Jørgensen, J. Olsen, Molecular Electronic-Structure Theory, Wiley 2000, eq. 6.4.47–6.4.50
 *   (equation numbers from memory; the same closed form as H. B. Schlegel, M. J. Frisch, Int. J.
 *   Quantum Chem. 54, 83 (1995)), each column normalised in the angular metric
 *   ⟨x^a y^b z^c | x^a' y^b' z^c'⟩ ∝ (a+a'−1)!!(b+b'−1)!!(c+c'−1)!! (zero when a sum is odd).
 *   The rotated harmonic is harmonic of the same degree, so D = Cᵀ G D_monomial C (C orthonormal
 *   in G).
 * The conventions are checked in the tests by the invariance UᵀSU = S of overlap matrices from an
 * independent program for molecules in general orientation (up to g functions).
 */

/** Exponents (a, b, c) of the cartesian functions of degree l, in the order of contracts.ts. */
export function cartesianExponents(l: number): [number, number, number][] {
  const out: [number, number, number][] = [];
  for (let a = l; a >= 0; a--) for (let b = l - a; b >= 0; b--) out.push([a, b, l - a - b]);
  return out;
}

function doubleFactorial(n: number): number {
  let result = 1;
  for (let k = n; k > 1; k -= 2) result *= k;
  return result;
}

function binomial(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  let result = 1;
  for (let i = 1; i <= k; i++) result = (result * (n - k + i)) / i;
  return result;
}

function cartesianIndex(l: number): Map<string, number> {
  const map = new Map<string, number>();
  cartesianExponents(l).forEach(([a, b, c], index) => map.set(`${a},${b},${c}`, index));
  return map;
}

/** Angular metric G between monomials of degree l (common radial factor dropped). */
function monomialMetric(l: number): Float64Array {
  const exps = cartesianExponents(l);
  const k = exps.length;
  const g = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    for (let j = 0; j < k; j++) {
      const [a, b, c] = exps[i]!;
      const [d, e, f] = exps[j]!;
      if ((a + d) % 2 || (b + e) % 2 || (c + f) % 2) continue;
      g[i * k + j] = doubleFactorial(a + d - 1) * doubleFactorial(b + e - 1) * doubleFactorial(c + f - 1);
    }
  }
  return g;
}

/**
 * Coefficients (cartesian monomial × m) of the unit-norm real solid harmonics of degree l,
 * m = −l … l, as a k×(2l+1) row-major matrix.
 */
export function solidHarmonicCoefficients(l: number): Float64Array {
  const exps = cartesianExponents(l);
  const index = cartesianIndex(l);
  const k = exps.length;
  const width = 2 * l + 1;
  const c = new Float64Array(k * width);
  for (let m = -l; m <= l; m++) {
    const am = Math.abs(m);
    const vm = m < 0 ? 0.5 : 0;
    const column = m + l;
    for (let t = 0; t <= Math.floor((l - am) / 2); t++) {
      for (let u = 0; u <= t; u++) {
        // v runs over vm, vm + 1, …, floor(|m|/2 − vm) + vm.
        for (let v2 = 2 * vm; v2 <= 2 * (Math.floor(am / 2 - vm) + vm); v2 += 2) {
          const v = v2 / 2;
          const coefficient = (-1) ** (t + v - vm) * 0.25 ** t * binomial(l, t) * binomial(l - t, am + t) * binomial(t, u) * binomial(am, 2 * v);
          const a = 2 * t + am - 2 * (u + v);
          const b = 2 * (u + v);
          const cz = l - 2 * t - am;
          c[index.get(`${a},${b},${cz}`)! * width + column]! += coefficient;
        }
      }
    }
  }
  // Normalise each column in the angular metric (the closed-form N_lm would do the same; the
  // explicit norm also fixes any rounding).
  const g = monomialMetric(l);
  for (let col = 0; col < width; col++) {
    let norm = 0;
    for (let i = 0; i < k; i++) for (let j = 0; j < k; j++) norm += c[i * width + col]! * g[i * k + j]! * c[j * width + col]!;
    const scale = 1 / Math.sqrt(norm);
    for (let i = 0; i < k; i++) c[i * width + col]! *= scale;
  }
  return c;
}

/** D_monomial for degree l: (monomial μ)(Rᵀ r) = Σ_ν D[ν][μ] (monomial ν)(r); R row-major 3×3. */
function monomialTransform(l: number, r: ArrayLike<number>): Float64Array {
  const exps = cartesianExponents(l);
  const k = exps.length;
  const d = new Float64Array(k * k);
  const maps: Map<string, number>[] = [];
  for (let degree = 0; degree <= l; degree++) maps.push(cartesianIndex(degree));
  exps.forEach(([a, b, c], mu) => {
    // Multiply linear forms u_x^a u_y^b u_z^c, u_q = Σ_j R[j][q] r_j.
    let poly = new Map<string, number>([['0,0,0', 1]]);
    const factors: number[] = [...Array<number>(a).fill(0), ...Array<number>(b).fill(1), ...Array<number>(c).fill(2)];
    for (const q of factors) {
      const next = new Map<string, number>();
      for (const [key, value] of poly) {
        const [p0, p1, p2] = key.split(',').map(Number) as [number, number, number];
        for (let j = 0; j < 3; j++) {
          const weight = r[j * 3 + q]!;
          if (weight === 0) continue;
          const e = [p0, p1, p2];
          e[j]!++;
          const nextKey = e.join(',');
          next.set(nextKey, (next.get(nextKey) ?? 0) + value * weight);
        }
      }
      poly = next;
    }
    for (const [key, value] of poly) d[maps[l]!.get(key)! * k + mu] = value;
  });
  return d;
}

/** The matrix D (size×size, row-major, D[ν][μ]) of one shell under the orthogonal matrix R. */
export function shellTransform(l: number, spherical: boolean, r: ArrayLike<number>): Float64Array {
  const monomial = monomialTransform(l, r);
  const exps = cartesianExponents(l);
  const k = exps.length;
  if (!spherical || l < 2) {
    const norms = exps.map(([a, b, c]) => 1 / Math.sqrt(doubleFactorial(2 * a - 1) * doubleFactorial(2 * b - 1) * doubleFactorial(2 * c - 1)));
    const d = new Float64Array(k * k);
    for (let nu = 0; nu < k; nu++) for (let mu = 0; mu < k; mu++) d[nu * k + mu] = (monomial[nu * k + mu]! * norms[mu]!) / norms[nu]!;
    return d;
  }
  const width = 2 * l + 1;
  const c = solidHarmonicCoefficients(l);
  const g = monomialMetric(l);
  // D = Cᵀ·G·(D_monomial·C).
  const rotated = new Float64Array(k * width);
  for (let i = 0; i < k; i++) for (let m = 0; m < width; m++) {
    let sum = 0;
    for (let j = 0; j < k; j++) sum += monomial[i * k + j]! * c[j * width + m]!;
    rotated[i * width + m] = sum;
  }
  const gr = new Float64Array(k * width);
  for (let i = 0; i < k; i++) for (let m = 0; m < width; m++) {
    let sum = 0;
    for (let j = 0; j < k; j++) sum += g[i * k + j]! * rotated[j * width + m]!;
    gr[i * width + m] = sum;
  }
  const d = new Float64Array(width * width);
  for (let nu = 0; nu < width; nu++) for (let mu = 0; mu < width; mu++) {
    let sum = 0;
    for (let i = 0; i < k; i++) sum += c[i * width + nu]! * gr[i * width + mu]!;
    d[nu * width + mu] = sum;
  }
  return d;
}
