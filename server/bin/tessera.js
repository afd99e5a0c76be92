#!/usr/bin/env node
// Entry point of the `tessera` command: the bundle is built by `npm ci` (the prepare script).
'use strict';
const path = require('node:path');
const fs = require('node:fs');
const bundle = path.join(__dirname, '..', '..', 'dist', 'cli.js');
if (!fs.existsSync(bundle)) {
  process.stderr.write('tessera: the command line is not built yet; run `npm run build` in the repository first.\n');
  process.exit(2);
}
require(bundle);
