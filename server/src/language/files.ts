/**
 * Access to files a spec includes. Analysis takes a host so that the language server can serve
 * unsaved editor buffers and tests can serve fixtures; the default reads the disk.
 */
import { readFileSync, realpathSync } from 'node:fs';
import * as path from 'node:path';

export type FileRead = { ok: true; text: string } | { ok: false; reason: string };

export interface FileHost {
  readFile(absolutePath: string): FileRead;
  /** Resolves symbolic links; returns the path unchanged when it cannot. */
  realPath(absolutePath: string): string;
}

export const diskFileHost: FileHost = {
  readFile(absolutePath) {
    try {
      return { ok: true, text: readFileSync(absolutePath, 'utf8') };
    } catch (error) {
      const code = (error as NodeJS.ErrnoException).code;
      const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a folder' : code === 'EACCES' ? 'permission denied' : String((error as Error).message);
      return { ok: false, reason };
    }
  },
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
