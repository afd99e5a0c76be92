/**
 * What Tessera reads: regular files only, of at most the supported size, said in the message; the
 * supported spec size itself; and carriage returns alone as line ends.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, truncateSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../server/src/language/analyze';
import { readTextFile } from '../../server/src/language/files';
import { countWords, MAX_ATOMS, MAX_FILE_BYTES } from '../../server/src/language/limits';
import { formatText } from '../../server/src/services/format';
import { run } from '../cli/harness';
import { tempFiles } from '../support/tempFolders';
import { WATER_H_Y, WATER_H_Z } from '../fixtures/water';

/** Water (tests/fixtures/water.ts, Hoy & Bunker 1979) as an XYZ file. */
const WATER_XYZ = `3\nwater\nO 0 0 0\nH 0 ${WATER_H_Y} ${WATER_H_Z}\nH 0 -${WATER_H_Y} ${WATER_H_Z}\n`;

describe('readTextFile', () => {
  it('reads a regular file', () => {
    const folder = tempFiles({ 'a.tess': 'spec "a"\n' });
    expect(readTextFile(path.join(folder, 'a.tess'))).toEqual({ ok: true, text: 'spec "a"\n' });
  });

  it('refuses a FIFO without blocking, a device, a folder and a missing file', () => {
    const folder = tempFiles({});
    execFileSync('mkfifo', [path.join(folder, 'pipe.xyz')]);
    mkdirSync(path.join(folder, 'sub'));
    expect(readTextFile(path.join(folder, 'pipe.xyz'))).toEqual({ ok: false, reason: 'it is a FIFO (named pipe), not a regular file' });
    expect(readTextFile('/dev/zero')).toEqual({ ok: false, reason: 'it is a device, not a regular file' });
    expect(readTextFile(path.join(folder, 'sub'))).toEqual({ ok: false, reason: 'it is a folder' });
    expect(readTextFile(path.join(folder, 'none.xyz'))).toEqual({ ok: false, reason: 'no such file' });
  });

  it('refuses a file beyond the limit without reading it, stating both sizes', () => {
    const folder = tempFiles({ 'big.xyz': '' });
    truncateSync(path.join(folder, 'big.xyz'), 1024 ** 3);
    const read = readTextFile(path.join(folder, 'big.xyz'));
    expect(read).toEqual({ ok: false, reason: 'it is 1.00 GiB (1,073,741,824 bytes); Tessera reads files of at most 8.00 MiB, the supported spec size' });
    const atLimit = tempFiles({ 'limit.xyz': 'x'.repeat(MAX_FILE_BYTES) });
    expect(readTextFile(path.join(atLimit, 'limit.xyz')).ok).toBe(true);
  });
});

describe('the command line and includes read only what they may', () => {
  it('check /dev/zero and a FIFO: refused at once (exit 2), the other file checked', async () => {
    const folder = tempFiles({ 'good.tess': `spec "w"\nbasis sto-3g\nstructure from "water.xyz"\n`, 'water.xyz': WATER_XYZ });
    execFileSync('mkfifo', [path.join(folder, 'pipe.tess')]);
    const result = await run(['check', '/dev/zero', 'pipe.tess', 'good.tess'], folder);
    expect(result.code).toBe(2);
    expect(result.stderr).toContain('tessera: cannot read /dev/zero: it is a device, not a regular file');
    expect(result.stderr).toContain('tessera: cannot read pipe.tess: it is a FIFO (named pipe), not a regular file');
    expect(result.stderr).toContain('0 errors, 0 warnings in 1 file; 2 unreadable');
  });

  it('structure from a FIFO and from a 1 GiB file: include-unreadable with the reason', () => {
    const folder = tempFiles({ 'big.xyz': '' });
    execFileSync('mkfifo', [path.join(folder, 'pipe.xyz')]);
    truncateSync(path.join(folder, 'big.xyz'), 1024 ** 3);
    const spec = path.join(folder, 'spec.tess');
    for (const [file, reason] of [
      ['pipe.xyz', 'it is a FIFO (named pipe), not a regular file'],
      ['big.xyz', 'it is 1.00 GiB (1,073,741,824 bytes); Tessera reads files of at most 8.00 MiB'],
    ] as const) {
      const analysis = analyze(`basis sto-3g\nstructure from "${file}"\n`, { path: spec });
      const unreadable = analysis.diagnostics.find((d) => d.code === 'include-unreadable')!;
      expect(unreadable.message).toContain(reason);
    }
  });

  it('an XYZ file declaring more atoms than supported is refused before its lines are read', () => {
    const folder = tempFiles({ 'many.xyz': `${MAX_ATOMS + 1}\nmany\nH 0 0 0\n` });
    const analysis = analyze('basis sto-3g\nstructure from "many.xyz"\n', { path: path.join(folder, 'spec.tess') });
    expect(analysis.diagnostics.map((d) => d.code)).toEqual(['spec-too-large']);
    expect(analysis.diagnostics[0]!.message).toContain('"many.xyz" says it holds 100,001 atoms');
  });
});

