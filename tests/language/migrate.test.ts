/**
 * Retired spellings: each one is an error (`retired-spelling`) whose message shows the new spelling,
 * and its rewrite keeps the spec's meaning — the same atoms at the same positions, the same fragments,
 * the same basis on every atom, the same function type and the same scan distances. The rewrites
 * are checked one statement at a time in both orders, and for the whole file at once.
 *
 * Geometries are invented test data, except the water (Hoy & Bunker 1979, tests/fixtures/water.ts).
 */
import { describe, expect, it } from 'vitest';
import { analyze, type Analysis, type AnalyzeOptions } from '../../server/src/language/analyze';
import { retiredSpellings } from '../../server/src/language/migrate';
import { applyChanges, rewriteRetiredSpellings } from '../../server/src/language/migrateAll';
import { memoryFiles } from './fixture';

/** What a spec means, independent of how it is spelt. */
function meaning(analysis: Analysis) {
  const { model } = analysis;
  return {
    atoms: model.atoms.map((atom) => [atom.element.symbol, atom.label ?? null]),
    // To 1e-6 Å: a rewritten distance is written to ten significant digits.
    coordinates: Array.from(model.coordinates, (value) => Number(value.toFixed(6))),
    fragments: model.fragments.map((fragment) => [fragment.name, fragment.atoms]),
    basis: model.basis.atomSets.map((set) => set?.displayName ?? null),
    functions: model.basis.functions,
    scan: model.scan?.values.map((distance) => Number(distance.toFixed(6))) ?? null,
  };
}

function codes(analysis: Analysis): string[] {
  return analysis.diagnostics.map((d) => d.code);
}

/** Applies the rewrites one statement at a time, first to last or last to first, analysing again after each. */
function oneByOne(text: string, order: 'forward' | 'backward', options: AnalyzeOptions = {}): string {
  let current = text;
  for (let step = 0; step < 20; step++) {
    const analysis = analyze(current, options);
    const items = retiredSpellings(current, analysis.tree, analysis.model).filter((item) => item.changes.length > 0);
    if (items.length === 0) return current;
    const item = order === 'forward' ? items[0]! : items[items.length - 1]!;
    current = applyChanges(current, item.changes);
  }
  throw new Error('the rewrites did not finish');
}

const WATER = `  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   0.756950   0.585882
  H  h2   0.000000  -0.756950   0.585882`;

/** The same water in bohr (÷ 0.529177210903, CODATA 2018). */
const WATER_BOHR = `  O  o    0.000000   0.000000   0.000000
  H  h1   0.000000   1.430429   1.107157
  H  h2   0.000000  -1.430429   1.107157`;

interface Case {
  readonly name: string;
  readonly old: string;
  /** The whole file rewritten. */
  readonly now: string;
  readonly messages: readonly string[];
  readonly options?: AnalyzeOptions;
}

const FRAGMENTS = `fragment w { atoms o h1; charge -1; tier mean-field { method rhf } }
fragment p { atoms rest; charge +1; tier mean-field { method rhf } }
`;

