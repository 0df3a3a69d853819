#!/usr/bin/env node
// Entry of the `plumbline` command: load TypeScript through tsx, then run the CLI.
// tsx reads the `@/` import alias from the repository's tsconfig.json; point it there so the
// command works from any working folder, not only the repository root.
const path = require('node:path');
process.env.TSX_TSCONFIG_PATH ??= path.join(__dirname, '..', '..', 'tsconfig.json');
require('tsx/cjs');
require('./main.ts');
