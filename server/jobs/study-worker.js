// Worker-thread entry of the study pool: register tsx so the TypeScript worker can be required.
require('tsx/cjs');
module.exports = require('./study-run.ts');
