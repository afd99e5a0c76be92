/**
 * The semantic model: atoms in ångström, labels and selectors resolved, basis sets looked up,
 * defaults applied, and the orbital space of the system and of every fragment counted.
 */
import { findBasisSet, type BasisSet } from '../chemistry/basis/library';
import type { FunctionType } from '../chemistry/basis/shells';
import { countOrbitalSpace, type CountedAtom, type OrbitalSpace } from '../chemistry/counting';
import { elementBySymbol, type Element } from '../chemistry/elements';
import { analyseContacts, type ContactAnalysis } from '../chemistry/geometry';
import type { Mapping } from '../chemistry/qubits';
import { lowestMultiplicity } from '../chemistry/spin';
import { toAngstrom, type LengthUnit } from '../chemistry/units';
import type { AtomRef, FragmentAst, SelectorAst, SpecAst, TierAst } from './ast';
import type { DiagnosticSink } from './diagnostics';
import { resolveInclude, type FileHost } from './files';
import { suggest } from './suggest';
import type { Span } from './text';
import type { TierLevel } from './vocabulary';
import { parseXyz } from './xyz';

export interface AtomModel {
  /** Zero-based position in the geometry; users see index + 1 as `#n`. */
  readonly index: number;
  readonly element: Element;
  readonly label?: string;
  /** The atom's line in the spec, or the `geometry from` path for atoms read from a file. */
  readonly span: Span;
  readonly labelSpan?: Span;
  /** For atoms read from an XYZ file: that file and the zero-based line. */
  readonly source?: { readonly file: string; readonly line: number };
}

export interface TierModel {
  readonly level: TierLevel;
  readonly method: string;
  readonly methodGiven: boolean;
  readonly ansatz: string | undefined;
  readonly mapping: Mapping | undefined;
  readonly active: { readonly electrons: number; readonly orbitals: number } | undefined;
  /** Active orbitals per irrep label, when the spec gives them. */
  readonly activeIrreps: readonly { readonly label: string; readonly count: number }[] | undefined;
  readonly frozenCore: boolean;
  readonly taper: boolean;
  readonly layers: number;
  readonly ast: TierAst;
}

export interface FragmentModel {
  readonly index: number;
  readonly name: string;
  readonly ast: FragmentAst;
  /** Sorted, unique atom indices. */
  readonly atoms: number[];
  readonly claimsRest: boolean;
  readonly charge: number;
  readonly chargeGiven: boolean;
  readonly multiplicity: number;
  readonly multiplicityGiven: boolean;
  readonly tier: TierModel | undefined;
  readonly space: OrbitalSpace;
}

export interface BasisModel {
  readonly main: BasisSet | undefined;
  readonly overrides: ReadonlyMap<string, BasisSet>;
  readonly functions: FunctionType;
  readonly functionsGiven: boolean;
}

export interface ScanModel {
  readonly first: number;
  readonly second: number;
  /** Distances in ångström, one per point. */
  readonly distances: number[];
}

export interface SpecModel {
  readonly name: string | undefined;
  readonly units: LengthUnit;
  readonly atoms: AtomModel[];
  /** x, y, z of every atom in ångström. */
  readonly coordinates: Float64Array;
  readonly labels: ReadonlyMap<string, number>;
  readonly charge: number;
  readonly chargeGiven: boolean;
  readonly multiplicity: number;
  readonly multiplicityGiven: boolean;
  readonly frozenCore: boolean;
  readonly basis: BasisModel;
  readonly fragments: FragmentModel[];
  /** Per atom: the first fragment that claims it, or -1 when none does. */
  readonly owner: Int32Array;
  /** Atoms claimed by more than one fragment, with every claimant in fragment order. */
  readonly sharedAtoms: ReadonlyMap<number, number[]>;
  readonly embedding: string;
  readonly scan: ScanModel | undefined;
  /** `qubitsFromSpec` is false when the qubit limit is the caller's default (the spec sets none). */
  readonly limits: { readonly qubits?: number; readonly qubitsFromSpec: boolean; readonly memoryBytes?: number };
  readonly system: OrbitalSpace;
  readonly contacts: ContactAnalysis;
  /** Absolute paths of files read for this spec. */
  readonly includes: string[];
  /** Every place a selector or scan names an atom by label or #index, resolved. */
  readonly atomReferences: readonly AtomReference[];
}

export interface AtomReference {
  readonly atom: number;
  readonly span: Span;
  readonly kind: 'label' | 'index';
}

