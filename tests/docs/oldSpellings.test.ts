/**
 * No retired spelling (`units angstrom|bohr`, `geometry { … }`, `geometry from`, the braced basis
 * block, `within <d> of <atom>`) remains in a place users read or copy from: samples, docs,
 * snippets, the grammar, the extension manifest, the editor tests' specs, and the messages and
 * words of the server. The migration itself is the exception: the module that finds and rewrites
 * old spellings, the vocabulary's table of them, their diagnostic title, the readers that still
 * understand them, and the section of the contributor guide that documents them.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = path.resolve(__dirname, '../..');

/** The old spellings, as they would be written in a spec or quoted in a message. */
const OLD_SPELLINGS: readonly { readonly name: string; readonly pattern: RegExp }[] = [
  { name: 'units line', pattern: /\bunits\s+(angstrom|bohr)\b/ },
  { name: 'geometry block', pattern: /\bgeometry\s*\{/ },
  { name: 'geometry from', pattern: /\bgeometry\s+from\b/ },
  { name: 'braced basis block', pattern: /\bbasis\s+[A-Za-z0-9][^\s{};#`'"]*\s*\{/ },
  { name: 'within … of', pattern: /\bwithin\s+(<[a-z]+>|[0-9.]+)\s+of\b/ },
];

/** Where users read or copy the language from. */
const USER_FACING = /^(samples\/|snippets\/|grammar\/|docs\/|client\/|tests\/e2e\/workspace\/|server\/src\/)|^(README|DEVELOPERS|CHANGELOG)\.md$|^package\.json$|^language-configuration\.json$/;

/** The migration: allowed to name the old spellings. */
const MIGRATION = new Set([
  'server/src/language/migrate.ts',
  'server/src/language/migrateAll.ts',
  'server/src/language/vocabulary.ts',
  'server/src/language/diagnostics.ts',
  'server/src/language/interpret/index.ts',
  'server/src/language/interpret/basis.ts',
  'server/src/language/interpret/geometry.ts',
  'server/src/language/interpret/selectors.ts',
]);

/** DEVELOPERS.md documents the migration between these markers. */
const GUIDE_SECTION = /<!-- retired-spellings -->[\s\S]*?<!-- \/retired-spellings -->/g;

function trackedFiles(): string[] {
  return execFileSync('git', ['ls-files', '-z'], { cwd: ROOT, encoding: 'utf8' })
    .split('\0')
    .filter((file) => file !== '' && USER_FACING.test(file) && !/\.(png|svg|ico|br)$/.test(file));
}

export function oldSpellingsIn(text: string): string[] {
  return OLD_SPELLINGS.filter((old) => old.pattern.test(text)).map((old) => old.name);
}

describe('old spellings', () => {
  it('the patterns find each old spelling and nothing of the new language', () => {
    expect(oldSpellingsIn('units bohr')).toEqual(['units line']);
    expect(oldSpellingsIn('geometry {\n  H 0 0 0\n}')).toEqual(['geometry block']);
    expect(oldSpellingsIn('geometry from "a.xyz"')).toEqual(['geometry from']);
    expect(oldSpellingsIn('basis def2-svp {\n  Zn = def2-tzvp\n}')).toEqual(['braced basis block']);
    expect(oldSpellingsIn('atoms within 3.0 of zn')).toEqual(['within … of']);
    const now = 'basis def2-svp\nbasis def2-tzvp on all Zn\nfunctions cartesian\nstructure in bohr {\n  Zn zn 0 0 0\n}\nstructure from "a.xyz"\nfragment f { atoms closer-than 3.0 to zn }\n';
    expect(oldSpellingsIn(now)).toEqual([]);
  });

  it('appear nowhere users read them, except in the migration', () => {
    const files = trackedFiles();
    expect(files).toContain('README.md');
    expect(files).toContain('samples/zn-site-h2s-scan.tess');
    const found: string[] = [];
    for (const file of files) {
      if (MIGRATION.has(file)) continue;
      let text: string;
      try {
        text = readFileSync(path.join(ROOT, file), 'utf8');
      } catch {
        continue; // deleted in the working tree
      }
      if (file === 'DEVELOPERS.md') text = text.replace(GUIDE_SECTION, '');
      for (const name of oldSpellingsIn(text)) found.push(`${file}: ${name}`);
    }
    expect(found).toEqual([]);
  });
});
