/**
 * The safe output writer (server/src/cli/outputFile.ts) and `--out` of the commands that write
 * files: nothing the spec reads is ever replaced, through any kind of link, and a failed write
 * leaves the old file whole.
 */
import { execFileSync } from 'node:child_process';
import { chmodSync, linkSync, mkdirSync, readdirSync, readFileSync, statSync, symlinkSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { openOutputFile, OutputError, writeOutputFile } from '../../server/src/cli/outputFile';
import { tempFiles } from '../support/tempFolders';
import { root, run } from './harness';

const WATER = readFileSync(path.join(root, 'samples', 'molecules', 'water-sto-3g.tess'), 'utf8');
/** Water at Hoy & Bunker's structure (1979), placed as in tests/fixtures/water.ts. */
const WATER_XYZ = '3\nwater\nO 0 0 0\nH 0 0.756950 0.585882\nH 0 -0.756950 0.585882\n';
const INCLUDING = 'spec "inc"\nbasis sto-3g\nstructure from "water.xyz"\n';

/** Files of a folder other than the ones given: leftovers such as temporary files. */
function leftovers(folder: string, expected: readonly string[]): string[] {
  return readdirSync(folder).filter((name) => !expected.includes(name));
}

async function refusal(promise: Promise<unknown>): Promise<OutputError> {
  const error = await promise.then(
    () => undefined,
    (caught: unknown) => caught,
  );
  expect(error).toBeInstanceOf(OutputError);
  return error as OutputError;
}

describe('writeOutputFile', () => {
  it('writes a new file and replaces an old one, keeping its permission bits', async () => {
    const folder = tempFiles({ 'old.md': 'old text' });
    chmodSync(path.join(folder, 'old.md'), 0o640);
    await writeOutputFile('new.md', 'new text', { cwd: folder });
    await writeOutputFile('old.md', ['replaced ', 'in ', 'chunks'], { cwd: folder });
    expect(readFileSync(path.join(folder, 'new.md'), 'utf8')).toBe('new text');
    expect(readFileSync(path.join(folder, 'old.md'), 'utf8')).toBe('replaced in chunks');
    expect(statSync(path.join(folder, 'old.md')).mode & 0o777).toBe(0o640);
    expect(leftovers(folder, ['new.md', 'old.md'])).toEqual([]);
  });

  it('a write that fails half-way leaves the old file whole and no temporary file', async () => {
    const folder = tempFiles({ 'report.md': 'the good report' });
    async function* failing(): AsyncGenerator<string> {
      yield 'the first part of a new report';
      throw new Error('the renderer failed');
    }
    const error = await refusal(writeOutputFile('report.md', failing(), { cwd: folder }));
    expect(error.kind).toBe('failed');
    expect(error.message).toContain('the renderer failed');
    expect(error.message).toContain('the old file, if any, is unchanged');
    expect(readFileSync(path.join(folder, 'report.md'), 'utf8')).toBe('the good report');
    expect(leftovers(folder, ['report.md'])).toEqual([]);
  });

  it('streams: nothing reaches the destination before commit, and discard leaves it alone', async () => {
    const folder = tempFiles({ 'out.txt': 'before' });
    const file = await openOutputFile('out.txt', { cwd: folder });
    await file.write('line 1\n');
    await file.write(new TextEncoder().encode('line 2\n'));
    expect(readFileSync(path.join(folder, 'out.txt'), 'utf8')).toBe('before');
    await file.commit();
    expect(readFileSync(path.join(folder, 'out.txt'), 'utf8')).toBe('line 1\nline 2\n');
    const second = await openOutputFile('out.txt', { cwd: folder });
    await second.write('never');
    await second.discard();
    expect(readFileSync(path.join(folder, 'out.txt'), 'utf8')).toBe('line 1\nline 2\n');
    expect(leftovers(folder, ['out.txt'])).toEqual([]);
  });

  it('writes through a symbolic link to an ordinary file and keeps the link', async () => {
    const folder = tempFiles({ 'target.md': 'old' });
    symlinkSync('target.md', path.join(folder, 'link.md'));
    await writeOutputFile('link.md', 'new', { cwd: folder });
    expect(readFileSync(path.join(folder, 'target.md'), 'utf8')).toBe('new');
    expect(statSync(path.join(folder, 'link.md')).isFile()).toBe(true);
    expect(readdirSync(folder).sort()).toEqual(['link.md', 'target.md']);
  });

  it('refuses a protected file by path, through a symbolic link and through a hard link', async () => {
    const folder = tempFiles({ 'spec.tess': WATER });
    symlinkSync('spec.tess', path.join(folder, 'soft.md'));
    linkSync(path.join(folder, 'spec.tess'), path.join(folder, 'hard.md'));
    const protect = [{ file: path.join(folder, 'spec.tess'), role: 'the spec itself' }];
    for (const [name, how] of [
      ['spec.tess', /it is the spec itself, which/],
      ['./sub/../spec.tess', /it is the spec itself, which/],
      ['soft.md', /through a symbolic link/],
      ['hard.md', /a hard link: same device and inode/],
    ] as const) {
      if (name.includes('sub')) mkdirSync(path.join(folder, 'sub'), { recursive: true });
      const error = await refusal(writeOutputFile(name, 'overwritten', { cwd: folder, protect }));
      expect(error.kind).toBe('refused');
      expect(error.message).toMatch(how);
    }
    expect(readFileSync(path.join(folder, 'spec.tess'), 'utf8')).toBe(WATER);
  });

  it('refuses a folder, a FIFO, a device and a dangling link', async () => {
    const folder = tempFiles({});
    mkdirSync(path.join(folder, 'folder'));
    execFileSync('mkfifo', [path.join(folder, 'pipe')]);
    symlinkSync('missing.md', path.join(folder, 'dangling.md'));
    expect((await refusal(writeOutputFile('folder', 'x', { cwd: folder }))).message).toContain('it is a folder');
    expect((await refusal(writeOutputFile('pipe', 'x', { cwd: folder }))).message).toContain('it is a FIFO (named pipe)');
    expect((await refusal(writeOutputFile('/dev/null', 'x', { cwd: folder }))).message).toContain('it is a device');
    expect((await refusal(writeOutputFile('dangling.md', 'x', { cwd: folder }))).message).toContain('a symbolic link to a file that does not exist');
  });

  it('a folder that does not exist is a failure to write, not a refusal', async () => {
    const folder = tempFiles({});
    const error = await refusal(writeOutputFile(path.join('no', 'such', 'out.md'), 'x', { cwd: folder }));
    expect(error.kind).toBe('failed');
    expect(error.message).toContain('the folder does not exist');
  });
});

describe('--out never replaces the spec or a file it reads', () => {
  it('report --out: a symbolic link and a hard link to the spec are refused (exit 2), the spec unchanged', async () => {
    const folder = tempFiles({ 'spec.tess': WATER });
    symlinkSync('spec.tess', path.join(folder, 'soft.md'));
    linkSync(path.join(folder, 'spec.tess'), path.join(folder, 'hard.md'));
    for (const out of ['soft.md', 'hard.md', 'spec.tess']) {
      const result = await run(['report', 'spec.tess', '--out', out], folder);
      expect(result.code, out).toBe(2);
      expect(result.stderr).toMatch(/refusing to write .*: it is the spec itself/);
    }
    expect(readFileSync(path.join(folder, 'spec.tess'), 'utf8')).toBe(WATER);
  });

  it('export --out: the included XYZ file, by name, by symbolic link and by hard link, is refused', async () => {
    const folder = tempFiles({ 'inc.tess': INCLUDING, 'water.xyz': WATER_XYZ });
    symlinkSync('water.xyz', path.join(folder, 'soft.xyz'));
    linkSync(path.join(folder, 'water.xyz'), path.join(folder, 'hard.xyz'));
    for (const out of ['water.xyz', 'soft.xyz', 'hard.xyz']) {
      const result = await run(['export', 'inc.tess', '--to', 'xyz', '--out', out], folder);
      expect(result.code, out).toBe(2);
      expect(result.stderr).toContain('a file the spec reads (water.xyz)');
    }
    expect(readFileSync(path.join(folder, 'water.xyz'), 'utf8')).toBe(WATER_XYZ);
  });

  it('export --out to another file works and leaves no temporary file', async () => {
    const folder = tempFiles({ 'inc.tess': INCLUDING, 'water.xyz': WATER_XYZ, 'out.xyz': 'old' });
    const result = await run(['export', 'inc.tess', '--to', 'xyz', '--out', 'out.xyz'], folder);
    expect(result.code).toBe(0);
    expect(readFileSync(path.join(folder, 'out.xyz'), 'utf8')).toMatch(/^3\ninc; /);
    expect(leftovers(folder, ['inc.tess', 'water.xyz', 'out.xyz'])).toEqual([]);
  });
});

describe('temporary files', () => {
  it('the names are hidden, beside the destination, and unique', async () => {
    const folder = tempFiles({});
    const first = await openOutputFile('a.md', { cwd: folder });
    const second = await openOutputFile('a.md', { cwd: folder });
    const temporary = readdirSync(folder);
    expect(temporary).toHaveLength(2);
    for (const name of temporary) expect(name).toMatch(/^\.a\.md\.\d+-[0-9a-f]{12}\.tmp$/);
    await first.discard();
    await second.commit();
    expect(readdirSync(folder)).toEqual(['a.md']);
  });
});
