/**
 * Document symbols (the outline) of the samples and workspace symbols across analysed documents.
 */
import { describe, expect, it } from 'vitest';
import { SymbolKind, type DocumentSymbol, type Range } from 'vscode-languageserver-types';
import { analyzeDocument } from '../../server/src/analysis';
import { findDocumentSymbols, findWorkspaceSymbols } from '../../server/src/services';
import { positionOf, rangeOfText, readSample } from './service';

interface Outline {
  name: string;
  kind: SymbolKind;
  detail: string | undefined;
  lines: [number, number];
  children?: [string, SymbolKind][];
}

function outline(symbols: readonly DocumentSymbol[]): Outline[] {
  return symbols.map((symbol) => ({
    name: symbol.name,
    kind: symbol.kind,
    detail: symbol.detail,
    lines: [symbol.range.start.line + 1, symbol.range.end.line + 1],
    ...(symbol.children ? { children: symbol.children.map((child): [string, SymbolKind] => [child.name, child.kind]) } : {}),
  }));
}

describe('outline', () => {
  it('of the zinc-site sample: names, kinds, details and line spans', () => {
    const analysis = analyzeDocument(readSample('zn-site-h2s-scan.tess'));
    // Line numbers are 1-based, as an editor shows them. Figures: 'site' is zn and #2..#9 (9 atoms)
    // with a 10e 10o active space, 2 × 10 = 20 qubits under Jordan–Wigner; 'guest' is S and two H;
    // 'frame' takes the remaining 20 − 9 − 3 = 8 atoms; the scan from 2.3 to 3.5 Å in steps of
    // 0.2 Å has (3.5 − 2.3) / 0.2 + 1 = 7 points. The classical tiers' labels are those of their
    // inlay hints (tests/services/hintsAndLens.test.ts, with their sources).
    expect(outline(findDocumentSymbols(analysis))).toEqual([
      { name: 'spec zn-site-h2s-approach', kind: SymbolKind.File, detail: 'zn-site-h2s-approach', lines: [5, 5] },
      { name: 'basis def2-svp', kind: SymbolKind.Module, detail: 'def2-svp', lines: [10, 10] },
      { name: 'basis def2-tzvp', kind: SymbolKind.Module, detail: 'def2-tzvp on all Zn', lines: [11, 11] },
      { name: 'structure', kind: SymbolKind.Struct, detail: '20 atoms, ångström', lines: [13, 34] },
      { name: 'fragment site', kind: SymbolKind.Class, detail: 'quantum · 9 atoms · 20 qubits · 18 tapered · impurity 70e 130o', lines: [37, 48], children: [['tier quantum', SymbolKind.Method]] },
      { name: 'fragment guest', kind: SymbolKind.Class, detail: 'correlated · 3 atoms · ccsd(t) under a second · 9.70 MiB · impurity 46e 46o', lines: [51, 54], children: [['tier correlated', SymbolKind.Method]] },
      { name: 'fragment frame', kind: SymbolKind.Class, detail: 'mean-field · 8 atoms · rhf under a second · 1.35 MiB', lines: [57, 61], children: [['tier mean-field', SymbolKind.Method]] },
      { name: 'embedding', kind: SymbolKind.Property, detail: 'dmet', lines: [63, 63] },
      { name: 'scan', kind: SymbolKind.Event, detail: '7 points', lines: [65, 65] },
      { name: 'limits', kind: SymbolKind.Object, detail: '', lines: [67, 70] },
    ]);
  });

  it('selects the fragment name, and the keyword of other statements', () => {
    const analysis = analyzeDocument(readSample('zn-site-h2s-scan.tess'));
    const symbols = findDocumentSymbols(analysis);
    const site = symbols.find((symbol) => symbol.name === 'fragment site')!;
    expect(site.selectionRange).toEqual({ start: positionOf(analysis, 'fragment site', 9), end: positionOf(analysis, 'fragment site', 13) });
    const geometry = symbols.find((symbol) => symbol.name === 'structure')!;
    expect(geometry.selectionRange).toEqual({ start: positionOf(analysis, 'structure {'), end: positionOf(analysis, 'structure {', 9) });
    for (const symbol of symbols) {
      expect(contains(symbol.range, symbol.selectionRange), symbol.name).toBe(true);
      for (const child of symbol.children ?? []) expect(contains(symbol.range, child.range), `${symbol.name} > ${child.name}`).toBe(true);
    }
  });

  it('of a quantum fragment under the parity mapping: 2 × 4 − 2 = 6 qubits', () => {
    // water-cc-pvdz.tess: active 4e 4o, parity with the two-qubit reduction (Bravyi, Gambetta,
    // Mezzacapo, Temme, arXiv:1701.08213 (2017)).
    const symbols = findDocumentSymbols(analyzeDocument(readSample('molecules/water-cc-pvdz.tess')));
    expect(symbols.find((symbol) => symbol.kind === SymbolKind.Class)?.detail).toBe('quantum · 3 atoms · 6 qubits · 4 tapered');
  });

  it('leaves out statements that are not outline entries and unknown keywords', () => {
    const analysis = analyzeDocument('functions cartesian\ncharge 0\nbassis sto-3g\nstructure in bohr {\n  H a 0 0 0\n  H b 0 0 1.4\n}\nfragment f { atoms rest }\n');
    expect(findDocumentSymbols(analysis).map((symbol) => symbol.name)).toEqual(['structure', 'fragment f']);
  });

  it('of every sample: one fragment entry per fragment', () => {
    for (const name of ['mistakes.tess', 'molecules/benzene-6-31gs.tess', 'open-shell/copper-aqua-doublet.tess']) {
      const analysis = analyzeDocument(readSample(name));
      const fragments = findDocumentSymbols(analysis).filter((symbol) => symbol.kind === SymbolKind.Class);
      expect(fragments.map((symbol) => symbol.name), name).toEqual(analysis.model.fragments.map((fragment) => `fragment ${fragment.name}`));
    }
  });
});