const CASES: readonly Case[] = [
  {
    name: '`geometry { … }` becomes `structure { … }`',
    old: `basis sto-3g\ngeometry {\n${WATER}\n}\n${FRAGMENTS}`,
    now: `basis sto-3g\nstructure {\n${WATER}\n}\n${FRAGMENTS}`,
    messages: ['`geometry` is an old spelling: write `structure { … }`.'],
  },
  {
    name: '`units bohr` moves into the structure header',
    old: `units bohr   # coordinates below in bohr\nbasis sto-3g\ngeometry {\n${WATER_BOHR}\n}\n${FRAGMENTS}scan distance o h2 from 1.8 to 2.2 step 0.2\n`,
    now: `basis sto-3g\nstructure in bohr {\n${WATER_BOHR}\n}\n${FRAGMENTS}scan distance o h2 from 1.8 to 2.2 step 0.2\n`,
    messages: [
      '`units bohr` is an old spelling: the length unit is part of the structure header now, `structure in bohr { … }`. The rewrite moves it there and deletes this line.',
      '`geometry` is an old spelling: write `structure in bohr { … }` (the unit of the old `units` line moves into the header, and that line goes).',
    ],
  },
  {
    name: '`units angstrom` goes: ångström is the default',
    old: `spec "w"\nunits angstrom\nbasis sto-3g\ngeometry {\n${WATER}\n}\n${FRAGMENTS}`,
    now: `spec "w"\nbasis sto-3g\nstructure {\n${WATER}\n}\n${FRAGMENTS}`,
    messages: [
      '`units angstrom` is an old spelling: the length unit is part of the structure header now, and ångström needs no word (`structure { … }`; `structure in bohr { … }` for bohr). Delete this line.',
      '`geometry` is an old spelling: write `structure { … }` (the old `units` line goes).',
    ],
  },
  {
    name: 'the braced basis block becomes one line per basis, comments kept',
    old: `basis def2-svp {   # the frame\n  # the metal gets more\n  Zn = def2-tzvp   # triple zeta\n  functions cartesian\n}\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n}\nfragment f { atoms rest; tier mean-field { method rhf } }\n`,
    now: `basis def2-svp  # the frame\n# the metal gets more\nbasis def2-tzvp on all Zn  # triple zeta\nfunctions cartesian\nstructure {\n  Zn zn 0 0 0\n  S s 0 0 2.3\n}\nfragment f { atoms rest; tier mean-field { method rhf } }\n`,
    messages: ['The braced basis block is an old spelling: write one line per basis and the function type on its own line, `basis def2-svp`, `basis def2-tzvp on all Zn`, `functions cartesian`.'],
  },
  {
    name: 'a one-line basis block',
    old: `basis sto-3g { H = 3-21G; functions spherical }\nstructure {\n${WATER}\n}\n${FRAGMENTS}`,
    now: `basis sto-3g\nbasis 3-21G on all H\nfunctions spherical\nstructure {\n${WATER}\n}\n${FRAGMENTS}`,
    messages: ['The braced basis block is an old spelling: write one line per basis and the function type on its own line, `basis sto-3g`, `basis 3-21G on all H`, `functions spherical`.'],
  },
  {
    name: '`within d of a` becomes `closer-than d to a`',
    old: `basis sto-3g\nstructure {\n${WATER}\n}\nfragment w { atoms within 1.2 of o; tier mean-field { method rhf } }\n`,
    now: `basis sto-3g\nstructure {\n${WATER}\n}\nfragment w { atoms closer-than 1.2 to o; tier mean-field { method rhf } }\n`,
    messages: ['`within 1.2 of o` is an old spelling: write `closer-than 1.2 to o`, every atom strictly closer than 1.2 Å (the structure\'s unit) to o.'],
  },
  {
    // A helium placed exactly 1 Å from o (by construction) sits on the boundary: `within 1 of o`
    // took it, `closer-than 1 to o` would not.
    name: '`within` with an atom exactly at its distance: the new distance is raised just enough',
    old: `basis sto-3g\nstructure {\n${WATER}\n  He he 1 0 0\n}\nfragment w { atoms within 1 of o; tier mean-field { method rhf } }\nfragment x { atoms rest; tier mean-field { method rhf } }\n`,
    now: `basis sto-3g\nstructure {\n${WATER}\n  He he 1 0 0\n}\nfragment w { atoms closer-than 1.0001 to o; tier mean-field { method rhf } }\nfragment x { atoms rest; tier mean-field { method rhf } }\n`,
    messages: [
      '`within 1 of o` is an old spelling: write `closer-than 1.0001 to o`, every atom strictly closer than 1.0001 Å (the structure\'s unit) to o (1.0001 rather than 1, because `closer-than` is strict and an atom lies exactly 1 Å away).',
    ],
  },
  {
    name: '`units bohr` with atoms from an XYZ file: the distances are converted to ångström',
    old: `units bohr\nbasis sto-3g\ngeometry from "water.xyz"\nfragment w { atoms within 2 of #1; tier mean-field { method rhf } }\nscan distance #1 #2 from 2 to 3 step 0.5\n`,
    // 2 bohr = 1.058354422 Å, 3 bohr = 1.587531633 Å, 0.5 bohr = 0.2645886055 Å (× 0.529177210903, CODATA 2018).
    now: `basis sto-3g\nstructure from "water.xyz"\nfragment w { atoms closer-than 1.058354422 to #1; tier mean-field { method rhf } }\nscan distance #1 #2 from 1.058354422 to 1.587531633 step 0.2645886055\n`,
    messages: [
      '`units bohr` is an old spelling: the length unit is part of the structure header now, and `structure from` reads an XYZ file in ångström by the format\'s convention. The rewrite deletes this line and converts the scan ranges and `closer-than` distances of this spec from bohr to ångström.',
      '`geometry` is an old spelling: write `structure from "water.xyz"` (the old `units` line goes, and the scan ranges and `closer-than` distances are converted from bohr to ångström, the unit of XYZ files).',
      '`within 2 of #1` is an old spelling: write `closer-than 2 to #1`, every atom strictly closer than 2 bohr (the structure\'s unit) to #1.',
    ],
    options: { path: '/work/specs/w.tess', files: memoryFiles({ '/work/specs/water.xyz': `3\nwater\n${WATER.split('\n').map((line) => line.trim().split(/\s+/).filter((_, k) => k !== 1).join(' ')).join('\n')}\n` }) },
  },
];

