/**
 * One vocabulary: every place that lists the words of the language (the parser's usage strings,
 * completion, hover, the chemistry layer's types, the editor settings in package.json, the
 * TextMate grammar and the snippets of server/src/services/snippets.ts) agrees with the table in server/src/language/vocabulary.ts.
 * Each check compares a consumer with the table, so a word added in one place and forgotten in
 * another fails here, with the place named.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import type { CompletionItem } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import { FUNCTION_TYPES } from '../../server/src/chemistry/basis/shells';
import { EMBEDDING_SYMMETRY, embeddingName } from '../../server/src/chemistry/estimate/embeddingSymmetry';
import { mappingKey, MAPPINGS, qubitCounts, type Mapping } from '../../server/src/chemistry/qubits';
import { LENGTH_UNITS } from '../../server/src/chemistry/units';
import {
  ACTIVE_CHOICES,
  ANSATZE,
  CAP_KINDS,
  CAP_RULES,
  choices,
  EMBEDDINGS,
  FUNCTION_TERMS,
  KEYWORDS,
  MAPPING_TERMS,
  METHODS,
  SCAN_KINDS,
  SELECTOR_WORDS,
  SWITCH_TERMS,
  TIER_LEVELS,
  UNIT_TERMS,
  type TermInfo,
} from '../../server/src/language/vocabulary';
import { SNIPPETS } from '../../server/src/services/snippets';
import { doComplete, doHover } from '../../server/src/services';
import { marked } from '../services/service';

const ROOT = path.resolve(__dirname, '..', '..');
const names = (terms: readonly TermInfo[]) => terms.map((term) => term.name);

/** The value lists of the language, with the keyword that takes them and where it stands. */
const VALUE_LISTS: { keyword: string; terms: readonly TermInfo[]; sample: (word: string) => string }[] = [
  { keyword: 'mapping', terms: MAPPING_TERMS, sample: (word) => `fragment f {\n  atoms rest\n  tier quantum { method vqe; mapping ${word} }\n}\n` },
  { keyword: 'ansatz', terms: ANSATZE, sample: (word) => `fragment f {\n  atoms rest\n  tier quantum { method vqe; ansatz ${word} }\n}\n` },
  { keyword: 'tier', terms: TIER_LEVELS, sample: (word) => `fragment f {\n  atoms rest\n  tier ${word} { }\n}\n` },
  { keyword: 'embedding', terms: EMBEDDINGS, sample: (word) => `embedding ${word}\n` },
  { keyword: 'functions', terms: FUNCTION_TERMS, sample: (word) => `functions ${word}\n` },
  { keyword: 'taper', terms: SWITCH_TERMS, sample: (word) => `fragment f {\n  atoms rest\n  tier quantum { method vqe; taper ${word} }\n}\n` },
];

const STRUCTURE = 'basis sto-3g\nstructure {\n  O o 0 0 0\n  H h1 0.76 0 0.59\n  H h2 -0.76 0 0.59\n}\n';

/** The words of `(a|b|c)` in a TextMate match between its look-behind and look-ahead, `\\(` unescaped. */
function alternatives(match: string): string[] {
  const group = match.replace(/^\(\?<![^)]*\)/, '').replace(/\(\?![^)]*\)$/, '');
  if (!group.startsWith('(') || !group.endsWith(')')) throw new Error(`no alternatives in ${match}`);
  return group.slice(1, -1).split('|').map((word) => word.replace(/\\/g, ''));
}

describe('the mapping list', () => {
  it('is the chemistry layer\'s Mapping type, in the same order', () => {
    expect(names(MAPPING_TERMS)).toEqual([...MAPPINGS]);
  });

  it('files every mapping under its own key and refuses a name that is none', () => {
    const keys = MAPPINGS.map((mapping) => mappingKey(mapping));
    expect(new Set(keys).size).toBe(MAPPINGS.length);
    expect(keys.every((key) => key in qubitCounts(1))).toBe(true);
    // A misspelt name must not be counted as parity (or anything else) without a word.
    expect(() => mappingKey('party' as Mapping)).toThrow(/not a fermion-to-qubit mapping/);
  });

  it('is the enum of the tessera.defaultMapping setting in package.json', () => {
    const pkg = JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { contributes: { configuration: { properties: Record<string, { enum?: string[]; default?: unknown }> } } };
    const setting = pkg.contributes.configuration.properties['tessera.defaultMapping']!;
    expect(setting.enum).toEqual(names(MAPPING_TERMS));
    expect(names(MAPPING_TERMS)).toContain(setting.default);
  });
});

describe('the chemistry layer\'s lists', () => {
  it('units, function types and embeddings are the vocabulary\'s', () => {
    expect([...LENGTH_UNITS]).toEqual(names(UNIT_TERMS));
    expect([...FUNCTION_TYPES]).toEqual(names(FUNCTION_TERMS));
    expect(Object.keys(EMBEDDING_SYMMETRY).sort()).toEqual(names(EMBEDDINGS).sort());
  });

  it('reads every embedding by its own name and refuses a name that is none', () => {
    for (const name of names(EMBEDDINGS)) expect(embeddingName(name)).toBe(name);
    // A misspelt or inherited name must not be counted as no embedding (its own point group) without a word.
    expect(() => embeddingName('dmte')).toThrow(/not an embedding/);
    expect(() => embeddingName('toString')).toThrow(/not an embedding/);
  });
});

