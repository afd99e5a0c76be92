/**
 * Bravyi–Kitaev and parity strings from Jordan–Wigner strings.
 *
 * Jordan–Wigner, parity and Bravyi–Kitaev all represent the occupation vector f of the modes by a
 * qubit basis state b = β f (mod 2) with an invertible binary matrix β, and represent the same
 * fermionic operators on it (J. T. Seeley, M. J. Richard, P. J. Love, J. Chem. Phys. 137, 224109
 * (2012)). So the mapped operator is U O_JW U† with U|f⟩ = |βf⟩, and for a string
 *   U X^x Z^z U† = X^(βx) Z^(β⁻ᵀz)
 * (U permutes the computational basis; no phase appears). In the Hermitian form of pauli.ts the
 * coefficient picks up i^(|x∧z| − |x′∧z′|), which is ±1 because x·z = x′·z′ (mod 2).
 *
 * Encoding matrices over the modes 0 … m−1 (qubit q's row lists the modes whose parity it holds):
 *  • Jordan–Wigner: identity.
 *  • parity: qubit q holds f_0 ⊕ … ⊕ f_q (Seeley et al. 2012, §III).
 *  • Bravyi–Kitaev: qubit q holds the modes of its Fenwick-tree block, q − 2^t + 1 … q, where 2^t is
 *    the lowest set bit of q + 1 (S. Bravyi, A. Kitaev, Ann. Phys. 298, 210 (2002); the matrix β_m
 *    of Seeley et al. 2012, Eq. (22), read with qubit 0 first; for m not a power of two, the leading
 *    m × m block of the next power, as in V. Havlíček et al., Phys. Rev. A 95, 032332 (2017)).
 *
 * The parity mapping's two-qubit reduction (S. Bravyi, J. M. Gambetta, A. Mezzacapo, K. Temme,
 * arXiv:1701.08213 (2017)): in block spin-orbital order, qubit n−1 holds N_α mod 2 and qubit 2n−1
 * holds N mod 2. The Hamiltonian conserves both, so every string has I or Z on those qubits; each
 * Z is replaced by its eigenvalue in the sector of the electron count and the two qubits are
 * removed (qubits above n−1 move down by one).
 */
import type { Mapping } from '../../chemistry/qubits';
import type { ElectronCount } from './activeSpace';
import { parity, popcount, type PauliSum } from './pauli';
import { PauliAccumulator } from './pauliTable';

/** Rows of a binary m × m matrix as bit masks: bit c of row r is entry (r, c). */
export type BinaryMatrix = Uint32Array;

export function encodingMatrix(mapping: Mapping, modes: number): BinaryMatrix {
  const rows = new Uint32Array(modes);
  for (let q = 0; q < modes; q++) {
    if (mapping === 'jordan-wigner') {
      rows[q] = (1 << q) >>> 0;
    } else if (mapping === 'parity') {
      rows[q] = q === 31 ? 0xffffffff : ((1 << (q + 1)) >>> 0) - 1;
    } else {
      const block = (q + 1) & -(q + 1);
      let row = 0;
      for (let m = q - block + 1; m <= q; m++) row |= 1 << m;
      rows[q] = row >>> 0;
    }
  }
  return rows;
}

/** β v over GF(2). */
export function applyBinary(matrix: BinaryMatrix, vector: number): number {
  let out = 0;
  for (let r = 0; r < matrix.length; r++) if (parity(matrix[r]! & vector)) out |= 1 << r;
  return out >>> 0;
}

/** Inverse over GF(2) by Gauss–Jordan elimination; throws for a singular matrix. */
export function inverseBinary(matrix: BinaryMatrix): BinaryMatrix {
  const m = matrix.length;
  const a = Uint32Array.from(matrix);
  const inverse = new Uint32Array(m);
  for (let r = 0; r < m; r++) inverse[r] = (1 << r) >>> 0;
  for (let col = 0; col < m; col++) {
    let pivot = col;
    while (pivot < m && ((a[pivot]! >>> col) & 1) === 0) pivot++;
    if (pivot === m) throw new RangeError('the encoding matrix is singular');
    [a[col], a[pivot]] = [a[pivot]!, a[col]!];
    [inverse[col], inverse[pivot]] = [inverse[pivot]!, inverse[col]!];
    for (let r = 0; r < m; r++) {
      if (r !== col && ((a[r]! >>> col) & 1) === 1) {
        a[r] = (a[r]! ^ a[col]!) >>> 0;
        inverse[r] = (inverse[r]! ^ inverse[col]!) >>> 0;
      }
    }
  }
  return inverse;
}

