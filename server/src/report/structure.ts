/**
 * Plain data for pictures and hand-off: atoms with their fragment, bonds (cut ones marked),
 * fragment colours and cost labels, the scan with the atoms it moves (from the document's
 * analysis). The structure view and the exports read it.
 */
import type { DocumentAnalysis, FragmentFigures } from '../analysis';
import type { ScanCoordinate } from '../chemistry/scan';

/**
 * Fragment colours: the first seven are the colour-universal-design palette of Okabe & Ito,
 * "Color Universal Design (CUD): how to make figures and presentations that are friendly to
 * colorblind people" (2008, https://jfly.uni-koeln.de/color/), which stays distinguishable under the
 * common colour-vision deficiencies; the order is ours. The eighth, a mid grey, replaces the
 * palette's black, which would hide dark atoms.
 */
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

export interface StructureCap {
  fragment: number;
  host: number;
  partner: number;
  element: string;
  x: number;
  y: number;
  z: number;
}

export interface StructureData {
  spec: string | null;
  atoms: StructureAtom[];
  fragments: { name: string; tier: string | null; colour: string; cost: string; atoms: number; line: number }[];
  bonds: { i: number; j: number; cut: boolean }[];
  /** Hydrogen caps of cut bonds (model/caps.ts): the fragment that has it, its host atom, its position (Å). */
  caps: StructureCap[];
  /** `values` in ångström for a distance, degrees for an angle or dihedral; `atoms` all the named atoms, `second` the last. */
  scan: { coordinate: ScanCoordinate; atoms: number[]; first: number; second: number; values: number[]; moving: number[] } | null;
}

function costLabel(fragment: FragmentFigures): string {
  if (fragment.qubitsRequired !== null) return `${fragment.qubitsRequired} qubits`;
  return `${fragment.orbitals} orbitals`;
}

export function structureData(analysis: DocumentAnalysis): StructureData {
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
      cost: costLabel(analysis.fragmentFigures(index)),
      atoms: fragment.atoms.length,
      line: analysis.lines.positionAt(fragment.ast.statement.span.start).line,
    })),
    bonds,
    caps: model.fragments.flatMap((fragment, index) =>
      fragment.caps.map((cap) => ({ fragment: index, host: cap.host, partner: cap.partner, element: 'H', x: cap.position[0], y: cap.position[1], z: cap.position[2] })),
    ),
    scan: model.scan
      ? { coordinate: model.scan.coordinate, atoms: [...model.scan.atoms], first: model.scan.first, second: model.scan.second, values: [...model.scan.values], moving: analysis.scanMovingAtoms() }
      : null,
  };
}
