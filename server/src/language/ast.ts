/**
 * The typed syntax tree: what each statement says, with the span of every part. Built from the
 * concrete tree by `interpret/`; names are not resolved yet (that is `model/`).
 */
import type { FunctionType } from '../chemistry/basis/shells';
import { elementByNumber, elementBySymbol } from '../chemistry/elements';
import type { LengthUnit } from '../chemistry/units';
import type { Span } from './text';
import type { AtomTable, Statement } from './syntax';
import type { TierLevel } from './vocabulary';

export interface Located<T> {
  readonly value: T;
  readonly span: Span;
}

export interface SpecAst {
  name?: Located<string>;
  /** The unit of a retired `units` line, still honoured where no structure header names one. */
  legacyUnits?: Located<LengthUnit>;
  charge?: Located<number>;
  multiplicity?: Located<number>;
  frozenCore?: Located<boolean>;
  /** The main `basis <name>` line. */
  basis?: BasisAst;
  /** `basis <name> on <atoms>` lines, in the order written. */
  basisOverrides: BasisOverrideAst[];
  /** `functions spherical|cartesian`. */
  functions?: Located<FunctionType>;
  /** What the `structure` statement gives: the atoms and their length unit. */
  geometry?: GeometryAst;
  fragments: FragmentAst[];
  embedding?: Located<string>;
  /** `caps …` at the top level: the default of every fragment. */
  caps?: CapsAst;
  scan?: ScanAst;
  limits?: LimitsAst;
  /** `accuracy <value> <unit>`, in hartree. */
  accuracy?: Located<number>;
  /** `variant <name> { … }` blocks, in order (their insides are read as specs of their own, language/variants.ts). */
  variants: VariantAst[];
  /** The first statement of each singular kind, for duplicate reports. */
  readonly statements: Statement[];
}

export interface VariantAst {
  readonly statement: Statement;
  readonly name?: Located<string>;
}

export interface BasisAst {
  readonly statement: Statement;
  readonly name?: Located<string>;
}

/** `basis <name> on <targets>`: a basis for the selected atoms instead of the main one. */
export interface BasisOverrideAst extends BasisAst {
  readonly targets: readonly BasisTargetAst[];
  /** The span of the `on` word and its targets. */
  readonly onSpan: Span;
}

/** What an override line selects: the atom selectors of fragments, or every atom of a fragment. */
export type BasisTargetAst = SelectorAst | { readonly kind: 'fragment'; readonly name: Located<string>; readonly span: Span };

export interface AtomAst {
  readonly element: Located<string>;
  readonly label?: Located<string>;
  /** Exactly three when valid; fewer or more are reported and the atom is skipped. */
  readonly coordinates: readonly Located<number>[];
  readonly span: Span;
}

/**
 * The valid atom lines of a geometry, read through one interface whether they are stored as
 * AtomAst objects (general parser) or column-wise (fast reader, see AtomTable).
 */
export interface AtomList {
  readonly length: number;
  /** Canonical element symbol. */
  symbol(i: number): string;
  /** Atomic number. */
  atomicNumber(i: number): number;
  label(i: number): string | undefined;
  /** Coordinate `axis` (0 x, 1 y, 2 z) in the file's unit. */
  coordinate(i: number, axis: number): number;
  /** The whole atom line. */
  span(i: number): Span;
  /** span(i).start and .end, and labelSpan(i)?.start (−1 without a label), without making objects. */
  spanStart(i: number): number;
  spanEnd(i: number): number;
  labelStart(i: number): number;
  elementSpan(i: number): Span;
  labelSpan(i: number): Span | undefined;
  coordinateSpan(i: number, axis: number): Span;
}

export interface GeometryAst {
  readonly statement: Statement;
  readonly atoms: AtomList;
  readonly include?: Located<string>;
  /** `with fragments` after an included spec's name: its fragments are this spec's too (model/includedFragments.ts). */
  readonly withFragments?: Span;
  /** The unit named in the header, `structure in bohr`. */
  readonly unit?: Located<LengthUnit>;
}

export function atomListOf(atoms: readonly AtomAst[]): AtomList {
  return {
    length: atoms.length,
    symbol: (i) => atoms[i]!.element.value,
    atomicNumber: (i) => elementBySymbol(atoms[i]!.element.value)!.z,
    label: (i) => atoms[i]!.label?.value,
    coordinate: (i, axis) => atoms[i]!.coordinates[axis]!.value,
    span: (i) => atoms[i]!.span,
    spanStart: (i) => atoms[i]!.span.start,
    spanEnd: (i) => atoms[i]!.span.end,
    labelStart: (i) => atoms[i]!.label?.span.start ?? -1,
    elementSpan: (i) => atoms[i]!.element.span,
    labelSpan: (i) => atoms[i]!.label?.span,
    coordinateSpan: (i, axis) => atoms[i]!.coordinates[axis]!.span,
  };
}

