/** A fragment's charge, multiplicity, tier (defaults applied) and orbital space. */
import type { FunctionType } from '../../chemistry/basis/shells';
import { countOrbitalSpace, type CountedAtom } from '../../chemistry/counting';
import type { Mapping } from '../../chemistry/qubits';
import { lowestMultiplicity } from '../../chemistry/spin';
import type { FragmentAst, TierAst } from '../ast';
import type { TierLevel } from '../vocabulary';
import { countedAtom, electronCount } from './basis';
import type { Selection } from './selectors';
import type { ActiveChoiceAst } from '../ast';
import { aufbauOccupation, minimalValence, valenceShell } from '../../chemistry/atomicShells';
import { DEFAULT_OCCUPATION_WINDOW } from '../../chemistry/activeSpaceDefaults';
import { elementByNumber } from '../../chemistry/elements';
import type { CapRule } from '../../chemistry/capping';
import type { ActiveChoiceModel, CapModel, FragmentModel, ModelOptions, ShellChoice, TierModel } from './types';

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
  context: ChoiceContext = { choiceAtoms: [], qubitLimit: undefined, atomicNumbers: [] },
): FragmentModel {
  // Caps are hydrogens with their own basis: they count like any atom of the fragment.
  const members = [...atoms.map((atom) => counted[atom]!), ...capping.caps.map((cap) => countedAtom(elementByNumber(cap.z)!, cap.basis))];
  const charge = ast.charge?.value ?? 0;
  const multiplicity = ast.multiplicity?.value ?? lowestMultiplicity(electronCount(members, charge));
  const tier = ast.tier ? tierModel(ast.tier, multiplicity, defaultFrozenCore, options, { ...context, members, charge }) : undefined;
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

/** What a fragment's active-space suggestion needs from the whole spec. */
export interface ChoiceContext {
  /** Atoms of each group of `active shells` (resolved selectors, in group order). */
  readonly choiceAtoms: readonly (readonly number[])[];
  readonly qubitLimit: number | undefined;
  /** Atomic number of every atom of the spec. */
  readonly atomicNumbers: readonly number[];
}

function tierModel(
  ast: TierAst,
  multiplicity: number,
  defaultFrozenCore: boolean,
  options: ModelOptions,
  context: ChoiceContext & { members: readonly CountedAtom[]; charge: number },
): TierModel | undefined {
  if (!ast.level) return undefined;
  const level = ast.level.value;
  const method = ast.method?.value ?? DEFAULT_METHODS[level](multiplicity);
  const quantum = level === 'quantum';
  const activeChoice = ast.active?.choice ? choiceModel(ast.active.choice, context.choiceAtoms) : undefined;
  const given = ast.active?.electrons && ast.active.orbitals ? { electrons: ast.active.electrons.value, orbitals: ast.active.orbitals.value } : undefined;
  const active = given ?? (activeChoice ? estimatedActiveSpace(activeChoice, context, multiplicity) : undefined);
  return {
    level,
    method,
    methodGiven: ast.method !== undefined,
    ansatz: quantum ? (ast.ansatz?.value ?? (method === 'vqe' ? 'uccsd' : undefined)) : undefined,
    mapping: quantum ? ((ast.mapping?.value as Mapping | undefined) ?? options.defaultMapping ?? 'jordan-wigner') : undefined,
    active,
    activeSource: given ? 'given' : active ? 'estimated' : undefined,
    activeChoice,
    activeIrreps: ast.active && ast.active.irreps.length > 0 ? ast.active.irreps.map((irrep) => ({ label: irrep.label.value, count: irrep.count.value })) : undefined,
    activeOccupation:
      ast.active && (ast.active.occupied || ast.active.open)
        ? { doubly: (ast.active.occupied ?? []).map((e) => ({ label: e.label.value, count: e.count.value })), singly: (ast.active.open ?? []).map((e) => ({ label: e.label.value, count: e.count.value })) }
        : undefined,
    frozenCore: ast.frozenCore?.value ?? defaultFrozenCore,
    taper: ast.taper?.value ?? false,
    layers: ast.layers?.value ?? 1,
    ast,
  };
}

function choiceModel(choice: ActiveChoiceAst, choiceAtoms: readonly (readonly number[])[]): ActiveChoiceModel {
  if (choice.kind === 'natural') return { kind: 'natural', window: choice.window ? { low: choice.window.low.value, high: choice.window.high.value } : DEFAULT_OCCUPATION_WINDOW };
  const seen = new Set<string>();
  const shells: ShellChoice[] = [];
  choice.groups.forEach((group, g) => {
    for (const atom of choiceAtoms[g] ?? []) {
      for (const shell of group.shells) {
        const key = `${atom}:${shell.n}:${shell.l}`;
        if (seen.has(key)) continue;
        seen.add(key);
        shells.push({ atom, n: shell.n, l: shell.l, span: shell.span, groupSpan: group.span });
      }
    }
  });
  return { kind: 'shells', shells };
}

/**
 * The counts a suggestion is planned with before its orbitals exist (a planning estimate): for
 * named shells, 2l + 1 orbitals per shell holding the free atom's aufbau electrons
 * (chemistry/atomicShells.ts); for natural occupations, the minimal-basis valence space of the
 * fragment. Both are fitted to the qubit limit (two qubits per orbital), and the electron count is
 * kept of the fragment's parity and within what the orbitals hold.
 */
function estimatedActiveSpace(choice: ActiveChoiceModel, context: ChoiceContext & { members: readonly CountedAtom[]; charge: number }, multiplicity: number): { electrons: number; orbitals: number } | undefined {
  let electrons = 0;
  let orbitals = 0;
  if (choice.kind === 'shells') {
    for (const shell of choice.shells) {
      const z = context.atomicNumbers[shell.atom];
      if (z === undefined) continue;
      const n = shell.n ?? valenceShell(z, shell.l);
      if (n === undefined) continue;
      orbitals += 2 * shell.l + 1;
      electrons += aufbauOccupation(z, n, shell.l);
    }
  } else {
    for (const atom of context.members) {
      const valence = minimalValence(atom.z);
      electrons += valence.electrons;
      orbitals += valence.orbitals;
    }
    electrons -= context.charge;
  }
  if (orbitals === 0) return undefined;
  if (context.qubitLimit !== undefined) orbitals = Math.max(1, Math.min(orbitals, Math.floor(context.qubitLimit / 2)));
  const total = electronCount(context.members, context.charge);
  const unpaired = multiplicity - 1;
  electrons = Math.max(unpaired, Math.min(electrons, 2 * orbitals - unpaired, total));
  if ((total - electrons) % 2 !== 0) electrons = electrons > unpaired ? electrons - 1 : electrons + 1;
  return { electrons: Math.max(0, electrons), orbitals };
}
