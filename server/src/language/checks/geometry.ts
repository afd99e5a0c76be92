/** Geometry: atoms present, no clashes, plausible units, and bonds cut by fragment boundaries. */
import { BOND_TOLERANCE_FACTOR, CLASH_DISTANCE, COORDINATE_LIMIT, coordinatesInRange, MAX_EXAMINED_PAIRS, suspectUnits } from '../../chemistry/geometry';
import { BOHR_IN_ANGSTROM } from '../../chemistry/units';
import type { RelatedInformation } from '../diagnostics';
import type { AtomModel } from '../model';
import { documentStart, listSome, shortAtomName, type CheckContext } from './context';

/** Reports beyond this many clashes are summarised in one line. */
const MAX_CLASH_REPORTS = 50;

function where(atom: AtomModel): string {
  return atom.source ? ` (line ${atom.source.line + 1} of the XYZ file)` : '';
}

function relatedAtom(atom: AtomModel, message: string): RelatedInformation {
  return atom.source ? { span: { start: 0, end: 0 }, file: atom.source.file, line: atom.source.line, message } : { span: atom.span, message };
}

export function checkGeometry(context: CheckContext): void {
  const { ast, model, sink } = context;
  if (!ast.geometry) {
    sink.report('missing-geometry', documentStart(ast), 'The spec has no atoms: add `structure { <Element> [label] x y z ... }` or `structure from "file.xyz"`.');
    return;
  }
  if (model.atoms.length === 0) {
    if (!ast.geometry.include) sink.report('missing-geometry', ast.geometry.statement.keyword.span, 'The structure has no atoms.');
    return;
  }

  checkCoordinateRange(context);

  const clashes = model.contacts.clashes;
  for (const clash of clashes.slice(0, MAX_CLASH_REPORTS)) {
    const a = model.atoms[clash.i]!;
    const b = model.atoms[clash.j]!;
    sink.report(
      'atoms-too-close',
      b.span,
      `Atoms ${shortAtomName(a)} (${a.element.symbol})${where(a)} and ${shortAtomName(b)} (${b.element.symbol})${where(b)} are ${clash.distance.toFixed(3)} Å apart, closer than ${CLASH_DISTANCE} Å: a duplicated or mistyped line?`,
      { related: [relatedAtom(a, `${shortAtomName(a)} is here`)] },
    );
  }
  const clashCount = model.contacts.clashCount;
  if (clashCount > MAX_CLASH_REPORTS || !model.contacts.complete) {
    const more = (clashCount - Math.min(clashCount, MAX_CLASH_REPORTS)).toLocaleString('en-US');
    const stopped = model.contacts.complete
      ? ''
      : ` (at least: the search stopped after examining ${MAX_EXAMINED_PAIRS.toLocaleString('en-US')} pairs of atoms, which only a pile of atoms at one spot makes it do; bonds and cut bonds are not all known either)`;
    sink.report('atoms-too-close', ast.geometry.statement.keyword.span, `${more} more pairs of atoms are closer than ${CLASH_DISTANCE} Å${stopped}.`, { data: { more: clashCount - Math.min(clashCount, MAX_CLASH_REPORTS), complete: model.contacts.complete } });
  }

  const radii = model.atoms.map((atom) => atom.element.covalentRadius ?? 1.5);
  // Coordinates from an XYZ file are in ångström by the format's convention; inline ones in the structure's unit.
  const coordinateUnit = ast.geometry.include ? 'angstrom' : model.units;
  const suspicion = suspectUnits(model.coordinates, radii, coordinateUnit, model.contacts);
  if (suspicion) {
    const declared = coordinateUnit === 'angstrom' ? 'ångström' : 'bohr';
    const factor = coordinateUnit === 'angstrom' ? 1 / BOHR_IN_ANGSTROM : BOHR_IN_ANGSTROM;
    const reason = ast.geometry.include ? 'XYZ files are in ångström by their convention' : `the structure reads them as ${declared}`;
    sink.report(
      'units-suspect',
      ast.geometry.unit?.span ?? ast.legacyUnits?.span ?? ast.geometry.statement.keyword.span,
      `Nearest-neighbour distances are ${suspicion.medianRatio.toFixed(2)} times the sum of covalent radii (median over ${suspicion.atomsConsidered} atoms), close to ${factor.toFixed(2)}: these coordinates look like ${suspicion.looksLike === 'bohr' ? 'bohr' : 'ångström'}, but ${reason}.` +
        (ast.geometry.include ? '' : ` Write \`structure in ${suspicion.looksLike} { … }\` if so.`),
      { data: { units: suspicion.looksLike } },
    );
  }

  checkCutBonds(context);
}

/** Reports beyond this many coordinates out of range are summarised in one line. */
const MAX_RANGE_REPORTS = 20;
const AXES = ['x', 'y', 'z'] as const;

