/**
 * The computed DMET bath in the editor: under `embedding dmet` the system's mean field runs by
 * itself, each fragment's bath after it, and the fragment hover shows the singular values, the bath
 * computed beside the bath counted, and the impurity's electrons.
 *
 * Check values: the Li+–water case of tests/fixtures/dmet-bath.psi4.json (made by
 * scripts/data/generate_dmet_bath_fixture.py with psi4 1.3.2 and numpy): 6 bath orbitals per
 * fragment, 12 impurity electrons, largest singular value 0.286; with the editor's threshold at 0.1
 * the same fixture's singular values (0.286, 0.208, 0.144, 0.095, …) keep 3 bath orbitals.
 */
import { readFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import * as path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import type { Hover, MarkupContent } from 'vscode-languageserver-types';
import { ROOT, startServer, type TestClient } from './client';

interface FixtureCase {
  name: string;
  geometry: { symbol: string; x: number; y: number; z: number }[];
  fragments: { name: string; atoms: number[]; alpha: { singularValues: number[]; bathOrbitals: number }; impurityElectrons: number }[];
}

const FIXTURE = JSON.parse(readFileSync(path.join(__dirname, '..', 'fixtures', 'dmet-bath.psi4.json'), 'utf8')) as { cases: FixtureCase[] };
const LITHIUM = FIXTURE.cases.find((c) => c.name === 'lithium cation with water')!;

function spec(): string {
  const atoms = LITHIUM.geometry.map((atom) => `  ${atom.symbol} ${atom.x.toFixed(12)} ${atom.y.toFixed(12)} ${atom.z.toFixed(12)}`);
  return ['spec "li-water"', 'charge 1', 'basis cc-pVDZ', 'embedding dmet', 'structure in bohr {', ...atoms, '}', 'fragment ion {\n  atoms #1\n  charge 1\n  tier mean-field { method rhf }\n}', 'fragment water {\n  atoms #2..#4\n  tier mean-field { method rhf }\n}', ''].join('\n');
}

function positionOf(text: string, needle: string): { line: number; character: number } {
  const index = text.indexOf(needle) + 'fragment '.length + 1;
  const before = text.slice(0, index);
  return { line: before.split('\n').length - 1, character: index - (before.lastIndexOf('\n') + 1) };
}

let client: TestClient | undefined;

afterEach(async () => {
  await client?.stop();
  client = undefined;
});

/** Opens the Li+–water spec with the given settings and returns the water fragment's hover once its bath is computed. */
async function computedBathHover(settings: Record<string, unknown>): Promise<string> {
  client = await startServer({ capabilities: { window: { workDoneProgress: true } }, settings });
  const c = client;
  c.connection.onRequest('window/workDoneProgress/create', () => null);
  c.connection.onNotification('$/progress', () => undefined);
  c.connection.onNotification('tessera/computedChanged', () => undefined);
  const uri = pathToFileURL(path.join(ROOT, 'samples', 'li-water-bath.tess')).toString();
  const text = spec();
  const published = c.diagnostics(uri);
  c.open(uri, text);
  expect((await published).filter((d) => d.severity === 1)).toEqual([]);
  const hover = async () => ((await c.request<Hover>('textDocument/hover', { textDocument: { uri }, position: positionOf(text, 'fragment water') })).contents as MarkupContent).value;
  const first = await hover();
  expect(first).toMatch(/\*\*DMET bath\*\* · (computing|computed once)/);
  const end = Date.now() + 120_000;
  let value = first;
  while (!value.includes('DMET bath (computed)') && Date.now() < end) {
    await new Promise((resolve) => setTimeout(resolve, 200));
    value = await hover();
  }
  return value;
}

describe('computed DMET bath over stdio', () => {
  it('shows the bath of a fragment once the system mean field and the bath job have run', async () => {
    const value = await computedBathHover({});
    expect(value).toContain("**DMET bath (computed)** · from the system's RHF mean field");
    const fragment = LITHIUM.fragments[1]!;
    expect(value).toContain(`| bath orbitals | ${fragment.alpha.bathOrbitals} | ${fragment.alpha.bathOrbitals} |`);
    // 12 electrons, 6 per spin = 6 bath + 0 fully occupied fragment orbitals; the rule counts the same.
    expect(value).toContain(`| impurity electrons | ${fragment.impurityElectrons.toFixed(6)} (6 per spin by the rule bath + fully occupied fragment orbitals) | 12 |`);
    expect(value).toContain('The DMET impurity in the planning figures above is counted');
    expect(value).toContain(`Singular values σ: ${fragment.alpha.singularValues[0]!.toPrecision(3)}`);
    expect(value).toContain('| | computed | counted |');
  }, 180_000);

  it('takes the bath threshold from the editor settings (tessera.embedding.bathThreshold)', async () => {
    const value = await computedBathHover({ embedding: { bathThreshold: 0.1 } });
    expect(value).toContain('bath where σ > 1e-1');
    expect(value).toContain('Löwdin-orthogonalised atomic orbitals');
    // Fixture singular values of the water fragment: 0.286, 0.208, 0.144, 0.095, ...: three above 0.1.
    expect(value).toMatch(/\| bath orbitals \| 3 \| \d+ \|/);
  }, 180_000);

  it('builds the bath against intrinsic atomic orbitals when the editor asks (tessera.embedding.bathOrbitals)', async () => {
    const value = await computedBathHover({ embedding: { bathOrbitals: 'iao' } });
    expect(value).toContain('intrinsic atomic orbitals (minimal basis');
  }, 180_000);
});
