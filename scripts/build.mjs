// Bundles the command line, the language server, the VS Code client and the benchmark with esbuild.
// Run by `npm ci` (the `prepare` script) so that `npx tessera` works right after installing.
import { build } from 'esbuild';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import * as path from 'node:path';

const root = path.dirname(path.dirname(fileURLToPath(import.meta.url)));
const { version } = JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8'));

/**
 * Builds the bundles into `outdir` (default dist/). `production` minifies and drops source maps;
 * `only` limits the build to the named bundles (cli, server, client, bench).
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
    { name: 'client', entryPoints: ['client/src/extension.ts'], outfile: path.join(outdir, 'client', 'extension.js'), external: ['vscode'] },
    { name: 'bench', entryPoints: ['bench/main.ts'], outfile: path.join(outdir, 'bench.js') },
  ].filter((entry) => existsSync(path.join(root, entry.entryPoints[0])) && (!only || only.includes(entry.name)));
  await Promise.all(entries.map(({ name, ...entry }) => build({ ...common, ...entry })));
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildBundles({ production: process.argv.includes('--production') });
}
