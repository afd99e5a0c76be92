/**
 * Writing a command's output to a file without ever destroying one.
 *
 * - The content goes to a temporary file in the destination's own folder (same file system), is
 *   flushed to disk, and only then replaces the destination with one rename. A write that fails
 *   half-way (a full disk, an error while producing the content) leaves the old file as it was and
 *   removes the temporary one.
 * - A destination that is one of the protected files (the spec and every file it includes) is
 *   refused before anything is written, compared by real path and by device and inode, so a
 *   symbolic link or a hard link to a protected file is refused too.
 * - A destination that is a symbolic link to an ordinary file is written through: the link stays
 *   and its target gets the new content. A folder, a device, a FIFO or a dangling link is refused.
 * - The new file keeps the permission bits of the file it replaces.
 *
 * Usage, all at once:   await writeOutputFile(out, text, { protect })
 * or streamed:          const file = await openOutputFile(out, { protect });
 *                       try { for (...) await file.write(chunk); await file.commit(); }
 *                       catch (error) { await file.discard(); throw error; }
 * Both throw OutputError, whose message says what and why (for example `cannot write x.md: ...`).
 */
import { randomBytes } from 'node:crypto';
import { lstatSync, promises as fs, realpathSync, statSync, type Stats } from 'node:fs';
import * as path from 'node:path';

/** A file the output must not replace, and how to name it in the refusal. */
export interface ProtectedFile {
  readonly file: string;
  /** For example "the spec" or "a file the spec includes". */
  readonly role: string;
}

export interface OutputOptions {
  readonly protect?: readonly ProtectedFile[];
  /** Folder that relative destinations are taken from (default: the process's). */
  readonly cwd?: string;
  /** How the destination is named in messages (default: as given). */
  readonly shownAs?: string;
}

export type OutputErrorKind = 'refused' | 'failed';

export class OutputError extends Error {
  constructor(
    readonly kind: OutputErrorKind,
    message: string,
  ) {
    super(message);
    this.name = 'OutputError';
  }
}

export interface OutputFile {
  /** Where the content lands on commit: the real path (a symbolic link's target). */
  readonly path: string;
  /** Appends a chunk to the temporary file; strings are written as UTF-8. */
  write(chunk: string | Uint8Array): Promise<void>;
  /** Flushes, closes and renames the temporary file over the destination. */
  commit(): Promise<void>;
  /** Closes and removes the temporary file; the destination is left as it was. Never throws. */
  discard(): Promise<void>;
}

export type OutputContent = string | Uint8Array | Iterable<string | Uint8Array> | AsyncIterable<string | Uint8Array>;

interface Target {
  readonly path: string;
  /** The file being replaced, when there is one. */
  readonly existing: Stats | undefined;
}

function errorText(error: unknown): string {
  const code = (error as NodeJS.ErrnoException).code;
  switch (code) {
    case 'ENOENT':
      return 'the folder does not exist';
    case 'EACCES':
    case 'EPERM':
      return 'permission denied';
    case 'ENOSPC':
      return 'no space left on the device';
    case 'EROFS':
      return 'the file system is read-only';
    case 'EDQUOT':
      return 'disk quota exceeded';
    case 'ENOTDIR':
      return 'a part of the path is not a folder';
    default:
      return (error as Error).message ?? String(error);
  }
}

function kindOfFile(stats: Stats): string {
  if (stats.isDirectory()) return 'a folder';
  if (stats.isFIFO()) return 'a FIFO (named pipe)';
  if (stats.isSocket()) return 'a socket';
  if (stats.isCharacterDevice() || stats.isBlockDevice()) return 'a device';
  return 'not a regular file';
}

function sameFile(a: Stats, b: Stats): boolean {
  return a.dev === b.dev && a.ino === b.ino;
}

