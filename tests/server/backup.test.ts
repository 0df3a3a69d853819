/**
 * Backup and restore: backupDatabase (what `npm run backup` runs) copies the database while a study
 * is storing runs, and the command itself runs as its own process; the copy is restored into a fresh DATA_DIR, a server starts on it,
 * SQLite's integrity_check answers 'ok', the users, study, runs and uploads of the moment of the
 * backup are there, the audit trail (key and checkpoint file brought along) names the entries lost
 * since the backup, and the study that was running at the backup
 * resumes to the very numbers the original server computed.
 */
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { backupDatabase, restoreDatabase } from '@/server/backup';
import { createDb } from '@/server/db/knex';
import { startTestServer, type TestServer } from './helpers';
import { smallRecipe, smallScenario, waitForStudy } from './work-fixtures';

const ROOT = path.resolve(__dirname, '../..');
let original: TestServer;
let restored: TestServer | undefined;
const restoreDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-restore-'));

afterAll(async () => {
  await restored?.close();
  await original?.close();
  fs.rmSync(restoreDir, { recursive: true, force: true });
});

it('backs up online during a study; the restored copy starts, verifies and resumes to the same numbers', async () => {
  original = await startTestServer({ STUDY_WORKERS: '1' });
  const analyst = await original.signIn('analyst');
  const lab = `/api/v1/labs/${original.labId}`;
  const long = (name: string) => ({ ...smallScenario(name, 20), acquisition: { sampleRateHz: 512, durationS: 64 } });
  const scenario = (await analyst.post(`${lab}/scenarios`).send({ definition: long('Backup scenario') }).expect(201)).body.id;
  const recipe = (await analyst.post(`${lab}/recipes`).send({ definition: { ...smallRecipe('Backup recipe'), blockLength: 1024 } }).expect(201)).body.id;
  const csv = ['time_s,input,output', ...Array.from({ length: 2048 }, (_, i) => `${i / 512},${Math.cos(i * 0.3)},${3 * Math.cos(i * 0.3)}`)].join('\n') + '\n';
  const uploadId = (await analyst.post(`${lab}/uploads`).field('kind', 'time-data').field('recipeId', recipe).attach('file', Buffer.from(csv), 'kept.csv').expect(201)).body;
  const study = (await analyst.post(`${lab}/studies`).send({ name: 'Written during backup', recipe: { id: recipe }, scenarios: [{ id: scenario }], seeds: 40, baseSeed: 7 }).expect(202)).body.id;
  for (;;) {
    const { body } = await analyst.get(`${lab}/studies/${study}`).expect(200);
    if (body.progress.done >= 1) break;
    await new Promise((r) => setTimeout(r, 10));
  }

  // The backup, through a connection of its own, while runs keep arriving (the same function the
  // command runs; the command itself is run below, after the study).
  const { file } = await backupDatabase(original.config);
  expect(file.startsWith(path.join(original.config.dataDir, 'backups'))).toBe(true);
  expect(fs.existsSync(file)).toBe(true);

  const finished = await waitForStudy(analyst, `${lab}/studies/${study}`, 60_000);
  expect(finished.status).toBe('finished');
  const backupDb = createDb(file);
  const inBackup = {
    users: Number((await backupDb('users').count({ n: '*' }).first())?.n),
    runs: Number((await backupDb('runs').where({ study_id: study }).count({ n: '*' }).first())?.n),
    audit: Number((await backupDb('audit_events').where({ lab_id: original.labId }).count({ n: '*' }).first())?.n),
  };
  await backupDb.destroy();

  // `npm run backup` as a process on the same DATA_DIR prints the path of a second, whole copy.
  const { stdout } = await promisify(execFile)(process.execPath, ['--require', 'tsx/cjs', 'server/backup.ts'], {
    cwd: ROOT,
    env: { ...process.env, DATA_DIR: original.config.dataDir, NODE_ENV: 'test' },
  });
  const second = stdout.trim();
  expect(second).not.toBe(file);
  expect(fs.existsSync(second)).toBe(true);
  const secondDb = createDb(second);
  expect((await secondDb.raw('PRAGMA integrity_check'))[0].integrity_check).toBe('ok');
  expect(Number((await secondDb('runs').where({ study_id: study }).count({ n: '*' }).first())?.n)).toBe(40);
  await secondDb.destroy();
  expect(inBackup.users).toBeGreaterThan(0);
  // Taken mid-study: some runs, not all (40 runs of 32768 samples on one worker).
  expect(inBackup.runs).toBeGreaterThanOrEqual(1);
  expect(inBackup.runs).toBeLessThan(40);

  // Restore into a fresh DATA_DIR and start a server on it.
  const target = await restoreDatabase({ dataDir: restoreDir, databaseFile: path.join(restoreDir, 'plumbline.sqlite') }, file);
  expect(target).toBe(path.join(restoreDir, 'plumbline.sqlite'));
  // The audit key and the checkpoint file live outside the database and the backup: restoring on
  // another machine brings them from the lab's own copies (docs/approval.md, "The audit trail").
  for (const f of ['audit-key', 'audit-checkpoints.log']) fs.copyFileSync(path.join(original.config.dataDir, f), path.join(restoreDir, f));
  restored = await startTestServer({ DATA_DIR: restoreDir, STUDY_WORKERS: '2' });
  expect((await restored.db.raw('PRAGMA integrity_check'))[0].integrity_check).toBe('ok');
  expect(Number((await restored.db('users').count({ n: '*' }).first())?.n)).toBe(inBackup.users);
  const analyst2 = await restored.signIn('analyst'); // the users and their passwords came back
  const auditor2 = await restored.signIn('auditor');
  await analyst2.get(`${lab}/uploads/${uploadId.upload?.id ?? uploadId.id}/result`).expect(200); // row and file both restored

  // The study running at the backup resumes on the restored server to the original's numbers.
  expect((await waitForStudy(analyst2, `${lab}/studies/${study}`, 60_000)).status).toBe('finished');

  // The trail shows the restore honestly: the original's entries after the backup (its study's
  // end) are gone, and the restored server wrote its own entry at that place.
  const laterOnOriginal = Number((await original.db('audit_events').where({ lab_id: original.labId }).count({ n: '*' }).first())?.n) - inBackup.audit;
  expect(laterOnOriginal).toBeGreaterThanOrEqual(1); // at least the study's end, after the mid-study backup
  const firstNew = await restored.db('audit_events').where({ lab_id: original.labId }).orderBy('id').offset(inBackup.audit).first('id');
  const verify = (await auditor2.get(`${lab}/audit/verify`).expect(200)).body;
  // Both servers' checkpoints are in the file: the newest is the restored server's own, after its
  // two sign-ins (recorded in the lab's trail) and the study's end, none of which match the original.
  const laterOnRestored = Number((await restored.db('audit_events').where({ lab_id: original.labId }).count({ n: '*' }).first())?.n) - inBackup.audit;
  expect(verify).toMatchObject({ ok: false, missing: laterOnRestored, firstBroken: { id: Number(firstNew.id), reason: 'checkpoint_mismatch' } });
  expect(verify.firstBroken.detail).toContain(`or an older backup was restored`);
  const results = async (agent: typeof analyst) => (await agent.get(`${lab}/studies/${study}/results`).expect(200)).body;
  expect(await results(analyst2)).toEqual(await results(analyst));
  const blobs = async (t: TestServer) =>
    (await t.db('runs').where({ study_id: study }).orderBy('seed_index').select('seed_index', 'line_scores')).map((r) => `${r.seed_index}:${(r.line_scores as Buffer).toString('base64')}`);
  expect(await blobs(restored)).toEqual(await blobs(original));
}, 120_000);
