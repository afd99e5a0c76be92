/** Protocol tests: the bundled server, started as a child process, driven over stdio like an editor. */
import { readFileSync, writeFileSync } from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CodeAction, CompletionList, DocumentSymbol, Hover, MarkupContent, TextEdit, WorkspaceEdit } from 'vscode-languageserver-types';
import { tempFolder } from '../support/tempFolders';
import { ROOT, startServer, type TestClient } from './client';

const demoPath = path.join(ROOT, 'samples', 'zn-site-h2s-scan.tess');
const demoUri = pathToFileURL(demoPath).toString();
const demoText = readFileSync(demoPath, 'utf8');
const mistakesPath = path.join(ROOT, 'samples', 'mistakes.tess');
const mistakesUri = pathToFileURL(mistakesPath).toString();

function positionOf(text: string, needle: string, occurrence = 0, delta = 0): { line: number; character: number } {
  let index = -1;
  for (let i = 0; i <= occurrence; i++) index = text.indexOf(needle, index + 1);
  if (index < 0) throw new Error(`'${needle}' not found`);
  const before = text.slice(0, index + delta);
  const line = before.split('\n').length - 1;
  return { line, character: before.length - before.lastIndexOf('\n') - 1 };
}

let client: TestClient;

beforeAll(async () => {
  client = await startServer();
});

afterAll(async () => {
  await client.stop();
});

