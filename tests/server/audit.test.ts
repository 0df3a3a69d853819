/**
 * The audit trail over a real SQLite file: the keyed hash chain verifies, a row changed with raw
 * SQL (after dropping the trigger, as an attacker with file access could) is detected at its id,
 * and the triggers refuse UPDATE and DELETE. Cuts, checkpoints and signatures: audit-cuts.test.ts.
 */
import { createHmac } from 'node:crypto';
import fs from 'node:fs';
import { canonicalJson, legacyAuditHash, recordAudit, sealAuditRow } from '@/server/services/audit';
import { verifyAuditTrail } from '@/server/services/audit-verify';
import { startTestServer, type TestServer } from './helpers';

let t: TestServer;
const failureOf = (p: PromiseLike<unknown>) =>
  Promise.resolve(p).then(
    () => 'resolved',
    (e: { message?: string }) => String(e?.message),
  );
beforeAll(async () => {
  t = await startTestServer();
});
afterAll(() => t.close());

describe('canonical JSON and the hash', () => {
  it('sorts keys at every level and drops undefined', () => {
    expect(canonicalJson({ b: 1, a: { d: [{ z: 1, y: 2 }], c: undefined } })).toBe('{"a":{"d":[{"y":2,"z":1}]},"b":1}');
  });

  it('is HMAC-SHA-256 with the audit key over prev_hash + canonical row, recomputed here with node:crypto', () => {
    const row = {
      id: 7, lab_id: 'L', actor_user_id: 'U', action: 'x.y', target_type: 't', target_id: null,
      before_json: null, after_json: '{"a":1}', at: 1000, prev_hash: 'abc',
    };
    const key = Buffer.from(fs.readFileSync(t.config.audit.keyFile, 'utf8').trim(), 'utf8');
    const expected = createHmac('sha256', key)
      .update('abc{"action":"x.y","actor_user_id":"U","after_json":"{\\"a\\":1}","at":1000,"before_json":null,"id":7,"lab_id":"L","prev_hash":"abc","target_id":null,"target_type":"t"}')
      .digest('hex');
    expect(sealAuditRow(key, row)).toBe(expected);
    expect(legacyAuditHash(row)).not.toBe(expected);
  });
});

describe('the chain in the database', () => {
  it('links each event to the previous one of the same lab', async () => {
    const e1 = await recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.one', targetType: 'thing', targetId: 'a', after: { n: 1 } });
    const other = await recordAudit(t.db, { labId: null, actorUserId: null, action: 'test.lab-less', targetType: 'thing' });
    const e2 = await recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.two', targetType: 'thing', targetId: 'a', before: { n: 1 }, after: { n: 2 } });
    expect(e2.prev_hash).toBe(e1.hash);
    expect(other.prev_hash === e1.hash).toBe(false);
    const stored = await t.db('audit_events').where({ id: e2.id }).first();
    expect(stored.before_json).toBe('{"n":1}');
    expect(stored.hash).not.toBe(legacyAuditHash(stored));
    expect(await verifyAuditTrail(t.db, t.labId)).toMatchObject({ ok: true, firstBroken: null });
    expect((await verifyAuditTrail(t.db, null)).ok).toBe(true);
  });

  it('keeps the chain whole under concurrent appends', async () => {
    await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.burst', targetType: 'thing', targetId: String(i) }),
      ),
    );
    const verdict = await verifyAuditTrail(t.db, t.labId);
    expect(verdict.ok).toBe(true);
    expect(verdict.checkpoint?.events).toBe(verdict.checked);
  });

  it('refuses UPDATE and DELETE through the triggers', async () => {
    // The rejection comes from better-sqlite3 (another realm than jest's), so compare messages.
    expect(await failureOf(t.db.raw("UPDATE audit_events SET action = 'forged'"))).toMatch(/append-only: UPDATE refused/);
    expect(await failureOf(t.db.raw('DELETE FROM audit_events'))).toMatch(/append-only: DELETE refused/);
    expect(await t.db('audit_events').where({ action: 'forged' }).count({ n: '*' }).first()).toEqual({ n: 0 });
  });
});

