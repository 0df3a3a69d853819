/**
 * The database's own refusals, tried with raw SQL on the server's SQLite file (the services never
 * issue these statements): an approved recipe version's body and name cannot change and it cannot
 * be deleted; states move only along the review lifecycle; a new version starts as a draft;
 * submissions, evidence, decisions and reports are append-only; a decision by the submitter or an
 * author is refused; a standard's scope and signature cannot change and an ended standard stays
 * ended.
 */
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { createWork, failureOf, finishedStudy, frameScope, signInAll, userId, type Agents, type WorkIds } from './approval-fixtures';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let submissionId: string;
let standardId: string;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  const studyId = await finishedStudy(as.analyst, w, 1);
  submissionId = (await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [studyId], scope: frameScope }).expect(201)).body.id;
  const approved = await as.reviewer
    .post(`${w.lab}/reviews/${submissionId}/decision`)
    .send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames' })
    .expect(200);
  standardId = approved.body.standardId;
}, 60_000);
afterAll(() => t.close());

const version1 = () => t.db('recipe_versions').where({ recipe_id: w.recipe, version: 1 });

describe('an approved recipe version', () => {
  it('refuses an UPDATE of its body, name or author', async () => {
    const before = await version1().first();
    expect(before.state).toBe('approved');
    for (const sql of [
      `UPDATE recipe_versions SET body = '{"name":"forged"}' WHERE recipe_id = ? AND version = 1`,
      "UPDATE recipe_versions SET name = 'forged' WHERE recipe_id = ? AND version = 1",
      "UPDATE recipe_versions SET author_id = (SELECT id FROM users WHERE email = 'reviewer@harborridge.test') WHERE recipe_id = ? AND version = 1",
    ]) {
      expect(await failureOf(t.db.raw(sql, [w.recipe]))).toMatch(/an approved version is immutable; an edit makes a new draft version/);
    }
    expect(await version1().first()).toEqual(before);
  });

  it('refuses a DELETE and a state change outside the lifecycle', async () => {
    expect(await failureOf(t.db.raw('DELETE FROM recipe_versions WHERE recipe_id = ? AND version = 1', [w.recipe]))).toMatch(/an approved version cannot be deleted/);
    for (const state of ['draft', 'in_review', 'returned']) {
      expect(await failureOf(t.db.raw('UPDATE recipe_versions SET state = ? WHERE recipe_id = ? AND version = 1', [state, w.recipe]))).toMatch(/outside the review lifecycle/);
    }
    expect((await version1().first('state')).state).toBe('approved');
  });

  it('lets a draft version move only to review, and a new version start only as a draft', async () => {
    const definition = JSON.parse((await version1().first('body')).body);
    const put = await as.analyst.put(`${w.lab}/recipes/${w.recipe}`).send({ baseVersion: 1, definition: { ...definition, overlap: 0.6 } }).expect(200);
    expect(put.body.version.version).toBe(2);
    expect(await failureOf(t.db.raw("UPDATE recipe_versions SET state = 'approved' WHERE recipe_id = ? AND version = 2", [w.recipe]))).toMatch(/outside the review lifecycle/);
    const author = await userId(t, 'analyst@harborridge.test');
    const insert = t.db.raw("INSERT INTO recipe_versions (recipe_id, version, name, body, note, author_id, created_at, state) VALUES (?, 99, 'x', '{}', '', ?, 0, 'approved')", [w.recipe, author]);
    expect(await failureOf(insert)).toMatch(/a new version starts as a draft/);
    // The body rule is for approved versions only: inside a rolled-back transaction a draft's body can be written.
    await expect(
      t.db.transaction(async (trx) => {
        await trx.raw(`UPDATE recipe_versions SET body = '{"draft":"edit"}' WHERE recipe_id = ? AND version = 2`, [w.recipe]);
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
  });
});

describe('submissions, evidence, decisions and reports', () => {
  it.each(['review_submissions', 'review_evidence', 'review_decisions'])('%s refuses UPDATE and DELETE', async (table) => {
    const column = table === 'review_evidence' ? 'position' : 'submission_id';
    const where = table === 'review_submissions' ? 'id' : 'submission_id';
    const update = table === 'review_submissions' ? "UPDATE review_submissions SET purpose = 'forged' WHERE id = ?" : `UPDATE ${table} SET ${column} = ${column} WHERE ${where} = ?`;
    expect(await failureOf(t.db.raw(update, [submissionId]))).toMatch(new RegExp(`${table} is append-only: UPDATE refused`));
    expect(await failureOf(t.db.raw(`DELETE FROM ${table} WHERE ${where} = ?`, [submissionId]))).toMatch(new RegExp(`${table} is append-only: DELETE refused`));
  });

  it('reports refuse UPDATE and DELETE', async () => {
    await as.auditor.get(`${w.lab}/standards/${standardId}/report`).expect(200);
    expect(await failureOf(t.db.raw("UPDATE reports SET sha256 = 'forged'"))).toMatch(/reports is append-only: UPDATE refused/);
    expect(await failureOf(t.db.raw('DELETE FROM reports'))).toMatch(/reports is append-only: DELETE refused/);
  });

  it('refuses a decision inserted for the submitter or an author, and one without its meaning or reason', async () => {
    const insert = (reviewer: string, decision: string, meaning: string | null, reason: string | null) =>
      t.db.raw(
        `INSERT INTO review_decisions (id, submission_id, lab_id, reviewer_id, decision, meaning, comment, reason, decided_at, engine_version, evidence_sha256, signature_sha256)
         VALUES (lower(hex(randomblob(8))), (SELECT id FROM review_submissions WHERE recipe_id = ? LIMIT 1), ?, ?, ?, ?, '', ?, 0, 'x', 'x', 'x')`,
        [w.recipe, t.labId, reviewer, decision, meaning, reason],
      );
    const analyst = await userId(t, 'analyst@harborridge.test');
    const auditor = await userId(t, 'auditor@harborridge.test');
    expect(await failureOf(insert(analyst, 'approved', 'meaning', null))).toMatch(/the submitter, an author of any version or the starter of an evidence study cannot decide it/);
    expect(await failureOf(insert(auditor, 'approved', '  ', null))).toMatch(/approved needs a meaning, returned needs a reason/);
    expect(await failureOf(insert(auditor, 'returned', null, null))).toMatch(/approved needs a meaning, returned needs a reason/);
    // The first decision is still the only one: the submission is unique in review_decisions.
    expect(await failureOf(insert(auditor, 'returned', null, 'reason'))).toMatch(/UNIQUE constraint failed: review_decisions.submission_id/);
  });
});

describe('a standard', () => {
  it("refuses changes of its scope, dates and signature, and a DELETE", async () => {
    for (const set of ['band_low_hz = 0', "structure_type = 'anything'", 'review_due_at = review_due_at + 1', "decision_id = 'x'", "excitations = ',impact,'"]) {
      expect(await failureOf(t.db.raw(`UPDATE standards SET ${set} WHERE id = ?`, [standardId]))).toMatch(/scope, signature and dates are immutable/);
    }
    expect(await failureOf(t.db.raw('DELETE FROM standards WHERE id = ?', [standardId]))).toMatch(/DELETE refused \(retire instead\)/);
  });

  it('ends once: a retired standard cannot become active or superseded again', async () => {
    await as.admin.post(`${w.lab}/standards/${standardId}/retire`).send({ reason: 'Replaced by a new method entirely.' }).expect(200);
    for (const status of ['active', 'superseded']) {
      expect(await failureOf(t.db.raw('UPDATE standards SET status = ? WHERE id = ?', [status, standardId]))).toMatch(/only an active standard can end/);
    }
    expect((await t.db('standards').where({ id: standardId }).first('status')).status).toBe('retired');
  });
});
