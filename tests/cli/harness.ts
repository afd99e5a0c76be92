/** Runs the command line in-process and lists the samples, for the CLI and report tests. */
import { readdirSync } from 'node:fs';
import * as path from 'node:path';
import { runCli } from '../../server/src/cli/main';
import { tempFiles } from '../support/tempFolders';

export const root = path.resolve(__dirname, '..', '..');

export interface RunResult {
  code: number;
  stdout: string;
  stderr: string;
}

export async function run(args: string[], cwd = root): Promise<RunResult> {
  let stdout = '';
  let stderr = '';
  const code = await runCli(args, { stdout: (t) => (stdout += t), stderr: (t) => (stderr += t), cwd });
  return { code, stdout, stderr };
}

/** A fresh folder holding the given files, removed after the test (tests/support/tempFolders.ts). */
export function scratch(files: Record<string, string>): string {
  return tempFiles(files, 'tessera-cli-');
}

/** Every sample spec, relative to the repository root, sorted. */
export function allSamples(): string[] {
  return (readdirSync(path.join(root, 'samples'), { recursive: true }) as string[])
    .filter((file) => file.endsWith('.tess'))
    .map((file) => path.join('samples', file).split(path.sep).join('/'))
    .sort();
}

/** The samples without errors (all but the deliberate mistakes). */
export function cleanSamples(): string[] {
  return allSamples().filter((file) => file !== 'samples/mistakes.tess');
}

/** A value of the JSON estimate by dotted path; undefined where the path does not lead. */
export function atPath(object: unknown, key: string): unknown {
  let value = object;
  for (const step of key.split('.')) {
    if (value === null || typeof value !== 'object') return undefined;
    value = (value as Record<string, unknown>)[step];
  }
  return value;
}
