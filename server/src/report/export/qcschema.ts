/**
 * The geometry and partition of a spec as QCSchema molecules (MolSSI QCSchema, `qcschema_molecule`
 * version 2): the system with its fragments, one molecule per fragment, and one system molecule per
 * scan point. Geometry is in bohr, QCSchema's unit.
 *
 * Layout of the exported document (stable; `format_version` changes when it does):
 *
 *   { format: "tessera-qcschema-export", format_version: 1, spec,
 *     system: <molecule>, fragments: [<molecule>, ...],
 *     scan: null | { coordinate, atoms, first_atom, second_atom, moving_atoms, values, unit,
 *                    distances_angstrom (distance scans only), molecules: [<molecule>, ...] } }
 *
 * `coordinate` is "distance", "angle" or "dihedral"; `atoms` the named atoms in order (the vertex in
 * the middle of an angle), `second_atom` the last of them (the one that moves); `values` one per
 * point, in `unit` ("angstrom" for a distance, "degree" for an angle or dihedral).
 *
 * Atom order: QCSchema lists the atoms of each fragment contiguously, fragments in order (the
 * reference implementation, QCElemental, refuses fragments it would have to reorder), so the
 * system molecule groups its atoms by fragment, in the spec's fragment order and, inside a
 * fragment, in the spec's atom order. `extras.tessera.spec_atom_numbers` gives each atom's number
 * in the spec (1-based, as `#n`). Indices in `fragments`, `cut_bonds` and `scan` are 0-based
 * positions in the exported system molecule.
 *
 * What QCSchema has no field for (the basis, the tiers, the embedding, cut bonds) sits under
 * `extras.tessera`, the place the schema leaves for a producer's own data.
 *
 * A fragment that caps its cut bonds (`caps hydrogen …`) lists its hydrogen caps after its own
 * atoms, with the label `cap`; `extras.tessera.caps` says which bond each one caps (`spec_atom_numbers`
 * covers the fragment's own atoms only). The system and scan-point molecules carry no caps.
 */
import { eachScanFrame, SCAN_UNITS, type ScanCoordinate } from '../../chemistry/scan';
import { safeJsonStringify } from '../../language/printable';
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import { elementBySymbol } from '../../chemistry/elements';
import { basisFigures, type DocumentAnalysis } from '../../analysis';
import type { CapModel, TierModel } from '../../language/model';
import type { StructureData } from '../structure';
import { coordinatesOf } from './xyz';

export const QCSCHEMA_EXPORT_FORMAT = 'tessera-qcschema-export';
export const QCSCHEMA_EXPORT_VERSION = 1;

export interface QcProvenance {
  creator: string;
  version: string;
  routine: string;
}

export interface TierExtras {
  level: string;
  method: string;
  ansatz: string | null;
  mapping: string | null;
  /** The active space as the spec gives it, or null when it gives none. */
  active: { electrons: number; orbitals: number } | null;
  active_irreps: Record<string, number> | null;
  frozen_core: boolean;
  taper: boolean;
  layers: number;
}

export interface BasisExtras {
  name: string | null;
  /** The `basis <name> on …` lines that decide atoms: the basis, the selection as written, how many atoms. */
  overrides: { basis: string; on: string; atoms: number }[];
  functions: 'spherical' | 'cartesian';
}

export interface TesseraExtras {
  spec: string;
  part: 'system' | 'fragment' | 'scan-point';
  spec_atom_numbers: number[];
  basis: BasisExtras;
  /** The basis set of each atom of this molecule, in its atom order (null where the spec names none). */
  atom_basis: (string | null)[];
  frozen_core: boolean;
  embedding?: string;
  fragments?: { name: string; tier: TierExtras | null }[];
  cut_bonds?: [number, number][];
  fragment?: string;
  fragment_index?: number;
  tier?: TierExtras | null;
  scan_point?: ScanPointExtras;
  /** The fragment's hydrogen caps, after its atoms: the bond each caps (spec numbers `#n`), rule, X–H length. */
  caps?: CapExtras[];
}

export interface CapExtras {
  host_atom: number;
  partner_atom: number;
  rule: string;
  length_angstrom: number;
}

/** Label of a cap atom in exported molecules. */
export const CAP_LABEL = 'cap';