export interface ModelOptions {
  readonly path?: string;
  readonly files: FileHost;
  readonly defaultMapping?: Mapping;
  readonly defaultQubitLimit?: number;
}

const DEFAULT_METHODS: Record<TierLevel, (multiplicity: number) => string> = {
  quantum: () => 'vqe',
  correlated: () => 'ccsd',
  'mean-field': (multiplicity) => (multiplicity === 1 ? 'rhf' : 'rohf'),
};

export function buildModel(ast: SpecAst, sink: DiagnosticSink, options: ModelOptions): SpecModel {
  const units = ast.units?.value ?? 'angstrom';
  const includes: string[] = [];
  const atoms = readAtoms(ast, units, sink, options, includes);
  const coordinates = atoms.positions;
  const labels = new Map<string, number>();
  for (const atom of atoms.list) {
    if (!atom.label) continue;
    const previous = labels.get(atom.label);
    if (previous !== undefined) {
      const first = atoms.list[previous]!;
      sink.report('duplicate-label', atom.labelSpan ?? atom.span, `Label '${atom.label}' is already used by atom #${previous + 1}; labels name one atom each.`, {
        related: [{ span: first.labelSpan ?? first.span, message: `'${atom.label}' first used here` }],
      });
      continue;
    }
    labels.set(atom.label, atom.index);
  }
  const basis = resolveBasis(ast);
  const countedByElement = new Map<string, CountedAtom>();
  const counted = atoms.list.map((atom) => {
    let entry = countedByElement.get(atom.element.symbol);
    if (!entry) countedByElement.set(atom.element.symbol, (entry = countedAtom(atom.element, basis)));
    return entry;
  });
  const charge = ast.charge?.value ?? 0;
  const systemElectrons = electronCount(counted, charge);
  const multiplicity = ast.multiplicity?.value ?? lowestMultiplicity(systemElectrons);
  const frozenCore = ast.frozenCore?.value ?? true;
  const system = countOrbitalSpace({ atoms: counted, charge, multiplicity, functions: basis.functions, frozenCore });
  const radii = new Float64Array(atoms.list.map((atom) => atom.element.covalentRadius ?? 1.5));
  const contacts = analyseContacts(coordinates, radii);

  const resolver = new SelectorResolver(atoms.list, labels, coordinates, units, sink);
  const selections = ast.fragments.map((fragmentAst) => resolver.resolve(fragmentAst.atoms?.selectors ?? []));
  // `rest` takes every atom the other fragments leave; with two claimants the first one takes
  // them and the fragment checks report the second.
  const restOwner = selections.find((selection) => selection.claimsRest);
  if (restOwner) {
    const claimedElsewhere = new Uint8Array(atoms.list.length);
    for (const selection of selections) {
      if (selection !== restOwner) for (const atom of selection.atoms) claimedElsewhere[atom] = 1;
    }
    const own = new Uint8Array(atoms.list.length);
    for (const atom of restOwner.atoms) own[atom] = 1;
    const merged: number[] = [];
    for (let atom = 0; atom < atoms.list.length; atom++) if (own[atom] || !claimedElsewhere[atom]) merged.push(atom);
    restOwner.atoms = merged;
  }
  const owner = new Int32Array(atoms.list.length).fill(-1);
  const sharedAtoms = new Map<number, number[]>();
  selections.forEach((selection, index) => {
    for (const atom of selection.atoms) {
      const first = owner[atom]!;
      if (first < 0) owner[atom] = index;
      else {
        const claimants = sharedAtoms.get(atom);
        if (claimants) claimants.push(index);
        else sharedAtoms.set(atom, [first, index]);
      }
    }
  });
  const fragments = ast.fragments.map((fragmentAst, index) =>
    finishFragment(fragmentAst, index, selections[index]!, counted, basis.functions, frozenCore, options),
  );

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
    },
    system,
    contacts,
    includes,
    atomReferences: resolver.references,
  };
}

/** The fragments that claim an atom, in fragment order (usually one). */
export function claimsOf(model: SpecModel, atom: number): number[] {
  const shared = model.sharedAtoms.get(atom);
  if (shared) return shared;
  const first = model.owner[atom] ?? -1;
  return first >= 0 ? [first] : [];
}

function countedAtom(element: Element, basis: BasisModel): CountedAtom {
  const set = basis.overrides.get(element.symbol) ?? basis.main;
  return { z: element.z, shells: set?.shellsFor(element.symbol), ecpCoreElectrons: set?.ecpCoreElectrons(element.symbol) ?? 0 };
}

