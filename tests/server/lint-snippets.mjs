// Lints snippets at virtual paths with the project's eslint.config.mjs through ESLint's Node API
// and prints the rule ids reported for each. Run as a child process by lint-boundaries.test.ts:
// jest's module sandbox cannot load the ES-module config that ESLint imports dynamically.
// stdin: [{ file, code }]; stdout: [[ruleId, …], …] in the same order.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const eslint = new ESLint({ cwd: root, overrideConfigFile: path.join(root, 'eslint.config.mjs') });
const chunks = [];
for await (const c of process.stdin) chunks.push(c);
const snippets = JSON.parse(Buffer.concat(chunks).toString('utf8'));
const out = [];
for (const { file, code } of snippets) {
  const [result] = await eslint.lintText(code, { filePath: path.join(root, file) });
  out.push(result.messages.map((m) => m.ruleId ?? `fatal: ${m.message}`));
}
process.stdout.write(JSON.stringify(out));
