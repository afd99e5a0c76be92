/**
 * Exponents, contraction coefficients and effective core potentials of the library's basis sets,
 * read on demand: one file per basis (and per JKFIT auxiliary set) in a `basis-sets` folder,
 * generated from psi4-data by scripts/data/generate_basis_library.py (origin and licence in
 * chemistry/data/BASIS-ORIGIN.md). The build copies the folder next to the bundles Brotli-compressed
 * (`<file>.json.br`); running from the sources reads the plain `<file>.json`. Parsing and checking a
 * spec never come here: only an engine job that needs the numbers does, and each file is read once.
 */
import { existsSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import { brotliDecompressSync } from 'node:zlib';
import library from '../../chemistry/data/basis-library.json';
import { normalizeBasisName } from '../../chemistry/basis/library';

/** One contracted shell as the library file prints it (coefficients not yet normalised). */
export interface ShellData {
  readonly l: number;
  readonly exponents: readonly number[];
  readonly coefficients: readonly number[];
}

/** One channel of an effective core potential: Σ d r^(n−2) exp(−ζ r²); l = −1 is the local channel. */
export interface EcpChannelData {
  readonly l: number;
  readonly powers: readonly number[];
  readonly exponents: readonly number[];
  readonly coefficients: readonly number[];
}

export interface EcpData {
  readonly coreElectrons: number;
  readonly channels: readonly EcpChannelData[];
}

export interface ElementBasisData {
  /** Shells in the order of the library file (an SP shell is an s shell followed by a p shell). */
  readonly shells: readonly ShellData[];
  readonly ecp?: EcpData;
}

export interface BasisSetData {
  /** Library key (`cc-pvdz`, `6-31g*`, `cc-pvdz-jkfit`). */
  readonly key: string;
  readonly displayName: string;
  /** The family's usual function kind (the first line of the library file). */
  readonly functions: 'spherical' | 'cartesian';
  readonly elements: ReadonlyMap<string, ElementBasisData>;
}

/** A basis name the library does not have. */
export class UnknownBasisError extends Error {
  constructor(readonly basisName: string) {
    super(`Basis set '${basisName}' is not in the basis library.`);
    this.name = 'UnknownBasisError';
  }
}

/** The library has the basis, but its exponent file cannot be read. */
export class BasisDataUnavailableError extends Error {
  constructor(
    readonly basisName: string,
    detail: string,
  ) {
    super(`The exponents of basis set '${basisName}' cannot be read: ${detail}`);
    this.name = 'BasisDataUnavailableError';
  }
}

interface LibraryRecord {
  readonly displayName: string;
  readonly data: string;
  readonly jkfit?: string;
}

const ORBITAL = library.bases as unknown as Record<string, LibraryRecord>;
const AUXILIARY = (library as unknown as { auxiliary: Record<string, LibraryRecord> }).auxiliary;

let folderOverride: string | undefined;

/** Points the loader at another `basis-sets` folder (tests, embedders); `undefined` restores the default. */
export function setBasisDataFolder(folder: string | undefined): void {
  folderOverride = folder;
  cache.clear();
}

/**
 * Where the files are: next to the running bundle (dist/basis-sets, also inside the .vsix), or, when
 * running from the sources, the generator's output folder.
 */
function candidateFolders(): string[] {
  if (folderOverride) return [folderOverride];
  const here = typeof __dirname === 'string' ? __dirname : process.cwd();
  return [path.join(here, 'basis-sets'), path.resolve(here, '..', '..', 'chemistry', 'data', 'basis-sets')];
}

type RawChannel = [number, number[], number[], number[]];
interface RawFile {
  key: string;
  displayName: string;
  functions: 'spherical' | 'cartesian';
  elements: Record<string, { shells: [number, number[], number[]][]; ecp?: { core: number; channels: RawChannel[] } }>;
}

function readRaw(name: string, stem: string): RawFile {
  const folders = candidateFolders();
  for (const folder of folders) {
    const compressed = path.join(folder, `${stem}.json.br`);
    const plain = path.join(folder, `${stem}.json`);
    try {
      if (existsSync(compressed)) return JSON.parse(brotliDecompressSync(readFileSync(compressed)).toString('utf8')) as RawFile;
      if (existsSync(plain)) return JSON.parse(readFileSync(plain, 'utf8')) as RawFile;
    } catch (error) {
      throw new BasisDataUnavailableError(name, `${stem}.json in ${folder} is damaged (${(error as Error).message}).`);
    }
  }
  throw new BasisDataUnavailableError(name, `${stem}.json was found in none of ${folders.join(', ')}.`);
}

function convert(raw: RawFile, key: string, displayName: string): BasisSetData {
  const elements = new Map<string, ElementBasisData>();
  for (const [symbol, record] of Object.entries(raw.elements)) {
    const shells = record.shells.map(([l, exponents, coefficients]) => ({ l, exponents, coefficients }));
    const ecp = record.ecp
      ? {
          coreElectrons: record.ecp.core,
          channels: record.ecp.channels.map(([l, powers, exponents, coefficients]) => ({ l, powers, exponents, coefficients })),
        }
      : undefined;
    elements.set(symbol, ecp ? { shells, ecp } : { shells });
  }
  return { key, displayName, functions: raw.functions, elements };
}

const cache = new Map<string, BasisSetData>();

/**
 * The exponent data of an orbital basis (any spelling `findBasisSet` accepts) or of a JKFIT set
 * (`cc-pvdz-jkfit`). Read from disk on first use, then cached. Throws `UnknownBasisError` or
 * `BasisDataUnavailableError`.
 */
export function loadBasisSetData(name: string): BasisSetData {
  const key = normalizeBasisName(name);
  const cached = cache.get(key);
  if (cached) return cached;
  const record = ORBITAL[key] ?? AUXILIARY[key];
  if (!record) throw new UnknownBasisError(name);
  const data = convert(readRaw(name, record.data), key, record.displayName);
  cache.set(key, data);
  return data;
}

/** The JKFIT auxiliary set psi4 pairs with an orbital basis (`cc-pvdz` → `cc-pvdz-jkfit`). */
export function jkfitBasisFor(name: string): string | undefined {
  return ORBITAL[normalizeBasisName(name)]?.jkfit;
}

/** Keys of the basis sets read so far (parsing and checking a spec read none). */
export function loadedBasisSets(): string[] {
  return [...cache.keys()];
}

/** Every key the loader accepts: the orbital bases, then the auxiliary sets. */
export function basisDataKeys(): string[] {
  return [...Object.keys(ORBITAL), ...Object.keys(AUXILIARY)];
}
