/**
 * The two choices made in canonical orbitals alone.
 *
 * `Ne No` (canonicalWindow): the doubly occupied orbitals lowest in energy are frozen until Ne
 * electrons remain; the remaining occupied orbitals (the Ne/2 highest for a closed shell) and the
 * lowest virtual orbitals fill the No active orbitals. In ROHF orbitals the singly occupied orbitals
 * count among the remaining occupied ones, so for a doublet `3e 3o` holds one doubly occupied, the
 * singly occupied and one virtual orbital. Orbital energies are the reference's (for ROHF, those of
 * its canonicalisation, scf/engine.ts).
 *
 * Per irrep (irrepWindow): for every irrep Γ the spec gives k_Γ orbitals; its singly occupied
 * orbitals come first, the rest are its highest doubly occupied and lowest virtual orbitals,
 * contiguous in that irrep, split so that the chosen orbitals lie nearest the Fermi level
 * ε_F = ½(ε_HOMO + ε_LUMO): the total Σ|ε − ε_F| is smallest. With Ne given, the doubly occupied
 * orbitals taken over all irreps number (Ne − singly occupied)/2. Each step (one more occupied, one
 * fewer virtual orbital in an irrep) costs d(next occupied) − d(last virtual), which grows with
 * every step in the same irrep, so taking the cheapest step each time is optimal.
 */
import { degenerateSplitNote, degenerateSplits } from './degenerate';
import { assembleSelection } from './describe';
import { canonicalOrbitals, orbitalsHolding, type CanonicalOrbitals, type SelectionReference } from './reference';
import { ActiveSelectionError, type ActiveSelection } from './selection';

export function canonicalWindow(reference: SelectionReference, activeElectrons: number, activeOrbitals: number): ActiveSelection {
  const orbitals = canonicalOrbitals(reference);
  const { alpha, beta } = orbitals.electrons;
  const total = alpha + beta;
  const name = `${activeElectrons}e ${activeOrbitals}o`;
  if (!Number.isInteger(activeElectrons) || activeElectrons < 0 || activeElectrons > total) throw new ActiveSelectionError(`The active space ${name} asks for ${activeElectrons} electrons; the part has ${total}.`);
  if ((total - activeElectrons) % 2 !== 0) throw new ActiveSelectionError(`The active space ${name} leaves ${total - activeElectrons} electrons outside it, an odd number that cannot fill doubly occupied orbitals.`);
  const nc = (total - activeElectrons) / 2;
  if (nc > beta) throw new ActiveSelectionError(`The active space ${name} would freeze ${nc} doubly occupied orbitals, but the part has only ${beta}; the ${alpha - beta} singly occupied orbitals must be active.`);
  const doubly = orbitalsHolding(orbitals, 2);
  const occupiedAbove = [...doubly.slice(nc), ...orbitalsHolding(orbitals, 1)];
  if (!Number.isInteger(activeOrbitals) || activeOrbitals < occupiedAbove.length) throw new ActiveSelectionError(`The active space ${name} needs at least ${occupiedAbove.length} orbitals to hold its occupied ones.`);
  const virtual = orbitalsHolding(orbitals, 0);
  const virtualCount = activeOrbitals - occupiedAbove.length;
  if (virtualCount > virtual.length) throw new ActiveSelectionError(`The active space ${name} needs ${virtualCount} virtual orbitals; the part has ${virtual.length}.`);
  const active = [...occupiedAbove, ...virtual.slice(0, virtualCount)].sort((a, b) => a - b);
  return finish(reference, orbitals, 'canonical-window', doubly.slice(0, nc), active);
}

export interface IrrepCount {
  readonly label: string;
  readonly count: number;
}

