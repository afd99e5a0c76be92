/**
 * The packaged extension: `npm run package` builds a .vsix with @vscode/vsce; it must carry the
 * bundled client and server and the language files, no node_modules or sources, and a valid manifest.
 */
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import * as path from 'node:path';
import yauzl from 'yauzl';
import { beforeAll, describe, expect, it } from 'vitest';

const root = path.resolve(__dirname, '..', '..');
const manifest = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));
const vsix = path.join(root, `tessera-${manifest.version}.vsix`);
/** The basis-set exponent files, shipped Brotli-compressed next to the server (scripts/build.mjs). */
const basisData = readdirSync(path.join(root, 'server', 'src', 'chemistry', 'data', 'basis-sets'))
  .filter((file) => file.endsWith('.json'))
  .map((file) => `extension/dist/basis-sets/${file}.br`);

function readZip(file: string): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.open(file, { lazyEntries: true }, (error, zip) => {
      if (error || !zip) return reject(error);
      const entries = new Map<string, Buffer>();
      zip.on('entry', (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (streamError, stream) => {
          if (streamError || !stream) return reject(streamError);
          const chunks: Buffer[] = [];
          stream.on('data', (chunk: Buffer) => chunks.push(chunk));
          stream.on('end', () => {
            entries.set(entry.fileName, Buffer.concat(chunks));
            zip.readEntry();
          });
        });
      });
      zip.on('end', () => resolve(entries));
      zip.readEntry();
    });
  });
}

let files: Map<string, Buffer>;

beforeAll(() => {
  execFileSync('npm', ['run', '--silent', 'package'], { cwd: root, stdio: 'pipe' });
  return readZip(vsix).then((entries) => {
    files = entries;
  });
}, 120_000);

describe('the .vsix package', () => {
  it('lists exactly the files the extension needs', () => {
    expect([...files.keys()].sort()).toEqual(
      [
        '[Content_Types].xml',
        'extension.vsixmanifest',
        'extension/LICENSE.txt',
        'extension/changelog.md',
        'extension/dist/client/extension.js',
        'extension/dist/server.js',
        'extension/dist/worker.js',
        'extension/dist/webview/costs.js',
        'extension/dist/webview/levels.js',
        'extension/dist/webview/structure.js',
        'extension/dist/webview/third-party-notices.txt',
        'extension/grammar/tessera.tmLanguage.json',
        'extension/icons/tessera-file.svg',
        'extension/icons/tessera.png',
        'extension/language-configuration.json',
        'extension/package.json',
        'extension/readme.md',
        'extension/dist/basis-sets/BASIS-ORIGIN.md',
        ...basisData,
      ].sort(),
    );
  });

  it('has a manifest whose every referenced file is in the package', () => {
    const packaged = JSON.parse(files.get('extension/package.json')!.toString('utf8'));
    const has = (relative: string) => files.has(`extension/${relative.replace(/^\.\//, '')}`);
    expect(packaged.engines.vscode).toMatch(/^\^1\.\d+\.\d+$/);
    expect(has(packaged.main)).toBe(true);
    expect(has(packaged.icon)).toBe(true);
    expect(packaged.activationEvents).toEqual(['onLanguage:tessera']);
    for (const language of packaged.contributes.languages) {
      expect(has(language.configuration)).toBe(true);
      expect(has(language.icon.light)).toBe(true);
    }
    for (const grammar of packaged.contributes.grammars) expect(has(grammar.path)).toBe(true);
    const commands = packaged.contributes.commands.map((c: { command: string }) => c.command);
    expect(commands).toEqual(expect.arrayContaining(['tessera.showReport', 'tessera.showStructure', 'tessera.showCosts', 'tessera.showLevels', 'tessera.restartServer']));
    expect(Object.keys(packaged.contributes.configuration.properties)).toEqual(
      expect.arrayContaining([
        'tessera.defaultMapping',
        'tessera.qubitLimit',
        'tessera.inlayHints.enabled',
        'tessera.codeLens.enabled',
        'tessera.meanField.autoFunctionLimit',
        'tessera.jobs.workers',
        'tessera.jobs.memoryLimit',
        'tessera.embedding.bathThreshold',
        'tessera.embedding.bathOrbitals',
        'tessera.trace.server',
      ]),
    );
    const xml = files.get('extension.vsixmanifest')!.toString('utf8');
    expect(xml).toContain(`Version="${manifest.version}"`);
    expect(xml).toContain('Microsoft.VisualStudio.Code');
  });

  it('bundles the run-time dependencies and stays small', () => {
    const server = files.get('extension/dist/server.js')!.toString('utf8');
    expect(server).not.toMatch(/require\(["']vscode-languageserver/);
    expect(server).not.toMatch(/require\(["']chevrotain/);
    const client = files.get('extension/dist/client/extension.js')!.toString('utf8');
    expect(client).toMatch(/require\(["']vscode["']\)/);
    expect(client).not.toMatch(/require\(["']vscode-languageclient/);
    // The extension holds no analysis: the parser (chevrotain) and the basis-set data stay in the server.
    expect(server).toMatch(/chevrotain/i);
    expect(server).toMatch(/def2-svp/i);
    // The worker runs the engine and nothing of the language: it is started by the server, not the client.
    const worker = files.get('extension/dist/worker.js')!.toString('utf8');
    expect(worker).not.toMatch(/chevrotain/i);
    expect(worker).not.toMatch(/require\(["']vscode/);
    expect(server).toMatch(/worker\.js/);
    for (const bundle of ['extension/dist/client/extension.js', 'extension/dist/webview/structure.js', 'extension/dist/webview/costs.js', 'extension/dist/webview/levels.js']) {
      expect(files.get(bundle)!.toString('utf8')).not.toMatch(/chevrotain|def2-svp/i);
    }
    // The webview scripts are self-contained browser bundles, and the viewer's licence ships with them.
    for (const view of ['structure', 'costs', 'levels']) expect(files.get(`extension/dist/webview/${view}.js`)!.toString('utf8')).not.toMatch(/\brequire\(["']/);
    const notices = files.get('extension/dist/webview/third-party-notices.txt')!.toString('utf8');
    expect(notices).toContain('3dmol');
    expect(notices).toContain('University of Pittsburgh');
    const total = [...files.values()].reduce((sum, buffer) => sum + buffer.length, 0);
    expect(total).toBeLessThan(2.5 * 1024 * 1024);
    // The exponent data is read on demand and stays compressed: about 0.4 MB for 24 bases and their JKFIT sets.
    const data = [...files].filter(([name]) => name.startsWith('extension/dist/basis-sets/')).reduce((sum, [, buffer]) => sum + buffer.length, 0);
    expect(data).toBeGreaterThan(100 * 1024);
    expect(data).toBeLessThan(600 * 1024);
  });
});
