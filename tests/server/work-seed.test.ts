/**
 * The demo seed of the work side on a real SQLite file: the two demo structures, every built-in
 * scenario and recipe, and one finished study computed through the same runner as the background
 * pool; a second run changes nothing.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { createDb, migrate, type Db } from '@/server/db/knex';
import { seedDemoLab } from '@/server/seed/demo-lab';
import { DEMO_STUDY, DEMO_SYSTEMS, seedDemoWork } from '@/server/seed/demo-work';
import { openAuditTrail } from '@/server/services/audit-trail';
import { getStudyResults } from '@/server/services/study-results';

let dir: string;
let db: Db;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-seed-'));
  db = createDb(path.join(dir, 'seed.sqlite'));
  await migrate(db);
  const quiet = { info: () => undefined, warn: () => undefined };
  await openAuditTrail(db, { key: null, keyFile: path.join(dir, 'audit-key'), checkpointFile: path.join(dir, 'audit-checkpoints.log') }, quiet);
  await seedDemoLab(db, 'seed-test-password-2026');
});
afterAll(async () => {
  await db.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

const count = async (table: string) => Number((await db(table).count({ n: '*' }).first())?.n);
const jsonCount = (folder: string) => fs.readdirSync(folder).filter((f) => f.endsWith('.json')).length;

it('seeds systems, built-in scenarios and recipes, and one finished study; then does nothing', async () => {
  expect(await seedDemoWork(db, { withStudy: true })).toBe(true);
  const root = path.resolve(__dirname, '../../scenarios');
  expect(await db('systems').orderBy('name').pluck('name')).toEqual(DEMO_SYSTEMS.map((s) => s.name).sort());
  expect(await count('scenarios')).toBe(jsonCount(root));
  expect(await count('recipes')).toBe(jsonCount(path.join(root, 'recipes')));

  const study = await db('studies').first();
  expect(study).toMatchObject({ status: 'finished', runs_done: DEMO_STUDY.scenarios.length * DEMO_STUDY.seeds, runs_failed: 0, error: null });
  expect(await db('jobs').pluck('status')).toEqual(['done']);
  const results = await getStudyResults(db, study.lab_id, study.id);
  expect(results.scenarios).toHaveLength(DEMO_STUDY.scenarios.length);
  for (const s of results.scenarios) {
    expect(s.seeds).toBe(DEMO_STUDY.seeds);
    expect(s.criteria.length).toBeGreaterThan(0);
    expect(s.pass).toBe(s.criteria.every((c) => c.pass));
    expect(s.curves.frequenciesHz!.length).toBe(s.figures.lines);
  }
  expect(results.pass).toBe(results.scenarios.every((s) => s.pass));

  const before = await Promise.all(['systems', 'scenarios', 'recipes', 'studies', 'runs', 'audit_events'].map(count));
  expect(await seedDemoWork(db, { withStudy: true })).toBe(false);
  expect(await Promise.all(['systems', 'scenarios', 'recipes', 'studies', 'runs', 'audit_events'].map(count))).toEqual(before);
}, 60_000);
