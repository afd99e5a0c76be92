/** The shapes of the semantic model (built by `index.ts`). */
import type { BasisSet } from '../../chemistry/basis/library';
import type { CapRule } from '../../chemistry/capping';
import type { FunctionType } from '../../chemistry/basis/shells';
import type { OrbitalSpace } from '../../chemistry/counting';
import type { Element } from '../../chemistry/elements';
import type { ContactAnalysis } from '../../chemistry/geometry';
import type { Mapping } from '../../chemistry/qubits';
import type { ScanCoordinate } from '../../chemistry/scan';
import type { LengthUnit } from '../../chemistry/units';
import type { BasisOverrideAst, FragmentAst, TierAst } from '../ast';
import type { FileHost } from '../files';
import type { Span } from '../text';
import type { TierLevel } from '../vocabulary';

export interface AtomModel {
  /** Zero-based position in the geometry; users see index + 1 as `#n`. */
  readonly index: number;
  readonly element: Element;
  readonly label?: string;
  /** The atom's line in the spec, or the `structure from` path for atoms read from a file. */
  readonly span: Span;
  readonly labelSpan?: Span;
  /** For atoms read from an XYZ file: that file and the zero-based line. */
  readonly source?: { readonly file: string; readonly line: number };
}

export interface TierModel {
  readonly level: TierLevel;
  readonly method: string;
  readonly methodGiven: boolean;
  readonly ansatz: string | undefined;
  readonly mapping: Mapping | undefined;
  readonly active: { readonly electrons: number; readonly orbitals: number } | undefined;
  /**
   * `given`: counts written in the spec; `estimated`: counted for a suggestion (`activeChoice`)
   * before its orbitals are computed — a planning estimate.
   */
  readonly activeSource: 'given' | 'estimated' | undefined;
  /** The suggestion the active space is taken from, when the spec asks for one instead of counts. */
  readonly activeChoice: ActiveChoiceModel | undefined;
  /** Active orbitals per irrep label, when the spec gives them. */
  readonly activeIrreps: readonly { readonly label: string; readonly count: number }[] | undefined;
  /** The reference occupation per irrep when the spec gives it: doubly and singly occupied orbitals. */
  readonly activeOccupation: { readonly doubly: readonly { readonly label: string; readonly count: number }[]; readonly singly: readonly { readonly label: string; readonly count: number }[] } | undefined;
  readonly frozenCore: boolean;
  readonly taper: boolean;
  readonly layers: number;
  /** The tier's own target accuracy (hartree), when it gives one; else the spec's applies. */
  readonly accuracy: number | undefined;
  /** Optimisation steps of a variational run (DEFAULT_VQE_STEPS unless given). */
  readonly steps: number;
  readonly stepsGiven: boolean;
  readonly ast: TierAst;
}

/** A named atomic shell of an active-space suggestion: atom index in the spec, n (null: the valence shell) and l. */
export interface ShellChoice {
  readonly atom: number;
  readonly n: number | null;
  readonly l: number;
  /** The shell name and the whole `<atoms> <shells>` group in the spec. */
  readonly span: Span;
  readonly groupSpan: Span;
}

export type ActiveChoiceModel =
  | { readonly kind: 'shells'; readonly shells: readonly ShellChoice[] }
  | { readonly kind: 'natural'; readonly window: { readonly low: number; readonly high: number } };

export interface FragmentModel {
  readonly index: number;
  readonly name: string;
  readonly ast: FragmentAst;
  /** Sorted, unique atom indices. */
  readonly atoms: number[];
  readonly claimsRest: boolean;
  readonly charge: number;
  readonly chargeGiven: boolean;
  readonly multiplicity: number;
  readonly multiplicityGiven: boolean;
  readonly tier: TierModel | undefined;
  /** The capping rule this fragment follows (its own `caps` line, else the spec's); undefined: none. */
  readonly capRule: CapRule | undefined;
  /** Its hydrogen caps, one per cut bond (model/caps.ts); counted in `space`. */
  readonly caps: readonly CapModel[];
  /** Orbital space of the fragment's atoms and its caps. */
  readonly space: OrbitalSpace;
}

