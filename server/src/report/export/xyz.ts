/**
 * The geometry of a spec as plain XYZ text (ångström): one frame, or one frame per scan point with
 * the moving atoms shifted as the scan says. XYZ has no labels, so each line keeps only the element
 * symbol. The comment line of each frame names the spec and, for a scan, the point and the scanned
 * coordinate's value (a distance in angstrom, an angle or dihedral in degrees).
 *
 * Fragments (`fragmentXyzChunks`): one frame per fragment (and scan point), its atoms in spec order
 * followed by its hydrogen caps (link atoms on the bonds its boundary cuts, model/caps.ts, placed
 * again for each scan point's coordinates); the comment line says which lines are caps and which
 * bond each one caps, since XYZ itself cannot.
 */
import type { DocumentAnalysis } from '../../analysis';
import { fragmentCapsAt, type CapModel } from '../../language/model';
import { plainText } from '../format/escape';
import { eachScanFrame } from '../../chemistry/scan';
import type { StructureAtom, StructureData } from '../structure';

/** Decimals of every coordinate: rounding moves an atom by at most 5e-11 Å. */
export const XYZ_DECIMALS = 10;

export interface XyzExportOptions {
  /** Names the spec in the comment lines (the spec's name, else its file name). */
  readonly title: string;
  /** The Tessera version, written into the comment lines. */
  readonly version: string;
}

export interface XyzFrame {
  readonly comment: string;
  /** x, y, z of every atom in ångström, in the spec's atom order. */
  readonly coordinates: Float64Array;
  /** The scanned value (ångström for a distance, degrees for an angle or dihedral), or null for a spec without a scan. */
  readonly value: number | null;
}

/** One line of text: XYZ comment lines cannot hold a line break. */
function oneLine(text: string): string {
  return plainText(text.replace(/[\r\n]+/g, ' ').trim());
}

export function formatCoordinate(value: number): string {
  const text = value.toFixed(XYZ_DECIMALS);
  // A coordinate that rounds to zero is written without a sign.
  return /^-0\.0+$/.test(text) ? text.slice(1) : text;
}

/** How an atom is named in a comment: its label, else `#n` (1-based, as in the spec). */
export function atomName(atom: StructureAtom): string {
  return atom.label ?? `#${atom.index + 1}`;
}

export function coordinatesOf(data: StructureData): Float64Array {
  const coordinates = new Float64Array(3 * data.atoms.length);
  data.atoms.forEach((atom, i) => {
    coordinates[3 * i] = atom.x;
    coordinates[3 * i + 1] = atom.y;
    coordinates[3 * i + 2] = atom.z;
  });
  return coordinates;
}

/**
 * The frames to write: the geometry itself, or one per scan point (the geometry as written in the
 * spec is then not a frame of its own unless a scan point reproduces it). Throws a RangeError when
 * the two scanned atoms coincide (the analysis reports that as an error first).
 */
export function xyzFrames(data: StructureData, options: XyzExportOptions): XyzFrame[] {
  return [...eachXyzFrame(data, options)];
}

/** The frames one at a time, each made when it is asked for (throws as xyzFrames does, at once). */
export function eachXyzFrame(data: StructureData, options: XyzExportOptions): Iterable<XyzFrame> {
  const title = oneLine(options.title);
  const coordinates = coordinatesOf(data);
  const scan = data.scan;
  if (!scan) {
    return [{ comment: `${title}; coordinates in angstrom; exported by Tessera ${options.version}`, coordinates, value: null }];
  }
  const atomNames = scan.atoms.map((atom) => atomName(data.atoms[atom]!)).join('-');
  const points = scan.values.length;
  const frames = eachScanFrame(coordinates, scan, scan.moving, scan.values);
  const value = (v: number) => (scan.coordinate === 'distance' ? `${v.toFixed(6)} angstrom` : `${v.toFixed(6)} degree`);
  return (function* named(): Generator<XyzFrame> {
    let k = 0;
    for (const frame of frames) {
      yield {
        comment: `${title}; scan point ${++k} of ${points}; ${scan.coordinate} ${atomNames} ${value(frame.value)}; exported by Tessera ${options.version}`,
        coordinates: frame.coordinates,
        value: frame.value,
      };
    }
  })();
}