function electronCount(atoms: readonly CountedAtom[], charge: number): number {
  let electrons = -charge;
  for (const atom of atoms) electrons += atom.z - atom.ecpCoreElectrons;
  return electrons;
}

function resolveBasis(ast: SpecAst): BasisModel {
  const main = ast.basis?.name ? findBasisSet(ast.basis.name.value) : undefined;
  const overrides = new Map<string, BasisSet>();
  for (const override of ast.basis?.overrides ?? []) {
    const set = findBasisSet(override.basis.value);
    if (set) overrides.set(override.element.value, set);
  }
  const given = ast.basis?.functions?.value;
  return { main, overrides, functions: given ?? main?.functions ?? 'spherical', functionsGiven: given !== undefined };
}

function finishFragment(
  ast: FragmentAst,
  index: number,
  { atoms, claimsRest }: Selection,
  counted: readonly CountedAtom[],
  functions: FunctionType,
  defaultFrozenCore: boolean,
  options: ModelOptions,
): FragmentModel {
  const members = atoms.map((atom) => counted[atom]!);
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

interface ReadAtoms {
  readonly list: AtomModel[];
  /** x, y, z of every atom in ångström. */
  readonly positions: Float64Array;
}

function readAtoms(ast: SpecAst, units: LengthUnit, sink: DiagnosticSink, options: ModelOptions, includes: string[]): ReadAtoms {
  const list: AtomModel[] = [];
  const none = { list, positions: new Float64Array(0) };
  const geometry = ast.geometry;
  if (!geometry) return none;
  if (geometry.include) {
    const include = geometry.include;
    const resolved = resolveInclude(options.path, include.value, options.files);
    if (!resolved.ok) {
      sink.report('include-outside-folder', include.span, `Cannot read "${include.value}": ${resolved.reason}.`);
      return none;
    }
    includes.push(resolved.path);
    const read = options.files.readFile(resolved.path);
    if (!read.ok) {
      sink.report('include-unreadable', include.span, `Cannot read "${include.value}" (${resolved.path}): ${read.reason}.`);
      return none;
    }
    const xyz = parseXyz(read.text);
    for (const problem of xyz.problems) {
      sink.report('include-invalid', include.span, `"${include.value}" line ${problem.line + 1}: ${problem.message}`, {
        related: [{ span: { start: 0, end: 0 }, file: resolved.path, line: problem.line, message: problem.message }],
      });
    }
    if (xyz.frames > 1) {
      sink.report('include-invalid', include.span, `"${include.value}" holds ${xyz.frames} frames; the first one is the geometry.`, { severity: 'information' });
    }
    const positions = new Float64Array(3 * xyz.atoms.length);
    xyz.atoms.forEach((atom, i) => {
      const element = elementBySymbol(atom.symbol)!;
      list.push({ index: i, element, span: include.span, source: { file: resolved.path, line: atom.line } });
      positions.set([atom.x, atom.y, atom.z], 3 * i);
    });
    return { list, positions };
  }
  const atoms = geometry.atoms;
  const positions = new Float64Array(3 * atoms.length);
  for (let i = 0; i < atoms.length; i++) {
    const element = elementBySymbol(atoms.symbol(i))!;
    const label = atoms.label(i);
    const labelSpan = atoms.labelSpan(i);
    list.push(
      label !== undefined && labelSpan
        ? { index: i, element, label, span: atoms.span(i), labelSpan }
        : { index: i, element, span: atoms.span(i) },
    );
    for (let axis = 0; axis < 3; axis++) positions[3 * i + axis] = toAngstrom(atoms.coordinate(i, axis), units);
  }
  return { list, positions };
}

export interface Selection {
  atoms: number[];
  claimsRest: boolean;
}

/** Turns selectors into atom indices, reporting names and indices that do not exist. */
export class SelectorResolver {
  readonly references: AtomReference[] = [];

  constructor(
    private readonly atoms: readonly AtomModel[],
    private readonly labels: ReadonlyMap<string, number>,
    private readonly coordinates: Float64Array,
    private readonly units: LengthUnit,
    private readonly sink: DiagnosticSink,
  ) {}

  ref(ref: AtomRef): number | undefined {
    const atom = this.lookup(ref);
    if (atom !== undefined) this.references.push({ atom, span: ref.span, kind: ref.kind });
    return atom;
  }

  private lookup(ref: AtomRef): number | undefined {
    if (ref.kind === 'index') {
      if (ref.index >= 1 && ref.index <= this.atoms.length) return ref.index - 1;
      const count = this.atoms.length;
      this.sink.report('unknown-atom', ref.span, `There is no atom #${ref.index}: the geometry has ${count} atom${count === 1 ? '' : 's'} (#1 to #${count}).`);
      return undefined;
    }
    const found = this.labels.get(ref.name);
    if (found !== undefined) return found;
    const suggestion = suggest(ref.name, this.labels.keys());
    const element = elementBySymbol(ref.name);
    const hint = suggestion ? ` Did you mean '${suggestion}'?` : element ? ` To select every ${element.symbol} atom, write 'all ${element.symbol}'.` : '';
    this.sink.report('unknown-atom', ref.span, `No atom is labelled '${ref.name}'.${hint}`, suggestion ? { data: { replacement: suggestion } } : {});
    return undefined;
  }

  resolve(selectors: readonly SelectorAst[]): Selection {
    const chosen = new Set<number>();
    let claimsRest = false;
    for (const selector of selectors) {
      switch (selector.kind) {
        case 'rest':
          claimsRest = true;
          break;
        case 'label':
        case 'index': {
          const atom = this.ref(selector);
          if (atom !== undefined) chosen.add(atom);
          break;
        }
        case 'range': {
          const from = this.ref(selector.from);
          const to = this.ref(selector.to);
          if (from === undefined || to === undefined) break;
          if (from > to) {
            this.sink.report('invalid-selector', selector.span, `This range runs backwards: atom #${from + 1} comes after #${to + 1} in the geometry; write the earlier atom first.`);
            break;
          }
          for (let atom = from; atom <= to; atom++) chosen.add(atom);
          break;
        }
        case 'element': {
          let found = 0;
          for (const atom of this.atoms) {
            if (atom.element.symbol === selector.element) {
              chosen.add(atom.index);
              found++;
            }
          }
          if (found === 0) {
            this.sink.report('invalid-selector', selector.span, `The geometry has no ${selector.element} atoms, so 'all ${selector.element}' selects nothing.`, { severity: 'warning' });
          }
          break;
        }
        case 'within': {
          const centre = this.ref(selector.of);
          if (centre === undefined) break;
          const radius = toAngstrom(selector.distance, this.units);
          const c = this.coordinates;
          for (let atom = 0; atom < this.atoms.length; atom++) {
            const dx = c[3 * atom]! - c[3 * centre]!;
            const dy = c[3 * atom + 1]! - c[3 * centre + 1]!;
            const dz = c[3 * atom + 2]! - c[3 * centre + 2]!;
            if (dx * dx + dy * dy + dz * dz <= radius * radius + 1e-12) chosen.add(atom);
          }
          break;
        }
      }
    }
    return { atoms: [...chosen].sort((a, b) => a - b), claimsRest };
  }
}

/** Largest number of scan points accepted (a guard against typing mistakes such as step 0.0001). */
export const MAX_SCAN_POINTS = 10_000;

/** Points from `from` to `to` in steps of `step`, both ends included (a step that never arrives gives 0). */
export function scanPointCount(from: number, to: number, step: number): number {
  if (step === 0 || (to - from) * step < 0) return 0;
  return Math.floor((to - from) / step + 1e-9) + 1;
}

function resolveScan(ast: SpecAst, resolver: SelectorResolver, units: LengthUnit): ScanModel | undefined {
  const scan = ast.scan;
  if (!scan?.first || !scan.second || !scan.from || !scan.to || (!scan.step && !scan.points)) return undefined;
  const first = resolver.ref(scan.first);
  const second = resolver.ref(scan.second);
  if (first === undefined || second === undefined) return undefined;
  const from = scan.from.value;
  const to = scan.to.value;
  let count: number;
  let step: number;
  if (scan.step) {
    step = scan.step.value;
    count = scanPointCount(from, to, step);
  } else {
    count = scan.points!.value;
    step = count > 1 ? (to - from) / (count - 1) : 0;
  }
  if (count > MAX_SCAN_POINTS) return { first, second, distances: [] };
  // Rounded to 10 decimals so that 2.3 + 2 × 0.2 prints as 2.7, not 2.6999999999999997.
  const distances = Array.from({ length: count }, (_, i) => toAngstrom(Number((from + i * step).toFixed(10)), units));
  return { first, second, distances };
}
