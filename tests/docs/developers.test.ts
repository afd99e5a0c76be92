/** The contributor guide stays in step with the code: every diagnostic code is documented. */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DIAGNOSTIC_CODES } from '../../server/src/language/diagnostics';

const guide = readFileSync(path.resolve(__dirname, '..', '..', 'DEVELOPERS.md'), 'utf8');

describe('DEVELOPERS.md', () => {
  it('lists every diagnostic code with its severity', () => {
    for (const [code, info] of Object.entries(DIAGNOSTIC_CODES)) {
      expect(guide, code).toContain(`| \`${code}\` | ${info.severity} |`);
    }
  });
});
