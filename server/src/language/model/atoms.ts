/**
 * The atoms of a spec in ångström: from the inline structure block, or from the XYZ file it
 * includes; and the label index (each label names one atom).
 */
import { elementByNumber, elementBySymbol } from '../../chemistry/elements';
import { toAngstrom, type LengthUnit } from '../../chemistry/units';
import type { SpecAst } from '../ast';
import { DiagnosticSink, type Diagnostic } from '../diagnostics';
import { interpret } from '../interpret';
import { parseSpec } from '../parser';
import { LineIndex, type Span } from '../text';
import { resolveInclude } from '../files';
import { byteSize, MAX_ATOMS, MAX_FILE_BYTES, SUPPORTED_SIZE } from '../limits';
import { parseXyz } from '../xyz';
import type { AtomModel, ModelOptions } from './types';

export interface ReadAtoms {
  readonly list: AtomModel[];
  /** x, y, z of every atom in ångström. */
  readonly positions: Float64Array;
  /** The spec the atoms were read from, when `structure from` names a spec (its fragments may be taken too). */
  readonly spec?: IncludedSpec;
}

/** Another spec read for its structure: its text, typed tree and the problems reading it found. */
export interface IncludedSpec {
  readonly file: string;
  readonly text: string;
  readonly lines: LineIndex;
  readonly ast: SpecAst;
  readonly problems: readonly Diagnostic[];
}

/**
 * Reads the atoms; `includes` receives the absolute path of every file read. An atom of the
 * previous version that reads the same (index, element, label, line) is kept as it was, so that
 * an edit of a few coordinates does not make every atom anew.
 */
export function readAtoms(ast: SpecAst, units: LengthUnit, sink: DiagnosticSink, options: ModelOptions, includes: string[], previous?: readonly AtomModel[]): ReadAtoms {
  const geometry = ast.geometry;
  if (!geometry) return { list: [], positions: new Float64Array(0) };
  if (geometry.include) return readIncludedAtoms(geometry.include, sink, options, includes);
  const list: AtomModel[] = new Array(geometry.atoms.length);
  const atoms = geometry.atoms;
  const positions = new Float64Array(3 * atoms.length);
  const factor = toAngstrom(1, units);
  for (let i = 0; i < atoms.length; i++) {
    const z = atoms.atomicNumber(i);
    const label = atoms.label(i);
    const old = previous?.[i];
    if (old && !old.source && old.element.z === z && old.label === label && old.span.start === atoms.spanStart(i) && old.span.end === atoms.spanEnd(i) && (label === undefined || old.labelSpan?.start === atoms.labelStart(i))) {
      list[i] = old;
    } else {
      const element = elementByNumber(z)!;
      const labelSpan = atoms.labelSpan(i);
      list[i] = label !== undefined && labelSpan ? { index: i, element, label, span: atoms.span(i), labelSpan } : { index: i, element, span: atoms.span(i) };
    }
    for (let axis = 0; axis < 3; axis++) positions[3 * i + axis] = atoms.coordinate(i, axis) * factor;
  }
  return { list, positions };
}

/** `structure from "file.xyz"`: the first frame, in ångström as XYZ files are by convention. */
function readIncludedAtoms(include: NonNullable<NonNullable<SpecAst['geometry']>['include']>, sink: DiagnosticSink, options: ModelOptions, includes: string[]): ReadAtoms {
  const list: AtomModel[] = [];
  const none = { list, positions: new Float64Array(0) };
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
  // Files on disk are capped when read (files.ts); text an editor holds is capped here, the same way.
  if (read.text.length > MAX_FILE_BYTES) {
    sink.report('include-unreadable', include.span, `Cannot read "${include.value}" (${resolved.path}): it has ${read.text.length.toLocaleString('en-US')} characters; Tessera reads files of at most ${byteSize(MAX_FILE_BYTES)}, the supported spec size.`);
    return none;
  }
  const declared = Number(read.text.slice(0, read.text.search(/\r?\n|$/)).trim());
  if (declared > MAX_ATOMS) {
    sink.report('spec-too-large', include.span, `"${include.value}" says it holds ${declared.toLocaleString('en-US')} atoms; Tessera analyses specs of up to ${SUPPORTED_SIZE}. Split the system into several specs.`);
    return none;
  }
  if (resolved.path.toLowerCase().endsWith('.tess')) return readSpecAtoms(read.text, resolved.path, include, sink, options);
  const xyz = parseXyz(read.text);
  for (const problem of xyz.problems) {
    sink.report('include-invalid', include.span, `"${include.value}" line ${problem.line + 1}: ${problem.message}`, {
      related: [{ span: { start: 0, end: 0 }, file: resolved.path, line: problem.line, message: problem.message }],
    });
  }
  if (xyz.frames > 1) {
    sink.report('include-invalid', include.span, `"${include.value}" holds ${xyz.frames} frames; the first one is the structure.`, { severity: 'information' });
  }
  const positions = new Float64Array(3 * xyz.atoms.length);
  xyz.atoms.forEach((atom, i) => {
    const element = elementBySymbol(atom.symbol)!;
    list.push({ index: i, element, span: include.span, source: { file: resolved.path, line: atom.line } });
    positions.set([atom.x, atom.y, atom.z], 3 * i);
  });
  return { list, positions };
}