/** Where a destination really is, or why it cannot be written; refuses protected files. */
export function resolveOutputTarget(destination: string, options: OutputOptions = {}): Target {
  const shown = options.shownAs ?? destination;
  const refuse = (reason: string): never => {
    throw new OutputError('refused', `refusing to write ${shown}: ${reason}`);
  };
  if (destination === '') refuse('no file name given');
  const absolute = path.resolve(options.cwd ?? process.cwd(), destination);
  let link: Stats | undefined;
  try {
    link = lstatSync(absolute);
  } catch {
    link = undefined;
  }
  let existing: Stats | undefined;
  let real: string;
  if (link) {
    try {
      existing = statSync(absolute);
      real = realpathSync(absolute);
    } catch {
      return refuse('it is a symbolic link to a file that does not exist');
    }
    if (!existing.isFile()) refuse(`it is ${kindOfFile(existing)}`);
  } else {
    let folder: string;
    try {
      folder = realpathSync(path.dirname(absolute));
    } catch (error) {
      throw new OutputError('failed', `cannot write ${shown}: ${errorText(error)}`);
    }
    real = path.join(folder, path.basename(absolute));
  }
  for (const guarded of options.protect ?? []) {
    let guardedStats: Stats;
    let guardedReal: string;
    try {
      guardedStats = statSync(guarded.file);
      guardedReal = realpathSync(guarded.file);
    } catch {
      continue;
    }
    const how = link?.isSymbolicLink() ? ' (through a symbolic link)' : '';
    if (guardedReal === real) refuse(`it is ${guarded.role}${how}, which the output would overwrite`);
    if (existing && sameFile(existing, guardedStats)) refuse(`it is ${guarded.role} under another name (a hard link: same device and inode), which the output would overwrite`);
  }
  return { path: real, existing };
}

/** Opens a temporary file beside the destination; see the file header. */
export async function openOutputFile(destination: string, options: OutputOptions = {}): Promise<OutputFile> {
  const shown = options.shownAs ?? destination;
  const target = resolveOutputTarget(destination, options);
  const temporary = path.join(path.dirname(target.path), `.${path.basename(target.path)}.${process.pid}-${randomBytes(6).toString('hex')}.tmp`);
  const mode = target.existing ? target.existing.mode & 0o7777 : 0o666;
  let handle: fs.FileHandle;
  try {
    // 'wx': created here and now, never an existing file or a link someone placed there.
    handle = await fs.open(temporary, 'wx', mode);
    if (target.existing) await handle.chmod(mode);
  } catch (error) {
    throw new OutputError('failed', `cannot write ${shown}: ${errorText(error)}`);
  }
  let open = true;
  let done = false;
  const removeTemporary = async () => {
    if (open) {
      open = false;
      await handle.close().catch(() => undefined);
    }
    await fs.unlink(temporary).catch(() => undefined);
  };
  return {
    path: target.path,
    async write(chunk) {
      if (done) throw new OutputError('failed', `cannot write ${shown}: the output was already finished`);
      try {
        const bytes = typeof chunk === 'string' ? Buffer.from(chunk, 'utf8') : chunk;
        for (let offset = 0; offset < bytes.length; ) offset += (await handle.write(bytes, offset, bytes.length - offset)).bytesWritten;
      } catch (error) {
        await removeTemporary();
        done = true;
        throw new OutputError('failed', `cannot write ${shown}: ${errorText(error)}; the old file, if any, is unchanged`);
      }
    },
    async commit() {
      if (done) throw new OutputError('failed', `cannot write ${shown}: the output was already finished`);
      done = true;
      try {
        await handle.sync();
        open = false;
        await handle.close();
        await fs.rename(temporary, target.path);
      } catch (error) {
        await removeTemporary();
        throw new OutputError('failed', `cannot write ${shown}: ${errorText(error)}; the old file, if any, is unchanged`);
      }
    },
    async discard() {
      done = true;
      await removeTemporary();
    },
  };
}

function chunksOf(content: OutputContent): Iterable<string | Uint8Array> | AsyncIterable<string | Uint8Array> {
  return typeof content === 'string' || content instanceof Uint8Array ? [content] : content;
}

/** Writes all of `content` (text, bytes, or chunks as they are produced) to `destination`. */
export async function writeOutputFile(destination: string, content: OutputContent, options: OutputOptions = {}): Promise<void> {
  const file = await openOutputFile(destination, options);
  try {
    for await (const chunk of chunksOf(content)) await file.write(chunk);
    await file.commit();
  } catch (error) {
    await file.discard();
    if (error instanceof OutputError) throw error;
    const shown = options.shownAs ?? destination;
    throw new OutputError('failed', `cannot write ${shown}: ${(error as Error).message ?? String(error)}; the old file, if any, is unchanged`);
  }
}
