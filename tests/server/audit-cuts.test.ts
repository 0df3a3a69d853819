/**
 * Cuts and edits of the audit trail, made with raw SQL through a separate better-sqlite3 handle on
 * the server's own file (triggers dropped, as someone holding the file could): each is found by
 * GET /audit/verify, which names the entry or the count that broke. Each case has a lab of its own
 * (its own chain) in one server. A clean trail verifies with its count and its checkpoint.
 */
import { createHash, createHmac } from 'node:crypto';
import fs from 'node:fs';
import Database from 'better-sqlite3';
import { canonicalJson, legacyAuditHash, recordAudit, sealAuditRow } from '@/server/services/audit';
import type { AuditRow } from '@/server/db/audit';
import { createOtherLab, startTestServer, type TestServer } from './helpers';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer();
});
afterAll(() => t.close());

// The auditor's sign-in (recorded in the lab's trail as an account event, services/account-events.ts)
// and five test steps.
const EVENTS = 6;
const NO_UPDATE = `CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events
  BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: UPDATE refused'); END`;
const NO_DELETE = `CREATE TRIGGER audit_events_no_delete BEFORE DELETE ON audit_events
  BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: DELETE refused'); END`;

/** Runs raw SQL on the database file through a handle of its own, with the audit triggers off. */
function tamper(work: (raw: Database.Database) => void): void {
  const raw = new Database(t.config.databaseFile);
  try {
    raw.exec('DROP TRIGGER audit_events_no_update; DROP TRIGGER audit_events_no_delete;');
    work(raw);
    raw.exec(`${NO_UPDATE}; ${NO_DELETE};`);
  } finally {
    raw.close();
  }
}

/** A lab of its own with EVENTS entries in its chain; returns its id, its rows and its auditor. */
async function labWithTrail(name: string) {
  const { labId, emails } = await createOtherLab(t.db, name);
  const auditor = await t.signIn(emails.auditor);
  for (let i = 1; i < EVENTS; i++) {
    await recordAudit(t.db, { labId, actorUserId: null, action: 'test.step', targetType: 'thing', targetId: String(i), after: { step: i } });
  }
  const rows: AuditRow[] = await t.db('audit_events').where({ lab_id: labId }).orderBy('id');
  const verify = async () => (await auditor.get(`/api/v1/labs/${labId}/audit/verify`).expect(200)).body;
  return { labId, rows, verify };
}

/** Rewrites the rows from `from` on with new hashes made by `hash`, each linked to the one before. */
function rehashFrom(raw: Database.Database, labId: string, from: number, hash: (row: Omit<AuditRow, 'hash'>) => string): void {
  const rows = raw.prepare('SELECT * FROM audit_events WHERE lab_id = ? ORDER BY id').all(labId) as AuditRow[];
  let prev: string | null = null;
  for (const row of rows) {
    if (row.id >= from) {
      const next = hash({ ...row, prev_hash: prev });
      raw.prepare('UPDATE audit_events SET prev_hash = ?, hash = ? WHERE id = ?').run(prev, next, row.id);
      prev = next;
    } else {
      prev = row.hash;
    }
  }
}

