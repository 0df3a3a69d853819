/**
 * The review lifecycle over HTTP against a real SQLite file, with each role: submit a recipe
 * version with its evidence, the reviewer's inbox and evidence view, approval as an electronic
 * signature (re-entered password, meaning, comment, time, hashes), the standard it opens, mail to
 * the author, the submitter's and the lab admin's inboxes, an edit that starts a new draft version,
 * return with a reason, supersession by a newer approved version, retirement, and the audit trail
 * (every step recorded, the chain verifying, then a tampered row found).
 */
import type request from 'supertest';
import { startTestServer, type TestServer } from './helpers';
import { auditSince, createWork, editRecipe, finishedStudy, frameScope, lastAuditId, signInAll, type Agents, type WorkIds } from './approval-fixtures';
import { TEST_PASSWORD } from './helpers';
import { evidenceDocument, evidenceSha256 } from '@/server/services/evidence';
import { ENGINE_VERSION } from '@/shared/engine/version';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let reviews: string;
const evidence: Record<number, string> = {};

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  reviews = `${w.lab}/reviews`;
  evidence[1] = await finishedStudy(as.analyst, w, 1);
}, 60_000);
afterAll(() => t.close());

const submit = (agent: request.Agent, version: number, studyIds: string[], extra: Record<string, unknown> = {}) =>
  agent.post(reviews).send({ recipe: { id: w.recipe, version }, studyIds, scope: frameScope, purpose: 'Programme on single-mode frames.', ...extra });
