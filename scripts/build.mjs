// Bundles the command line, the language server, the VS Code client and the benchmark with esbuild.
// Run by `npm ci` (the `prepare` script) so that `npx tessera` works right after installing.
import { build } from 'esbuild';
import { existsSync, readFileSync } from 'node:fs';

const { version } = JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8'));

const production = process.argv.includes('--production');
const common = {
  bundle: true,
  platform: 'node',
  target: 'node20',
  format: 'cjs',
  sourcemap: production ? false : 'linked',
  minify: production,
  logLevel: 'warning',
  legalComments: 'none',
};

const entries = [
  { entryPoints: ['server/src/cli/bin.ts'], outfile: 'dist/cli.js', define: { TESSERA_VERSION: JSON.stringify(version) } },
  { entryPoints: ['server/src/lsp/main.ts'], outfile: 'dist/server.js', define: { TESSERA_VERSION: JSON.stringify(version) } },
  { entryPoints: ['client/src/extension.ts'], outfile: 'dist/client/extension.js', external: ['vscode'] },
  { entryPoints: ['bench/main.ts'], outfile: 'dist/bench.js' },
].filter((entry) => existsSync(entry.entryPoints[0]));

await Promise.all(entries.map((entry) => build({ ...common, ...entry })));