describe('the keyed trail and its checkpoints', () => {
  it('verifies a clean trail with its count, its newest checkpoint and the key file private', async () => {
    const lab = await labWithTrail('Alder Test Lab');
    const v = await lab.verify();
    expect(v).toMatchObject({ ok: true, checked: EVENTS, missing: 0, firstBroken: null, checkpoint: { events: EVENTS, head: lab.rows.at(-1)!.hash } });
    const lines = fs.readFileSync(t.config.audit.checkpointFile, 'utf8').trim().split('\n').map((l) => JSON.parse(l));
    expect(lines.filter((c) => c.lab === lab.labId).map((c) => c.events)).toEqual([1, 2, 3, 4, 5, 6]);
    // Each line carries the HMAC of its other fields under the key in the key file.
    const key = Buffer.from(fs.readFileSync(t.config.audit.keyFile, 'utf8').trim(), 'utf8');
    const last = lines.at(-1)!;
    const { mac, ...body } = last;
    expect(createHmac('sha256', key).update(canonicalJson(body)).digest('hex')).toBe(mac);
    expect(fs.statSync(t.config.audit.keyFile).mode & 0o777).toBe(0o600);
  });

  it('names an edited entry', async () => {
    const lab = await labWithTrail('Birch Test Lab');
    const victim = lab.rows[2]!;
    tamper((raw) => raw.prepare('UPDATE audit_events SET after_json = ? WHERE id = ?').run('{"step":99}', victim.id));
    expect(await lab.verify()).toMatchObject({ ok: false, checked: 3, firstBroken: { id: victim.id, reason: 'hash_mismatch' } });
  });

  it('names the entry after one deleted from the middle', async () => {
    const lab = await labWithTrail('Cedar Test Lab');
    tamper((raw) => raw.prepare('DELETE FROM audit_events WHERE id = ?').run(lab.rows[2]!.id));
    const v = await lab.verify();
    expect(v).toMatchObject({ ok: false, firstBroken: { id: lab.rows[3]!.id, reason: 'link_mismatch' } });
    expect(v.firstBroken.detail).toBe(`Entry #${lab.rows[3]!.id} does not point to the entry before it: an entry was removed or put in between here.`);
  });

  it('counts the entries deleted from the end', async () => {
    const lab = await labWithTrail('Dogwood Test Lab');
    tamper((raw) => raw.prepare('DELETE FROM audit_events WHERE id IN (?, ?)').run(lab.rows[4]!.id, lab.rows[5]!.id));
    const v = await lab.verify();
    expect(v).toMatchObject({ ok: false, checked: EVENTS - 2, missing: 2, firstBroken: { id: null, reason: 'missing_events' } });
    expect(v.firstBroken.detail).toMatch(/recorded 6 entries, but the database holds 4: the last 2 are missing/);
  });

  it('does not pass a lab whose whole chain was deleted as "0 entries checked"', async () => {
    const lab = await labWithTrail('Elm Test Lab');
    tamper((raw) => raw.prepare('DELETE FROM audit_events WHERE lab_id = ?').run(lab.labId));
    expect(await lab.verify()).toMatchObject({ ok: false, checked: 0, missing: EVENTS, firstBroken: { reason: 'missing_events' } });
  });

  it('names an edit whose later hashes were recomputed without the key (plain sha256, or a wrong key)', async () => {
    const wrongKey = Buffer.from('a-key-that-is-not-the-audit-key-of-this-server', 'utf8');
    const rewrites = [
      (row: Omit<AuditRow, 'hash'>) => legacyAuditHash(row),
      (row: Omit<AuditRow, 'hash'>) => sealAuditRow(wrongKey, row),
      (row: Omit<AuditRow, 'hash'>) => createHash('sha256').update(canonicalJson(row)).digest('hex'),
    ];
    for (const [i, rewrite] of rewrites.entries()) {
      const lab = await labWithTrail(`Fir${i} Test Lab`);
      const victim = lab.rows[1]!;
      tamper((raw) => {
        raw.prepare('UPDATE audit_events SET actor_user_id = ? WHERE id = ?').run('someone-else', victim.id);
        rehashFrom(raw, lab.labId, victim.id, rewrite);
      });
      expect(await lab.verify()).toMatchObject({ ok: false, checked: 2, firstBroken: { id: victim.id, reason: 'hash_mismatch' } });
    }
  });

  it('names an edit recomputed with the key itself, by the checkpoints outside the database', async () => {
    const lab = await labWithTrail('Ginkgo Test Lab');
    const key = Buffer.from(fs.readFileSync(t.config.audit.keyFile, 'utf8').trim(), 'utf8');
    const victim = lab.rows[3]!;
    tamper((raw) => {
      raw.prepare('UPDATE audit_events SET after_json = ? WHERE id = ?').run('{"step":"forged"}', victim.id);
      rehashFrom(raw, lab.labId, victim.id, (row) => sealAuditRow(key, row));
    });
    const v = await lab.verify();
    expect(v).toMatchObject({ ok: false, missing: 3, firstBroken: { id: victim.id, reason: 'checkpoint_mismatch' } });
    expect(v.firstBroken.detail).toContain(`the trail was rewritten after entry #${lab.rows[2]!.id}`);
  });

  it('names a checkpoint line that was edited in the file', async () => {
    const lab = await labWithTrail('Hazel Test Lab');
    const file = t.config.audit.checkpointFile;
    const original = fs.readFileSync(file, 'utf8');
    const lines = original.trim().split('\n');
    const at = lines.findIndex((l) => JSON.parse(l).lab === lab.labId);
    lines[at] = JSON.stringify({ ...JSON.parse(lines[at]!), events: 1000 });
    fs.writeFileSync(file, `${lines.join('\n')}\n`);
    try {
      const v = await lab.verify();
      expect(v).toMatchObject({ ok: false, firstBroken: { id: null, reason: 'checkpoint_file' } });
      expect(v.firstBroken.detail).toContain(`line ${at + 1} of the checkpoint file does not carry a valid seal`);
    } finally {
      fs.writeFileSync(file, original);
    }
  });
});
