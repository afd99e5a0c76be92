/**
 * The semantic model: atoms in ångström, labels and selectors resolved, basis sets looked up and
 * given to each atom, defaults applied, and the orbital space of the system and of every fragment
 * counted. One module per seam: `atoms.ts` (inline atoms and includes, labels), `basis.ts`,
 * `selectors.ts`, `ownership.ts` (rest and owners), `fragments.ts` (fragments and tiers),
 * `includedFragments.ts` (fragments taken from another spec), `scan.ts`.
 */
import { CHEMICAL_ACCURACY_HARTREE } from '../../chemistry/units';
import { countOrbitalSpace } from '../../chemistry/counting';
import { analyseContacts } from '../../chemistry/geometry';
import { lowestMultiplicity } from '../../chemistry/spin';
import type { SpecAst } from '../ast';
import type { DiagnosticSink } from '../diagnostics';
import { indexLabels, readAtoms } from './atoms';
import { countedAtoms, electronCount, resolveBasis } from './basis';
import { BondNeighbours, capBasis, capRuleOf, fragmentCaps } from './caps';
import { buildFragment } from './fragments';
import { withIncludedFragments } from './includedFragments';
import { assignOwners } from './ownership';
import { resolveScan } from './scan';
import { SelectorResolver } from './selectors';
import type { ModelOptions, SpecModel } from './types';

export type { AtomModel, AtomReference, BasisModel, CapModel, BasisOverrideModel, FragmentModel, ModelOptions, ScanModel, SpecModel, TierModel } from './types';
export { BASIS_RANK, BASIS_RANK_NAMES } from './basis';
export { fragmentCapsAt } from './caps';
export { claimsOf } from './ownership';
export { defaultScanMoving, MAX_SCAN_POINTS, scanPointCount } from './scan';
export { SelectorResolver, type Selection } from './selectors';

export function buildModel(ast: SpecAst, sink: DiagnosticSink, options: ModelOptions): SpecModel {
  // The header's unit; a retired `units` line still counts where the header names none.
  const units = ast.geometry?.unit?.value ?? ast.legacyUnits?.value ?? 'angstrom';
  const includes: string[] = [];
  const atoms = readAtoms(ast, units, sink, options, includes, options.previousAtoms);
  // `with fragments`: the included spec's fragments, patched by this spec's own, are the fragments from here on.
  if (ast.geometry?.withFragments) ast.fragments = withIncludedFragments(ast, atoms.spec, sink, units);
  const coordinates = atoms.positions;
  const labels = indexLabels(atoms.list, sink);

  const resolver = new SelectorResolver(atoms.list, labels, coordinates, units, sink);
  const selections = ast.fragments.map((fragmentAst) => resolver.resolve(fragmentAst.atoms?.selectors ?? []));
  const { owner, sharedAtoms } = assignOwners(selections, atoms.list.length);
  const basis = resolveBasis(ast, atoms.list, resolver, { names: ast.fragments.map((f) => f.name?.value), selections }, sink);
  const counted = countedAtoms(atoms.list, basis);
  const charge = ast.charge?.value ?? 0;
  const multiplicity = ast.multiplicity?.value ?? lowestMultiplicity(electronCount(counted, charge));
  const frozenCore = ast.frozenCore?.value ?? true;
  const system = countOrbitalSpace({ atoms: counted, charge, multiplicity, functions: basis.functions, frozenCore });
  const radii = new Float64Array(atoms.list.map((atom) => atom.element.covalentRadius ?? 1.5));
  const contacts = analyseContacts(coordinates, radii, options.previousContacts);

  const qubitLimit = ast.limits?.qubits?.value ?? options.defaultQubitLimit;
  const atomicNumbers = atoms.list.map((atom) => atom.element.z);
  const capRules = ast.fragments.map((fragmentAst) => capRuleOf(fragmentAst.caps, ast.caps));
  const neighbours = capRules.some((rule) => rule !== undefined) ? new BondNeighbours(atoms.list.length, contacts.bonds) : undefined;
  const stamp = neighbours ? new Int32Array(atoms.list.length).fill(-1) : undefined;
  const fragments = ast.fragments.map((fragmentAst, index) => {
    const rule = capRules[index];
    const choice = fragmentAst.tier?.active?.choice;
    const choiceAtoms = choice?.kind === 'shells' ? choice.groups.map((group) => resolver.resolve(group.selectors).atoms) : [];
    const caps =
      rule && neighbours && stamp
        ? fragmentCaps(rule, selections[index]!.atoms, atoms.list, coordinates, neighbours, capBasis(ast, basis, fragmentAst.name?.value), stamp, index)
        : [];
    return buildFragment(fragmentAst, index, selections[index]!, counted, basis.functions, frozenCore, options, { rule, caps }, { choiceAtoms, qubitLimit, atomicNumbers });
  });

  return {
    name: ast.name?.value,
    units,
    atoms: atoms.list,
    coordinates,
    labels,
    charge,
    chargeGiven: ast.charge !== undefined,
    multiplicity,
    multiplicityGiven: ast.multiplicity !== undefined,
    frozenCore,
    basis,
    fragments,
    owner,
    sharedAtoms,
    embedding: ast.embedding?.value ?? 'none',
    scan: resolveScan(ast, resolver, units),
    limits: {
      ...(ast.limits?.qubits ? { qubits: ast.limits.qubits.value } : options.defaultQubitLimit ? { qubits: options.defaultQubitLimit } : {}),
      qubitsFromSpec: ast.limits?.qubits !== undefined,
      ...(ast.limits?.memory ? { memoryBytes: ast.limits.memory.value } : {}),
      ...(ast.limits?.shotRate ? { shotRate: ast.limits.shotRate.value } : {}),
      ...(ast.limits?.rate ? { flopsPerSecond: ast.limits.rate.value } : {}),
    },
    accuracy: ast.accuracy?.value ?? CHEMICAL_ACCURACY_HARTREE,
    accuracyGiven: ast.accuracy !== undefined,
    system,
    contacts,
    includes,
    atomReferences: resolver.references,
  };
}
