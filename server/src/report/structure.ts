/**
 * Plain data for pictures and hand-off: atoms with their fragment, bonds (cut ones marked),
 * fragment colours and cost labels, the scan with the atoms it moves, and the growth of a
 * fragment's cost with its active-space size. The structure view, the plots and the exports read it.
 */
import { countPauliTerms } from '../chemistry/estimate/pauliTerms';
import { symmetryPattern } from '../chemistry/estimate/integralPattern';
import { apportion, spreadIrreps } from '../chemistry/estimate/plan';
import { taperQubits } from '../chemistry/estimate/tapering';
import { bondedGroup } from '../chemistry/scan';
import type { Analysis } from '../language/analyze';
import { estimatesOf, planSymmetry } from '../language/estimates';
import type { SpecModel } from '../language/model';
import type { EstimateReport } from './estimate';

/** Fragment colours of our own palette, chosen to stay apart for the colour-blind (no source). */
export const FRAGMENT_COLOURS = ['#e69f00', '#0072b2', '#009e73', '#cc79a7', '#56b4e9', '#d55e00', '#f0e442', '#7f7f7f'];
export const UNASSIGNED_COLOUR = '#bbbbbb';

export interface StructureAtom {
  index: number;
  element: string;
  label: string | null;
  x: number;
  y: number;
  z: number;
  /** Index into `fragments`, or −1 for an atom in no fragment. */
  fragment: number;
  /** Zero-based line of the atom in the spec, or −1 for atoms read from an XYZ file. */
  line: number;
}

export interface StructureData {
  spec: string | null;
  atoms: StructureAtom[];
  fragments: { name: string; tier: string | null; colour: string; cost: string; atoms: number; line: number }[];
  bonds: { i: number; j: number; cut: boolean }[];
  scan: { first: number; second: number; distances: number[]; moving: number[] } | null;
}

/** The atoms a scan moves: the second atom's fragment, or its bonded group without fragments. */
export function scanMovingAtoms(model: SpecModel): number[] {
  const scan = model.scan;
  if (!scan) return [];
  const owner = model.owner[scan.second] ?? -1;
  if (owner >= 0) return [...model.fragments[owner]!.atoms];
  return bondedGroup(model.atoms.length, model.contacts.bonds, scan.first, scan.second);
}

function costLabel(report: EstimateReport, index: number): string {
  const fragment = report.fragments[index]!;
  if (fragment.qubitsRequired !== null) return `${fragment.qubitsRequired} qubits`;
  return `${fragment.orbitals} orbitals`;
}

export function structureData(analysis: Analysis, report: EstimateReport): StructureData {
  const { model } = analysis;
  const atoms: StructureAtom[] = model.atoms.map((atom) => ({
    index: atom.index,
    element: atom.element.symbol,
    label: atom.label ?? null,
    x: model.coordinates[3 * atom.index]!,
    y: model.coordinates[3 * atom.index + 1]!,
    z: model.coordinates[3 * atom.index + 2]!,
    fragment: model.owner[atom.index] ?? -1,
    line: atom.source ? -1 : analysis.lines.positionAt(atom.span.start).line,
  }));
  const bonds = model.contacts.bonds.map(({ i, j }) => {
    const a = model.owner[i] ?? -1;
    const b = model.owner[j] ?? -1;
    return { i, j, cut: a >= 0 && b >= 0 && a !== b };
  });
  return {
    spec: model.name ?? null,
    atoms,
    fragments: model.fragments.map((fragment, index) => ({
      name: fragment.name,
      tier: fragment.tier?.level ?? null,
      colour: FRAGMENT_COLOURS[index % FRAGMENT_COLOURS.length]!,
      cost: costLabel(report, index),
      atoms: fragment.atoms.length,
      line: analysis.lines.positionAt(fragment.ast.statement.span.start).line,
    })),
    bonds,
    scan: model.scan ? { first: model.scan.first, second: model.scan.second, distances: [...model.scan.distances], moving: scanMovingAtoms(model) } : null,
  };
}

export interface GrowthPoint {
  orbitals: number;
  qubits: number;
  tapered: number;
  pauliTerms: number;
}

/**
 * How qubits and Pauli terms grow with the active space of a fragment: n = 1 … the solver's
 * problem size (at most 60), half filled, irreps in proportion to the fragment's.
 */
export function activeSpaceGrowth(analysis: Analysis, fragmentIndex: number, maxOrbitals = 60): GrowthPoint[] {
  const estimates = estimatesOf(analysis.model);
  const plan = estimates.fragment(fragmentIndex);
  if (!plan) return [];
  const symmetry = planSymmetry(estimates.fragmentSymmetry(fragmentIndex));
  const unpaired = analysis.model.fragments[fragmentIndex]!.multiplicity - 1;
  const points: GrowthPoint[] = [];
  for (let n = 1; n <= Math.min(plan.problem.orbitals, maxOrbitals); n++) {
    let electrons = n + ((n - unpaired) % 2 === 0 ? 0 : 1);
    if ((electrons + unpaired) / 2 > n) electrons -= 2;
    if (electrons < unpaired) continue;
    const alpha = (electrons + unpaired) / 2;
    const beta = (electrons - unpaired) / 2;
    const irreps = Uint8Array.from(spreadIrreps(symmetry ? apportion(symmetry.available, n) : [{ label: 'A', mask: 0, count: n }]));
    points.push({
      orbitals: n,
      qubits: 2 * n,
      tapered: taperQubits(irreps, symmetry?.generatorCount ?? 0, { alpha, beta }).tapered,
      pauliTerms: countPauliTerms(symmetryPattern(irreps), { alpha, beta }).jordanWigner,
    });
  }
  return points;
}