describe('usage strings', () => {
  it('each keyword\'s syntax lists exactly the words the table has for it', () => {
    for (const { keyword, terms } of VALUE_LISTS) {
      const info = KEYWORDS.find((k) => k.name === keyword)!;
      expect(info.syntax, `syntax of '${keyword}'`).toContain(`${keyword} ${choices(terms)}`);
    }
    expect(KEYWORDS.find((k) => k.name === 'structure')!.syntax).toContain(`in ${choices(UNIT_TERMS)}`);
  });

  it('every word the scan reads is in its syntax', () => {
    const scan = KEYWORDS.find((k) => k.name === 'scan')!.syntax;
    for (const word of [...names(SCAN_KINDS), 'from', 'to', 'step', 'points']) expect(scan, `scan syntax lacks '${word}'`).toMatch(new RegExp(`\\b${word}\\b`));
  });

  it('the parser quotes the same list when a word is missing or unknown', () => {
    for (const { keyword, terms, sample } of VALUE_LISTS.filter((list) => list.keyword !== 'taper')) {
      const missing = analyzeDocument(STRUCTURE + sample('').replace(`${keyword} `, keyword)).diagnostics.map((d) => d.message).join('\n');
      expect(missing, `message for a bare '${keyword}'`).toContain(choices(terms));
    }
  });
});

describe('parser, completion and hover', () => {
  for (const { keyword, terms, sample } of VALUE_LISTS) {
    it(`'${keyword}' accepts, completes and explains exactly ${choices(terms)}`, () => {
      for (const term of terms) {
        const analysis = analyzeDocument(STRUCTURE + sample(term.name));
        const unknown = analysis.diagnostics.filter((d) => d.code.startsWith('unknown') || d.code === 'invalid-value');
        expect(unknown, `'${keyword} ${term.name}'`).toEqual([]);
        const m = marked(STRUCTURE + sample(`${term.name.slice(0, 1)}$0${term.name.slice(1)}`));
        const hover = doHover(m.analysis, m.cursor);
        expect(JSON.stringify(hover?.contents ?? null), `hover on '${term.name}'`).toContain(JSON.stringify(term.summary).slice(1, 30));
      }
      const unknown = analyzeDocument(STRUCTURE + sample('no-such-word')).diagnostics;
      expect(unknown.length, `'${keyword} no-such-word' is reported`).toBeGreaterThan(0);
      const m = marked(STRUCTURE + sample('$0'));
      const labels = doComplete(m.analysis, m.cursor).items.map((item: CompletionItem) => item.label);
      expect(labels).toEqual(names(terms));
    });
  }
});

describe('the TextMate grammar', () => {
  const grammar = JSON.parse(readFileSync(path.join(ROOT, 'grammar', 'tessera.tmLanguage.json'), 'utf8')) as { repository: Record<string, { match?: string; patterns?: { match?: string; name?: string }[] }> };

  it('colours every keyword, and only words the language reads', () => {
    const colored = new Set(alternatives(grammar.repository['statement-keyword']!.match!));
    for (const keyword of KEYWORDS) expect(colored.has(keyword.name), `keyword '${keyword.name}' is not coloured`).toBe(true);
    const written = KEYWORDS.map((keyword) => keyword.syntax).join(' ');
    for (const word of colored) expect(KEYWORDS.some((k) => k.name === word) || new RegExp(`(^|[^A-Za-z-])${word}($|[^A-Za-z-])`).test(written), `grammar colours '${word}', which no syntax has`).toBe(true);
  });

  it('colours exactly the value words of the table as constants', () => {
    const values = grammar.repository['values']!.patterns!.find((p) => p.name === 'constant.language.tessera')!.match!;
    const expected = [TIER_LEVELS, METHODS, ANSATZE, MAPPING_TERMS, EMBEDDINGS, UNIT_TERMS, FUNCTION_TERMS, SWITCH_TERMS, SCAN_KINDS, CAP_KINDS, CAP_RULES, ACTIVE_CHOICES].flatMap(names);
    expect(new Set(alternatives(values))).toEqual(new Set(expected));
  });

  it('colours the selector words', () => {
    const selectors = alternatives(grammar.repository['selector-words']!.match!);
    expect(new Set(selectors)).toEqual(new Set(names(SELECTOR_WORDS).filter((word) => word !== 'to')));
  });
});

describe('the snippets', () => {
  const lines = SNIPPETS.flatMap((snippet) => snippet.body.split('\n'));

  it('offer exactly the table\'s words as choices', () => {
    const lists: Record<string, readonly TermInfo[]> = { mapping: MAPPING_TERMS, ansatz: ANSATZE, tier: TIER_LEVELS, in: UNIT_TERMS, embedding: EMBEDDINGS, functions: FUNCTION_TERMS };
    let seen = 0;
    for (const line of lines) {
      for (const match of line.matchAll(/([a-z-]+) \$\{\d+\|([^|]*)\|\}/g)) {
        const terms = lists[match[1]!];
        expect(terms, `no table for the choices after '${match[1]}'`).toBeDefined();
        expect(match[2]!.split(',')).toEqual(names(terms!));
        seen++;
      }
    }
    expect(seen).toBeGreaterThanOrEqual(3);
  });

  it('start their lines with keywords of the language, and their specs parse', () => {
    for (const line of lines) {
      const first = /^\s*([a-z][a-z-]*)\b/.exec(line.replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\{\d+\|([^,|]*)[^}]*\}/g, '$1'))?.[1];
      if (!first || line.trim().startsWith('#')) continue;
      expect(KEYWORDS.some((k) => k.name === first), `snippet line '${line}'`).toBe(true);
    }
  });
});
