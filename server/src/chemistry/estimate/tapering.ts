/**
 * Qubits removable by Z2 symmetries ("tapering", S. Bravyi, J. M. Gambetta, A. Mezzacapo,
 * K. Temme, arXiv:1701.08213 (2017); point-group symmetries: K. Setia, R. Chen, J. E. Rice,
 * A. Mezzacapo, M. Pistoia, J. D. Whitfield, J. Chem. Theory Comput. 16, 6091 (2020)).
 *
 * Each symmetry is the parity of the occupations of a set of spin orbitals, (−1)^{Σ_{p∈v} n_p}:
 *  • the α-number parity and the β-number parity (H conserves N_α and N_β);
 *  • for each generator g of the point group, the orbitals whose irrep has character −1 under g
 *    (bit g of the mask), both spins. A term a†_p a†_q a_s a_r survives the selection rule only
 *    when Γp ⊕ Γq ⊕ Γr ⊕ Γs = 0, so it moves an even number of electrons in or out of that set and
 *    commutes with its parity (Setia et al. 2020).
 * Under Jordan–Wigner the symmetry is the Z string on v; independent Z strings remove one qubit
 * each (Bravyi et al. 2017), so the qubits removed are the rank over GF(2) of the vectors v on the
 * 2n spin orbitals. Only generators that act non-trivially on the active orbitals are included;
 * the rank takes care of dependent ones (for example a generator under which every orbital is odd
 * gives the total parity, already α ⊕ β).
 *
 * The count is the same for every mapping: Bravyi–Kitaev and parity are invertible linear
 * changes of the occupation basis, which keep the rank. The two-qubit reduction of the parity
 * mapping is exactly the removal of the two number parities, so after it rank − 2 more qubits go
 * and the register ends at 2n − rank qubits, as under Jordan–Wigner or Bravyi–Kitaev.
 *
 * Spin orbitals are in block order: (i, α) = i, (i, β) = n + i.
 */
import type { ElectronCount } from './pauliTerms';

export interface Z2Symmetry {
  /** 'N_alpha parity', 'N_beta parity' or 'generator g'. */
  readonly label: string;
  /** Generator index for point-group symmetries, undefined for the number parities. */
  readonly generator?: number;
  /** Spin orbitals in the parity, one byte per spin orbital (block order). */
  readonly modes: Uint8Array;
  /**
   * Eigenvalue ±1 on the reference determinant (α electrons in orbitals 0..N_α−1, β in
   * 0..N_β−1, register order taken as energy order), when an electron count was given.
   */
  readonly eigenvalue?: 1 | -1;
}

export interface TaperingResult {
  /** 2n. */
  readonly qubits: number;
  /** Rank over GF(2) of the symmetry vectors. */
  readonly removable: number;
  /** 2n − removable, whatever the mapping. */
  readonly tapered: number;
  /** Point-group generators that act non-trivially on the active orbitals (bit indices). */
  readonly generators: readonly number[];
  /** An independent set of `removable` symmetries, in the order tried (α, β, then generators). */
  readonly independent: readonly Z2Symmetry[];
}

/**
 * Tapering for n active orbitals with the given irrep masks (D2h or a subgroup, see
 * integralPattern.ts); `generatorCount` is k, the number of generators of the group (3 for D2h,
 * 0 for C1).
 */
