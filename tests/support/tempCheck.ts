/**
 * Global setup of the test run: every test gets its temporary folders under one fresh folder, and
 * the run fails if anything is left there at the end (a test that does not clean up after itself).
 * Tests make their folders with tests/support/tempFolders.ts, which removes them.
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';

export default function setup(): () => void {
  const folder = mkdtempSync(path.join(tmpdir(), 'tessera-test-run-'));
  // os.tmpdir() reads TMPDIR; the test processes start after this and inherit it.
  process.env['TMPDIR'] = folder;
  return () => {
    const left = readdirSync(folder);
    rmSync(folder, { recursive: true, force: true });
    if (left.length > 0) {
      // vitest reports an error thrown here but still exits 0: set the exit code as well.
      process.exitCode = 1;
      throw new Error(`The tests left ${left.length} entries in the temporary folder, which each test must remove: ${left.slice(0, 10).join(', ')}`);
    }
  };
}
