/** The contributor guide stays in step with the code: every diagnostic code is documented. */
import { existsSync, readdirSync, readFileSync } from 'node:fs';
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

describe('DEVELOPERS.md on the data generators', () => {
  const root = path.resolve(__dirname, '..', '..');
  const commands = [...guide.matchAll(/\/usr\/bin\/python3 (scripts\/data\/[a-z_]+\.py)/g)].map((match) => match[1]!);

  it('names generators that exist', () => {
    expect(commands.length).toBeGreaterThan(5);
    for (const script of commands) expect(existsSync(path.join(root, script)), script).toBe(true);
  });

  it('says which generators accept --check, and exactly those do', () => {
    // The guide's sentence names them in words; each word names one script.
    const named: Record<string, string> = {
      'the basis library': 'generate_basis_library.py',
      'the elements': 'generate_elements.py',
      'the elements fixture': 'generate_elements_fixture.py',
      'the QCSchema schema': 'generate_qcschema_schema.py',
      'the QCSchema input schema': 'generate_qcschema_input_schema.py',
      'the integrals fixture': 'generate_integrals_fixture.py',
      'the exponents fixture': 'generate_exponents_fixture.py',
    };
    const sentence = /The generators of (.+?) accept\s+`--check`/s.exec(guide)?.[1]?.replace(/\s+/g, ' ');
    expect(sentence, 'the sentence on --check').toBeDefined();
    const claimed = sentence!.split(/, | and /).map((phrase) => {
      const script = named[phrase.trim()];
      expect(script, `no script known for '${phrase}'`).toBeDefined();
      return script!;
    });
    const accepting = readdirSync(path.join(root, 'scripts', 'data'))
      .filter((file) => file.startsWith('generate_') && file.endsWith('.py'))
      .filter((file) => /add_argument\(\s*["']--check["']/.test(readFileSync(path.join(root, 'scripts', 'data', file), 'utf8')));
    expect(claimed.sort()).toEqual(accepting.sort());
  });
});
