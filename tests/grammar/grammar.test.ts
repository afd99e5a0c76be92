/** The TextMate grammar against its scope assertions, with vscode-tmgrammar-test (npm). */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { tempFolder } from '../support/tempFolders';

const root = path.resolve(__dirname, '..', '..');
const grammar = path.join(root, 'grammar', 'tessera.tmLanguage.json');
const runner = path.join(root, 'node_modules', '.bin', 'vscode-tmgrammar-test');

function runCases(files: string[]): { status: number | null; output: string } {
  const result = spawnSync(runner, ['-g', grammar, ...files], { cwd: root, encoding: 'utf8' });
  return { status: result.status, output: `${result.stdout}${result.stderr}` };
}

describe('TextMate grammar', () => {
  it('passes its scope assertions', () => {
    const result = runCases(['tests/grammar/spec.test.tess']);
    expect(result.output).toContain('run successfuly');
    expect(result.status).toBe(0);
  });

  it('fails on a wrong assertion, so the assertions are really checked', () => {
    const wrong = readFileSync(path.join(root, 'tests', 'grammar', 'spec.test.tess'), 'utf8').replace('#         ^^^^^^^^^ constant.language.tessera', '#         ^^^^^^^^^ keyword.control.tessera');
    const file = path.join(tempFolder('tessera-grammar-'), 'wrong.test.tess');
    writeFileSync(file, wrong);
    const result = runCases([file]);
    expect(result.status).not.toBe(0);
    expect(result.output).toContain('missing required scopes: keyword.control.tessera');
  });
});
