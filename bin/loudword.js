#!/usr/bin/env node
'use strict';
// Thin launcher: the CLI is bundled into dist/cli.js by `npm run build`.
const path = require('path');
const fs = require('fs');
const bundle = path.join(__dirname, '..', 'dist', 'cli.js');
if (!fs.existsSync(bundle)) {
  process.stderr.write('loudword: dist/cli.js is missing; run `npm run build` first.\n');
  process.exit(2);
}
require(bundle);