/** The caps of a fragment as extras (spec atom numbers are 1-based). */
export function capExtras(caps: readonly CapModel[]): CapExtras[] {
  return caps.map((cap) => ({ host_atom: cap.host + 1, partner_atom: cap.partner + 1, rule: cap.rule, length_angstrom: cap.length }));
}

export interface QcMolecule {
  schema_name: 'qcschema_molecule';
  schema_version: 2;
  name: string;
  comment?: string;
  symbols: string[];
  /** Flat x, y, z per atom, in bohr. */
  geometry: number[];
  atomic_numbers: number[];
  atom_labels: string[];
  molecular_charge: number;
  molecular_multiplicity: number;
  fragments?: number[][];
  fragment_charges?: number[];
  fragment_multiplicities?: number[];
  fix_com: true;
  fix_orientation: true;
  provenance: QcProvenance;
  extras: { tessera: TesseraExtras };
}

export interface QcSchemaExport {
  format: typeof QCSCHEMA_EXPORT_FORMAT;
  format_version: typeof QCSCHEMA_EXPORT_VERSION;
  spec: string;
  system: QcMolecule;
  fragments: QcMolecule[];
  scan: {
    coordinate: ScanCoordinate;
    atoms: number[];
    first_atom: number;
    second_atom: number;
    moving_atoms: number[];
    values: number[];
    unit: 'angstrom' | 'degree';
    distances_angstrom?: number[];
    molecules: QcMolecule[];
  } | null;
}

export interface QcSchemaExportOptions {
  /** The spec's name, else its file name. */
  readonly title: string;
  readonly version: string;
  /** The routine recorded in provenance. */
  readonly routine?: string;
}

export function tierExtras(tier: TierModel | undefined): TierExtras | null {
  if (!tier) return null;
  return {
    level: tier.level,
    method: tier.method,
    ansatz: tier.ansatz ?? null,
    mapping: tier.mapping ?? null,
    active: tier.active ? { electrons: tier.active.electrons, orbitals: tier.active.orbitals } : null,
    active_irreps: tier.activeIrreps ? Object.fromEntries(tier.activeIrreps.map((irrep) => [irrep.label, irrep.count])) : null,
    frozen_core: tier.frozenCore,
    taper: tier.taper,
    layers: tier.layers,
  };
}

/** The exported order of the spec's atoms: grouped by fragment when the spec has fragments. */
export function qcAtomOrder(data: StructureData, fragmentAtoms: readonly (readonly number[])[]): number[] {
  if (fragmentAtoms.length === 0) return data.atoms.map((_, i) => i);
  const order = fragmentAtoms.flatMap((atoms) => [...atoms]);
  // Atoms in no fragment (only possible in a spec with errors, which is not exported) go last.
  const placed = new Uint8Array(data.atoms.length);
  for (const atom of order) placed[atom] = 1;
  data.atoms.forEach((_, i) => {
    if (!placed[i]) order.push(i);
  });
  return order;
}

function toBohr(value: number): number {
  return value / BOHR_IN_ANGSTROM;
}

/** A scan point as the exports describe it: its number, the coordinate's value and unit (and the distance under its old key). */
export interface ScanPointExtras {
  point: number;
  points: number;
  coordinate: ScanCoordinate;
  value: number;
  unit: 'angstrom' | 'degree';
  /** Distance scans only. */
  distance_angstrom?: number;
}

export function scanPointExtras(point: number, points: number, coordinate: ScanCoordinate, value: number): ScanPointExtras {
  return { point, points, coordinate, value, unit: SCAN_UNITS[coordinate], ...(coordinate === 'distance' ? { distance_angstrom: value } : {}) };
}

/** Builds the export. The spec should be free of errors: the CLI refuses to export one that is not. */
export function buildQcSchemaExport(analysis: DocumentAnalysis, data: StructureData, options: QcSchemaExportOptions): QcSchemaExport {
  const { head, scanMolecules } = qcSchemaExportParts(analysis, data, options);
  return head.scan ? { ...head, scan: { ...head.scan, molecules: [...scanMolecules] } } : head;
}

/**
 * The export in two parts: everything but the scan's molecules (`scan.molecules` empty), and those
 * molecules one at a time, each made when it is asked for, so that a scan of any length is written
 * with one point in memory (qcSchemaJsonChunks).
 */
