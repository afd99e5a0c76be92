/** A fragment's charge, multiplicity, tier (defaults applied) and orbital space. */
import type { FunctionType } from '../../chemistry/basis/shells';
import { countOrbitalSpace, type CountedAtom } from '../../chemistry/counting';
import type { Mapping } from '../../chemistry/qubits';
import { lowestMultiplicity } from '../../chemistry/spin';
import type { FragmentAst, TierAst } from '../ast';
import type { TierLevel } from '../vocabulary';
import { countedAtom, electronCount } from './basis';
import type { Selection } from './selectors';
import { elementByNumber } from '../../chemistry/elements';
import type { CapRule } from '../../chemistry/capping';
import type { CapModel, FragmentModel, ModelOptions, TierModel } from './types';

const DEFAULT_METHODS: Record<TierLevel, (multiplicity: number) => string> = {
  quantum: () => 'vqe',
  correlated: () => 'ccsd',
  'mean-field': (multiplicity) => (multiplicity === 1 ? 'rhf' : 'rohf'),
};

export function buildFragment(
  ast: FragmentAst,
  index: number,
  { atoms, claimsRest }: Selection,
  counted: readonly CountedAtom[],
  functions: FunctionType,
  defaultFrozenCore: boolean,
  options: ModelOptions,
  capping: { readonly rule: CapRule | undefined; readonly caps: readonly CapModel[] } = { rule: undefined, caps: [] },
): FragmentModel {
  // Caps are hydrogens with their own basis: they count like any atom of the fragment.
  const members = [...atoms.map((atom) => counted[atom]!), ...capping.caps.map((cap) => countedAtom(elementByNumber(cap.z)!, cap.basis))];
  const charge = ast.charge?.value ?? 0;
  const multiplicity = ast.multiplicity?.value ?? lowestMultiplicity(electronCount(members, charge));
  const tier = ast.tier ? tierModel(ast.tier, multiplicity, defaultFrozenCore, options) : undefined;
  const space = countOrbitalSpace({
    atoms: members,
    charge,
    multiplicity,
    functions,
    frozenCore: tier?.frozenCore ?? defaultFrozenCore,
    ...(tier?.active ? { active: tier.active } : {}),
  });
  return {
    index,
    name: ast.name?.value ?? `#${index + 1}`,
    ast,
    atoms,
    claimsRest,
    charge,
    chargeGiven: ast.charge !== undefined,
    multiplicity,
    multiplicityGiven: ast.multiplicity !== undefined,
    tier,
    capRule: capping.rule,
    caps: capping.caps,
    space,
  };
}

function tierModel(ast: TierAst, multiplicity: number, defaultFrozenCore: boolean, options: ModelOptions): TierModel | undefined {
  if (!ast.level) return undefined;
  const level = ast.level.value;
  const method = ast.method?.value ?? DEFAULT_METHODS[level](multiplicity);
  const quantum = level === 'quantum';
  const active = ast.active?.electrons && ast.active.orbitals ? { electrons: ast.active.electrons.value, orbitals: ast.active.orbitals.value } : undefined;
  return {
    level,
    method,
    methodGiven: ast.method !== undefined,
    ansatz: quantum ? (ast.ansatz?.value ?? (method === 'vqe' ? 'uccsd' : undefined)) : undefined,
    mapping: quantum ? ((ast.mapping?.value as Mapping | undefined) ?? options.defaultMapping ?? 'jordan-wigner') : undefined,
    active,
    activeIrreps: ast.active && ast.active.irreps.length > 0 ? ast.active.irreps.map((irrep) => ({ label: irrep.label.value, count: irrep.count.value })) : undefined,
    frozenCore: ast.frozenCore?.value ?? defaultFrozenCore,
    taper: ast.taper?.value ?? false,
    layers: ast.layers?.value ?? 1,
    ast,
  };
}
