/**
 * The audit trail over a real SQLite file: the hash chain verifies, a row changed with raw SQL
 * (after dropping the trigger, as an attacker with file access could) is detected at its id, and
 * the triggers refuse UPDATE and DELETE.
 */
import { createHash } from 'node:crypto';
import { canonicalJson, hashAuditRow, recordAudit, verifyAuditChain } from '@/server/services/audit';
import { startTestServer, type TestServer } from './helpers';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer();
});
afterAll(() => t.close());

describe('canonical JSON and the hash', () => {
  it('sorts keys at every level and drops undefined', () => {
    expect(canonicalJson({ b: 1, a: { d: [{ z: 1, y: 2 }], c: undefined } })).toBe('{"a":{"d":[{"y":2,"z":1}]},"b":1}');
  });

  it('is sha256 over prev_hash + canonical row, recomputed here with node:crypto', () => {
    const row = {
      id: 7, lab_id: 'L', actor_user_id: 'U', action: 'x.y', target_type: 't', target_id: null,
      before_json: null, after_json: '{"a":1}', at: 1000, prev_hash: 'abc',
    };
    const expected = createHash('sha256')
      .update('abc{"action":"x.y","actor_user_id":"U","after_json":"{\\"a\\":1}","at":1000,"before_json":null,"id":7,"lab_id":"L","prev_hash":"abc","target_id":null,"target_type":"t"}')
      .digest('hex');
    expect(hashAuditRow(row)).toBe(expected);
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
    expect(stored.hash).toBe(hashAuditRow(stored));
    expect(await verifyAuditChain(t.db, t.labId)).toMatchObject({ ok: true, firstBroken: null });
    expect((await verifyAuditChain(t.db, null)).ok).toBe(true);
  });

  it('keeps the chain whole under concurrent appends', async () => {
    await Promise.all(
      Array.from({ length: 20 }, (_, i) =>
        recordAudit(t.db, { labId: t.labId, actorUserId: null, action: 'test.burst', targetType: 'thing', targetId: String(i) }),
      ),
    );
    expect((await verifyAuditChain(t.db, t.labId)).ok).toBe(true);
  });

  it('refuses UPDATE and DELETE through the triggers', async () => {
    await expect(t.db.raw("UPDATE audit_events SET action = 'forged'")).rejects.toThrow(/append-only: UPDATE refused/);
    await expect(t.db.raw('DELETE FROM audit_events')).rejects.toThrow(/append-only: DELETE refused/);
    expect(await t.db('audit_events').where({ action: 'forged' }).count({ n: '*' }).first()).toEqual({ n: 0 });
  });
});
