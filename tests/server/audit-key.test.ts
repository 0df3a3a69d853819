/**
 * The audit key across starts: made once with mode 600 and reused after a restart (the trail keeps
 * verifying); a key file others may read, or a missing key over a sealed trail, stops the start
 * with a plain message; a chain written before the key is sealed once and verifies; an older
 * backup restored against newer checkpoints reports the entries lost.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { backupDatabase, restoreDatabase } from '@/server/backup';
import { createDb, migrate } from '@/server/db/knex';
import { legacyAuditHash, recordAudit } from '@/server/services/audit';
import { verifyAuditTrail } from '@/server/services/audit-verify';
import { startTestServer, type TestServer } from './helpers';

const dirs: string[] = [];
const servers: TestServer[] = [];
const freshDir = () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-key-'));
  dirs.push(dir);
  return dir;
};
const start = async (dataDir: string) => {
  const t = await startTestServer({ DATA_DIR: dataDir });
  servers.push(t);
  return t;
};
const failureOf = (p: Promise<unknown>) => p.then(() => 'started', (e: Error) => e.message);
afterAll(async () => {
  for (const s of servers) await s.close();
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

const step = (t: TestServer, i: number) =>
  recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.step', targetType: 'thing', targetId: String(i) });
// The check is called directly: signing in over HTTP would add its own sign-in entry to the lab's
// trail (services/account-events.ts) and move the counts this test is about.
const verify = async (t: TestServer) => JSON.parse(JSON.stringify(await verifyAuditTrail(t.db, t.labId)));

it('reuses the key after a restart, keeps verifying, and reports entries lost by restoring an older backup', async () => {
  const dir = freshDir();
  const first = await start(dir);
  const keyFile = path.join(dir, 'audit-key');
  const key = fs.readFileSync(keyFile, 'utf8');
  expect(fs.statSync(keyFile).mode & 0o777).toBe(0o600);
  await step(first, 1);
  const before = await verify(first);
  expect(before.ok).toBe(true);
  const { file: backup } = await backupDatabase(first.config);
  for (let i = 2; i <= 4; i++) await step(first, i);
  await first.running.close();

  const second = await start(dir);
  expect(fs.readFileSync(keyFile, 'utf8')).toBe(key);
  await step(second, 5);
  expect(await verify(second)).toMatchObject({ ok: true, checked: before.checked + 4, firstBroken: null });
  await second.running.close();

  // The backup holds the trail as it was before the last four entries; the checkpoints remember them.
  await restoreDatabase(second.config, backup);
  const third = await start(dir);
  const v = await verify(third);
  expect(v).toMatchObject({ ok: false, checked: before.checked, missing: 4, firstBroken: { reason: 'missing_events' } });
  expect(v.firstBroken.detail).toContain(`but the database holds ${before.checked}: the last 4 are missing (removed, or an older backup was restored)`);
}, 60_000);

it('refuses to start with a key file others can read, naming the file and the fix', async () => {
  const dir = freshDir();
  const keyFile = path.join(dir, 'audit-key');
  fs.writeFileSync(keyFile, 'k'.repeat(64), { mode: 0o644 });
  fs.chmodSync(keyFile, 0o644);
  expect(await failureOf(start(dir))).toBe(
    `The audit key file ${keyFile} can be read or changed by other users (mode 644). Make it private with "chmod 600 ${keyFile}" and start again.`,
  );
});

it('refuses to make a new key over a trail an earlier key sealed', async () => {
  const dir = freshDir();
  const t = await start(dir);
  await t.running.close();
  fs.rmSync(path.join(dir, 'audit-key'));
  expect(await failureOf(start(dir))).toMatch(/^There is no audit key file at .*audit-key, and the checkpoint file .* shows a trail sealed with an earlier key\./);
});

it('seals a chain written before the key once, and an edit of it afterwards breaks the seal', async () => {
  const dir = freshDir();
  const old = createDb(path.join(dir, 'plumbline.sqlite'));
  await migrate(old);
  let prev: string | null = null;
  for (let id = 1; id <= 3; id++) {
    const row = { id, lab_id: 'old-lab', actor_user_id: null, action: 'test.old', target_type: 'thing', target_id: String(id), before_json: null, after_json: null, at: 1_700_000_000_000 + id, prev_hash: prev };
    const hash = legacyAuditHash(row);
    await old('audit_events').insert({ ...row, hash });
    prev = hash;
  }
  await old.destroy();

  const t = await start(dir);
  const seal = await t.db('audit_events').where({ lab_id: 'old-lab' }).orderBy('id', 'desc').first();
  expect(seal).toMatchObject({ action: 'audit.seal', prev_hash: prev });
  expect(JSON.parse(seal.after_json)).toMatchObject({ sealedEvents: 3, legacyHead: prev });
  expect(await verifyAuditTrail(t.db, 'old-lab')).toMatchObject({ ok: true, checked: 4 });
  await t.running.close();
  const again = await start(dir); // a second start seals nothing more
  expect(await again.db('audit_events').where({ lab_id: 'old-lab', action: 'audit.seal' }).count({ n: '*' }).first()).toEqual({ n: 1 });

  // Someone edits an old entry and recomputes the plain sha256 of it and the next one.
  await again.db.raw('DROP TRIGGER audit_events_no_update');
  let link: string | null = null;
  for (const row of await again.db('audit_events').where({ lab_id: 'old-lab' }).where('id', '<=', 3).orderBy('id')) {
    const edited = { ...row, target_id: row.id === 2 ? 'forged' : row.target_id, prev_hash: link };
    delete edited.hash;
    link = legacyAuditHash(edited);
    await again.db('audit_events').where({ id: row.id }).update({ target_id: edited.target_id, prev_hash: edited.prev_hash, hash: link });
  }
  expect(await verifyAuditTrail(again.db, 'old-lab')).toMatchObject({ ok: false, firstBroken: { id: seal.id, reason: 'link_mismatch' } });
}, 60_000);