export function qcSchemaExportParts(analysis: DocumentAnalysis, data: StructureData, options: QcSchemaExportOptions): { head: QcSchemaExport; scanMolecules: Iterable<QcMolecule> } {
  const named = basisFigures(analysis);
  const { model } = analysis;
  const provenance: QcProvenance = { creator: 'Tessera', version: options.version, routine: options.routine ?? 'tessera export --to qcschema' };
  const basis: BasisExtras = { name: named.name, overrides: named.overrides.map((line) => ({ ...line })), functions: named.functions };
  const basisOf = (atoms: readonly number[]) => atoms.map((atom) => model.basis.atomSets[atom]?.displayName ?? null);
  const fragmentAtoms = model.fragments.map((fragment) => fragment.atoms);
  const order = qcAtomOrder(data, fragmentAtoms);
  const position = new Int32Array(data.atoms.length).fill(-1);
  order.forEach((atom, k) => (position[atom] = k));
  const symbolsOf = (atoms: readonly number[]) => atoms.map((atom) => data.atoms[atom]!.element);
  const numbersOf = (atoms: readonly number[]) => atoms.map((atom) => elementBySymbol(data.atoms[atom]!.element)?.z ?? 0);
  const labelsOf = (atoms: readonly number[]) => atoms.map((atom) => data.atoms[atom]!.label ?? '');
  const geometryOf = (coordinates: Float64Array, atoms: readonly number[]) => atoms.flatMap((atom) => [0, 1, 2].map((k) => toBohr(coordinates[3 * atom + k]!)));
  const tiers = model.fragments.map((fragment) => tierExtras(fragment.tier));
  const partition =
    model.fragments.length > 0
      ? {
          fragments: fragmentAtoms.map((atoms) => atoms.map((atom) => position[atom]!)),
          fragment_charges: model.fragments.map((fragment) => fragment.charge),
          fragment_multiplicities: model.fragments.map((fragment) => fragment.multiplicity),
        }
      : {};
  const coordinates = coordinatesOf(data);

  const systemMolecule = (name: string, frame: Float64Array, extras: Partial<TesseraExtras>, part: TesseraExtras['part']): QcMolecule => ({
    schema_name: 'qcschema_molecule',
    schema_version: 2,
    name,
    symbols: symbolsOf(order),
    geometry: geometryOf(frame, order),
    atomic_numbers: numbersOf(order),
    atom_labels: labelsOf(order),
    molecular_charge: model.charge,
    molecular_multiplicity: model.multiplicity,
    ...partition,
    fix_com: true,
    fix_orientation: true,
    provenance,
    extras: {
      tessera: {
        spec: options.title,
        part,
        spec_atom_numbers: order.map((atom) => atom + 1),
        basis,
        atom_basis: basisOf(order),
        frozen_core: model.frozenCore,
        embedding: model.embedding,
        fragments: model.fragments.map((fragment, index) => ({ name: fragment.name, tier: tiers[index]! })),
        ...extras,
      },
    },
  });

  const cutBonds = data.bonds
    .filter((bond) => bond.cut)
    .map((bond) => [position[bond.i]!, position[bond.j]!].sort((a, b) => a - b) as [number, number])
    .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const system = systemMolecule(options.title, coordinates, { cut_bonds: cutBonds }, 'system');

  const context: FragmentMoleculeContext = { analysis, data, title: options.title, provenance, basis };
  const fragments = model.fragments.map((fragment, index) => fragmentMolecule(context, index, coordinates, fragment.caps));

  let scan: QcSchemaExport['scan'] = null;
  let scanMolecules: Iterable<QcMolecule> = [];
  if (data.scan) {
    const { coordinate, values } = data.scan;
    const frames = eachScanFrame(coordinates, data.scan, data.scan.moving, values);
    const points = values.length;
    scan = {
      coordinate,
      atoms: data.scan.atoms.map((atom) => position[atom]!),
      first_atom: position[data.scan.first]!,
      second_atom: position[data.scan.second]!,
      moving_atoms: data.scan.moving.map((atom) => position[atom]!).sort((a, b) => a - b),
      values: [...values],
      unit: SCAN_UNITS[coordinate],
      ...(coordinate === 'distance' ? { distances_angstrom: [...values] } : {}),
      molecules: [],
    };
    scanMolecules = (function* molecules(): Generator<QcMolecule> {
      let k = 0;
      for (const frame of frames) {
        k++;
        yield systemMolecule(`${options.title}/scan-${k}`, frame.coordinates, { scan_point: scanPointExtras(k, points, coordinate, frame.value) }, 'scan-point');
      }
    })();
  }

  return { head: { format: QCSCHEMA_EXPORT_FORMAT, format_version: QCSCHEMA_EXPORT_VERSION, spec: options.title, system, fragments, scan }, scanMolecules };
}

