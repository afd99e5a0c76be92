/**
 * Temporary folders for tests that are removed again: each one made during a test is deleted
 * after that test, each one made outside a test (in a describe body or beforeAll) after its file.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import * as path from 'node:path';
import { afterAll, afterEach, beforeEach } from 'vitest';

const perTest: string[] = [];
const perFile: string[] = [];
let insideTest = false;

function remove(folders: string[]): void {
  for (const folder of folders.splice(0)) rmSync(folder, { recursive: true, force: true });
}

afterEach(() => {
  remove(perTest);
  insideTest = false;
});
afterAll(() => remove(perFile));

// From the start of a test, folders made are removed after it.
beforeEach(() => {
  insideTest = true;
});

/** A fresh folder under the system's temporary folder, removed after the test (or the file). */
export function tempFolder(prefix = 'tessera-test-'): string {
  const folder = mkdtempSync(path.join(tmpdir(), prefix));
  (insideTest ? perTest : perFile).push(folder);
  return folder;
}

/** A fresh temporary folder holding the given files. */
export function tempFiles(files: Record<string, string | Uint8Array>, prefix?: string): string {
  const folder = tempFolder(prefix);
  for (const [name, content] of Object.entries(files)) writeFileSync(path.join(folder, name), content);
  return folder;
}