/**
 * Coordinates must be finite and within ±COORDINATE_LIMIT Å (after conversion from bohr). Such an
 * atom is left out of the neighbour search, and the symmetry search answers C1 (chemistry/).
 */
function checkCoordinateRange(context: CheckContext): void {
  const { ast, model, sink } = context;
  const limit = `±${COORDINATE_LIMIT.toLocaleString('en-US')} Å (10 µm)`;
  let found = 0;
  for (const atom of model.atoms) {
    if (coordinatesInRange(model.coordinates, atom.index)) continue;
    found++;
    if (found > MAX_RANGE_REPORTS) continue;
    const axis = [0, 1, 2].find((k) => !(Math.abs(model.coordinates[3 * atom.index + k]!) <= COORDINATE_LIMIT))!;
    const value = model.coordinates[3 * atom.index + axis]!;
    const shown = Number.isFinite(value) ? value.toPrecision(3) : String(value);
    const span = atom.source || !ast.geometry || ast.geometry.include ? atom.span : ast.geometry.atoms.coordinateSpan(atom.index, axis);
    sink.report(
      'coordinate-out-of-range',
      span,
      `Atom ${shortAtomName(atom)} (${atom.element.symbol})${where(atom)} has ${AXES[axis]} = ${shown} Å; coordinates are accepted within ${limit}, far beyond any molecule: a typing mistake? Until it is fixed the atom is left out of the distance and bond checks, and the point group is taken as C1.`,
      atom.source ? { related: [relatedAtom(atom, `${shortAtomName(atom)} is here`)] } : {},
    );
  }
  if (found > MAX_RANGE_REPORTS) {
    sink.report('coordinate-out-of-range', ast.geometry!.statement.keyword.span, `${found - MAX_RANGE_REPORTS} more atoms have coordinates beyond ${limit}.`);
  }
}

/** A bond joins atoms closer than 1.2 × the sum of their covalent radii (common practice, no source). */
function checkCutBonds(context: CheckContext): void {
  const { model, sink } = context;
  if (model.fragments.length < 2) return;
  const owner = (atom: number) => (model.sharedAtoms.has(atom) ? -1 : model.owner[atom]!);
  const cuts = new Map<string, { i: number; j: number; distance: number }[]>();
  for (const bond of model.contacts.bonds) {
    const a = owner(bond.i);
    const b = owner(bond.j);
    if (a < 0 || b < 0 || a === b) continue;
    const key = a < b ? `${a}:${b}` : `${b}:${a}`;
    const list = cuts.get(key);
    if (list) list.push(bond);
    else cuts.set(key, [bond]);
  }
  for (const [key, bonds] of cuts) {
    const [first, second] = key.split(':').map(Number) as [number, number];
    const earlier = model.fragments[first]!;
    const later = model.fragments[second]!;
    const described = bonds.map((bond) => {
      const a = model.atoms[bond.i]!;
      const b = model.atoms[bond.j]!;
      return `${shortAtomName(a)}–${shortAtomName(b)} ${bond.distance.toFixed(2)} Å`;
    });
    const related: RelatedInformation[] = [
      { span: earlier.ast.atoms?.span ?? earlier.ast.statement.keyword.span, message: `fragment '${earlier.name}'` },
      ...bonds.slice(0, 10).map((bond) => relatedAtom(model.atoms[bond.j]!, `bond ${shortAtomName(model.atoms[bond.i]!)}–${shortAtomName(model.atoms[bond.j]!)}, ${bond.distance.toFixed(2)} Å`)),
    ];
    const what = `The boundary between '${earlier.name}' and '${later.name}' cuts ${bonds.length} covalent bond${bonds.length === 1 ? '' : 's'}: ${listSome(described, 6)} (bonded: closer than ${BOND_TOLERANCE_FACTOR} × the sum of covalent radii).`;
    // Capped on both sides: the cut is planned for, so it is told, not warned about.
    const capped = earlier.capRule !== undefined && later.capRule !== undefined;
    const advice = capped
      ? ` Both fragments cap ${bonds.length === 1 ? 'it' : 'them'} with hydrogen link atoms (${earlier.capRule === later.capRule ? earlier.capRule : `${earlier.capRule} and ${later.capRule}`} placement), counted in their figures.`
      : earlier.capRule !== undefined || later.capRule !== undefined
        ? ` Only '${earlier.capRule !== undefined ? earlier.name : later.name}' caps ${bonds.length === 1 ? 'it' : 'them'}; \`caps hydrogen fixed\` in '${earlier.capRule !== undefined ? later.name : earlier.name}' caps the other side.`
        : ' Cut bonds need capping or link atoms in the embedding: `caps hydrogen fixed` (or `scaled`) adds hydrogen link atoms.';
    sink.report('bond-cut', later.ast.atoms?.span ?? later.ast.statement.keyword.span, what + advice, {
      related,
      data: { bonds: bonds.map((bond) => [bond.i, bond.j]) },
      ...(capped ? { severity: 'information' as const } : {}),
    });
  }
}