describe('language server over stdio', () => {
  it('publishes the diagnostics of an opened spec', async () => {
    const pending = client.diagnostics(demoUri);
    client.open(demoUri, demoText);
    const diagnostics = await pending;
    expect(diagnostics.every((d) => d.source === 'tessera')).toBe(true);
    expect(diagnostics.filter((d) => d.severity === 1)).toEqual([]);
    expect(diagnostics.some((d) => d.code === 'bond-cut')).toBe(true);
    const bondCut = diagnostics.find((d) => d.code === 'bond-cut')!;
    expect(bondCut.relatedInformation?.length).toBeGreaterThan(0);
  });

  it('publishes each mistake of the mistakes sample with its range and related information', async () => {
    const text = readFileSync(mistakesPath, 'utf8');
    const pending = client.diagnostics(mistakesUri);
    client.open(mistakesUri, text);
    const diagnostics = await pending;
    const basis = diagnostics.find((d) => d.code === 'unknown-basis')!;
    expect(basis.range).toEqual({ start: positionOf(text, 'cc-pvdzz'), end: positionOf(text, 'cc-pvdzz', 0, 'cc-pvdzz'.length) });
    const overlap = diagnostics.find((d) => d.code === 'fragment-overlap')!;
    expect(overlap.relatedInformation?.[0]?.message).toContain("'water' claims them here");
  });

  it('hovers a fragment name with its resource card', async () => {
    const hover = await client.request<Hover>('textDocument/hover', { textDocument: { uri: demoUri }, position: positionOf(demoText, 'fragment site', 0, 10) });
    const value = (hover.contents as MarkupContent).value;
    expect(value).toContain('**fragment site**');
    expect(value).toContain('Jordan–Wigner 20');
    expect(value).toContain('qubits needed');
    expect(value).toContain('Planning estimates');
  });

  it('hovers an atom label with its element, coordinates and fragment', async () => {
    const hover = await client.request<Hover>('textDocument/hover', { textDocument: { uri: demoUri }, position: positionOf(demoText, 'zn s from', 0, 0) });
    const value = (hover.contents as MarkupContent).value;
    expect(value).toContain('**Zinc**');
    expect(value).toContain('Z = 30');
    expect(value).toContain('`site`');
    expect(value).toContain('bohr');
  });

  it('completes the methods of the enclosing tier and the keywords of a fragment block', async () => {
    const methods = await client.request<CompletionList>('textDocument/completion', { textDocument: { uri: demoUri }, position: positionOf(demoText, 'method ccsd(t)', 0, 'method '.length) });
    const labels = methods.items.map((item) => item.label);
    expect(labels).toEqual(expect.arrayContaining(['mp2', 'ccsd', 'ccsd(t)', 'fci']));
    expect(labels).not.toContain('vqe');
    const keywords = await client.request<CompletionList>('textDocument/completion', { textDocument: { uri: demoUri }, position: positionOf(demoText, '  charge +2', 0, 2) });
    // Keywords of a fragment block, less the ones this fragment already has (atoms, tier).
    expect(keywords.items.map((item) => item.label).sort()).toEqual(['caps', 'charge', 'multiplicity']);
  });

  it('renames an atom label at its definition and every use', async () => {
    const edit = await client.request<WorkspaceEdit>('textDocument/rename', { textDocument: { uri: demoUri }, position: positionOf(demoText, '  S   s', 0, 6), newName: 'sulfur' });
    const edits = edit.changes![demoUri]!;
    expect(edits.length).toBe(3); // the label, `atoms s #19..#20`, `scan distance zn s`
    expect(edits.every((e) => e.newText === 'sulfur')).toBe(true);
  });

  it('formats a messy geometry into aligned columns, and formatting twice changes nothing', async () => {
    const uri = 'untitled:messy.tess';
    const text = 'basis sto-3g\nstructure {\nO 0 0 0\n   H h1 0 .756950 0.585882\nH h2 0 -0.756950 0.585882\n}\n';
    const pending = client.diagnostics(uri);
    client.open(uri, text);
    await pending;
    const edits = await client.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } });
    const lines = text.split('\n');
    for (const e of edits) lines[e.range.start.line] = e.newText;
    expect(lines.slice(2, 5)).toEqual(['  O       0.000000   0.000000   0.000000', '  H  h1   0.000000   0.756950   0.585882', '  H  h2   0.000000  -0.756950   0.585882']);
    const pendingSecond = client.diagnostics(uri, 2);
    client.change(uri, 2, [{ text: lines.join('\n') }]);
    await pendingSecond;
    const again = await client.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } });
    expect(again).toEqual([]);
  });

  it('offers a quick fix that sets a valid multiplicity, and applying it clears the diagnostic', async () => {
    const uri = 'untitled:spin.tess';
    const text = 'multiplicity 2\nbasis sto-3g\nstructure {\n  O 0 0 0\n  H 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\n';
    const pending = client.diagnostics(uri);
    client.open(uri, text);
    const diagnostics = await pending;
    const parity = diagnostics.find((d) => d.code === 'multiplicity-parity')!;
    const actions = await client.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: parity.range, context: { diagnostics: [parity] } });
    const fix = actions.find((a) => a.title === 'Set the multiplicity to 1')!;
    const edit = fix.edit!.changes![uri]![0]!;
    const lines = text.split('\n');
    lines[edit.range.start.line] = lines[edit.range.start.line]!.slice(0, edit.range.start.character) + edit.newText + lines[edit.range.start.line]!.slice(edit.range.end.character);
    const after = client.diagnostics(uri, 2);
    client.change(uri, 2, [{ text: lines.join('\n') }]);
    expect((await after).map((d) => d.code)).not.toContain('multiplicity-parity');
  });

  it('re-checks after an incremental edit', async () => {
    const uri = 'untitled:edit.tess';
    const text = 'basis sto-3g\nstructure {\n  H 0 0 0\n  H 0 0 0.74\n}\n';
    const pending = client.diagnostics(uri);
    client.open(uri, text);
    expect(await pending).toEqual([]);
    const after = client.diagnostics(uri, 2);
    // Type `x` into the basis name: sto-3g -> sto-3gx
    client.change(uri, 2, [{ range: { start: { line: 0, character: 12 }, end: { line: 0, character: 12 } }, text: 'x' }]);
    const diagnostics = await after;
    expect(diagnostics.map((d) => d.code)).toEqual(['unknown-basis']);
    expect(diagnostics[0]!.message).toContain("Did you mean 'STO-3G'?");
  });

  it('lists the outline: basis lines, structure, fragments, scan, limits', async () => {
    const symbols = await client.request<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri: demoUri } });
    expect(symbols.map((s) => s.name)).toEqual(['spec zn-site-h2s-approach', 'basis def2-svp', 'basis def2-tzvp', 'structure', 'fragment site', 'fragment guest', 'fragment frame', 'embedding', 'scan', 'limits']);
    expect(symbols.find((s) => s.name === 'fragment site')!.detail).toContain('20 qubits · 18 tapered');
  });

  it('answers semantic tokens, folding ranges, inlay hints, code lens and the report request', async () => {
    const tokens = await client.request<{ data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri: demoUri } });
    expect(tokens.data.length % 5).toBe(0);
    expect(tokens.data.length).toBeGreaterThan(100);
    const folds = await client.request<unknown[]>('textDocument/foldingRange', { textDocument: { uri: demoUri } });
    expect(folds.length).toBeGreaterThan(5);
    const hints = await client.request<{ label: string }[]>('textDocument/inlayHint', { textDocument: { uri: demoUri }, range: { start: { line: 0, character: 0 }, end: { line: 200, character: 0 } } });
    expect(hints.map((h) => h.label)).toContain('20 qubits · 18 tapered · impurity 70e 130o');
    const lenses = await client.request<{ command: { title: string } }[]>('textDocument/codeLens', { textDocument: { uri: demoUri } });
    expect(lenses[0]!.command.title).toContain('largest quantum fragment 18 qubits (site)');
    const report = await client.request<{ markdown: string }>('tessera/report', { uri: demoUri });
    expect(report.markdown).toContain('# Resource report: zn-site-h2s-approach');
    // The demo has no variants: the comparison holds the spec alone, marked best under its limits.
    const comparison = await client.request<{ markdown: string }>('tessera/compare', { uri: demoUri });
    expect(comparison.markdown).toContain('| | zn-site-h2s-approach (best) |');
  });

  it('answers the status-bar summary: the largest quantum fragment, the errors and the limit', async () => {
    // The demo's quantum fragment 'site' needs 18 qubits after tapering in the stabiliser of its
    // atoms (its code lens above); the spec sets `limits { qubits 24 }` and has no errors.
    const summary = await client.request<{ largestQubits: number | null; fragment: string | null; errors: number; limit: number | null }>('tessera/summary', { uri: demoUri });
    expect(summary).toEqual({ largestQubits: 18, fragment: 'site', errors: 0, limit: 24 });
    const mistakes = await client.request<{ errors: number }>('tessera/summary', { uri: mistakesUri });
    const published = (await client.request<unknown>('tessera/summary', { uri: 'untitled:not-open.tess' })) as null;
    expect(mistakes.errors).toBeGreaterThan(5);
    expect(published).toBeNull();
  });

  it('sends semantic tokens as a small delta after a one-line edit', async () => {
    const uri = 'untitled:tokens.tess';
    const text = demoText;
    const opened = client.diagnostics(uri);
    client.open(uri, text);
    await opened;
    const full = await client.request<{ resultId: string; data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri } });
    expect(full.resultId).toBeTruthy();
    const at = positionOf(text, 'embedding dmet', 0, 'embedding dmet'.length);
    const changed = client.diagnostics(uri, 2);
    client.change(uri, 2, [{ range: { start: at, end: at }, text: '  # a note' }]);
    await changed;
    const delta = await client.request<{ resultId: string; edits: { start: number; deleteCount: number; data: number[] }[] }>('textDocument/semanticTokens/full/delta', { textDocument: { uri }, previousResultId: full.resultId });
    expect(delta.edits.length).toBe(1);
    expect(delta.edits[0]!.data.length).toBeLessThanOrEqual(15);
    const next = [...full.data];
    next.splice(delta.edits[0]!.start, delta.edits[0]!.deleteCount, ...delta.edits[0]!.data);
    const fresh = await client.request<{ data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri } });
    expect(next).toEqual(fresh.data);
  });

  it('re-checks a spec when its included XYZ file changes', async () => {
    const folder = tempFolder('tessera-lsp-');
    const xyz = path.join(folder, 'mol.xyz');
    writeFileSync(xyz, '2\nH2\nH 0 0 0\nH 0 0 0.74\n');
    const specUri = pathToFileURL(path.join(folder, 'mol.tess')).toString();
    const pending = client.diagnostics(specUri);
    client.open(specUri, 'basis sto-3g\nstructure from "mol.xyz"\n');
    expect(await pending).toEqual([]);
    writeFileSync(xyz, '2\nH2\nH 0 0 0\nH 0 0 0.1\n');
    // A publish of the old state may still be on its way (a settings change re-publishes every
    // spec): wait for the one that has read the new file.
    const after = client.diagnosticsWhere(specUri, (diagnostics) => diagnostics.length > 0);
    await client.connection.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: pathToFileURL(xyz).toString(), type: 2 }] });
    expect((await after).map((d) => d.code)).toContain('atoms-too-close');
  });

  it('keeps serving after bad input', async () => {
    const uri = 'untitled:garbage.tess';
    const pending = client.diagnostics(uri);
    client.open(uri, '}}}{{{ @@@ "unterminated\n#\u0000\u{1F600} structure { H 1e999 }');
    expect((await pending).length).toBeGreaterThan(0);
    const hover = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position: { line: 5, character: 80 } });
    expect(hover).toBeNull();
    const unknown = await client.request<Hover | null>('textDocument/hover', { textDocument: { uri: 'untitled:not-open.tess' }, position: { line: 0, character: 0 } });
    expect(unknown).toBeNull();
  });
});

describe('settings', () => {
  it('reads the qubit limit and the default mapping from the editor settings', async () => {
    const configured = await startServer({ settings: { qubitLimit: 10, defaultMapping: 'parity' } });
    try {
      const uri = 'untitled:settings.tess';
      const text = 'basis sto-3g\nstructure {\n  O 0 0 0\n  H 0 0.756950 0.585882\n  H 0 -0.756950 0.585882\n}\nfrozen-core off\nfragment w {\n  atoms rest\n  tier quantum { method vqe }\n}\n';
      // The first publication may come before the settings arrive; wait for one with the limit applied.
      configured.open(uri, text);
      let diagnostics = await configured.diagnostics(uri);
      for (let i = 0; i < 5 && !diagnostics.some((d) => d.code === 'qubit-limit-exceeded'); i++) diagnostics = await configured.diagnostics(uri);
      const limit = diagnostics.find((d) => d.code === 'qubit-limit-exceeded')!;
      expect(limit.message).toContain('needs 12 qubits (parity;');
      expect(limit.message).toContain('the spec sets none');
      expect(configured.serverRequests).toContain('workspace/configuration');
    } finally {
      await configured.stop();
    }
  });
});