describe('retired spellings', () => {
  for (const c of CASES) {
    describe(c.name, () => {
      const before = analyze(c.old, c.options);

      it('reports each old statement as retired-spelling, with the new spelling in the message', () => {
        expect(before.diagnostics.filter((d) => d.code === 'retired-spelling').map((d) => d.message)).toEqual(c.messages);
        expect(before.diagnostics.filter((d) => d.code === 'retired-spelling').every((d) => d.severity === 'error')).toBe(true);
      });

      it('rewrites the whole file to the new spellings', () => {
        const rewritten = rewriteRetiredSpellings(c.old, c.options);
        expect(rewritten.text).toBe(c.now);
        expect(rewritten.remaining).toEqual([]);
      });

      it('keeps what the spec means, and brings no new diagnostic', () => {
        const after = analyze(c.now, c.options);
        expect(codes(after)).not.toContain('retired-spelling');
        expect(meaning(after)).toEqual(meaning(before));
        for (const code of codes(after)) expect(codes(before)).toContain(code);
      });

      it('gives the same spec when the statements are rewritten one at a time, in either order', () => {
        for (const order of ['forward', 'backward'] as const) {
          const text = oneByOne(c.old, order, c.options);
          expect(meaning(analyze(text, c.options)), order).toEqual(meaning(before));
          expect(codes(analyze(text, c.options)), order).not.toContain('retired-spelling');
        }
      });
    });
  }

  it('reads old spellings with their old meaning, so the rest of an old spec is still analysed', () => {
    const old = analyze(`units bohr\nbasis sto-3g { H = 3-21G }\ngeometry {\n${WATER_BOHR}\n}\nfragment w { atoms within 1.9 of o; tier mean-field { method rhf } }\n`);
    expect(old.model.units).toBe('bohr');
    expect(old.model.basis.atomSets.map((set) => set?.displayName)).toEqual(['STO-3G', '3-21G', '3-21G']);
    // 1.9 bohr reaches the hydrogens, 1.8088 bohr (0.9572 Å) away.
    expect(old.model.fragments[0]!.atoms).toEqual([0, 1, 2]);
    expect(codes(old).filter((code) => code !== 'retired-spelling')).toEqual([]);
  });

  it('offers no rewrite for an unclosed basis block, and says why', () => {
    const analysis = analyze(`basis sto-3g {\n  H = 3-21G\nstructure {\n${WATER}\n}\n`);
    const [item] = retiredSpellings(analysis.text, analysis.tree, analysis.model);
    expect(item!.changes).toEqual([]);
    expect(item!.message).toContain('Close the block first, then apply the rewrite.');
  });

  it('keeps a line the old block did not allow, as a comment, so nothing is lost', () => {
    const rewritten = rewriteRetiredSpellings(`basis sto-3g {\n  H = 3-21G\n  Qx = 6-31G\n}\nstructure {\n${WATER}\n}\nfragment w { atoms rest; tier mean-field { method rhf } }\n`);
    expect(rewritten.text.startsWith('basis sto-3g\nbasis 3-21G on all H\n# Qx = 6-31G\nstructure {\n')).toBe(true);
  });
});
