/**
 * Input records for quantum-chemistry engines: one QCSchema input record (`schema_name`
 * "qcschema_input", version 1, as QCElemental's AtomicInput defines it) per fragment with a tier
 * and, when the spec scans, per fragment and scan point. The molecule of each record is the
 * fragment with its hydrogen caps (report/export/qcschema.ts), geometry in bohr.
 *
 * Layout of the exported document (stable; `format_version` changes when it does):
 *
 *   { format: "tessera-qcschema-input-export", format_version: 1, spec,
 *     manifest: [{ record, id, fragment, fragment_index, scan_point, scan_value, scan_unit, distance_angstrom, driver, method, basis, caps }, ...],
 *     skipped: [{ fragment, reason }, ...],
 *     records: [<qcschema_input>, ...] }
 *
 * `manifest[k]` describes `records[k]`. What a record asks for:
 *
 * - `driver` "energy": the fragment energy is what a fragment plan needs at every point.
 * - `model.method`: a correlated tier's method as written (mp2, ccsd, ccsd(t), casci, casscf, fci);
 *   "hf" for a mean-field tier (the reference rhf/uhf/rohf in `keywords.reference`) and for a
 *   quantum tier, whose solver runs on the integrals of that mean field (the quantum method, ansatz,
 *   mapping, active space, tapering and layers are under `extras.tessera.tier`).
 * - `model.basis`: the basis name when every atom of the molecule (caps included) has the same
 *   basis. When override lines give atoms different bases, a QCSchema basis set (`qcschema_basis`)
 *   with one center per element and basis, holding its contracted shells and effective core
 *   potential from the library's data, and an `atom_map` over the molecule's atoms: the way
 *   QCSchema carries a per-atom basis.
 * - `keywords`: `reference` (rhf for a singlet, else uhf for correlated methods; the tier's own for a
 *   mean-field tier: common practice), `frozen_core`, and for casci/casscf `active_space`. QCSchema
 *   leaves keywords to each program; these are Tessera's names, for a driver to translate.
 * - `extras.tessera`: spec, fragment, tier (level, method, ansatz, mapping, active space as given,
 *   frozen core, taper, layers), the embedding, caps, and the scan point.
 */
import { scanFrames } from '../../chemistry/scan';
import { basisFigures, type DocumentAnalysis } from '../../analysis';
import { fragmentCapsAt, type CapModel, type FragmentModel } from '../../language/model';
import { loadBasisSetData, type ElementBasisData } from '../../electronic/basis/data';
import type { StructureData } from '../structure';
import { fragmentMolecule, scanPointExtras, tierExtras, type FragmentMoleculeContext, type QcMolecule, type QcProvenance, type ScanPointExtras, type TierExtras } from './qcschema';
import { coordinatesOf } from './xyz';

export const QCSCHEMA_INPUT_EXPORT_FORMAT = 'tessera-qcschema-input-export';
export const QCSCHEMA_INPUT_EXPORT_VERSION = 1;

export interface QcElectronShell {
  angular_momentum: number[];
  harmonic_type: 'spherical' | 'cartesian';
  exponents: number[];
  coefficients: number[][];
}

export interface QcEcpPotential {
  ecp_type: 'scalar';
  angular_momentum: number[];
  r_exponents: number[];
  gaussian_exponents: number[];
  coefficients: number[][];
}

export interface QcBasisCenter {
  electron_shells: QcElectronShell[];
  ecp_electrons?: number;
  ecp_potentials?: QcEcpPotential[];
}

export interface QcBasisSet {
  schema_name: 'qcschema_basis';
  schema_version: 1;
  name: string;
  description: string;
  center_data: Record<string, QcBasisCenter>;
  atom_map: string[];
}

export interface InputExtras {
  spec: string;
  fragment: string;
  fragment_index: number;
  tier: TierExtras;
  embedding: string;
  caps: number;
  scan_point: ScanPointExtras | null;
  /** The basis of each atom of the molecule, in its order (caps last). */
  atom_basis: (string | null)[];
}

export interface QcInputRecord {
  schema_name: 'qcschema_input';
  schema_version: 1;
  id: string;
  driver: 'energy';
  model: { method: string; basis: string | QcBasisSet };
  keywords: Record<string, unknown>;
  molecule: QcMolecule;
  provenance: QcProvenance;
  extras: { tessera: InputExtras };
}

