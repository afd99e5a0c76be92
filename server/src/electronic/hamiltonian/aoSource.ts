/**
 * The atomic-orbital two-electron integrals as the active-space transformation reads them: shell
 * quartets, Schwarz factors for screening, and the Coulomb and exchange matrices of the core
 * density. Two inputs are accepted:
 *  • a `TwoElectronIntegrals` source (contracts.ts), computed directly shell quartet by shell
 *    quartet, for any size;
 *  • packed integrals (pairs.ts order) for small cases, read in blocks of a few functions that
 *    play the part of shells.
 */
import { throwIfCancelled, type CancelToken, type TwoElectronIntegrals } from '../contracts';
import { packedLength, quartetIndex } from './pairs';

/** (μν|λσ) of every function quartet with the eightfold symmetry, packed as in pairs.ts. */
export interface PackedAoIntegrals {
  readonly kind: 'packed';
  readonly functionCount: number;
  readonly values: Float64Array;
}

export type AoTwoElectronInput = TwoElectronIntegrals | PackedAoIntegrals;

/** Packed input beyond this many functions is refused: it holds N⁴/8 numbers. */
export const PACKED_FUNCTION_LIMIT = 200;

export interface AoSource {
  readonly functionCount: number;
  readonly shellCount: number;
  readonly shellOffset: Int32Array;
  readonly shellSize: Int32Array;
  readonly maxShellSize: number;
  /** (PQ|RS) into `out`, indexed [p][q][r][s] over the shells' functions. */
  quartet(p: number, q: number, r: number, s: number, out: Float64Array): void;
  schwarz(p: number, q: number): number;
  /** J[μν] = Σ (μν|λσ) D[λσ], K[μν] = Σ (μλ|νσ) D[λσ] for one symmetric density. */
  coulombExchange(density: Float64Array, J: Float64Array, K: Float64Array, cancel: CancelToken | undefined): void;
}

export function isPacked(input: AoTwoElectronInput): input is PackedAoIntegrals {
  return (input as PackedAoIntegrals).kind === 'packed';
}

export function aoSource(input: AoTwoElectronInput): AoSource {
  return isPacked(input) ? packedSource(input) : directSource(input);
}

function directSource(integrals: TwoElectronIntegrals): AoSource {
  const shells = integrals.basis.shells;
  const shellOffset = new Int32Array(shells.length);
  const shellSize = new Int32Array(shells.length);
  let maxShellSize = 0;
  shells.forEach((shell, index) => {
    shellOffset[index] = shell.offset;
    shellSize[index] = shell.size;
    maxShellSize = Math.max(maxShellSize, shell.size);
  });
  return {
    functionCount: integrals.basis.functionCount,
    shellCount: shells.length,
    shellOffset,
    shellSize,
    maxShellSize,
    quartet: (p, q, r, s, out) => integrals.shellQuartet(p, q, r, s, out),
    schwarz: (p, q) => integrals.schwarz(p, q),
    coulombExchange: (density, J, K, cancel) => integrals.buildJK([density], [J], [K], cancel ? { cancel } : undefined),
  };
}

/** Functions per block when packed integrals are read block by block. */
const PACKED_BLOCK = 8;

function packedSource(input: PackedAoIntegrals): AoSource {
  const n = input.functionCount;
  if (!Number.isInteger(n) || n < 1) throw new RangeError(`packed two-electron integrals: function count ${n} is not a positive whole number`);
  if (n > PACKED_FUNCTION_LIMIT) throw new RangeError(`packed two-electron integrals: ${n} functions is more than the ${PACKED_FUNCTION_LIMIT} this form is meant for; pass a TwoElectronIntegrals source`);
  if (input.values.length !== packedLength(n)) {
    throw new RangeError(`packed two-electron integrals: ${input.values.length} values, but ${n} functions need ${packedLength(n)}`);
  }
  const values = input.values;
  const blocks = Math.ceil(n / PACKED_BLOCK);
  const shellOffset = new Int32Array(blocks);
  const shellSize = new Int32Array(blocks);
  for (let b = 0; b < blocks; b++) {
    shellOffset[b] = b * PACKED_BLOCK;
    shellSize[b] = Math.min(PACKED_BLOCK, n - b * PACKED_BLOCK);
  }
  const diagonal = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) diagonal[i * n + j] = Math.sqrt(Math.abs(values[quartetIndex(i, j, i, j)]!));
  const schwarz = new Float64Array(blocks * blocks);
  for (let p = 0; p < blocks; p++) {
    for (let q = 0; q < blocks; q++) {
      let max = 0;
      for (let i = shellOffset[p]!; i < shellOffset[p]! + shellSize[p]!; i++) {
        for (let j = shellOffset[q]!; j < shellOffset[q]! + shellSize[q]!; j++) max = Math.max(max, diagonal[i * n + j]!);
      }
      schwarz[p * blocks + q] = max;
    }
  }
  return {
    functionCount: n,
    shellCount: blocks,
    shellOffset,
    shellSize,
    maxShellSize: Math.min(PACKED_BLOCK, n),
    quartet(p, q, r, s, out) {
      let index = 0;
      const p0 = shellOffset[p]!, q0 = shellOffset[q]!, r0 = shellOffset[r]!, s0 = shellOffset[s]!;
      const p1 = p0 + shellSize[p]!, q1 = q0 + shellSize[q]!, r1 = r0 + shellSize[r]!, s1 = s0 + shellSize[s]!;
      for (let i = p0; i < p1; i++) for (let j = q0; j < q1; j++) for (let k = r0; k < r1; k++) for (let l = s0; l < s1; l++) out[index++] = values[quartetIndex(i, j, k, l)]!;
    },
    schwarz: (p, q) => schwarz[p * blocks + q]!,
    coulombExchange(density, J, K, cancel) {
      for (let i = 0; i < n; i++) {
        throwIfCancelled(cancel);
        for (let j = 0; j <= i; j++) {
          let coulomb = 0;
          let exchange = 0;
          for (let k = 0; k < n; k++) {
            for (let l = 0; l < n; l++) {
              const d = density[k * n + l]!;
              coulomb += values[quartetIndex(i, j, k, l)]! * d;
              exchange += values[quartetIndex(i, k, j, l)]! * d;
            }
          }
          J[i * n + j] = J[j * n + i] = coulomb;
          K[i * n + j] = K[j * n + i] = exchange;
        }
      }
    },
  };
}
