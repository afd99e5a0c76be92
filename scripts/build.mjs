// Bundles the command line, the language server, the jobs' worker, the VS Code client and the benchmark with esbuild.
// Run by `npm ci` (the `prepare` script) so that `npx tessera` works right after installing.
import { build } from 'esbuild';
import { existsSync, mkdirSync, readFileSync, readdirSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { brotliCompressSync, constants as zlibConstants } from 'node:zlib';
import { fileURLToPath } from 'node:url';
import * as path from 'node:path';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { version } = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));

/**
 * Builds the bundles into `outdir` (default dist/). `production` minifies and drops source maps;
 * `only` limits the build to the named bundles (cli, server, worker, client, webview, bench). The webview
 * scripts are browser bundles (the 3D viewer included) with the licences of what they bundle.
 */
export async function buildBundles({ outdir = path.join(root, 'dist'), production = false, only } = {}) {
  const common = {
    bundle: true,
    platform: 'node',
    target: 'node20',
    format: 'cjs',
    sourcemap: production ? false : 'linked',
    minify: production,
    logLevel: 'warning',
    legalComments: 'none',
    absWorkingDir: root,
    define: { TESSERA_VERSION: JSON.stringify(version) },
  };
  const entries = [
    { name: 'cli', entryPoints: ['server/src/cli/bin.ts'], outfile: path.join(outdir, 'cli.js') },
    { name: 'server', entryPoints: ['server/src/lsp/main.ts'], outfile: path.join(outdir, 'server.js') },
    // The jobs' worker thread (server/src/jobs/worker.ts), started by the server and the command line.
    { name: 'worker', entryPoints: ['server/src/jobs/worker.ts'], outfile: path.join(outdir, 'worker.js') },
    { name: 'client', entryPoints: ['client/src/extension.ts'], outfile: path.join(outdir, 'client', 'extension.js'), external: ['vscode'] },
    { name: 'bench', entryPoints: ['bench/main.ts'], outfile: path.join(outdir, 'bench.js') },
    ...['structure', 'costs', 'levels'].map((view) => ({
      name: 'webview',
      entryPoints: [`client/webview/${view}.ts`],
      outfile: path.join(outdir, 'webview', `${view}.js`),
      platform: 'browser',
      target: 'es2022',
      format: 'iife',
    })),
  ].filter((entry) => existsSync(path.join(root, entry.entryPoints[0])) && (!only || only.includes(entry.name)));
  await Promise.all(entries.map(({ name, ...entry }) => build({ ...common, ...entry })));
  if (entries.some((entry) => entry.name === 'webview')) writeNotices(path.join(outdir, 'webview', 'third-party-notices.txt'));
  if (entries.some((entry) => ['cli', 'server', 'worker', 'bench'].includes(entry.name))) writeBasisData(path.join(outdir, BASIS_DATA_FOLDER));
}

/** Where the exponent files live in the sources, and the folder next to the bundles that gets them. */
const BASIS_DATA_SOURCE = path.join(root, 'server', 'src', 'chemistry', 'data', 'basis-sets');
const BASIS_DATA_FOLDER = 'basis-sets';

/**
 * Copies the basis-set exponent files next to the bundles, Brotli-compressed (about a quarter of
 * the JSON), with the origin note whose licence covers them. The engine reads one file when a job
 * needs it (server/src/electronic/basis/data.ts); nothing else loads them. Files already up to date
 * are left alone, so repeated builds stay fast.
 */
function writeBasisData(folder) {
  mkdirSync(folder, { recursive: true });
  const wanted = new Set();
  for (const name of readdirSync(BASIS_DATA_SOURCE).filter((file) => file.endsWith('.json'))) {
    const source = path.join(BASIS_DATA_SOURCE, name);
    const target = path.join(folder, `${name}.br`);
    wanted.add(`${name}.br`);
    if (existsSync(target) && statSync(target).mtimeMs >= statSync(source).mtimeMs) continue;
    const compressed = brotliCompressSync(readFileSync(source), { params: { [zlibConstants.BROTLI_PARAM_QUALITY]: 11 } });
    writeFileSync(target, compressed);
  }
  const origin = path.join(root, 'server', 'src', 'chemistry', 'data', 'BASIS-ORIGIN.md');
  writeFileSync(path.join(folder, 'BASIS-ORIGIN.md'), readFileSync(origin));
  wanted.add('BASIS-ORIGIN.md');
  for (const stale of readdirSync(folder).filter((file) => !wanted.has(file))) rmSync(path.join(folder, stale));
}

/** The packages bundled into the webview scripts: 3Dmol.js and what its build carries inside. */
const WEBVIEW_PACKAGES = ['3dmol', 'iobuffer', 'netcdfjs', 'pako', 'upng-js'];

/** The licences of the bundled packages, which their terms ask to ship with the binaries. */
function writeNotices(file) {
  const sections = WEBVIEW_PACKAGES.map((name) => {
    const folder = path.join(root, 'node_modules', name);
    const manifest = JSON.parse(readFileSync(path.join(folder, 'package.json'), 'utf8'));
    const licence = ['LICENSE', 'LICENSE.md', 'LICENSE.txt', 'license'].map((f) => path.join(folder, f)).find((f) => existsSync(f));
    if (!licence) throw new Error(`${name} ships no licence file; the notices need one`);
    return `${manifest.name} ${manifest.version} (${manifest.license})\n${'-'.repeat(72)}\n${readFileSync(licence, 'utf8').trim()}\n`;
  });
  mkdirSync(path.dirname(file), { recursive: true });
  writeFileSync(file, `The structure view (dist/webview/structure.js) bundles the following packages.\n\n${sections.join('\n\n')}`);
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildBundles({ production: process.argv.includes('--production') });
}