export function atomListOfTable(table: AtomTable): AtomList {
  return {
    length: table.count,
    symbol: (i) => elementByNumber(table.atomicNumbers[i]!)!.symbol,
    atomicNumber: (i) => table.atomicNumbers[i]!,
    label: (i) => table.labels.get(i),
    coordinate: (i, axis) => table.coordinates[3 * i + axis]!,
    span: (i) => ({ start: table.lineStart[i]!, end: table.lineEnd[i]! }),
    spanStart: (i) => table.lineStart[i]!,
    spanEnd: (i) => table.lineEnd[i]!,
    labelStart: (i) => table.labelStart[i]!,
    elementSpan: (i) => ({ start: table.lineStart[i]!, end: table.elementEnd[i]! }),
    labelSpan: (i) => (table.labelStart[i]! >= 0 ? { start: table.labelStart[i]!, end: table.labelEnd[i]! } : undefined),
    coordinateSpan: (i, axis) => ({ start: table.coordinateStart[3 * i + axis]!, end: table.coordinateEnd[3 * i + axis]! }),
  };
}

/** The atoms of a block the fast reader read, with those of the lines it left to the general parser, in document order. */
export function atomListOfMixed(table: AtomTable, others: readonly AtomAst[]): AtomList {
  const fast = atomListOfTable(table);
  if (others.length === 0) return fast;
  const slow = atomListOf(others);
  const count = table.count + others.length;
  // Where the i-th atom lives: its index in the table (≥ 0), or −1 − its index among the others.
  const where = new Int32Array(count);
  for (let i = 0, j = 0, k = 0; k < count; k++) {
    if (j >= others.length || (i < table.count && table.lineStart[i]! < others[j]!.span.start)) where[k] = i++;
    else where[k] = -1 - j++;
  }
  const pick = <T>(k: number, fromTable: (i: number) => T, fromOthers: (j: number) => T): T => {
    const at = where[k]!;
    return at >= 0 ? fromTable(at) : fromOthers(-1 - at);
  };
  return {
    length: count,
    symbol: (k) => pick(k, fast.symbol, slow.symbol),
    atomicNumber: (k) => pick(k, fast.atomicNumber, slow.atomicNumber),
    label: (k) => pick(k, fast.label, slow.label),
    coordinate: (k, axis) => pick(k, (i) => fast.coordinate(i, axis), (j) => slow.coordinate(j, axis)),
    span: (k) => pick(k, fast.span, slow.span),
    spanStart: (k) => pick(k, fast.spanStart, slow.spanStart),
    spanEnd: (k) => pick(k, fast.spanEnd, slow.spanEnd),
    labelStart: (k) => pick(k, fast.labelStart, slow.labelStart),
    elementSpan: (k) => pick(k, fast.elementSpan, slow.elementSpan),
    labelSpan: (k) => pick(k, fast.labelSpan, slow.labelSpan),
    coordinateSpan: (k, axis) => pick(k, (i) => fast.coordinateSpan(i, axis), (j) => slow.coordinateSpan(j, axis)),
  };
}

export type AtomRef =
  | { readonly kind: 'label'; readonly name: string; readonly span: Span }
  | { readonly kind: 'index'; readonly index: number; readonly span: Span };

export type SelectorAst =
  | AtomRef
  | { readonly kind: 'range'; readonly from: AtomRef; readonly to: AtomRef; readonly span: Span }
  | { readonly kind: 'element'; readonly element: string; readonly span: Span }
  /** `closer-than <d> to <atom>`; `inclusive` only for the retired distance selector it replaced (at most d). */
  | { readonly kind: 'closer-than'; readonly distance: number; readonly to: AtomRef; readonly inclusive: boolean; readonly span: Span }
  | { readonly kind: 'rest'; readonly span: Span };

export interface ActiveIrrepAst {
  readonly label: Located<string>;
  readonly count: Located<number>;
  readonly span: Span;
}

/** One shell named after `active shells`: `3d` (n and l) or `d` (l alone: the atom's valence shell of that l). */
export interface ShellNameAst {
  readonly n: number | null;
  readonly l: number;
  readonly span: Span;
}

/** `<atoms> <shell>…` after `active shells`: the shells of the selected atoms. */
export interface ShellGroupAst {
  readonly selectors: readonly SelectorAst[];
  readonly shells: readonly ShellNameAst[];
  readonly span: Span;
}

/**
 * A suggestion the active space is taken from, instead of counts: `active shells Fe1 3d all O 2p`
 * (projection onto atomic shells) or `active natural [0.02 to 1.98]` (MP2 natural occupations).
 */
