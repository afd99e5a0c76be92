// Packages the extension with @vscode/vsce into tessera-<version>.vsix. The files go to a staging
// folder first (.cache/vsix-stage) with minified bundles, so dist/ is never touched: tests that run
// the development bundles meanwhile keep working. The bundles hold every run-time dependency, so
// the package carries no node_modules.
import { execFileSync } from 'node:child_process';
import { cpSync, mkdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import * as path from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildBundles } from './build.mjs';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { version } = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));
const stage = path.join(root, '.cache', 'vsix-stage');
const out = path.join(root, `tessera-${version}.vsix`);

rmSync(stage, { recursive: true, force: true });
mkdirSync(stage, { recursive: true });
for (const item of ['package.json', 'LICENSE', 'CHANGELOG.md', 'language-configuration.json', '.vscodeignore', 'icons', 'grammar']) {
  cpSync(path.join(root, item), path.join(stage, item), { recursive: true });
}
cpSync(path.join(root, 'client', 'README.md'), path.join(stage, 'README.md'));
await buildBundles({ outdir: path.join(stage, 'dist'), production: true, only: ['server', 'worker', 'client', 'webview'] });
const vsce = path.join(root, 'node_modules', '.bin', 'vsce');
execFileSync(vsce, ['package', '--no-dependencies', '--out', out], { cwd: stage, stdio: ['ignore', 'inherit', 'inherit'] });
const bytes = statSync(out).size;
console.log(`${path.basename(out)}: ${(bytes / 1024).toFixed(0)} KiB (${bytes} bytes), target under 2 MiB`);
