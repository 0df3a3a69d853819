// Lint: TypeScript rules, React's rules of hooks, plus the dependency direction of the layout (docs/conventions.md):
// shared/engine imports nothing of the project outside itself; app/ and shared/ui never import
// server/; only server/db touches Knex. tests/server/lint-boundaries.test.ts lints violating
// snippets at virtual paths to prove each rule fires.
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

const noServer = {
  regex: '^(@/server|(\\.\\./)+server)(/|$)',
  message: 'The client and the engine never import server code.',
};
const noKnex = { group: ['knex', 'knex/*', 'better-sqlite3'], message: 'Only server/db touches Knex and SQLite.' };
const knexPaths = ['knex', 'better-sqlite3'].map((name) => ({ name, message: noKnex.message }));
// The engine may import only inside shared/engine. Import paths are not resolved by the rule, so
// the limit goes by the file's depth: a file directly in shared/engine may not go up at all
// ('../ui/…', '../api/…'), one in a subfolder not two levels up ('../../ui/…'), and so on.
const engineOnly = (depth) => ({
  regex: `^(@/|${'\\.\\./'.repeat(depth + 1)})`,
  message: 'shared/engine imports nothing of the project outside itself (use relative paths inside it).',
});
const engineAt = (files, depth) => ({
  files,
  rules: { 'no-restricted-imports': ['error', { paths: knexPaths, patterns: [engineOnly(depth), noServer] }] },
});

// Query building outside server/db. Services receive `db` (or a transaction `trx`) and pass it to
// repositories; they may open a transaction, since a unit of work is the use case's decision, but
// never query a table. Without type information the rule goes by the shapes Knex is used in:
// calling the connection as a function (db('studies'), trx('runs'), deps.db('jobs'),
// this.db(...)) and its raw-SQL methods. Connections go by these names throughout the server.
const QUERY_MESSAGE = 'Queries live in server/db repositories: call a repository function with db/trx instead.';
const noQueryBuilding = [
  { selector: "CallExpression[callee.type='Identifier'][callee.name=/^(db|trx|tx|knex|conn|connection)$/]", message: QUERY_MESSAGE },
  { selector: "CallExpression[callee.type='MemberExpression'][callee.property.name=/^(db|trx|knex)$/]", message: QUERY_MESSAGE },
  { selector: "CallExpression[callee.property.name=/^(raw|whereRaw|orWhereRaw|havingRaw|orderByRaw|joinRaw|fromRaw)$/]", message: QUERY_MESSAGE },
  { selector: "MemberExpression[object.name=/^(db|trx|knex)$/][property.name='schema']", message: QUERY_MESSAGE },
];

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.expo/', 'data/', 'coverage/', '.tmp/', 'expo-env.d.ts', 'tests/e2e/screenshots/'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-require-imports': 'off',
      'no-restricted-imports': ['error', { paths: knexPaths }],
      'no-restricted-syntax': ['error', ...noQueryBuilding],
    },
  },
  engineAt(['shared/engine/*'], 0),
  engineAt(['shared/engine/*/*'], 1),
  engineAt(['shared/engine/*/*/**'], 2),
  // React: the rules of hooks, and complete dependency lists for effects, memos and callbacks (a
  // missing one is an error, not a warning). The plugin's React Compiler rules are not enabled.
  {
    files: ['app/**/*.tsx', 'shared/ui/**/*.{ts,tsx}', 'tests/ui/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['app/**', 'shared/ui/**', 'shared/api/**'],
    rules: { 'no-restricted-imports': ['error', { paths: knexPaths, patterns: [noServer] }] },
  },
  {
    files: ['server/db/**', 'migrations/**', 'knexfile.ts', 'tests/**'],
    rules: { 'no-restricted-imports': 'off', 'no-restricted-syntax': 'off' },
  },
);