/** Problems of an included spec's structure listed in the report; the rest are counted. */
const LISTED_INCLUDE_PROBLEMS = 3;

/**
 * `structure from "other.tess"`: the atoms of another spec's inline structure block, with their
 * labels, in ångström (its `structure in bohr` header, or its retired `units` line, converted), so
 * that a family of specs shares one structure and selects atoms by the same labels. The other spec's
 * own top-level statements (basis, caps, limits) are not read, its fragments only when asked for
 * (`with fragments`, model/includedFragments.ts); a spec whose structure is itself
 * `structure from …` is refused (one level of includes), and a spec that includes itself, or one
 * that includes this spec back, is named as a cycle.
 */
function readSpecAtoms(text: string, file: string, include: { readonly value: string; readonly span: Span }, sink: DiagnosticSink, options: ModelOptions): ReadAtoms {
  const list: AtomModel[] = [];
  const none = { list, positions: new Float64Array(0) };
  const otherSink = new DiagnosticSink();
  const tree = parseSpec(text);
  const ast = interpret(tree, otherSink);
  const geometry = ast.geometry;
  if (!geometry) {
    sink.report('include-invalid', include.span, `"${include.value}" has no structure block to take the atoms from.`);
    return none;
  }
  const self = options.path !== undefined && options.files.realPath(options.path) === options.files.realPath(file);
  if (self) {
    sink.report('include-invalid', include.span, `"${include.value}" is this spec itself: a spec cannot take its structure from itself (an include cycle).`);
    return none;
  }
  if (geometry.include) {
    const back = resolveInclude(file, geometry.include.value, options.files);
    if (back.ok && options.path !== undefined && options.files.realPath(back.path) === options.files.realPath(options.path)) {
      sink.report('include-invalid', include.span, `"${include.value}" takes its structure from this spec ("${geometry.include.value}"): the two include each other (an include cycle). Keep the structure in one of them.`);
      return none;
    }
    sink.report('include-invalid', include.span, `"${include.value}" takes its own atoms from "${geometry.include.value}"; include that file instead (structures are included one level deep).`);
    return none;
  }
  const lines = new LineIndex(text);
  const inside = otherSink.items.filter((d) => d.severity === 'error' && d.span.start >= geometry.statement.span.start && d.span.end <= geometry.statement.span.end);
  inside.slice(0, LISTED_INCLUDE_PROBLEMS).forEach((problem) => {
    const line = lines.positionAt(problem.span.start).line;
    sink.report('include-invalid', include.span, `"${include.value}" line ${line + 1}: ${problem.message}`, { related: [{ span: { start: 0, end: 0 }, file, line, message: problem.message }] });
  });
  if (inside.length > LISTED_INCLUDE_PROBLEMS) sink.report('include-invalid', include.span, `"${include.value}" has ${inside.length - LISTED_INCLUDE_PROBLEMS} more problems in its structure block.`);
  const atoms = geometry.atoms;
  const factor = toAngstrom(1, geometry.unit?.value ?? ast.legacyUnits?.value ?? 'angstrom');
  const positions = new Float64Array(3 * atoms.length);
  for (let i = 0; i < atoms.length; i++) {
    const element = elementByNumber(atoms.atomicNumber(i))!;
    const label = atoms.label(i);
    const source = { file, line: lines.positionAt(atoms.spanStart(i)).line };
    list.push(label !== undefined ? { index: i, element, label, span: include.span, labelSpan: include.span, source } : { index: i, element, span: include.span, source });
    for (let axis = 0; axis < 3; axis++) positions[3 * i + axis] = atoms.coordinate(i, axis) * factor;
  }
  return { list, positions, spec: { file, text, lines, ast, problems: otherSink.items } };
}

/** Label → atom index; a label used twice is reported and keeps its first atom. */
export function indexLabels(atoms: readonly AtomModel[], sink: DiagnosticSink): Map<string, number> {
  const labels = new Map<string, number>();
  for (const atom of atoms) {
    if (!atom.label) continue;
    const previous = labels.get(atom.label);
    if (previous !== undefined) {
      const first = atoms[previous]!;
      sink.report('duplicate-label', atom.labelSpan ?? atom.span, `Label '${atom.label}' is already used by atom #${previous + 1}; labels name one atom each.`, {
        related: [{ span: first.labelSpan ?? first.span, message: `'${atom.label}' first used here` }],
      });
      continue;
    }
    labels.set(atom.label, atom.index);
  }
  return labels;
}
