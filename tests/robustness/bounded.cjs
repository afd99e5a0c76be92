// Runs the bundled command line (dist/cli.js) with the arguments given, as `tessera` would, and
// prints its peak resident memory on standard error when it exits, for the hostile-input tests.
'use strict';
const path = require('node:path');
process.on('exit', () => process.stderr.write(`\n[peak resident memory ${process.resourceUsage().maxRSS} KiB]\n`));
require(path.join(__dirname, '..', '..', 'dist', 'cli.js'));