describe('the audit trail over HTTP', () => {
  it('lists events with filters and pages, for admin and auditor only', async () => {
    const admin = await t.signIn('admin');
    const analystId = (await t.db('users').where({ email: 'analyst@harborridge.test' }).first()).id;
    await admin.patch(`/api/v1/labs/${t.labId}/members/${analystId}`).send({ role: 'reviewer' }).expect(200);
    await admin.patch(`/api/v1/labs/${t.labId}/members/${analystId}`).send({ role: 'analyst' }).expect(200);

    const auditor = await t.signIn('auditor');
    const roles = await auditor.get(`/api/v1/labs/${t.labId}/audit?action=members.change-role`).expect(200);
    expect(roles.body.total).toBe(2);
    expect(roles.body.items.map((e: { after: { role: string } }) => e.after.role)).toEqual(['analyst', 'reviewer']); // newest first
    expect(roles.body.items[0].actor).toMatchObject({ email: 'admin@harborridge.test', displayName: 'Mara Okafor' });

    // The family members.* holds the two role changes and the seed's five members.add events.
    const family = await auditor.get(`/api/v1/labs/${t.labId}/audit?action=members.*&limit=1`).expect(200);
    expect(family.body).toMatchObject({ total: 7, limit: 1 });
    expect(family.body.items).toHaveLength(1);
    const adminId = roles.body.items[0].actor.userId;
    const byActor = await auditor.get(`/api/v1/labs/${t.labId}/audit?actor=${adminId}`).expect(200);
    expect(byActor.body.items.every((e: { actor: { userId: string } }) => e.actor.userId === adminId)).toBe(true);
    const today = new Date().toISOString().slice(0, 10);
    const inDay = await auditor.get(`/api/v1/labs/${t.labId}/audit?from=${today}&to=${today}&action=members.change-role`).expect(200);
    expect(inDay.body.total).toBe(2);
    const past = await auditor.get(`/api/v1/labs/${t.labId}/audit?to=2020-01-01`).expect(200);
    expect(past.body.total).toBe(0);
    const bad = await auditor.get(`/api/v1/labs/${t.labId}/audit?from=yesterday-ish`);
    expect(bad.status).toBe(400);
    const reviewer = await t.signIn('reviewer');
    await reviewer.get(`/api/v1/labs/${t.labId}/audit`).expect(403);
  });

  it('records failed sign-ins as lab-less events', async () => {
    await t.http.post('/api/v1/auth/sign-in').send({ email: 'ghost@harborridge.test', password: 'whatever-it-is' }).expect(401);
    const row = await t.db('audit_events').whereNull('lab_id').where({ action: 'auth.sign-in-failed' }).orderBy('id', 'desc').first();
    expect(JSON.parse(row.after_json)).toMatchObject({ email: 'ghost@harborridge.test', reason: 'unknown_email' });
    expect(row.actor_user_id).toBeNull();
  });

  it('exports CSV with formula-looking text escaped', async () => {
    await recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.csv', targetType: 'thing', targetId: '=HYPERLINK("x")' });
    const auditor = await t.signIn('auditor');
    const res = await auditor.get(`/api/v1/labs/${t.labId}/audit/export`).expect(200).expect('content-type', /text\/csv/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toBe('id,at_iso,actor_user_id,actor_name,actor_email,action,target_type,target_id,target_name,target_email,before_json,after_json,prev_hash,hash');
    const csvLine = lines.find((l) => l.includes('test.csv'))!;
    expect(csvLine).toContain(`"'=HYPERLINK(""x"")"`);
    const stored = await t.db('audit_events').where({ lab_id: t.labId }).count({ n: '*' }).first();
    expect(lines.length - 1).toBe(Number(stored!.n));
  });

  it('verifies the chain, then finds a row tampered with raw SQL after the trigger is dropped', async () => {
    const auditor = await t.signIn('auditor');
    const ok = await auditor.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200);
    expect(ok.body.ok).toBe(true);
    expect(ok.body.checked).toBeGreaterThan(5);

    const victim = await t.db('audit_events').where({ lab_id: t.labId, action: 'members.change-role' }).orderBy('id').first();
    await t.db.raw('DROP TRIGGER audit_events_no_update');
    try {
      await t.db.raw('UPDATE audit_events SET after_json = ? WHERE id = ?', ['{"role":"admin"}', victim.id]);
    } finally {
      await t.db.raw(`CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events
        BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: UPDATE refused'); END`);
    }
    const broken = await auditor.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200);
    expect(broken.body).toMatchObject({ ok: false, firstBroken: { id: Number(victim.id), reason: 'hash_mismatch' } });
    expect(broken.body.firstBroken.detail).toBe(`Entry #${victim.id} does not match its keyed hash: it was changed after it was written, or its hash was made without the audit key.`);

    // Rewriting its hash as plain sha256 (no key) still fails at the entry itself; rewriting it
    // with the key breaks the link of the next event instead.
    const next = await t.db('audit_events').where({ lab_id: t.labId }).where('id', '>', victim.id).orderBy('id').first();
    const forged = await t.db('audit_events').where({ id: victim.id }).first();
    const key = Buffer.from(fs.readFileSync(t.config.audit.keyFile, 'utf8').trim(), 'utf8');
    for (const [hash, expected] of [
      [legacyAuditHash(forged), { id: Number(victim.id), reason: 'hash_mismatch' }],
      [sealAuditRow(key, forged), { id: Number(next.id), reason: 'link_mismatch' }],
    ] as const) {
      await t.db.raw('DROP TRIGGER audit_events_no_update');
      await t.db.raw('UPDATE audit_events SET hash = ? WHERE id = ?', [hash, victim.id]);
      await t.db.raw(`CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events
        BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: UPDATE refused'); END`);
      expect(await verifyAuditTrail(t.db, t.labId)).toMatchObject({ ok: false, firstBroken: expected });
    }
  });
});