/** A hydrogen link atom on a bond the fragment boundary cuts. */
export interface CapModel {
  /** The fragment's atom of the cut bond (X). */
  readonly host: number;
  /** The atom outside the fragment (Y). */
  readonly partner: number;
  readonly rule: CapRule;
  /** Atomic number of the cap (1, hydrogen). */
  readonly z: number;
  /** x, y, z in ångström. */
  readonly position: readonly [number, number, number];
  /** X–H distance, ångström. */
  readonly length: number;
  /** The cap's basis set (an `all H` line, else a line for its fragment, else the main basis). */
  readonly basis: BasisSet | undefined;
}

export interface BasisOverrideModel {
  readonly ast: BasisOverrideAst;
  /** Undefined when the library has no basis of that name (the line then decides nothing). */
  readonly set: BasisSet | undefined;
  /** The atoms the line selects, each with the rank of its most specific target (model/basis.ts). */
  readonly atomRanks: ReadonlyMap<number, number>;
}

export interface BasisModel {
  readonly main: BasisSet | undefined;
  /** The `basis <name> on …` lines in the order written. */
  readonly overrides: readonly BasisOverrideModel[];
  /** Per atom: the override line that decides its basis, or -1 for the main line. */
  readonly decidedBy: Int32Array;
  /** Per atom: its basis set (undefined without a main line, or when the main name is unknown). */
  readonly atomSets: readonly (BasisSet | undefined)[];
  readonly functions: FunctionType;
  readonly functionsGiven: boolean;
}

export interface ScanModel {
  /** What is scanned: a distance, a bond angle or a dihedral. */
  readonly coordinate: ScanCoordinate;
  /** The named atoms in order: 2 for a distance, 3 for an angle (vertex in the middle), 4 for a dihedral. */
  readonly atoms: readonly number[];
  /** The first named atom (the one the coordinate is measured from). */
  readonly first: number;
  /** The last named atom: the one that moves. */
  readonly second: number;
  /** One value per point: ångström for a distance, degrees for an angle or dihedral. */
  readonly values: number[];
  /** The atoms `moving` names (sorted, unique), when the spec gives them. */
  readonly moving?: readonly number[];
}

export interface SpecModel {
  readonly name: string | undefined;
  /** The structure's length unit: of inline coordinates, scan ranges and `closer-than` distances. */
  readonly units: LengthUnit;
  readonly atoms: AtomModel[];
  /** x, y, z of every atom in ångström. */
  readonly coordinates: Float64Array;
  readonly labels: ReadonlyMap<string, number>;
  readonly charge: number;
  readonly chargeGiven: boolean;
  readonly multiplicity: number;
  readonly multiplicityGiven: boolean;
  readonly frozenCore: boolean;
  readonly basis: BasisModel;
  readonly fragments: FragmentModel[];
  /** Per atom: the first fragment that claims it, or -1 when none does. */
  readonly owner: Int32Array;
  /** Atoms claimed by more than one fragment, with every claimant in fragment order. */
  readonly sharedAtoms: ReadonlyMap<number, number[]>;
  readonly embedding: string;
  readonly scan: ScanModel | undefined;
  /** `qubitsFromSpec` is false when the qubit limit is the caller's default (the spec sets none). */
  readonly limits: { readonly qubits?: number; readonly qubitsFromSpec: boolean; readonly memoryBytes?: number; readonly shotRate?: number; readonly flopsPerSecond?: number };
  /** Target accuracy of quantum fragments' energies (hartree): the spec's `accuracy`, else 1.6 mHa (chemical accuracy, common practice). */
  readonly accuracy: number;
  readonly accuracyGiven: boolean;
  readonly system: OrbitalSpace;
  readonly contacts: ContactAnalysis;
  /** Absolute paths of files read for this spec. */
  readonly includes: string[];
  /** Every place a selector or scan names an atom by label or #index, resolved. */
  readonly atomReferences: readonly AtomReference[];
}

export interface AtomReference {
  readonly atom: number;
  readonly span: Span;
  readonly kind: 'label' | 'index';
}

export interface ModelOptions {
  readonly path?: string;
  readonly files: FileHost;
  readonly defaultMapping?: Mapping;
  readonly defaultQubitLimit?: number;
  /** The contacts of the previous version of the same document: only what an edit moved is searched again. */
  readonly previousContacts?: ContactAnalysis;
  /** The atoms of the previous version: those that read the same are kept. */
  readonly previousAtoms?: readonly AtomModel[];
}
