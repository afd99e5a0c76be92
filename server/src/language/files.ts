/**
 * Access to files a spec includes. Analysis takes a host so that the language server can serve
 * unsaved editor buffers and tests can serve fixtures; the default reads the disk.
 */
import { closeSync, constants, fstatSync, openSync, readSync, realpathSync, type Stats } from 'node:fs';
import * as path from 'node:path';
import { byteSize, MAX_FILE_BYTES } from './limits';

export type FileRead = { ok: true; text: string } | { ok: false; reason: string };

export interface FileHost {
  readFile(absolutePath: string): FileRead;
  /** Resolves symbolic links; returns the path unchanged when it cannot. */
  realPath(absolutePath: string): string;
}

function notRegular(stats: Stats): string {
  if (stats.isDirectory()) return 'it is a folder';
  if (stats.isFIFO()) return 'it is a FIFO (named pipe), not a regular file';
  if (stats.isSocket()) return 'it is a socket, not a regular file';
  if (stats.isCharacterDevice() || stats.isBlockDevice()) return 'it is a device, not a regular file';
  return 'it is not a regular file';
}

function tooLarge(bytes: number, maxBytes: number): string {
  return `it is ${byteSize(bytes)} (${bytes.toLocaleString('en-US')} bytes); Tessera reads files of at most ${byteSize(maxBytes)}, the supported spec size`;
}

/** Why a file could not be opened or read, in words. */
export function readErrorReason(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOENT':
      return 'no such file';
    case 'EISDIR':
      return 'it is a folder';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'ELOOP':
      return 'too many symbolic links';
    case 'ENOTDIR':
      return 'a part of the path is not a folder';
    default:
      return code ? `${code}: ${(error as Error).message}` : String((error as Error).message ?? error);
  }
}

/**
 * Reads a regular file of at most `maxBytes` as UTF-8. Anything else is refused without reading
 * it: opened without blocking and checked with fstat, so a FIFO cannot stall the reader, a device
 * such as /dev/zero cannot fill the memory, and a file that grows while read is caught at the limit.
 */
export function readTextFile(absolutePath: string, maxBytes: number = MAX_FILE_BYTES): FileRead {
  let descriptor: number;
  try {
    descriptor = openSync(absolutePath, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (error) {
    return { ok: false, reason: readErrorReason(error) };
  }
  try {
    const stats = fstatSync(descriptor);
    if (!stats.isFile()) return { ok: false, reason: notRegular(stats) };
    if (stats.size > maxBytes) return { ok: false, reason: tooLarge(stats.size, maxBytes) };
    // One byte more than allowed, to notice a file that grew since fstat.
    const buffer = Buffer.allocUnsafe(Math.min(maxBytes + 1, stats.size + 1));
    let length = 0;
    for (;;) {
      if (length === buffer.length) break;
      const read = readSync(descriptor, buffer, length, buffer.length - length, null);
      if (read === 0) break;
      length += read;
    }
    if (length > maxBytes) return { ok: false, reason: `${tooLarge(length, maxBytes)} (it grew while being read)` };
    if (length > stats.size) return { ok: false, reason: 'it grew while being read; read it again once it is written' };
    return { ok: true, text: buffer.toString('utf8', 0, length) };
  } catch (error) {
    return { ok: false, reason: readErrorReason(error) };
  } finally {
    closeSync(descriptor);
  }
}

export const diskFileHost: FileHost = {
  readFile: (absolutePath) => readTextFile(absolutePath),
  realPath(absolutePath) {
    try {
      return realpathSync(absolutePath);
    } catch {
      return absolutePath;
    }
  },
};

export type IncludeResolution = { ok: true; path: string } | { ok: false; reason: string };

/**
 * Resolves an included path relative to the spec's folder and refuses anything outside that
 * folder tree, also through symbolic links.
 */
export function resolveInclude(specPath: string | undefined, included: string, host: FileHost): IncludeResolution {
  if (!specPath) return { ok: false, reason: 'this spec has not been saved to a folder yet, so a relative path has nothing to start from' };
  if (path.isAbsolute(included)) return { ok: false, reason: 'give the path relative to the spec\'s folder, not an absolute path' };
  const folder = path.dirname(specPath);
  const resolved = path.resolve(folder, included);
  if (!isInside(folder, resolved)) return { ok: false, reason: `'${included}' points outside the spec's folder (${folder})` };
  const realFolder = host.realPath(folder);
  const realTarget = host.realPath(resolved);
  if (!isInside(realFolder, realTarget)) return { ok: false, reason: `'${included}' leads outside the spec's folder through a symbolic link` };
  return { ok: true, path: resolved };
}

function isInside(folder: string, target: string): boolean {
  const relative = path.relative(folder, target);
  return relative !== '' && !relative.startsWith('..') && !path.isAbsolute(relative);
}
