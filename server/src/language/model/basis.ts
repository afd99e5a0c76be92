/** Basis sets looked up in the library, and what each element brings to the counts. */
import { findBasisSet, type BasisSet } from '../../chemistry/basis/library';
import type { CountedAtom } from '../../chemistry/counting';
import type { Element } from '../../chemistry/elements';
import type { SpecAst } from '../ast';
import type { BasisModel } from './types';

export function resolveBasis(ast: SpecAst): BasisModel {
  const main = ast.basis?.name ? findBasisSet(ast.basis.name.value) : undefined;
  const overrides = new Map<string, BasisSet>();
  for (const override of ast.basis?.overrides ?? []) {
    const set = findBasisSet(override.basis.value);
    if (set) overrides.set(override.element.value, set);
  }
  const given = ast.basis?.functions?.value;
  return { main, overrides, functions: given ?? main?.functions ?? 'spherical', functionsGiven: given !== undefined };
}

export function countedAtom(element: Element, basis: BasisModel): CountedAtom {
  const set = basis.overrides.get(element.symbol) ?? basis.main;
  return { z: element.z, shells: set?.shellsFor(element.symbol), ecpCoreElectrons: set?.ecpCoreElectrons(element.symbol) ?? 0 };
}

export function electronCount(atoms: readonly CountedAtom[], charge: number): number {
  let electrons = -charge;
  for (const atom of atoms) electrons += atom.z - atom.ecpCoreElectrons;
  return electrons;
}
