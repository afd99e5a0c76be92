/**
 * Vitest global setup: the protocol and command-line tests run the bundles in dist/, so they must
 * not test an older build than the sources. When a source file is newer than a bundle (or a bundle
 * is missing), the bundles are built again before any test runs; if that does not help, the run
 * stops with a message that says which bundle is stale.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import * as path from 'node:path';

const ROOT = path.resolve(__dirname, '..', '..');
/** What the bundles are built from. */
const SOURCES = ['server/src', 'client/src', 'scripts/build.mjs', 'package.json'];
/** The bundles the tests start as processes. */
export const BUNDLES = ['dist/server.js', 'dist/cli.js'];

function newestModification(entry: string): number {
  const full = path.join(ROOT, entry);
  if (!existsSync(full)) return 0;
  const stat = statSync(full);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = 0;
  for (const child of readdirSync(full)) newest = Math.max(newest, newestModification(path.join(entry, child)));
  return newest;
}

/** The bundles older than the newest source file, or missing. */
export function staleBundles(): string[] {
  const sources = Math.max(...SOURCES.map(newestModification));
  return BUNDLES.filter((bundle) => {
    const full = path.join(ROOT, bundle);
    return !existsSync(full) || statSync(full).mtimeMs < sources;
  });
}

export default function setup(): void {
  if (staleBundles().length === 0) return;
  execFileSync(process.execPath, [path.join(ROOT, 'scripts', 'build.mjs')], { cwd: ROOT, stdio: 'inherit' });
  const still = staleBundles();
  if (still.length > 0) throw new Error(`${still.join(', ')} older than the sources even after 'node scripts/build.mjs'; the protocol and CLI tests would test an old build.`);
}