export function transposeBinary(matrix: BinaryMatrix): BinaryMatrix {
  const m = matrix.length;
  const out = new Uint32Array(m);
  for (let r = 0; r < m; r++) for (let c = 0; c < m; c++) if ((matrix[r]! >>> c) & 1) out[c] = (out[c]! | (1 << r)) >>> 0;
  return out;
}

/** Columns of a binary matrix as bit masks (column c lists the rows with a 1). */
function columnsOf(matrix: BinaryMatrix): Uint32Array {
  return transposeBinary(matrix);
}

/** M v as the XOR of the columns of M at the set bits of v (fast when v has few bits). */
function applyColumns(columns: Uint32Array, vector: number): number {
  let out = 0;
  let v = vector >>> 0;
  while (v !== 0) {
    const low = v & -v;
    out ^= columns[31 - Math.clz32(low)]!;
    v = (v ^ low) >>> 0;
  }
  return out >>> 0;
}

/**
 * The Jordan–Wigner strings re-expressed under another encoding of the same modes. The magnitudes
 * of the coefficients do not change, so the strings keep the input's order (|c| descending; ties
 * in the order of the Jordan–Wigner strings).
 */
export function reencode(jordanWigner: PauliSum, mapping: Mapping): PauliSum {
  if (mapping === 'jordan-wigner') return jordanWigner;
  const modes = jordanWigner.qubits;
  const beta = encodingMatrix(mapping, modes);
  const xColumns = columnsOf(beta);
  const zColumns = columnsOf(transposeBinary(inverseBinary(beta)));
  const length = jordanWigner.length;
  const x = new Uint32Array(length);
  const z = new Uint32Array(length);
  const coefficients = new Float64Array(length);
  for (let k = 0; k < length; k++) {
    const x0 = jordanWigner.x[k]!;
    const z0 = jordanWigner.z[k]!;
    const x1 = applyColumns(xColumns, x0);
    const z1 = applyColumns(zColumns, z0);
    const exponent = popcount(x0 & z0) - popcount(x1 & z1);
    x[k] = x1;
    z[k] = z1;
    coefficients[k] = ((exponent & 3) === 0 ? 1 : -1) * jordanWigner.coefficients[k]!;
  }
  return { qubits: modes, length, x, z, coefficients };
}

/**
 * The parity mapping's two-qubit reduction of parity-encoded strings on 2n qubits (block order) in
 * the sector of `electrons`; strings that become equal are merged and those with |c| ≤ threshold
 * dropped.
 */
export function taperParity(paritySum: PauliSum, orbitals: number, electrons: ElectronCount, threshold: number): PauliSum {
  const n = orbitals;
  if (paritySum.qubits !== 2 * n) throw new RangeError(`parity strings on ${paritySum.qubits} qubits for ${n} orbitals`);
  const alphaQubit = n - 1;
  const totalQubit = 2 * n - 1;
  const alphaSign = electrons.alpha % 2 === 0 ? 1 : -1;
  const totalSign = (electrons.alpha + electrons.beta) % 2 === 0 ? 1 : -1;
  const lowMask = alphaQubit === 0 ? 0 : ((1 << alphaQubit) >>> 0) - 1;
  const highMask = ((((1 << totalQubit) >>> 0) - 1) & ~((1 << (alphaQubit + 1)) - 1)) >>> 0;
  const removed = ((1 << alphaQubit) | (1 << totalQubit)) >>> 0;
  const table = new PauliAccumulator(2 * n - 2, paritySum.length);
  const length = paritySum.length;
  const outX = new Uint32Array(length);
  const outZ = new Uint32Array(length);
  const outC = new Float64Array(length);
  for (let k = 0; k < length; k++) {
    const x = paritySum.x[k]!;
    const z = paritySum.z[k]!;
    if ((x & removed) !== 0) throw new Error('a parity string flips a particle-number parity qubit: the Hamiltonian does not conserve N_α and N_β');
    let coefficient = paritySum.coefficients[k]!;
    if ((z >>> alphaQubit) & 1) coefficient *= alphaSign;
    if ((z >>> totalQubit) & 1) coefficient *= totalSign;
    outX[k] = ((x & lowMask) | ((x & highMask) >>> 1)) >>> 0;
    outZ[k] = ((z & lowMask) | ((z & highMask) >>> 1)) >>> 0;
    outC[k] = coefficient;
    table.add(outX[k]!, outZ[k]!, coefficient);
  }
  // Without merges (always for n ≥ 5) the strings keep their order and magnitudes.
  if (table.size === length) return { qubits: 2 * n - 2, length, x: outX, z: outZ, coefficients: outC };
  return table.toSum(threshold);
}
