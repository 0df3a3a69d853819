// Worker-thread entry of the Monte Carlo bench: register tsx so the TypeScript worker loads.
require('tsx/cjs');
require('./monte-carlo-worker.ts');