export function irrepWindow(reference: SelectionReference, counts: readonly IrrepCount[], activeElectrons?: number): ActiveSelection {
  const orbitals = canonicalOrbitals(reference);
  const M = orbitals.orbitalCount;
  const known = [...new Set(orbitals.irreps.filter((label): label is string => label !== null))];
  const resolve = (label: string): string => {
    const exact = known.find((k) => k === label) ?? known.find((k) => k.toLowerCase() === label.toLowerCase());
    if (!exact) throw new ActiveSelectionError(`The orbitals of this part have no irrep '${label}' (point group ${reference.pointGroup}: ${known.join(', ') || 'no labels'}).`);
    return exact;
  };
  const wanted = new Map<string, number>();
  for (const { label, count } of counts) {
    const irrep = resolve(label);
    wanted.set(irrep, (wanted.get(irrep) ?? 0) + count);
  }
  const fermi = fermiLevel(orbitals);
  const distance = (p: number) => Math.abs(orbitals.energies[p]! - fermi);
  const singly = orbitalsHolding(orbitals, 1);
  for (const p of singly) {
    const irrep = orbitals.irreps[p];
    if (irrep === null || irrep === undefined || !wanted.has(irrep)) throw new ActiveSelectionError(`The singly occupied orbital ${p + 1} (${irrep ?? 'no irrep'}) must be active, but the active space gives no ${irrep ?? 'unlabelled'} orbitals.`);
  }

  interface Plan { irrep: string; singly: number[]; doubly: number[]; virtual: number[]; rest: number; taken: number; max: number }
  const plans: Plan[] = [];
  for (const [irrep, k] of wanted) {
    const inIrrep = (occupation: number) => Array.from({ length: M }, (_, p) => p).filter((p) => orbitals.irreps[p] === irrep && orbitals.occupations[p] === occupation);
    const s = inIrrep(1);
    const doubly = inIrrep(2).reverse();
    const virtual = inIrrep(0);
    const rest = k - s.length;
    if (rest < 0) throw new ActiveSelectionError(`The active space gives ${k} ${irrep} orbitals, fewer than the ${s.length} singly occupied ones, which must be active.`);
    if (rest > doubly.length + virtual.length) throw new ActiveSelectionError(`The active space gives ${k} ${irrep} orbitals; this part has ${doubly.length + virtual.length + s.length} orbitals of that irrep.`);
    const min = Math.max(0, rest - virtual.length);
    plans.push({ irrep, singly: s, doubly, virtual, rest, taken: min, max: Math.min(rest, doubly.length) });
  }
  const step = (plan: Plan) => distance(plan.doubly[plan.taken]!) - distance(plan.virtual[plan.rest - plan.taken - 1]!);
  const singlyCount = singly.length;
  if (activeElectrons === undefined) {
    for (const plan of plans) while (plan.taken < plan.max && step(plan) < 0) plan.taken++;
  } else {
    const low = plans.reduce((sum, plan) => sum + plan.taken, 0);
    const high = plans.reduce((sum, plan) => sum + plan.max, 0);
    const doublyWanted = (activeElectrons - singlyCount) / 2;
    if (!Number.isInteger(doublyWanted) || doublyWanted < low || doublyWanted > high) {
      throw new ActiveSelectionError(`These irreps can hold ${2 * low + singlyCount} to ${2 * high + singlyCount} active electrons in steps of 2, not ${activeElectrons}.`);
    }
    for (let remaining = doublyWanted - low; remaining > 0; remaining--) {
      let best: Plan | undefined;
      for (const plan of plans) if (plan.taken < plan.max && (!best || step(plan) < step(best))) best = plan;
      best!.taken++;
    }
  }
  const active = plans.flatMap((plan) => [...plan.singly, ...plan.doubly.slice(0, plan.taken), ...plan.virtual.slice(0, plan.rest - plan.taken)]).sort((a, b) => a - b);
  const chosen = new Set(active);
  const core = orbitalsHolding(orbitals, 2).filter((p) => !chosen.has(p));
  return finish(reference, orbitals, 'irrep-window', core, active);
}

/** Midway between the highest occupied and the lowest empty orbital. */
function fermiLevel(orbitals: CanonicalOrbitals): number {
  let homo = -Infinity;
  let lumo = Infinity;
  for (let p = 0; p < orbitals.orbitalCount; p++) {
    const e = orbitals.energies[p]!;
    if (orbitals.occupations[p]! > 0) homo = Math.max(homo, e);
    else lumo = Math.min(lumo, e);
  }
  if (!Number.isFinite(homo)) return lumo;
  if (!Number.isFinite(lumo)) return homo;
  return (homo + lumo) / 2;
}

function finish(reference: SelectionReference, orbitals: CanonicalOrbitals, source: 'canonical-window' | 'irrep-window', core: readonly number[], active: readonly number[]): ActiveSelection {
  const degenerate = degenerateSplitNote(degenerateSplits(orbitals.energies, orbitals.occupations, active));
  return assembleSelection(reference, {
    ...(degenerate ? { notes: [degenerate] } : {}),
    source,
    orbitalKind: 'canonical',
    orbitals: { functionCount: orbitals.functionCount, orbitalCount: orbitals.orbitalCount, coefficients: orbitals.coefficients },
    core,
    active,
    energies: orbitals.energies,
    occupations: orbitals.occupations,
    irreps: orbitals.irreps,
    totalElectrons: orbitals.electrons,
  });
}