export interface ManifestEntry {
  record: number;
  id: string;
  fragment: string;
  fragment_index: number;
  scan_point: number | null;
  /** The scanned coordinate's value at this point, in `scan_unit` (ångström or degrees). */
  scan_value: number | null;
  scan_unit: 'angstrom' | 'degree' | null;
  /** Distance scans only (null otherwise). */
  distance_angstrom: number | null;
  driver: 'energy';
  method: string;
  /** The basis name, or `per-atom (…)` naming the sets of a basis object. */
  basis: string;
  caps: number;
}

export interface QcInputExport {
  format: typeof QCSCHEMA_INPUT_EXPORT_FORMAT;
  format_version: typeof QCSCHEMA_INPUT_EXPORT_VERSION;
  spec: string;
  manifest: ManifestEntry[];
  /** Fragments without a record, and why. */
  skipped: { fragment: string; reason: string }[];
  records: QcInputRecord[];
}

export interface QcInputExportOptions {
  readonly title: string;
  readonly version: string;
}

/** The basis data of a set cannot be read, so a per-atom basis cannot be written. */
export class InputExportError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InputExportError';
  }
}

/** QCSchema's method and Tessera's keywords for a fragment's tier. */
function methodAndKeywords(fragment: FragmentModel): { method: string; keywords: Record<string, unknown> } {
  const tier = fragment.tier!;
  const singlet = fragment.multiplicity === 1;
  const frozen = { frozen_core: tier.frozenCore };
  switch (tier.level) {
    case 'mean-field':
      return { method: 'hf', keywords: { reference: tier.method, ...frozen } };
    case 'correlated': {
      const active = (tier.method === 'casci' || tier.method === 'casscf') && tier.active ? { active_space: { electrons: tier.active.electrons, orbitals: tier.active.orbitals } } : {};
      return { method: tier.method, keywords: { reference: singlet ? 'rhf' : 'uhf', ...frozen, ...active } };
    }
    case 'quantum':
      return { method: 'hf', keywords: { reference: singlet ? 'rhf' : 'uhf', ...frozen } };
  }
}

/**
 * The basis of a molecule: a name when all its atoms share one set, else a QCSchema basis set with
 * a center per (set, element). `sets` holds each atom's library key and display name.
 */
function moleculeBasis(symbols: readonly string[], sets: readonly { key: string; name: string }[], functions: 'spherical' | 'cartesian'): string | QcBasisSet {
  const names = [...new Set(sets.map((set) => set.name))];
  if (names.length === 1) return names[0]!;
  const centerData: Record<string, QcBasisCenter> = {};
  const atomMap = symbols.map((symbol, k) => {
    const set = sets[k]!;
    const centre = `${set.key}_${symbol.toLowerCase()}`;
    if (!centerData[centre]) centerData[centre] = basisCenter(set.key, set.name, symbol, functions);
    return centre;
  });
  return {
    schema_name: 'qcschema_basis',
    schema_version: 1,
    name: names.join(' + '),
    description: `Per-atom basis from the spec's override lines: ${names.join(', ')} (exponents and contraction coefficients as the library holds them, unnormalised)`,
    center_data: centerData,
    atom_map: atomMap,
  };
}

function basisCenter(key: string, name: string, symbol: string, functions: 'spherical' | 'cartesian'): QcBasisCenter {
  let element: ElementBasisData | undefined;
  try {
    element = loadBasisSetData(key).elements.get(symbol);
  } catch (error) {
    throw new InputExportError(`the exponents of basis set '${name}' cannot be read (${error instanceof Error ? error.message : String(error)}), so the per-atom basis cannot be written.`);
  }
  if (!element) throw new InputExportError(`basis set '${name}' has no functions for ${symbol}.`);
  const center: QcBasisCenter = {
    electron_shells: element.shells.map((shell) => ({ angular_momentum: [shell.l], harmonic_type: functions, exponents: [...shell.exponents], coefficients: [[...shell.coefficients]] })),
  };
  if (element.ecp) {
    // The library's channels as psi4's data prints them: l = −1 is the local channel, which
    // QCSchema (as the Basis Set Exchange writes it) files under the angular momentum one above the
    // highest projector; r_exponents are the n of r^(n−2).
    const projectors = element.ecp.channels.filter((channel) => channel.l >= 0);
    const localL = projectors.reduce((high, channel) => Math.max(high, channel.l + 1), 0);
    center.ecp_electrons = element.ecp.coreElectrons;
    center.ecp_potentials = element.ecp.channels.map((channel) => ({
      ecp_type: 'scalar',
      angular_momentum: [channel.l < 0 ? localL : channel.l],
      r_exponents: [...channel.powers],
      gaussian_exponents: [...channel.exponents],
      coefficients: [[...channel.coefficients]],
    }));
  }
  return center;
}