export type ActiveChoiceAst =
  | { readonly kind: 'shells'; readonly keyword: Span; readonly groups: readonly ShellGroupAst[]; readonly span: Span }
  | { readonly kind: 'natural'; readonly keyword: Span; readonly window?: { readonly low: Located<number>; readonly high: Located<number> }; readonly span: Span };

export interface ActiveSpaceAst {
  readonly choice?: ActiveChoiceAst;
  readonly electrons?: Located<number>;
  /** Given as `6o`, or the sum of the per-irrep counts. */
  readonly orbitals?: Located<number>;
  /** Orbitals per irrep of the fragment's point group, when given (`A1=3 B2=1`). */
  readonly irreps: readonly ActiveIrrepAst[];
  /** The reference occupation, when given: doubly occupied (`occupied A1=2`) and singly occupied (`open B1=1`) orbitals per irrep. */
  readonly occupied?: readonly ActiveIrrepAst[];
  readonly open?: readonly ActiveIrrepAst[];
  readonly span: Span;
}

export interface TierAst {
  readonly statement: Statement;
  readonly level?: Located<TierLevel>;
  method?: Located<string>;
  ansatz?: Located<string>;
  mapping?: Located<string>;
  active?: ActiveSpaceAst;
  frozenCore?: Located<boolean>;
  taper?: Located<boolean>;
  layers?: Located<number>;
  /** `accuracy <value> <unit>`, in hartree. */
  accuracy?: Located<number> | undefined;
  /** `steps <n>`: optimisation steps of a variational run. */
  steps?: Located<number> | undefined;
}

export interface FragmentAst {
  readonly statement: Statement;
  readonly name?: Located<string>;
  atoms?: { readonly selectors: SelectorAst[]; readonly span: Span; readonly keywordSpan: Span };
  charge?: Located<number>;
  multiplicity?: Located<number>;
  /** `caps …` in the fragment: overrides the top-level choice for this fragment. */
  caps?: CapsAst;
  tier?: TierAst;
  /** For a fragment taken from another spec (`structure from "…" with fragments`): where it is written there. */
  readonly included?: IncludedFragmentOrigin;
}

/**
 * Where an included fragment is written in the other spec (zero-based line and character of its
 * name, or of its keyword when it has none), and whether this spec's own `fragment` of the same
 * name patches it. The spans of an included fragment's syntax are the `with fragments` words of
 * this spec, where its problems are reported.
 */
export interface IncludedFragmentOrigin {
  readonly file: string;
  readonly start: { readonly line: number; readonly character: number };
  readonly end: { readonly line: number; readonly character: number };
  /** This spec has a fragment of the same name that patches the included one. */
  readonly patched: boolean;
}

/** `caps hydrogen fixed|scaled` or `caps none`: how cut bonds are capped. */
export interface CapsAst {
  readonly statement: Statement;
  /** `none`, or the placement rule of hydrogen caps. */
  readonly rule: Located<'none' | 'fixed' | 'scaled'>;
}

export interface ScanAst {
  readonly statement: Statement;
  readonly kind: Located<'distance' | 'angle' | 'dihedral'>;
  /** The named atoms in order (as many as were readable). */
  readonly atoms: readonly AtomRef[];
  readonly first?: AtomRef;
  /** The last named atom: the one that moves. */
  readonly second?: AtomRef;
  readonly from?: Located<number>;
  readonly to?: Located<number>;
  readonly step?: Located<number>;
  readonly points?: Located<number>;
  /** `moving <atom> …`: the atoms that move with the last named one, when given. */
  readonly moving?: { readonly atoms: readonly AtomRef[]; readonly span: Span };
}

export interface LimitsAst {
  readonly statement: Statement;
  qubits?: Located<number>;
  /** In bytes. */
  memory?: Located<number>;
  /** Shots per second. */
  shotRate?: Located<number>;
  /** Floating-point operations per second. */
  rate?: Located<number>;
}

export function describeRef(ref: AtomRef): string {
  return ref.kind === 'index' ? `#${ref.index}` : ref.name;
}

/** A selector or basis target written back in the language's own spelling (`all Zn`, `n1..n4`). */
export function describeTarget(target: BasisTargetAst): string {
  switch (target.kind) {
    case 'label':
    case 'index':
      return describeRef(target);
    case 'range':
      return `${describeRef(target.from)}..${describeRef(target.to)}`;
    case 'element':
      return `all ${target.element}`;
    case 'closer-than':
      return `closer-than ${target.distance} to ${describeRef(target.to)}`;
    case 'rest':
      return 'rest';
    case 'fragment':
      return `fragment ${target.name.value}`;
  }
}
