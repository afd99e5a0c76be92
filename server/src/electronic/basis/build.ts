/**
 * The basis functions of a molecule: shells on atoms, normalised, in the function order of
 * contracts.ts, with the effective core potentials the basis puts on heavy atoms.
 */
import { elementBySymbol } from '../../chemistry/elements';
import type { Center, EcpCenter, FunctionKind, MolecularBasis, Shell } from '../contracts';
import { doubleFactorialOdd } from './cartesian';
import { loadBasisSetData, type EcpData, type ShellData } from './data';

/** An atom as the basis builder needs it: element symbol and position in bohr. */
export interface BasisAtom {
  readonly symbol: string;
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** An element that the chosen basis does not define. */
export class MissingBasisDataError extends Error {
  constructor(
    readonly basisName: string,
    readonly symbols: readonly string[],
    readonly atomIndices: readonly number[],
  ) {
    super(
      `Basis set '${basisName}' has no functions for ${symbols.join(', ')} (atom${atomIndices.length > 1 ? 's' : ''} ${atomIndices
        .map((i) => i + 1)
        .join(', ')}).`,
    );
    this.name = 'MissingBasisDataError';
  }
}

/** An atom the builder cannot place: unknown element or a coordinate that is not a finite number. */
export class InvalidAtomError extends Error {
  constructor(
    readonly atomIndex: number,
    detail: string,
  ) {
    super(`Atom ${atomIndex + 1}: ${detail}`);
    this.name = 'InvalidAtomError';
  }
}

/** Functions per shell: 2l+1 spherical, (l+1)(l+2)/2 cartesian; s and p are the same in both. */
export function shellSize(l: number, kind: FunctionKind): number {
  return kind === 'spherical' ? 2 * l + 1 : ((l + 1) * (l + 2)) / 2;
}

/**
 * Contraction coefficients with the primitive normalisation folded in, scaled so that the
 * contracted x^l component has unit norm. Primitive norm of x^l e^(−αr²):
 * (2α/π)^(3/4) (4α)^(l/2) / √((2l−1)!!); the overlap of two normalised primitives of one shell is
 * (2√(αβ)/(α+β))^(l+3/2).
 */
export function normalizedCoefficients(l: number, exponents: readonly number[], coefficients: readonly number[]): Float64Array {
  const n = exponents.length;
  const out = new Float64Array(n);
  const dfact = doubleFactorialOdd(l);
  for (let i = 0; i < n; i++) {
    const alpha = exponents[i]!;
    const primitiveNorm = (2 * alpha / Math.PI) ** 0.75 * (4 * alpha) ** (l / 2) / Math.sqrt(dfact);
    out[i] = coefficients[i]! * primitiveNorm;
  }
  let norm2 = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const a = exponents[i]!;
      const b = exponents[j]!;
      norm2 += coefficients[i]! * coefficients[j]! * ((2 * Math.sqrt(a * b)) / (a + b)) ** (l + 1.5);
    }
  }
  const scale = 1 / Math.sqrt(norm2);
  for (let i = 0; i < n; i++) out[i]! *= scale;
  return out;
}

function makeShell(data: ShellData, center: number, atom: BasisAtom, offset: number, kind: FunctionKind): Shell {
  return {
    l: data.l,
    center,
    x: atom.x,
    y: atom.y,
    z: atom.z,
    exponents: Float64Array.from(data.exponents),
    coefficients: normalizedCoefficients(data.l, data.exponents, data.coefficients),
    offset,
    size: shellSize(data.l, kind),
    kind,
  };
}

function makeEcp(data: EcpData, center: number): EcpCenter {
  return {
    center,
    coreElectrons: data.coreElectrons,
    channels: data.channels.map((channel) => ({
      l: channel.l,
      powers: Int32Array.from(channel.powers),
      exponents: Float64Array.from(channel.exponents),
      coefficients: Float64Array.from(channel.coefficients),
    })),
  };
}

/**
 * Builds the molecular basis: atoms in bohr, the basis name of each atom (one name for all, or
 * one per atom: the spec's main basis or its override), and the function kind. Shells come in the
 * order of the atoms and, on each atom, of the library file. Throws `UnknownBasisError`,
 * `BasisDataUnavailableError`, `MissingBasisDataError` (naming every element and atom without
 * functions) or `InvalidAtomError`.
 */
export function buildMolecularBasis(atoms: readonly BasisAtom[], basisNames: string | readonly string[], kind: FunctionKind): MolecularBasis {
  const names = typeof basisNames === 'string' ? atoms.map(() => basisNames) : [...basisNames];
  if (names.length !== atoms.length) throw new Error(`buildMolecularBasis: ${atoms.length} atoms but ${names.length} basis names.`);
  const centers: Center[] = [];
  const shells: Shell[] = [];
  const ecps: EcpCenter[] = [];
  const missing = new Map<string, { symbols: string[]; atoms: number[] }>();
  let offset = 0;
  atoms.forEach((atom, index) => {
    const element = elementBySymbol(atom.symbol);
    if (!element) throw new InvalidAtomError(index, `'${atom.symbol}' is not an element symbol.`);
    if (![atom.x, atom.y, atom.z].every(Number.isFinite)) throw new InvalidAtomError(index, 'a coordinate is not a finite number.');
    const name = names[index]!;
    const data = loadBasisSetData(name).elements.get(element.symbol);
    if (!data) {
      const entry = missing.get(name) ?? { symbols: [], atoms: [] };
      if (!entry.symbols.includes(element.symbol)) entry.symbols.push(element.symbol);
      entry.atoms.push(index);
      missing.set(name, entry);
      return;
    }
    const core = data.ecp?.coreElectrons ?? 0;
    centers.push({ symbol: element.symbol, atomicNumber: element.z, charge: element.z - core, x: atom.x, y: atom.y, z: atom.z });
    for (const shell of data.shells) {
      shells.push(makeShell(shell, index, atom, offset, kind));
      offset += shellSize(shell.l, kind);
    }
    if (data.ecp) ecps.push(makeEcp(data.ecp, index));
  });
  const [firstMissing] = missing;
  if (firstMissing) throw new MissingBasisDataError(firstMissing[0], firstMissing[1].symbols, firstMissing[1].atoms);
  const functionCenter = new Int32Array(offset);
  const functionL = new Int32Array(offset);
  for (const shell of shells) {
    functionCenter.fill(shell.center, shell.offset, shell.offset + shell.size);
    functionL.fill(shell.l, shell.offset, shell.offset + shell.size);
  }
  return { basisNames: names, kind, centers, shells, functionCount: offset, functionCenter, functionL, ecps };
}