describe('workspace symbols', () => {
  const zinc = { uri: 'file:///work/zn-site-h2s-scan.tess', analysis: analyzeDocument(readSample('zn-site-h2s-scan.tess')) };
  const copper = { uri: 'file:///work/copper-aqua-doublet.tess', analysis: analyzeDocument(readSample('open-shell/copper-aqua-doublet.tess')) };

  it('finds fragments and spec names in both documents, case-blind', () => {
    const found = findWorkspaceSymbols([zinc, copper], 'E');
    expect(found.map((symbol) => [symbol.name, symbol.kind, symbol.location.uri, symbol.containerName])).toEqual([
      ['site', SymbolKind.Class, zinc.uri, 'zn-site-h2s-approach'],
      ['guest', SymbolKind.Class, zinc.uri, 'zn-site-h2s-approach'],
      ['frame', SymbolKind.Class, zinc.uri, 'zn-site-h2s-approach'],
      ['zn-site-h2s-approach', SymbolKind.File, zinc.uri, undefined],
      ['metal', SymbolKind.Class, copper.uri, 'copper-aqua-doublet'],
      ['waters', SymbolKind.Class, copper.uri, 'copper-aqua-doublet'],
      ['copper-aqua-doublet', SymbolKind.File, copper.uri, undefined],
    ]);
    expect(findWorkspaceSymbols([zinc, copper], 'SIT').map((symbol) => symbol.name)).toEqual(['site', 'zn-site-h2s-approach']);
  });

  it('points at the fragment name in its own document', () => {
    const [metal] = findWorkspaceSymbols([zinc, copper], 'metal');
    expect(metal?.location).toEqual({ uri: copper.uri, range: rangeOfText(copper.analysis, 'metal') });
  });

  it('returns every fragment and spec for an empty query, nothing for an unmatched one', () => {
    expect(findWorkspaceSymbols([zinc, copper], '').map((symbol) => symbol.name)).toEqual(['site', 'guest', 'frame', 'zn-site-h2s-approach', 'metal', 'waters', 'copper-aqua-doublet']);
    expect(findWorkspaceSymbols([zinc, copper], 'benzene')).toEqual([]);
  });

  it('omits the container of a spec without a name', () => {
    const unnamed = { uri: 'file:///work/unnamed.tess', analysis: analyzeDocument('basis sto-3g\nstructure {\n  H a 0 0 0\n  H b 0 0 0.74\n}\nfragment h2 { atoms rest; tier mean-field { method rhf } }\n') };
    const found = findWorkspaceSymbols([unnamed], 'h2');
    expect(found).toEqual([{ name: 'h2', kind: SymbolKind.Class, location: { uri: unnamed.uri, range: { start: positionOf(unnamed.analysis, 'h2 {'), end: positionOf(unnamed.analysis, 'h2 {', 2) } } }]);
  });
});

function contains(outer: Range, inner: Range): boolean {
  const before = (a: Range['start'], b: Range['start']) => a.line < b.line || (a.line === b.line && a.character <= b.character);
  return before(outer.start, inner.start) && before(inner.end, outer.end);
}