export function taperQubits(irreps: ArrayLike<number>, generatorCount: number, electrons?: ElectronCount): TaperingResult {
  const n = irreps.length;
  const modes = 2 * n;
  if (!Number.isInteger(generatorCount) || generatorCount < 0 || generatorCount > 3) throw new RangeError(`generator count ${generatorCount} is not 0–3 (D2h or a subgroup)`);
  for (let i = 0; i < n; i++) {
    const mask = irreps[i]!;
    if (!Number.isInteger(mask) || mask < 0 || mask >= 2 ** generatorCount) throw new RangeError(`irrep mask ${mask} of orbital ${i} does not fit ${generatorCount} generators`);
  }
  if (n === 0) return { qubits: 0, removable: 0, tapered: 0, generators: [], independent: [] };

  const candidates: { label: string; generator?: number; modes: Uint8Array }[] = [];
  const alpha = new Uint8Array(modes);
  const beta = new Uint8Array(modes);
  for (let i = 0; i < n; i++) {
    alpha[i] = 1;
    beta[n + i] = 1;
  }
  candidates.push({ label: 'N_alpha parity', modes: alpha }, { label: 'N_beta parity', modes: beta });
  const generators: number[] = [];
  for (let g = 0; g < generatorCount; g++) {
    const vector = new Uint8Array(modes);
    let acts = false;
    for (let i = 0; i < n; i++) {
      if ((irreps[i]! >> g) & 1) {
        vector[i] = 1;
        vector[n + i] = 1;
        acts = true;
      }
    }
    if (!acts) continue;
    generators.push(g);
    candidates.push({ label: `generator ${g}`, generator: g, modes: vector });
  }

  // Gaussian elimination over GF(2) on packed 32-bit words.
  const words = Math.ceil(modes / 32);
  const pack = (v: Uint8Array) => {
    const packed = new Uint32Array(words);
    for (let p = 0; p < modes; p++) if (v[p] === 1) packed[p >> 5]! |= 1 << (p & 31);
    return packed;
  };
  const basis: { pivot: number; row: Uint32Array }[] = [];
  const independent: Z2Symmetry[] = [];
  for (const candidate of candidates) {
    const row = pack(candidate.modes);
    for (const { pivot, row: b } of basis) {
      if ((row[pivot >> 5]! >>> (pivot & 31)) & 1) for (let w = 0; w < words; w++) row[w]! ^= b[w]!;
    }
    let pivot = -1;
    for (let p = 0; p < modes && pivot < 0; p++) if ((row[p >> 5]! >>> (p & 31)) & 1) pivot = p;
    if (pivot < 0) continue;
    basis.push({ pivot, row });
    independent.push({ ...candidate, ...(electrons === undefined ? {} : { eigenvalue: eigenvalueOn(candidate.modes, n, electrons) }) });
  }
  return { qubits: modes, removable: basis.length, tapered: modes - basis.length, generators, independent };
}

function eigenvalueOn(modes: Uint8Array, n: number, electrons: ElectronCount): 1 | -1 {
  let occupied = 0;
  for (let i = 0; i < Math.min(n, electrons.alpha); i++) occupied += modes[i]!;
  for (let i = 0; i < Math.min(n, electrons.beta); i++) occupied += modes[n + i]!;
  return occupied % 2 === 0 ? 1 : -1;
}

/**
 * Tapering without point-group symmetry in closed form: for n ≥ 1 active orbitals the α- and
 * β-number parities are two independent Z strings on disjoint halves of the register, so exactly
 * two qubits go (2n − 2); the same result as taperQubits on n orbitals of one irrep with no
 * generators, without building its 2n-long vectors (they are made only if read).
 */
export function taperNumberParities(n: number, electrons?: ElectronCount): TaperingResult {
  if (n <= 0) return { qubits: 0, removable: 0, tapered: 0, generators: [], independent: [] };
  const parity = (label: 'N_alpha parity' | 'N_beta parity', count: number | undefined): Z2Symmetry => {
    const offset = label === 'N_alpha parity' ? 0 : n;
    let modes: Uint8Array | undefined;
    return {
      label,
      get modes(): Uint8Array {
        if (!modes) {
          modes = new Uint8Array(2 * n);
          modes.fill(1, offset, offset + n);
        }
        return modes;
      },
      ...(count === undefined ? {} : { eigenvalue: Math.min(n, count) % 2 === 0 ? (1 as const) : (-1 as const) }),
    };
  };
  return {
    qubits: 2 * n,
    removable: 2,
    tapered: 2 * n - 2,
    generators: [],
    independent: [parity('N_alpha parity', electrons?.alpha), parity('N_beta parity', electrons?.beta)],
  };
}
