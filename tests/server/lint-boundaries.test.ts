/**
 * The layout's dependency rules (eslint.config.mjs) catch what they are meant to catch: each
 * violating snippet, linted at a virtual path with the project's own config through ESLint's Node
 * API, is reported by the named rule, and a clean snippet at the same path is not. The expected
 * outcomes come from the rules written in DEVELOPERS.md ("Layout and dependency direction").
 * ESLint runs in a child process (lint-snippets.mjs), once for all snippets.
 */
import { execFileSync } from 'node:child_process';
import path from 'node:path';

type Snippet = { file: string; code: string };

function lintAll(snippets: Snippet[]): string[][] {
  const out = execFileSync(process.execPath, [path.join(__dirname, 'lint-snippets.mjs')], { input: JSON.stringify(snippets), encoding: 'utf8' });
  return JSON.parse(out) as string[][];
}

const violations: { what: string; file: string; code: string; rule: string }[] = [
  { what: 'engine file importing ../ui', file: 'shared/engine/x.ts', code: "import { colors } from '../ui/theme';\nexport const c = colors;\n", rule: 'no-restricted-imports' },
  { what: 'engine file importing ../api', file: 'shared/engine/x.ts', code: "import { studySchema } from '../api/work';\nexport const s = studySchema;\n", rule: 'no-restricted-imports' },
  { what: 'engine subfolder file importing ../../ui', file: 'shared/engine/scores/x.ts', code: "import { colors } from '../../ui/theme';\nexport const c = colors;\n", rule: 'no-restricted-imports' },
  { what: 'engine importing @/server', file: 'shared/engine/x.ts', code: "import { createApp } from '@/server/app';\nexport const a = createApp;\n", rule: 'no-restricted-imports' },
  { what: 'engine importing through the alias', file: 'shared/engine/systems/x.ts', code: "import { fft } from '@/shared/engine/fft';\nexport const f = fft;\n", rule: 'no-restricted-imports' },
  { what: 'service calling db(table)', file: 'server/services/x.ts', code: "import type { Db } from '../db/knex';\nexport const f = (db: Db) => db('studies').where({ id: 1 });\n", rule: 'no-restricted-syntax' },
  { what: 'service calling trx(table) in a transaction', file: 'server/services/x.ts', code: "import type { Db } from '../db/knex';\nexport const f = (db: Db) => db.transaction(async (trx) => trx('runs').del());\n", rule: 'no-restricted-syntax' },
  { what: 'route calling deps.db(table)', file: 'server/routes/x.ts', code: "export const f = (deps: { db: (t: string) => unknown }) => deps.db('jobs');\n", rule: 'no-restricted-syntax' },
  { what: 'job using raw SQL', file: 'server/jobs/x.ts', code: "import type { Db } from '../db/knex';\nexport const f = (db: Db) => db.raw('select 1');\n", rule: 'no-restricted-syntax' },
  { what: 'service importing knex', file: 'server/services/x.ts', code: "import knex from 'knex';\nexport const k = knex;\n", rule: 'no-restricted-imports' },
  { what: 'app/ importing server/', file: 'app/(lab)/x.tsx', code: "import { createApp } from '../../server/app';\nexport const a = createApp;\n", rule: 'no-restricted-imports' },
  { what: 'app/ importing @/server', file: 'app/x.tsx', code: "import { createApp } from '@/server/app';\nexport const a = createApp;\n", rule: 'no-restricted-imports' },
  { what: 'shared/ui importing server/', file: 'shared/ui/screens/x/y.tsx', code: "import { createApp } from '../../../../server/app';\nexport const a = createApp;\n", rule: 'no-restricted-imports' },
];

const clean: { what: string; file: string; code: string }[] = [
  { what: 'engine file importing inside the engine', file: 'shared/engine/x.ts', code: "import { fft } from './fft';\nimport { parseSystemSpec } from './systems';\nexport const f = [fft, parseSystemSpec];\n" },
  { what: 'engine subfolder file importing its parent folder', file: 'shared/engine/scores/x.ts', code: "import { fft } from '../fft';\nexport const f = fft;\n" },
  { what: 'service passing db to a repository inside a transaction', file: 'server/services/x.ts', code: "import type { Db } from '../db/knex';\nimport { findStudy } from '../db/studies';\nexport const f = (db: Db) => db.transaction(async (trx) => findStudy(trx, 'lab', 'id'));\n" },
  { what: 'repository building a query', file: 'server/db/x.ts', code: "import type { Db } from './knex';\nexport const f = (db: Db) => db('studies').where({ id: 1 });\n" },
  { what: 'screen importing shared/api', file: 'shared/ui/screens/x/y.tsx', code: "import { studySchema } from '@/shared/api/work';\nexport const s = studySchema;\n" },
];

let reported: string[][] = [];
beforeAll(() => {
  reported = lintAll([...violations, ...clean]);
}, 120_000);

describe('lint catches layout violations', () => {
  it.each(violations.map((v, i) => ({ ...v, i })))('$what ($file)', ({ rule, i }) => {
    expect(reported[i]).toContain(rule);
  });
});

describe('lint leaves clean code alone', () => {
  it.each(clean.map((c, i) => ({ ...c, i: violations.length + i })))('$what ($file)', ({ i }) => {
    expect(reported[i]).toEqual([]);
  });
});
