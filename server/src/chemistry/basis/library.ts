/**
 * The basis-set library: which elements each basis defines, their contracted shells, the usual
 * function type of the family, and the core electrons an effective core potential replaces.
 * Generated from psi4-data by scripts/data/generate_basis_library.py (see data/BASIS-ORIGIN.md).
 */
import library from '../data/basis-library.json';
import { functionCount, parseShellNotation, type FunctionType, type ShellCounts } from './shells';

interface BasisRecord {
  displayName: string;
  file: string;
  functions: FunctionType;
  shells: Record<string, string>;
  ecpCoreElectrons?: Record<string, number>;
}

export interface BasisFamily {
  readonly id: string;
  readonly title: string;
  /** Reference publications of the family, as commonly cited. */
  readonly references: readonly string[];
}

export interface BasisSet {
  /** Canonical key, lower case: `cc-pvdz`, `6-31g*`, `def2-svp`. */
  readonly key: string;
  readonly displayName: string;
  readonly family: BasisFamily;
  /** The family's usual convention: the first line of the library file says which. */
  readonly functions: FunctionType;
  readonly elements: readonly string[];
  shellsFor(symbol: string): ShellCounts | undefined;
  /** Core electrons replaced by an effective core potential on this element (0 when none). */
  ecpCoreElectrons(symbol: string): number;
  functionCount(symbol: string, type: FunctionType): number | undefined;
}

// Reference publications, as commonly cited (written from memory; the psi4-data file headers
// name the same papers for the families they cover).
const FAMILIES: readonly (BasisFamily & { matches: (key: string) => boolean })[] = [
  {
    id: 'sto-ng',
    title: 'Minimal Slater-type-orbital fits (STO-nG)',
    references: ['W. J. Hehre, R. F. Stewart, J. A. Pople, J. Chem. Phys. 51, 2657 (1969)'],
    matches: (key) => key.startsWith('sto-'),
  },
  {
    id: 'pople-3-21g',
    title: 'Pople split-valence 3-21G',
    references: ['J. S. Binkley, J. A. Pople, W. J. Hehre, J. Am. Chem. Soc. 102, 939 (1980)'],
    matches: (key) => key.startsWith('3-21'),
  },
  {
    id: 'pople-6-31g',
    title: 'Pople split-valence 6-31G family',
    references: [
      'W. J. Hehre, R. Ditchfield, J. A. Pople, J. Chem. Phys. 56, 2257 (1972)',
      'P. C. Hariharan, J. A. Pople, Theor. Chim. Acta 28, 213 (1973) (polarization functions)',
      'T. Clark, J. Chandrasekhar, G. W. Spitznagel, P. v. R. Schleyer, J. Comput. Chem. 4, 294 (1983) (diffuse functions)',
    ],
    matches: (key) => key.startsWith('6-31') && !key.startsWith('6-311'),
  },
  {
    id: 'pople-6-311g',
    title: 'Pople triple-split-valence 6-311G family',
    references: [
      'R. Krishnan, J. S. Binkley, R. Seeger, J. A. Pople, J. Chem. Phys. 72, 650 (1980)',
      'T. Clark, J. Chandrasekhar, G. W. Spitznagel, P. v. R. Schleyer, J. Comput. Chem. 4, 294 (1983) (diffuse functions)',
    ],
    matches: (key) => key.startsWith('6-311'),
  },
  {
    id: 'dunning-cc',
    title: 'Dunning correlation-consistent cc-pVXZ',
    references: [
      'T. H. Dunning Jr., J. Chem. Phys. 90, 1007 (1989)',
      'R. A. Kendall, T. H. Dunning Jr., R. J. Harrison, J. Chem. Phys. 96, 6796 (1992) (aug- diffuse functions)',
    ],
    matches: (key) => key.includes('cc-pv'),
  },
  {
    id: 'karlsruhe-def2',
    title: 'Karlsruhe def2 split-, triple- and quadruple-zeta valence',
    references: [
      'F. Weigend, R. Ahlrichs, Phys. Chem. Chem. Phys. 7, 3297 (2005)',
      'D. Andrae, U. Häußermann, M. Dolg, H. Stoll, H. Preuß, Theor. Chim. Acta 77, 123 (1990) (effective core potentials)',
      'D. Rappoport, F. Furche, J. Chem. Phys. 133, 134105 (2010) (diffuse -D variants)',
    ],
    matches: (key) => key.startsWith('def2-'),
  },
];

const OTHER_FAMILY: BasisFamily = { id: 'other', title: 'Basis set', references: [] };

function familyOf(key: string): BasisFamily {
  const family = FAMILIES.find((candidate) => candidate.matches(key));
  return family ? { id: family.id, title: family.title, references: family.references } : OTHER_FAMILY;
}

function makeBasisSet(key: string, record: BasisRecord): BasisSet {
  const parsed = new Map<string, ShellCounts>();
  for (const [symbol, notation] of Object.entries(record.shells)) parsed.set(symbol, parseShellNotation(notation));
  const ecp = record.ecpCoreElectrons ?? {};
  return {
    key,
    displayName: record.displayName,
    family: familyOf(key),
    functions: record.functions,
    elements: [...parsed.keys()],
    shellsFor: (symbol) => parsed.get(symbol),
    ecpCoreElectrons: (symbol) => ecp[symbol] ?? 0,
    functionCount: (symbol, type) => {
      const shells = parsed.get(symbol);
      return shells ? functionCount(shells, type) : undefined;
    },
  };
}

const records = library.bases as unknown as Record<string, BasisRecord>;
const BASIS_SETS = new Map<string, BasisSet>(Object.entries(records).map(([key, record]) => [key, makeBasisSet(key, record)]));

export const BASIS_LIBRARY_ORIGIN = library.origin;

export function allBasisSets(): BasisSet[] {
  return [...BASIS_SETS.values()];
}

/**
 * Reduces a basis name as people write it to the library's key: case and spaces do not matter,
 * `(d)` is `*` and `(d,p)` is `**` (6-31G(d,p) = 6-31G**), `def2svp` is `def2-svp`,
 * `ccpvdz` is `cc-pvdz`.
 */
export function normalizeBasisName(name: string): string {
  let key = name.trim().toLowerCase().replace(/\s+/g, '');
  key = key.replace(/\(d,p\)$/, '**').replace(/\(d\)$/, '*');
  key = key.replace(/^def2(?!-)/, 'def2-');
  key = key.replace(/^(aug-)?ccpv/, (_match, aug: string | undefined) => `${aug ?? ''}cc-pv`);
  key = key.replace(/^augcc-/, 'aug-cc-');
  key = key.replace(/^sto3g$/, 'sto-3g');
  return key;
}

export function findBasisSet(name: string): BasisSet | undefined {
  return BASIS_SETS.get(normalizeBasisName(name));
}

/** Bases that define every one of the given elements, in library order. */
export function basisSetsCovering(symbols: Iterable<string>): BasisSet[] {
  const wanted = [...new Set(symbols)];
  return allBasisSets().filter((basis) => wanted.every((symbol) => basis.shellsFor(symbol) !== undefined));
}
