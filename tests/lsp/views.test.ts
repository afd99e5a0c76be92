/**
 * The language server's requests for the extension's views, over stdio: `tessera/structure`,
 * `tessera/costs` and `tessera/viewTarget` answer for an open spec, follow its edits, answer null
 * for a spec that is not open, and shrug off malformed parameters.
 */
import { readFileSync } from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkCosts, checkStructure, type ViewCosts, type ViewStructure } from '../../client/src/views/protocol';
import { ROOT, startServer, type TestClient } from './client';

const demoPath = path.join(ROOT, 'samples', 'zn-site-h2s-scan.tess');
const demoUri = pathToFileURL(demoPath).toString();
const demoText = readFileSync(demoPath, 'utf8');

let client: TestClient;

beforeAll(async () => {
  client = await startServer();
  const opened = client.diagnostics(demoUri);
  client.open(demoUri, demoText);
  await opened;
});

afterAll(async () => {
  await client.stop();
});

describe('view requests', () => {
  it('tessera/structure answers the structure of an open spec, in the shape the view checks', async () => {
    const data = await client.request<ViewStructure>('tessera/structure', { uri: demoUri });
    expect(checkStructure(data).ok).toBe(true);
    expect(data.fragments.map((f) => f.name)).toEqual(['site', 'guest', 'frame']);
    expect(data.atoms).toHaveLength(20);
    // Zero-based line of the zinc atom in the sample.
    expect(data.atoms[0]!.line).toBe(demoText.split('\n').findIndex((line) => line.startsWith('  Zn  zn')));
  });

  it('tessera/costs answers the three charts and the selectable fragments; a fragment can be asked for', async () => {
    const first = await client.request<ViewCosts>('tessera/costs', { uri: demoUri });
    expect(checkCosts(first).ok).toBe(true);
    expect(first.selected).toBe(0);
    const guest = await client.request<ViewCosts>('tessera/costs', { uri: demoUri, fragment: 1 });
    expect(guest.selected).toBe(1);
    expect(guest.svg.growth).toContain('active-space size: guest');
  });

  it('tessera/viewTarget answers the fragment block and atom line at a position', async () => {
    const lines = demoText.split('\n');
    const inGuest = lines.findIndex((line) => line.includes('tier correlated'));
    const zinc = lines.findIndex((line) => line.startsWith('  Zn  zn'));
    expect(await client.request('tessera/viewTarget', { uri: demoUri, position: { line: inGuest, character: 4 } })).toEqual({ fragment: 1, atom: null });
    expect(await client.request('tessera/viewTarget', { uri: demoUri, position: { line: zinc, character: 2 } })).toEqual({ fragment: null, atom: 0 });
  });

  it('follow an edit of the spec', async () => {
    const uri = 'untitled:views-edit.tess';
    const text = 'basis sto-3g\nstructure {\n  H 0 0 0\n  H 0 0 0.74\n}\nfragment a { atoms rest; tier mean-field { method rhf } }\n';
    const opened = client.diagnostics(uri);
    client.open(uri, text);
    await opened;
    expect((await client.request<ViewStructure>('tessera/structure', { uri })).fragments.map((f) => f.name)).toEqual(['a']);
    const changed = client.diagnostics(uri, 2);
    client.change(uri, 2, [{ text: text.replace('fragment a', 'fragment renamed') }]);
    await changed;
    expect((await client.request<ViewStructure>('tessera/structure', { uri })).fragments.map((f) => f.name)).toEqual(['renamed']);
  });

  it('answer null for a spec that is not open, and for malformed parameters', async () => {
    const notOpen = 'untitled:not-open.tess';
    expect(await client.request('tessera/structure', { uri: notOpen })).toBeNull();
    expect(await client.request('tessera/costs', { uri: notOpen })).toBeNull();
    expect(await client.request('tessera/viewTarget', { uri: notOpen, position: { line: 0, character: 0 } })).toBeNull();
    expect(await client.request('tessera/structure', { uri: 42 })).toBeNull();
    expect(await client.request('tessera/structure', null)).toBeNull();
    expect(await client.request('tessera/costs', null)).toBeNull();
    expect(await client.request('tessera/viewTarget', { uri: demoUri })).toBeNull();
    expect(await client.request('tessera/viewTarget', { uri: demoUri, position: { line: 'x', character: 0 } })).toBeNull();
    // A fragment that is not a whole number is ignored: the default chart.
    expect((await client.request<ViewCosts>('tessera/costs', { uri: demoUri, fragment: '1' })).selected).toBe(0);
    // Still serving.
    expect((await client.request<ViewStructure>('tessera/structure', { uri: demoUri })).atoms).toHaveLength(20);
  });
});
