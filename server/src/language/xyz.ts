/**
 * Reader for plain XYZ files: an atom count, a comment line, then one `element x y z` line per
 * atom, in ångström. Further frames may follow; the first frame is the geometry.
 */
import { elementByNumber, elementBySymbol } from '../chemistry/elements';

export interface XyzAtom {
  readonly symbol: string;
  readonly x: number;
  readonly y: number;
  readonly z: number;
  /** Zero-based line in the file. */
  readonly line: number;
}

export interface XyzProblem {
  readonly line: number;
  readonly message: string;
}

export interface XyzFile {
  readonly atoms: XyzAtom[];
  readonly comment: string;
  readonly frames: number;
  readonly problems: XyzProblem[];
}

export function parseXyz(text: string): XyzFile {
  const lines = text.split(/\r\n|\r|\n/);
  const problems: XyzProblem[] = [];
  const countText = (lines[0] ?? '').trim();
  const count = Number(countText);
  if (countText === '' || !Number.isInteger(count) || count < 0) {
    problems.push({ line: 0, message: `The first line of an XYZ file is the number of atoms; found '${countText.slice(0, 40)}'.` });
    return { atoms: [], comment: '', frames: 0, problems };
  }
  const atoms: XyzAtom[] = [];
  for (let i = 0; i < count; i++) {
    const lineNumber = i + 2;
    const line = lines[lineNumber];
    if (line === undefined || line.trim() === '') {
      problems.push({ line: Math.min(lineNumber, lines.length - 1), message: `The file says ${count} atoms but has only ${i}.` });
      break;
    }
    const fields = line.trim().split(/\s+/);
    const element = /^[0-9]+$/.test(fields[0]!) ? elementByNumber(Number(fields[0])) : elementBySymbol(fields[0]!);
    if (!element) {
      problems.push({ line: lineNumber, message: `'${fields[0]!.slice(0, 20)}' is not an element symbol or atomic number.` });
      continue;
    }
    const coordinates = fields.slice(1, 4).map(Number);
    if (fields.length < 4 || coordinates.some((value) => !Number.isFinite(value))) {
      problems.push({ line: lineNumber, message: `Expected 'element x y z'; found '${line.trim().slice(0, 60)}'.` });
      continue;
    }
    atoms.push({ symbol: element.symbol, x: coordinates[0]!, y: coordinates[1]!, z: coordinates[2]!, line: lineNumber });
  }
  let frames = 1;
  let next = count + 2;
  while (next < lines.length) {
    const header = (lines[next] ?? '').trim();
    if (header === '') {
      next++;
      continue;
    }
    const frameCount = Number(header);
    if (!Number.isInteger(frameCount) || frameCount < 0) {
      problems.push({ line: next, message: `Unexpected line after the ${count} atoms: '${header.slice(0, 60)}'.` });
      break;
    }
    frames++;
    next += frameCount + 2;
  }
  return { atoms, comment: lines[1] ?? '', frames, problems };
}