/** Builds the export. The spec should be free of errors: the CLI refuses to export one that is not. */
export function buildQcInputExport(analysis: DocumentAnalysis, data: StructureData, options: QcInputExportOptions): QcInputExport {
  const { model } = analysis;
  const named = basisFigures(analysis);
  const provenance: QcProvenance = { creator: 'Tessera', version: options.version, routine: 'tessera export --to qcschema-input' };
  const context: FragmentMoleculeContext = { analysis, data, title: options.title, provenance, basis: { name: named.name, overrides: named.overrides.map((line) => ({ ...line })), functions: named.functions } };
  const coordinates = coordinatesOf(data);
  const scan = data.scan;
  const frames = scan ? scanFrames(coordinates, scan, scan.moving, scan.values) : [];
  const points: { coordinates: Float64Array; point: InputExtras['scan_point'] }[] =
    scan && frames.length > 0 ? frames.map((frame, k) => ({ coordinates: frame.coordinates, point: scanPointExtras(k + 1, frames.length, scan.coordinate, frame.value) })) : [{ coordinates, point: null }];

  const records: QcInputRecord[] = [];
  const manifest: ManifestEntry[] = [];
  const skipped: QcInputExport['skipped'] = [];
  for (const fragment of model.fragments) {
    if (!fragment.tier) skipped.push({ fragment: fragment.name, reason: 'no tier: the spec names no method for it' });
  }
  for (const { coordinates: frame, point } of points) {
    model.fragments.forEach((fragment, index) => {
      if (!fragment.tier) return;
      const caps: readonly CapModel[] = point ? fragmentCapsAt(model, index, frame) : fragment.caps;
      const id = point ? `${fragment.name}@scan-${point.point}` : fragment.name;
      const molecule = fragmentMolecule(context, index, frame, caps, point ? { scan_point: point } : {}, `${options.title}/${id}`);
      const sets = [...fragment.atoms.map((atom) => model.basis.atomSets[atom]), ...caps.map((cap) => cap.basis)].map((set) => ({ key: set?.key ?? '', name: set?.displayName ?? '' }));
      const basis = moleculeBasis(molecule.symbols, sets, model.basis.functions);
      const { method, keywords } = methodAndKeywords(fragment);
      records.push({
        schema_name: 'qcschema_input',
        schema_version: 1,
        id,
        driver: 'energy',
        model: { method, basis },
        keywords,
        molecule,
        provenance,
        extras: {
          tessera: {
            spec: options.title,
            fragment: fragment.name,
            fragment_index: index,
            tier: tierExtras(fragment.tier)!,
            embedding: model.embedding,
            caps: caps.length,
            scan_point: point,
            atom_basis: sets.map((set) => set.name || null),
          },
        },
      });
      manifest.push({
        record: records.length - 1,
        id,
        fragment: fragment.name,
        fragment_index: index,
        scan_point: point?.point ?? null,
        scan_value: point?.value ?? null,
        scan_unit: point?.unit ?? null,
        distance_angstrom: point?.distance_angstrom ?? null,
        driver: 'energy',
        method,
        basis: typeof basis === 'string' ? basis : `per-atom (${basis.name})`,
        caps: caps.length,
      });
    });
  }
  return { format: QCSCHEMA_INPUT_EXPORT_FORMAT, format_version: QCSCHEMA_INPUT_EXPORT_VERSION, spec: options.title, manifest, skipped, records };
}