/**
 * The export as JSON text (two-space indent, the same text as safeJsonStringify of
 * buildQcSchemaExport), in chunks: the head, then one chunk per scan molecule, then the end.
 */
export function qcSchemaJsonChunks(parts: { head: QcSchemaExport; scanMolecules: Iterable<QcMolecule> }): Iterable<string> {
  const { head, scanMolecules } = parts;
  return (function* chunks(): Generator<string> {
    if (!head.scan) {
      yield `${safeJsonStringify(head, 2)}\n`;
      return;
    }
    // The scan is the last key: its molecules array is written last, element by element.
    const text = safeJsonStringify(head, 2);
    const empty = '"molecules": []\n  }\n}';
    if (!text.endsWith(empty)) throw new Error('The scan molecules are not the last key of the QCSchema export.');
    yield `${text.slice(0, -empty.length)}"molecules": [`;
    let first = true;
    for (const molecule of scanMolecules) {
      yield `${first ? '' : ','}\n${safeJsonStringify(molecule, 2).replace(/\n/g, '\n      ').replace(/^/, '      ')}`;
      first = false;
    }
    yield first ? ']\n  }\n}\n' : '\n    ]\n  }\n}\n';
  })();
}

/** What every fragment molecule of one export shares. */
export interface FragmentMoleculeContext {
  readonly analysis: DocumentAnalysis;
  readonly data: StructureData;
  readonly title: string;
  readonly provenance: QcProvenance;
  readonly basis: BasisExtras;
}

/**
 * One fragment as a QCSchema molecule at the given coordinates of the spec's atoms (ångström):
 * its atoms in spec order, then its caps (placed for those coordinates), geometry in bohr.
 */
export function fragmentMolecule(context: FragmentMoleculeContext, index: number, coordinates: Float64Array, caps: readonly CapModel[], extras: Partial<TesseraExtras> = {}, name?: string): QcMolecule {
  const { analysis, data, title } = context;
  const model = analysis.model;
  const fragment = model.fragments[index]!;
  const atoms = fragment.atoms;
  const capped = caps.length > 0;
  return {
    schema_name: 'qcschema_molecule',
    schema_version: 2,
    name: name ?? `${title}/${fragment.name}`,
    comment: capped
      ? `Fragment '${fragment.name}' of '${title}': its atoms as placed in the system, then ${caps.length} hydrogen cap${caps.length === 1 ? '' : 's'} on its cut bonds (${fragment.capRule} placement).`
      : `Fragment '${fragment.name}' of '${title}': its atoms as placed in the system, without capping or link atoms at cut bonds.`,
    symbols: [...atoms.map((atom) => data.atoms[atom]!.element), ...caps.map(() => 'H')],
    geometry: [...atoms.flatMap((atom) => [0, 1, 2].map((k) => toBohr(coordinates[3 * atom + k]!))), ...caps.flatMap((cap) => cap.position.map(toBohr))],
    atomic_numbers: [...atoms.map((atom) => elementBySymbol(data.atoms[atom]!.element)?.z ?? 0), ...caps.map((cap) => cap.z)],
    atom_labels: [...atoms.map((atom) => data.atoms[atom]!.label ?? ''), ...caps.map(() => CAP_LABEL)],
    molecular_charge: fragment.charge,
    molecular_multiplicity: fragment.multiplicity,
    fix_com: true,
    fix_orientation: true,
    provenance: context.provenance,
    extras: {
      tessera: {
        spec: title,
        part: 'fragment',
        spec_atom_numbers: atoms.map((atom) => atom + 1),
        basis: context.basis,
        atom_basis: [...atoms.map((atom) => model.basis.atomSets[atom]?.displayName ?? null), ...caps.map((cap) => cap.basis?.displayName ?? null)],
        frozen_core: fragment.tier?.frozenCore ?? model.frozenCore,
        fragment: fragment.name,
        fragment_index: index,
        tier: tierExtras(fragment.tier),
        ...(capped ? { caps: capExtras(caps) } : {}),
        ...extras,
      },
    },
  };
}
