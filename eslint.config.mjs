// Lint: TypeScript rules, React's rules of hooks, plus the dependency direction of the layout (conventions.md):
// shared/engine imports nothing of the project outside itself; app/ and shared/ui never import
// server/; only server/db touches Knex.
import reactHooks from 'eslint-plugin-react-hooks';
import tseslint from 'typescript-eslint';

const noServer = {
  group: ['@/server', '@/server/*', '../server/*', '../../server/*', '../../../server/*'],
  message: 'The client never imports server code.',
};
const noKnex = { group: ['knex', 'knex/*', 'better-sqlite3'], message: 'Only server/db touches Knex and SQLite.' };
const knexPaths = ['knex', 'better-sqlite3'].map((name) => ({ name, message: noKnex.message }));
const noProject = {
  group: ['@/*', '../../*'],
  message: 'shared/engine imports nothing of the project outside itself (use relative paths inside it).',
};

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', '.expo/', 'data/', 'coverage/', '.tmp/', 'expo-env.d.ts', 'tests/e2e/screenshots/'] },
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-require-imports': 'off',
      'no-restricted-imports': ['error', { paths: knexPaths }],
    },
  },
  // React: the rules of hooks, and complete dependency lists for effects, memos and callbacks (a
  // missing one is an error, not a warning). The plugin's React Compiler rules are not enabled.
  {
    files: ['app/**/*.tsx', 'shared/ui/**/*.{ts,tsx}', 'tests/ui/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { 'react-hooks/rules-of-hooks': 'error', 'react-hooks/exhaustive-deps': 'error' },
  },
  {
    files: ['shared/engine/**'],
    rules: { 'no-restricted-imports': ['error', { paths: knexPaths, patterns: [noProject, noServer] }] },
  },
  {
    files: ['app/**', 'shared/ui/**', 'shared/api/**'],
    rules: { 'no-restricted-imports': ['error', { paths: knexPaths, patterns: [noServer] }] },
  },
  {
    files: ['server/db/**', 'migrations/**', 'knexfile.ts', 'tests/**'],
    rules: { 'no-restricted-imports': 'off' },
  },
);