describe('the supported spec size', () => {
  it('100,001 inline atoms: refused with one diagnostic; 100,000 atoms are analysed', () => {
    const lines = (count: number) => `basis sto-3g\nstructure {\n${Array.from({ length: count }, (_, i) => `  H ${(i % 100) * 2} ${Math.floor(i / 100) % 100 * 2} ${Math.floor(i / 10_000) * 2}`).join('\n')}\n}\n`;
    const refused = analyze(lines(MAX_ATOMS + 1));
    expect(refused.diagnostics.map((d) => d.code)).toEqual(['spec-too-large']);
    expect(refused.diagnostics[0]!.message).toMatch(/^This spec has 100,001 atoms; Tessera analyses specs of up to 8,388,608 characters \(8 MiB\), 100,000 atoms and 1,000,000 words/);
    expect(refused.model.atoms).toHaveLength(0);
    const accepted = analyze(lines(MAX_ATOMS));
    expect(accepted.model.atoms).toHaveLength(MAX_ATOMS);
    expect(accepted.diagnostics.filter((d) => d.code === 'spec-too-large')).toEqual([]);
  });

  it('more than 1,000,000 words outside plain structure blocks: refused before lexing', () => {
    const analysis = analyze(`spec "w"\n${';'.repeat(1_000_001)}\n`);
    expect(analysis.diagnostics.map((d) => d.code)).toEqual(['spec-too-large']);
    expect(analysis.diagnostics[0]!.message).toContain('about 1,000,003 words outside plain structure blocks');
  });

  it('countWords counts runs between blanks and each brace, semicolon and equals sign', () => {
    expect(countWords('')).toBe(0);
    expect(countWords('fragment a { atoms rest; tier quantum { A1=3 } }')).toBe(14);
    expect(countWords('  structure\n\t{\r\n}')).toBe(3);
  });
});

describe('carriage returns alone end lines', () => {
  const CRLF = `spec "w"\r\nbasis sto-3g\r\nstructure {\r\n  O 0 0 0\r\n  H 0 ${WATER_H_Y} ${WATER_H_Z}\r\n  H 0 -${WATER_H_Y} ${WATER_H_Z}\r\n}\r\nfragment w { atoms rest; tier mean-field { } }\r\nbogus\r\n`;

  it('a spec with CR line ends reads like the same spec with CRLF: same diagnostics, lines and columns', () => {
    const cr = CRLF.replace(/\r\n/g, '\r');
    const byCrlf = analyze(CRLF);
    const byCr = analyze(cr);
    const where = (a: ReturnType<typeof analyze>) => a.diagnostics.map((d) => ({ code: d.code, ...a.lines.rangeOf(d.span) }));
    expect(where(byCr)).toEqual(where(byCrlf));
    expect(byCr.model.atoms).toHaveLength(3);
    expect(byCr.diagnostics.map((d) => d.code)).toEqual(['unknown-keyword']);
    expect(byCr.lines.positionAt(cr.indexOf('bogus'))).toEqual({ line: 8, character: 0 });
  });

  it('an XYZ file with CR line ends is read', () => {
    const folder = tempFiles({ 'w.xyz': WATER_XYZ.replace(/\n/g, '\r') });
    const analysis = analyze('basis sto-3g\nstructure from "w.xyz"\n', { path: path.join(folder, 's.tess') });
    expect(analysis.model.atoms).toHaveLength(3);
    expect(analysis.diagnostics.filter((d) => d.code.startsWith('include'))).toEqual([]);
  });

  it('the formatter keeps the lines of a CR-only spec', () => {
    const formatted = formatText('structure {\r H 0 0 0\r}\r');
    expect(formatted.split('\n')).toEqual(['structure {', '  H  0.0000  0.0000  0.0000', '}', '']);
  });
});


describe('an included file held by the editor', () => {
  it('beyond 8 MiB is refused like one on disk', () => {
    const files = {
      readFile: () => ({ ok: true as const, text: `3\nbig\n${'# padding\n'.repeat(900_000)}` }),
      realPath: (file: string) => file,
    };
    const analysis = analyze('basis sto-3g\nstructure from "big.xyz"\n', { path: '/work/specs/s.tess', files });
    const unreadable = analysis.diagnostics.find((d) => d.code === 'include-unreadable')!;
    expect(unreadable.message).toContain('it has 9,000,006 characters; Tessera reads files of at most 8.00 MiB');
  });
});
