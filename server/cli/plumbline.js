#!/usr/bin/env node
// Entry of the `plumbline` command: load TypeScript through tsx, then run the CLI.
require('tsx/cjs');
require('./main.ts');