/** One frame as XYZ text: the atom count, the comment line and one `symbol x y z` line per atom. */
function frameText(data: StructureData, frame: XyzFrame): string {
  const lines: string[] = [String(data.atoms.length), oneLine(frame.comment)];
  data.atoms.forEach((atom, i) => {
    const xyz = [0, 1, 2].map((k) => formatCoordinate(frame.coordinates[3 * i + k]!).padStart(XYZ_DECIMALS + 8));
    lines.push(`${atom.element.padEnd(2)} ${xyz.join(' ')}`);
  });
  return `${lines.join('\n')}\n`;
}

/**
 * XYZ text one frame at a time, for writing a scan of any length with one frame in memory.
 * Throws a RangeError before the first chunk when the two scanned atoms coincide.
 */
export function xyzChunks(data: StructureData, options: XyzExportOptions): Iterable<string> {
  const frames = eachXyzFrame(data, options);
  return (function* chunks(): Generator<string> {
    for (const frame of frames) yield frameText(data, frame);
  })();
}

/** XYZ text: for each frame the atom count, the comment line and one `symbol x y z` line per atom. */
export function renderXyz(data: StructureData, options: XyzExportOptions): string {
  return [...xyzChunks(data, options)].join('');
}

/** What a fragment frame holds: the fragment's atoms (spec indices) and its caps at that frame's coordinates. */
interface FragmentFrame {
  readonly comment: string;
  readonly coordinates: Float64Array;
  readonly atoms: readonly number[];
  readonly caps: readonly CapModel[];
}

/** The comment line's account of a fragment frame: its atoms, then each cap by its line and the bond it caps. */
function fragmentNote(data: StructureData, name: string, atoms: readonly number[], caps: readonly CapModel[], rule: string | undefined): string {
  const own = `fragment ${name}: ${atoms.length} atom${atoms.length === 1 ? '' : 's'}`;
  if (caps.length === 0) return `${own}, no caps`;
  const listed = caps.map((cap, k) => `atom ${atoms.length + k + 1} H caps ${atomName(data.atoms[cap.host]!)}-${atomName(data.atoms[cap.partner]!)}`);
  return `${own} then ${caps.length} hydrogen cap${caps.length === 1 ? '' : 's'} (link atoms, ${rule ?? 'hydrogen'} placement): ${listed.join(', ')}`;
}

/**
 * Frames of the given fragments with their caps: fragment by fragment, each over every scan point
 * (so that one fragment's frames have one atom count). Throws as xyzFrames does.
 */
export function eachFragmentXyzFrame(analysis: DocumentAnalysis, data: StructureData, fragments: readonly number[], options: XyzExportOptions): Iterable<FragmentFrame> {
  const model = analysis.model;
  const title = oneLine(options.title);
  // Made once, at once, so that coinciding scan atoms throw before the first chunk.
  eachXyzFrame(data, options);
  return (function* framesOfFragments(): Generator<FragmentFrame> {
    for (const index of fragments) {
      const fragment = model.fragments[index]!;
      for (const frame of eachXyzFrame(data, options)) {
        const caps = frame.value === null ? fragment.caps : fragmentCapsAt(model, index, frame.coordinates);
        const note = fragmentNote(data, fragment.name, fragment.atoms, caps, fragment.capRule);
        const rest = frame.comment.startsWith(title) ? frame.comment.slice(title.length) : `; ${frame.comment}`;
        yield { comment: `${title}; ${note}${rest}`, coordinates: frame.coordinates, atoms: fragment.atoms, caps };
      }
    }
  })();
}

function fragmentFrameText(data: StructureData, frame: FragmentFrame): string {
  const lines: string[] = [String(frame.atoms.length + frame.caps.length), oneLine(frame.comment)];
  const row = (symbol: string, xyz: readonly number[]) => `${symbol.padEnd(2)} ${xyz.map((value) => formatCoordinate(value).padStart(XYZ_DECIMALS + 8)).join(' ')}`;
  for (const atom of frame.atoms) lines.push(row(data.atoms[atom]!.element, [0, 1, 2].map((k) => frame.coordinates[3 * atom + k]!)));
  for (const cap of frame.caps) lines.push(row('H', cap.position));
  return `${lines.join('\n')}\n`;
}

/** XYZ text of the given fragments, each with its caps, one frame at a time. */
export function fragmentXyzChunks(analysis: DocumentAnalysis, data: StructureData, fragments: readonly number[], options: XyzExportOptions): Iterable<string> {
  const frames = eachFragmentXyzFrame(analysis, data, fragments, options);
  return (function* chunks(): Generator<string> {
    for (const frame of frames) yield fragmentFrameText(data, frame);
  })();
}
