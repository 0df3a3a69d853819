/**
 * Signatures under the audit trail's check: a recipe version returned once and then approved gives
 * two decisions; the check re-computes both (evidence hash, signature hash) and matches them with
 * their decision entries. A decision row moved to the other submission, one moved with its hashes
 * recomputed to fit, and one whose meaning or time was altered are each named (raw SQL through a
 * separate better-sqlite3 handle, triggers dropped).
 */
import Database from 'better-sqlite3';
import type { DecisionRow } from '@/server/db/approval';
import { signatureSha256 } from '@/server/services/evidence';
import { createWork, finishedStudy, frameScope, signInAll, type Agents, type WorkIds } from './approval-fixtures';
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let returned: string;
let approved: string;

const TRIGGERS = ['update', 'delete'].map(
  (op) => `CREATE TRIGGER review_decisions_no_${op} BEFORE ${op.toUpperCase()} ON review_decisions
    BEGIN SELECT RAISE(ABORT, 'review_decisions is append-only: ${op.toUpperCase()} refused'); END`,
);

/** Runs raw SQL on the server's file through a handle of its own, the decisions' triggers off. */
function tamper(work: (raw: Database.Database) => void): void {
  const raw = new Database(t.config.databaseFile);
  raw.pragma('foreign_keys = OFF'); // the spare id of `swap` names no submission for a moment
  try {
    raw.exec('DROP TRIGGER review_decisions_no_update; DROP TRIGGER review_decisions_no_delete;');
    try {
      work(raw);
    } finally {
      raw.exec(TRIGGERS.join('; '));
    }
  } finally {
    raw.close();
  }
}

const decisionOf = (raw: Database.Database, submissionId: string) => raw.prepare('SELECT * FROM review_decisions WHERE submission_id = ?').get(submissionId) as DecisionRow;

/** Swaps which submission the two decisions point to (the column is unique, so through a spare id). */
const swap = (raw: Database.Database) => {
  const move = raw.prepare('UPDATE review_decisions SET submission_id = ? WHERE submission_id = ?');
  move.run('spare', returned);
  move.run(returned, approved);
  move.run(approved, 'spare');
};

const verify = async () => (await as.auditor.get(`${w.lab}/audit/verify`).expect(200)).body;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  const study = await finishedStudy(as.analyst, w, 1);
  const submit = async () =>
    (await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [study], scope: frameScope, purpose: 'Frames.' }).expect(201)).body.id as string;
  returned = await submit();
  await as.reviewer.post(`${w.lab}/reviews/${returned}/decision`).send({ decision: 'returned', reason: 'Add a scenario with noise on the force channel.' }).expect(200);
  approved = await submit();
  await as.reviewer
    .post(`${w.lab}/reviews/${approved}/decision`)
    .send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames', comment: 'Read in full.' })
    .expect(200);
}, 90_000);
afterAll(() => t.close());

it('re-computes both signatures of a clean trail', async () => {
  expect(await verify()).toMatchObject({ ok: true, signatures: 2, firstBroken: null });
});

it('names a decision moved to the other submission', async () => {
  tamper(swap);
  try {
    const v = await verify();
    expect(v).toMatchObject({ ok: false, firstBroken: { reason: 'signature_mismatch' } });
    expect(v.firstBroken.detail).toMatch(/its signature hash does not re-compute from the submission, decision, signer, meaning, comment and time stored with it\.$/);
  } finally {
    tamper(swap);
  }
  expect((await verify()).ok).toBe(true);
});

it('names a moved decision whose hashes were recomputed to fit, by its decision entry', async () => {
  const approveEntry = await t.db('audit_events').where({ lab_id: t.labId, action: 'reviews.approve', target_id: approved }).first('id');
  const reviewer = await t.db('users').where({ email: 'reviewer@harborridge.test' }).first();
  const kept = new Map<string, string>();
  tamper((raw) => {
    for (const sub of [returned, approved]) kept.set(decisionOf(raw, sub).id, decisionOf(raw, sub).signature_sha256);
    swap(raw);
    for (const sub of [returned, approved]) {
      const d = decisionOf(raw, sub);
      const signature = signatureSha256({
        evidenceSha256: d.evidence_sha256, submissionId: sub, decision: d.decision,
        signer: { id: reviewer.id, displayName: reviewer.display_name, email: reviewer.email },
        meaning: d.meaning, comment: d.comment, reason: d.reason, signedAt: Number(d.decided_at),
      });
      raw.prepare('UPDATE review_decisions SET signature_sha256 = ? WHERE id = ?').run(signature, d.id);
    }
  });
  try {
    // The return (decided first) now sits on the approved submission: its entry there is the approval's.
    const v = await verify();
    expect(v).toMatchObject({ ok: false, firstBroken: { id: Number(approveEntry.id), reason: 'signature_mismatch' } });
    expect(v.firstBroken.detail).toContain(`on submission ${approved} does not match its decision entry #${approveEntry.id} in the trail`);
  } finally {
    tamper((raw) => {
      swap(raw);
      for (const [id, signature] of kept) raw.prepare('UPDATE review_decisions SET signature_sha256 = ? WHERE id = ?').run(signature, id);
    });
  }
  expect((await verify()).ok).toBe(true);
});

it('names a signature whose meaning, or a return whose time, was altered', async () => {
  const alter = async (sql: string, submissionId: string) => {
    const before = await t.db('review_decisions').where({ submission_id: submissionId }).first();
    tamper((raw) => raw.prepare(sql).run(submissionId));
    try {
      const v = await verify();
      expect(v).toMatchObject({ ok: false, firstBroken: { reason: 'signature_mismatch' } });
      expect(v.firstBroken.detail).toContain(`on submission ${submissionId}: its signature hash does not re-compute`);
    } finally {
      tamper((raw) => raw.prepare('UPDATE review_decisions SET meaning = ?, decided_at = ? WHERE submission_id = ?').run(before.meaning, before.decided_at, submissionId));
    }
  };
  await alter("UPDATE review_decisions SET meaning = 'Approved for every structure there is' WHERE submission_id = ?", approved);
  await alter('UPDATE review_decisions SET decided_at = decided_at - 86400000 WHERE submission_id = ?', returned);
  expect((await verify()).ok).toBe(true);
});
