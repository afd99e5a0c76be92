/**
 * Basis sets looked up in the library, each atom's basis decided by the precedence rule, and what
 * each atom brings to the counts.
 *
 * Precedence (vocabulary.ts BASIS_PRECEDENCE): an atom takes the basis of the most specific line
 * that selects it — lines naming atoms (labels, #indices, ranges, closer-than) over `all <Element>`
 * lines, over `fragment <name>` lines, over the main line — and between lines of the same kind the
 * later one wins. A line naming a basis the library does not have decides nothing (its name is
 * reported), so the atoms keep the basis they would have without it.
 */
import { findBasisSet, type BasisSet } from '../../chemistry/basis/library';
import type { CountedAtom } from '../../chemistry/counting';
import type { Element } from '../../chemistry/elements';
import type { BasisTargetAst, SpecAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import { suggest } from '../suggest';
import type { Selection, SelectorResolver } from './selectors';
import type { AtomModel, BasisModel, BasisOverrideModel } from './types';

/** How specific a target is: a larger rank wins. The main line is rank 0. */
export const BASIS_RANK = { fragment: 1, element: 2, atoms: 3 } as const;

export const BASIS_RANK_NAMES: Readonly<Record<number, string>> = { 0: 'the main line', 1: 'a fragment line', 2: 'an element line', 3: 'a line naming atoms' };

function rankOf(target: BasisTargetAst): number {
  if (target.kind === 'fragment') return BASIS_RANK.fragment;
  if (target.kind === 'element') return BASIS_RANK.element;
  return BASIS_RANK.atoms;
}

export interface FragmentSelections {
  readonly names: readonly (string | undefined)[];
  readonly selections: readonly Selection[];
}

/** The atoms one target selects (fragment targets by the fragments' final atom lists). */
function targetAtoms(target: BasisTargetAst, resolver: SelectorResolver, fragments: FragmentSelections, sink: DiagnosticSink): number[] {
  if (target.kind !== 'fragment') return resolver.resolve([target]).atoms;
  const index = fragments.names.indexOf(target.name.value);
  if (index < 0) {
    const known = fragments.names.filter((name): name is string => name !== undefined);
    const suggestion = suggest(target.name.value, known);
    sink.report(
      'invalid-selector',
      target.name.span,
      `No fragment is named '${target.name.value}'.${suggestion ? ` Did you mean '${suggestion}'?` : known.length > 0 ? ` Fragments: ${known.join(', ')}.` : ' The spec has no fragments yet.'}`,
      suggestion ? { data: { replacement: suggestion } } : {},
    );
    return [];
  }
  return fragments.selections[index]!.atoms;
}

export function resolveBasis(ast: SpecAst, atoms: readonly AtomModel[], resolver: SelectorResolver, fragments: FragmentSelections, sink: DiagnosticSink): BasisModel {
  const main = ast.basis?.name ? findBasisSet(ast.basis.name.value) : undefined;
  const decidedBy = new Int32Array(atoms.length).fill(-1);
  const decidingRank = new Uint8Array(atoms.length);
  const overrides: BasisOverrideModel[] = ast.basisOverrides.map((line, index) => {
    const set = line.name ? findBasisSet(line.name.value) : undefined;
    const atomRanks = new Map<number, number>();
    for (const target of line.targets) {
      const rank = rankOf(target);
      for (const atom of targetAtoms(target, resolver, fragments, sink)) atomRanks.set(atom, Math.max(rank, atomRanks.get(atom) ?? 0));
    }
    if (set) {
      // Later lines come later in this loop: `>=` lets the later of two equal ranks win.
      for (const [atom, rank] of atomRanks) {
        if (rank >= decidingRank[atom]!) {
          decidingRank[atom] = rank;
          decidedBy[atom] = index;
        }
      }
    }
    return { ast: line, set, atomRanks };
  });
  const atomSets = atoms.map((atom) => (decidedBy[atom.index]! >= 0 ? overrides[decidedBy[atom.index]!]!.set : main));
  const given = ast.functions?.value;
  return { main, overrides, decidedBy, atomSets, functions: given ?? main?.functions ?? 'spherical', functionsGiven: given !== undefined };
}

/** What one atom brings to the counts with the basis it was given; atoms sharing both share the object. */
export function countedAtoms(atoms: readonly AtomModel[], basis: BasisModel): CountedAtom[] {
  const cache = new Map<BasisSet | undefined, Map<string, CountedAtom>>();
  return atoms.map((atom) => {
    const set = basis.atomSets[atom.index];
    let bySymbol = cache.get(set);
    if (!bySymbol) cache.set(set, (bySymbol = new Map()));
    let entry = bySymbol.get(atom.element.symbol);
    if (!entry) bySymbol.set(atom.element.symbol, (entry = countedAtom(atom.element, set)));
    return entry;
  });
}

export function countedAtom(element: Element, set: BasisSet | undefined): CountedAtom {
  return { z: element.z, shells: set?.shellsFor(element.symbol), ecpCoreElectrons: set?.ecpCoreElectrons(element.symbol) ?? 0 };
}

export function electronCount(atoms: readonly CountedAtom[], charge: number): number {
  let electrons = -charge;
  for (const atom of atoms) electrons += atom.z - atom.ecpCoreElectrons;
  return electrons;
}
