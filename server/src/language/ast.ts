/**
 * The typed syntax tree: what each statement says, with the span of every part. Built from the
 * concrete tree by `interpret.ts`; names are not resolved yet (that is `model.ts`).
 */
import type { Span } from './text';
import type { Statement } from './syntax';
import type { TierLevel } from './vocabulary';

export interface Located<T> {
  readonly value: T;
  readonly span: Span;
}

export interface SpecAst {
  name?: Located<string>;
  units?: Located<'angstrom' | 'bohr'>;
  charge?: Located<number>;
  multiplicity?: Located<number>;
  frozenCore?: Located<boolean>;
  basis?: BasisAst;
  geometry?: GeometryAst;
  fragments: FragmentAst[];
  embedding?: Located<string>;
  scan?: ScanAst;
  limits?: LimitsAst;
  /** The first statement of each singular kind, for duplicate reports. */
  readonly statements: Statement[];
}

export interface BasisAst {
  readonly statement: Statement;
  readonly name?: Located<string>;
  readonly overrides: BasisOverrideAst[];
  functions?: Located<'spherical' | 'cartesian'>;
}

export interface BasisOverrideAst {
  readonly element: Located<string>;
  readonly basis: Located<string>;
  readonly span: Span;
}

export interface AtomAst {
  readonly element: Located<string>;
  readonly label?: Located<string>;
  /** Exactly three when valid; fewer or more are reported and the atom is skipped. */
  readonly coordinates: readonly Located<number>[];
  readonly span: Span;
}

export interface GeometryAst {
  readonly statement: Statement;
  readonly atoms: AtomAst[];
  readonly include?: Located<string>;
}

export type AtomRef =
  | { readonly kind: 'label'; readonly name: string; readonly span: Span }
  | { readonly kind: 'index'; readonly index: number; readonly span: Span };

export type SelectorAst =
  | AtomRef
  | { readonly kind: 'range'; readonly from: AtomRef; readonly to: AtomRef; readonly span: Span }
  | { readonly kind: 'element'; readonly element: string; readonly span: Span }
  | { readonly kind: 'within'; readonly distance: number; readonly of: AtomRef; readonly span: Span }
  | { readonly kind: 'rest'; readonly span: Span };

export interface ActiveSpaceAst {
  readonly electrons?: Located<number>;
  readonly orbitals?: Located<number>;
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
}

export interface FragmentAst {
  readonly statement: Statement;
  readonly name?: Located<string>;
  atoms?: { readonly selectors: SelectorAst[]; readonly span: Span; readonly keywordSpan: Span };
  charge?: Located<number>;
  multiplicity?: Located<number>;
  tier?: TierAst;
}

export interface ScanAst {
  readonly statement: Statement;
  readonly kind: Located<'distance'>;
  readonly first?: AtomRef;
  readonly second?: AtomRef;
  readonly from?: Located<number>;
  readonly to?: Located<number>;
  readonly step?: Located<number>;
  readonly points?: Located<number>;
}

export interface LimitsAst {
  readonly statement: Statement;
  qubits?: Located<number>;
  /** In bytes. */
  memory?: Located<number>;
}