const approve = (agent: request.Agent, id: string, extra: Record<string, unknown> = {}) =>
  agent.post(`${reviews}/${id}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames, 30–80 Hz', comment: 'Evidence read in full.', ...extra });
const states = async () => Object.fromEntries((await as.auditor.get(`${w.lab}/recipes/${w.recipe}/lifecycle`).expect(200)).body.versions.map((v: { version: number; state: string }) => [v.version, v.state]));

describe('version 1: submitted, read, approved', () => {
  let submissionId: string;
  let auditStart: number;

  it('is a draft when created', async () => {
    expect(await states()).toEqual({ 1: 'draft' });
  });

  it('refuses submission by roles that do not build (403 from the permission table)', async () => {
    for (const role of ['reviewer', 'auditor', 'admin'] as const) {
      const res = await submit(as[role], 1, [evidence[1]!]).expect(403);
      expect(res.body.error.code).toBe('forbidden');
    }
  });

  it('is submitted by an analyst: in review, reviewers mailed', async () => {
    auditStart = await lastAuditId(t);
    const res = await submit(as.analyst, 1, [evidence[1]!]).expect(201);
    submissionId = res.body.id;
    expect(res.body).toMatchObject({
      recipe: { id: w.recipe, version: 1, state: 'in_review', latestVersion: 1 },
      status: 'pending',
      stale: false,
      coverage: { covered: true },
      failingCriteria: [],
      studies: [{ id: evidence[1], pass: true }],
      decision: null,
    });
    // The submitter may not decide it, and an analyst may not decide at all.
    expect(res.body.blockedForYou.join(' ')).toMatch(/Only a reviewer.*analyst/);
    expect(res.body.blockedForYou.join(' ')).toMatch(/You submitted this recipe version/);
    expect(await states()).toEqual({ 1: 'in_review' });
    const mail = await t.waitForMail('reviewer@harborridge.test', (m) => m.subject.startsWith('Review requested'));
    expect(mail.subject).toContain('v1');
    expect(mail.text).toContain('submitted version 1');
    const stored = await t.db('review_submissions').where({ id: submissionId }).first();
    expect(stored).toMatchObject({ recipe_id: w.recipe, recipe_version: 1, structure_type: frameScope.structureType });
    expect(await t.db('review_evidence').where({ submission_id: submissionId }).select('study_id')).toEqual([{ study_id: evidence[1] }]);
  });

  it('cannot be submitted twice while in review', async () => {
    const res = await submit(as.analyst2, 1, [evidence[1]!]).expect(409);
    expect(res.body.error).toMatchObject({ code: 'not_a_draft', message: expect.stringContaining('already in review') });
  });

  it("is in the reviewer's inbox with nothing blocking them, and everyone can read it", async () => {
    const inbox = await as.reviewer.get(`${reviews}?status=pending`).expect(200);
    expect(inbox.body.total).toBe(1);
    expect(inbox.body.items[0]).toMatchObject({ id: submissionId, blockedForYou: [] });
    for (const role of ['admin', 'analyst', 'analyst2', 'auditor'] as const) await as[role].get(`${reviews}/${submissionId}`).expect(200);
  });

  it('shows the evidence: the recipe, each scenario with its criteria and which passed', async () => {
    const res = await as.reviewer.get(`${reviews}/${submissionId}/evidence`).expect(200);
    expect(res.body.recipeDefinition).toMatchObject({ window: 'hann', blockLength: 2048, estimator: 'H1' });
    const [study] = res.body.studies;
    expect(study).toMatchObject({ id: evidence[1], engineVersion: ENGINE_VERSION, seeds: 2, pass: true, reportPath: `${w.lab}/reports/study/${evidence[1]}` });
    expect(study.scenarios).toHaveLength(2);
    for (const s of study.scenarios) {
      // The recipe's tolerances (1.5 dB, 15 degrees, coherence 0.5) give four criteria (scores/criteria.ts).
      expect(s.criteria.map((c: { id: string }) => c.id).sort()).toEqual(['magnitude-bias', 'magnitude-p95', 'min-coherence', 'phase-p95'].sort());
      expect(s.criteria.every((c: { pass: boolean }) => c.pass)).toBe(true);
    }
  });

  it('is approved by the reviewer as an electronic signature, opening a standard', async () => {
    const before = Date.now();
    const res = await approve(as.reviewer, submissionId).expect(200);
    const after = Date.now();
    expect(res.body).toMatchObject({ status: 'approved', recipe: { state: 'approved' }, decision: { decision: 'approved', reviewer: { displayName: 'Dana Whitcombe' }, comment: 'Evidence read in full.', engineVersion: ENGINE_VERSION } });
    const d = res.body.decision;
    expect(d.meaning).toBe('Approved as lab standard for single-mode frames, 30–80 Hz');
    expect(d.decidedAt).toBeGreaterThanOrEqual(before);
    expect(d.decidedAt).toBeLessThanOrEqual(after);
    expect(d.evidenceSha256).toMatch(/^[0-9a-f]{64}$/);
    expect(d.signatureSha256).toMatch(/^[0-9a-f]{64}$/);
    // The evidence hash is over the recipe version, the study results and the engine version as stored.
    const doc = await evidenceDocument(t.db, t.labId, { id: w.recipe, version: 1 }, [evidence[1]!], ENGINE_VERSION);
    expect(evidenceSha256(doc)).toBe(d.evidenceSha256);
    expect(doc.studies[0]!.curves.length).toBeGreaterThan(10);

    const standard = await t.db('standards').where({ recipe_id: w.recipe, recipe_version: 1 }).first();
    expect(standard).toMatchObject({ status: 'active', decision_id: d.id, structure_type: frameScope.structureType, band_low_hz: 30, band_high_hz: 80, damping_min_percent: 1, damping_max_percent: 2, excitations: ',random,' });
    // Default review due date: 12 months (of 365.2425/12 days) after the signature.
    expect(Number(standard.review_due_at) - Number(standard.effective_at)).toBe(Math.round(365.2425 * 86_400_000));
    expect(res.body.standardId).toBe(standard.id);
    expect(await states()).toEqual({ 1: 'approved' });
  });

  it('mails the author (also the submitter) and the lab admin', async () => {
    for (const to of ['analyst@harborridge.test', 'admin@harborridge.test']) {
      const m = await t.waitForMail(to, (x) => x.subject.startsWith('Review approved'));
      expect(m.text).toContain('Meaning of the signature: Approved as lab standard for single-mode frames');
    }
  });

  it('recorded submit, approve and the new standard in the audit trail', async () => {
    const events = await auditSince(t, auditStart);
    expect(events.map((e) => e.action)).toEqual(['reviews.submit', 'reviews.approve', 'standards.create']);
    expect(JSON.parse(events[1]!.after_json!)).toMatchObject({ state: 'approved', recipe: { id: w.recipe, version: 1 } });
  });

  it('lists the approved version in the register, found by its scope', async () => {
    const all = await as.auditor.get(`${w.lab}/standards`).expect(200);
    expect(all.body.items).toHaveLength(1);
    expect(all.body.items[0]).toMatchObject({ recipe: { id: w.recipe, version: 1 }, status: 'active', scope: frameScope, supersedes: null, evidenceStudyIds: [evidence[1]] });
    const q = (query: string) => as.analyst.get(`${w.lab}/standards?${query}`).expect(200).then((r) => r.body.total as number);
    expect(await q('structureType=single-mode&lowHz=35&highHz=75&dampingPercent=1.5&excitation=random')).toBe(1);
    expect(await q('dampingPercent=0.5')).toBe(0); // lighter than the evidence
    expect(await q('highHz=200')).toBe(0); // beyond the band
    expect(await q('excitation=impact')).toBe(0);
    expect(await q('structureType=arm')).toBe(0);
    expect((await as.analyst.get(`${w.lab}/standards?lowHz=100&highHz=50`).expect(400)).body.error.message).toMatch(/lowHz=100 must be below highHz=50/);
  });
});

describe('an edit of the approved recipe', () => {
  it('starts version 2 as a draft and leaves version 1 approved and unchanged', async () => {
    const bodyBefore = (await t.db('recipe_versions').where({ recipe_id: w.recipe, version: 1 }).first('body')).body;
    expect(await editRecipe(as.analyst, w, 1, { overlap: 0.75 })).toBe(2);
    expect(await states()).toEqual({ 1: 'approved', 2: 'draft' });
    expect((await t.db('recipe_versions').where({ recipe_id: w.recipe, version: 1 }).first('body')).body).toBe(bodyBefore);
  });

  it('needs evidence of exactly that version', async () => {
    const res = await submit(as.analyst, 2, [evidence[1]!]).expect(409);
    expect(res.body.error).toMatchObject({ code: 'study_other_version', message: expect.stringContaining('ran recipe version 1') });
  });
});

describe('version 2: returned with a reason, resubmitted, approved, superseding version 1', () => {
  let first: string;

  beforeAll(async () => {
    evidence[2] = await finishedStudy(as.analyst, w, 2);
  }, 60_000);

  it('a return needs a reason, then is recorded and mailed', async () => {
    first = (await submit(as.analyst2, 2, [evidence[2]!]).expect(201)).body.id;
    const noReason = await as.reviewer.post(`${reviews}/${first}/decision`).send({ decision: 'returned', reason: 'no' }).expect(400);
    expect(noReason.body.error.message).toMatch(/^reason: Give the reason/);
    const res = await as.reviewer.post(`${reviews}/${first}/decision`).send({ decision: 'returned', reason: 'Add a scenario with noise on the force channel.' }).expect(200);
    expect(res.body).toMatchObject({ status: 'returned', recipe: { state: 'returned' }, decision: { decision: 'returned', reason: 'Add a scenario with noise on the force channel.', meaning: null } });
    expect(await states()).toEqual({ 1: 'approved', 2: 'returned' });
    // The author of version 2 is the analyst who edited it; the submitter is analyst2.
    for (const to of ['analyst@harborridge.test', 'analyst2@harborridge.test', 'admin@harborridge.test']) {
      const m = await t.waitForMail(to, (x) => x.subject.startsWith('Review returned'));
      expect(m.text).toContain('Reason: Add a scenario with noise on the force channel.');
    }
  });

  it('a returned version is resubmitted as it is, approved, and supersedes version 1', async () => {
    const again = (await submit(as.analyst2, 2, [evidence[2]!]).expect(201)).body.id;
    const res = await approve(as.reviewer, again, { reviewMonths: 6 }).expect(200);
    expect(await states()).toEqual({ 1: 'superseded', 2: 'approved' });
    const v1 = await t.db('standards').where({ recipe_id: w.recipe, recipe_version: 1 }).first();
    const v2 = await t.db('standards').where({ recipe_id: w.recipe, recipe_version: 2 }).first();
    expect(v1).toMatchObject({ status: 'superseded', superseded_by_id: v2.id, end_reason: 'superseded by version 2' });
    expect(v2).toMatchObject({ status: 'active', supersedes_id: v1.id, id: res.body.standardId });
    const active = await as.auditor.get(`${w.lab}/standards`).expect(200);
    expect(active.body.items.map((s: { id: string }) => s.id)).toEqual([v2.id]);
    expect(active.body.items[0].supersedes).toEqual({ id: v1.id, recipeVersion: 1 });
    const everything = await as.auditor.get(`${w.lab}/standards?status=all`).expect(200);
    expect(everything.body.items.find((s: { id: string }) => s.id === v1.id).supersededBy).toEqual({ id: v2.id, recipeVersion: 2 });
    const history = await as.auditor.get(`${reviews}?recipeId=${w.recipe}`).expect(200);
    expect(history.body.items.map((s: { status: string }) => s.status)).toEqual(['approved', 'returned', 'approved']);
  });
});

describe('retiring a standard', () => {
  it('is the lab admin\'s: others are refused, a reason is needed, the record stays', async () => {
    const v2 = await t.db('standards').where({ recipe_id: w.recipe, recipe_version: 2 }).first('id');
    for (const role of ['analyst', 'reviewer', 'auditor'] as const) await as[role].post(`${w.lab}/standards/${v2.id}/retire`).send({ reason: 'Programme finished for good.' }).expect(403);
    await as.admin.post(`${w.lab}/standards/${v2.id}/retire`).send({ reason: 'short' }).expect(400);
    const res = await as.admin.post(`${w.lab}/standards/${v2.id}/retire`).send({ reason: 'Programme finished for good.' }).expect(200);
    expect(res.body).toMatchObject({ status: 'retired', ended: { by: { displayName: 'Mara Okafor' }, reason: 'Programme finished for good.' } });
    expect(await states()).toEqual({ 1: 'superseded', 2: 'retired' });
    expect((await as.admin.post(`${w.lab}/standards/${v2.id}/retire`).send({ reason: 'Programme finished for good.' }).expect(409)).body.error.code).toBe('standard_ended');
    expect((await as.auditor.get(`${w.lab}/standards`).expect(200)).body.total).toBe(0);
    expect((await as.auditor.get(`${w.lab}/standards?status=retired`).expect(200)).body.total).toBe(1);
  });
});

describe('the audit trail of the whole lifecycle', () => {
  it('holds every step, and the chain verifies', async () => {
    const res = await as.auditor.get(`/api/v1/labs/${t.labId}/audit?limit=200`).expect(200);
    const actions: string[] = res.body.items.map((e: { action: string }) => e.action).reverse();
    const mine = actions.filter((a) => /^(reviews|standards)\./.test(a));
    expect(mine).toEqual([
      'reviews.submit', 'reviews.approve', 'standards.create',
      'reviews.submit', 'reviews.return',
      'reviews.submit', 'reviews.approve', 'standards.create', 'standards.supersede',
      'standards.retire',
    ]);
    expect(actions).toContain('recipes.update');
    expect((await as.auditor.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200)).body).toMatchObject({ ok: true, firstBroken: null });
  });

  it('detects an approval event altered with raw SQL', async () => {
    const victim = await t.db('audit_events').where({ lab_id: t.labId, action: 'reviews.approve' }).orderBy('id').first('id');
    await t.db.raw('DROP TRIGGER audit_events_no_update');
    try {
      await t.db.raw('UPDATE audit_events SET after_json = ? WHERE id = ?', ['{"state":"approved","meaning":"forged"}', victim.id]);
    } finally {
      await t.db.raw(`CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events
        BEGIN SELECT RAISE(ABORT, 'audit_events is append-only: UPDATE refused'); END`);
    }
    const res = await as.admin.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200);
    expect(res.body).toMatchObject({ ok: false, firstBroken: { id: victim.id, reason: 'hash_mismatch' } });
  });
});
