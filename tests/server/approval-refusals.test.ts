/**
 * Every refusal of the review process, over HTTP with a clear message and an audit event:
 * decisions by an analyst, an auditor or an admin; self-approval; approval by the author or an
 * editor of the version; approval with a wrong password; approval of a stale version; a second
 * decision on the same submission. And the refusals of a submission: evidence that is not
 * finished or of another version, a scope the evidence does not cover, failed criteria without a
 * written justification, a version that is not a draft.
 */
import type request from 'supertest';
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { auditSince, createWork, editRecipe, finishedStudy, frameRecipe, frameScenario, frameScope, lastAuditId, setRole, signInAll, type Agents, type WorkIds } from './approval-fixtures';
import { waitForStudy } from './work-fixtures';

let t: TestServer;
let as: Agents;
let w: WorkIds;
let reviews: string;
const study: Record<string, string> = {};
const sub: Record<string, string> = {};
let auditStart: number;

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  reviews = `${w.lab}/reviews`;
  study.v1 = await finishedStudy(as.analyst, w, 1);
  auditStart = await lastAuditId(t);
  sub.v1 = (await submit(as.analyst, 1, [study.v1]).expect(201)).body.id;
}, 60_000);
afterAll(() => t.close());

function submit(agent: request.Agent, version: number, studyIds: string[], extra: Record<string, unknown> = {}, recipe = w.recipe) {
  return agent.post(reviews).send({ recipe: { id: recipe, version }, studyIds, scope: frameScope, ...extra });
}
const approve = (agent: request.Agent, id: string, extra: Record<string, unknown> = {}) =>
  agent.post(`${reviews}/${id}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames', ...extra });
const giveBack = (agent: request.Agent, id: string) => agent.post(`${reviews}/${id}/decision`).send({ decision: 'returned', reason: 'Needs a scenario with force-channel noise.' });

async function refusalsOf(submissionId: string) {
  return (await auditSince(t, auditStart))
    .filter((e) => e.target_id === submissionId && /^reviews\.(decide|signature)-refused$/.test(e.action))
    .map((e) => ({ action: e.action, ...JSON.parse(e.after_json!) }));
}

describe('decisions refused by role', () => {
  it.each(['analyst2', 'auditor', 'admin'] as const)('%s: 403 with the reason, logged', async (who) => {
    const role = who === 'analyst2' ? 'analyst' : who;
    const res = await approve(as[who], sub.v1!).expect(403);
    expect(res.body.error).toEqual({ code: 'forbidden', message: `Only a reviewer may approve or return a submission; your role in this lab is ${role}.` });
    const logged = (await refusalsOf(sub.v1!)).filter((r) => r.refused === 'role' && r.role === role);
    expect(logged).toHaveLength(1);
  });
});

describe('self-approval', () => {
  it('is refused for the submitter even after they become a reviewer, for approving and returning alike', async () => {
    await setRole(t, as.admin, 'analyst@harborridge.test', 'reviewer');
    try {
      for (const attempt of [approve(as.analyst, sub.v1!), giveBack(as.analyst, sub.v1!)]) {
        const res = await attempt.expect(403);
        expect(res.body.error).toMatchObject({ code: 'self_approval', message: 'You submitted this recipe version for review: an independent reviewer must decide it.' });
      }
    } finally {
      await setRole(t, as.admin, 'analyst@harborridge.test', 'analyst');
    }
    const logged = await refusalsOf(sub.v1!);
    expect(logged.filter((r) => r.refused === 'self_approval').map((r) => r.decision)).toEqual(['approved', 'returned']);
    expect((await auditSince(t, auditStart)).filter((e) => e.action === 'reviews.decide-refused' && e.actor_user_id === null)).toEqual([]);
  });
});

describe('the electronic signature', () => {
  it('needs the right password: a wrong one is refused and logged', async () => {
    const res = await approve(as.reviewer, sub.v1!, { password: 'not-my-password' }).expect(403);
    expect(res.body.error).toMatchObject({ code: 'signature_refused', message: 'The password is not correct: the approval was not signed.' });
    const logged = await refusalsOf(sub.v1!);
    expect(logged.filter((r) => r.action === 'reviews.signature-refused')).toHaveLength(1);
    expect(await t.db('review_decisions').where({ submission_id: sub.v1 })).toEqual([]);
  });

  it('needs a stated meaning', async () => {
    const res = await as.reviewer.post(`${reviews}/${sub.v1}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'ok' }).expect(400);
    expect(res.body.error.message).toMatch(/^meaning: State what the signature means/);
  });
});

describe('a stale version and a second decision', () => {
  it('refuses approving a version once a newer one exists, but lets it be returned', async () => {
    expect(await editRecipe(as.analyst2, w, 1, { overlap: 0.6 })).toBe(2);
    const res = await approve(as.reviewer, sub.v1!).expect(409);
    expect(res.body.error).toMatchObject({ code: 'stale_version', message: expect.stringContaining('Version 1 is no longer the recipe\'s latest (version 2 exists)') });
    expect((await refusalsOf(sub.v1!)).filter((r) => r.refused === 'stale_version')).toHaveLength(1);
    const view = await as.reviewer.get(`${reviews}/${sub.v1}`).expect(200);
    expect(view.body).toMatchObject({ stale: true, status: 'pending' });
    await giveBack(as.reviewer, sub.v1!).expect(200);
  });

  it('refuses a second decision on the same submission', async () => {
    const res = await approve(as.reviewer, sub.v1!).expect(409);
    expect(res.body.error).toMatchObject({ code: 'already_decided', message: expect.stringMatching(/^This submission was already returned by Dana Whitcombe on \d{4}-\d{2}-\d{2}; a decision is final/) });
    expect((await refusalsOf(sub.v1!)).filter((r) => r.refused === 'already_decided')).toHaveLength(1);
    expect(await t.db('review_decisions').where({ submission_id: sub.v1 }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });
});

describe('the author and the editors of a version', () => {
  beforeAll(async () => {
    study.v2 = await finishedStudy(as.analyst, w, 2);
    sub.v2 = (await submit(as.analyst, 2, [study.v2]).expect(201)).body.id;
  }, 60_000);

  it('refuses the author of the version (analyst2 wrote version 2), after a role change too', async () => {
    await setRole(t, as.admin, 'analyst2@harborridge.test', 'reviewer');
    const res = await approve(as.analyst2, sub.v2!).expect(403);
    expect(res.body.error).toMatchObject({ code: 'author_cannot_decide', message: 'You wrote version 2 of this recipe: a reviewer who is not its author must decide it.' });
    expect((await refusalsOf(sub.v2!)).map((r) => r.refused)).toEqual(['author_cannot_decide']);
  });

  it('refuses an editor of an earlier version the submitted one builds on', async () => {
    expect(await editRecipe(as.analyst, w, 2, { overlap: 0.5 })).toBe(3);
    study.v3 = await finishedStudy(as.analyst, w, 3);
    sub.v3 = (await submit(as.analyst, 3, [study.v3]).expect(201)).body.id;
    const view = await as.analyst2.get(`${reviews}/${sub.v3}`).expect(200);
    expect(view.body.blockedForYou).toEqual(['You wrote version 2, which version 3 builds on: a reviewer who wrote no version of this recipe must decide it.']);
    const res = await approve(as.analyst2, sub.v3!).expect(403);
    expect(res.body.error.code).toBe('editor_cannot_decide');
    expect((await refusalsOf(sub.v3!)).map((r) => r.refused)).toEqual(['editor_cannot_decide']);
  }, 60_000);

  it('lets an independent reviewer approve, after which the older pending version is stale', async () => {
    await approve(as.reviewer, sub.v3!).expect(200);
    expect((await approve(as.reviewer, sub.v2!).expect(409)).body.error.code).toBe('stale_version');
  });
});

describe('submissions that are refused', () => {
  it('refuses a version that is not a draft, and a draft that is not the latest', async () => {
    const approved = await submit(as.analyst, 3, [study.v3!]).expect(409);
    expect(approved.body.error).toMatchObject({ code: 'not_a_draft', message: 'Version 3 cannot be submitted: it is approved; edit the recipe to start a new draft version.' });
    expect(await editRecipe(as.analyst, w, 3, { overlap: 0.55 })).toBe(4);
    expect(await editRecipe(as.analyst, w, 4, { overlap: 0.5 })).toBe(5);
    expect((await submit(as.analyst, 4, [study.v3!]).expect(409)).body.error.code).toBe('stale_version');
  });

  it('refuses evidence that did not finish, unknown studies and an empty list', async () => {
    // A softening cubic spring this strong makes the response diverge (no pre-flight check can
    // foresee it): every run fails, so the study ends as failed.
    const broken = (await as.analyst.post(`${w.lab}/recipes`).send({ definition: frameRecipe('Recipe of a failed study') }).expect(201)).body.id;
    const diverging = (await as.analyst.post(`${w.lab}/scenarios`).send({ definition: { ...frameScenario(0.01, { cubicStiffness: { k3NPerM3: -1e14 } }), name: 'Diverging spring' } }).expect(201)).body.id;
    const started = await as.analyst.post(`${w.lab}/studies`).send({ name: 'Fails', recipe: { id: broken }, scenarios: [{ id: diverging }], seeds: 1 }).expect(202);
    expect((await waitForStudy(as.analyst, `${w.lab}/studies/${started.body.id}`)).status).toBe('failed');
    const res = await submit(as.analyst, 1, [started.body.id], {}, broken).expect(409);
    expect(res.body.error).toMatchObject({ code: 'study_not_finished', message: 'Study "Fails" is failed: only finished studies count as evidence.' });
    expect((await submit(as.analyst, 5, ['no-such-study']).expect(404)).body.error.message).toBe('Study no-such-study was not found.');
    expect((await submit(as.analyst, 5, []).expect(400)).body.error.message).toBe('studyIds: Give at least one finished study as evidence');
  }, 60_000);

  describe('a scope the evidence does not cover', () => {
    let v5: string;
    beforeAll(async () => {
      v5 = await finishedStudy(as.analyst, w, 5);
    }, 60_000);
    const refused = async (scope: Record<string, unknown>, studies?: string[]) => {
      const res = await as.analyst.post(reviews).send({ recipe: { id: w.recipe, version: 5 }, studyIds: studies ?? [v5], scope: { ...frameScope, ...scope } }).expect(422);
      expect(res.body.error.code).toBe('scope_not_covered');
      return { message: res.body.error.message as string, failed: res.body.error.details.coverage.checks.filter((c: { ok: boolean }) => !c.ok).map((c: { id: string }) => c.id) };
    };
    it('a band wider than the recipe judges', async () => {
      expect((await refused({ band: { lowHz: 10, highHz: 80 } })).failed).toEqual(['band-in-recipe']);
    });
    it('lighter damping than any mode of the evidence', async () => {
      const r = await refused({ dampingPercent: { min: 0.5, max: 2 } });
      expect(r.failed).toEqual(['damping-range']);
      expect(r.message).toContain('in-band modes span 1–2 % damping; the scope asks for 0.5–2 %');
    });
    it('an excitation no scenario uses', async () => {
      expect((await refused({ excitations: ['random', 'impact'] })).failed).toEqual(['excitation:impact']);
    });
    it('a band with no mode in it', async () => {
      expect((await refused({ band: { lowHz: 60, highHz: 90 } })).failed).toEqual(['modes-in-band', 'damping-range']);
    });
  });

  describe('failed criteria', () => {
    let tight: WorkIds;
    let evidence: string;
    beforeAll(async () => {
      tight = await createWork(t, as.analyst, { ...frameRecipe('Tight tolerance'), tolerances: { magnitudeDb: 0.01 } });
      evidence = await finishedStudy(as.analyst, tight, 1);
    }, 60_000);
    const send = (justification?: string) => as.analyst.post(reviews).send({ recipe: { id: tight.recipe, version: 1 }, studyIds: [evidence], scope: frameScope, justification });

    it('need a written justification of at least 20 characters', async () => {
      for (const j of [undefined, 'too short']) {
        const res = await send(j).expect(422);
        expect(res.body.error.code).toBe('justification_required');
        expect(res.body.error.message).toMatch(/^4 criterion\(s\) failed \(SDOF 50 Hz at 2 % damping: Magnitude bias \|mean error\|; .*give a written justification of at least 20 characters\.$/);
      }
      const ok = await send('The 0.01 dB limit is a stress setting; the programme tolerance is 1 dB.').expect(201);
      expect(ok.body.failingCriteria).toHaveLength(4);
      expect(ok.body.failingCriteria[0]).toMatchObject({ studyId: evidence, label: 'Magnitude bias |mean error|', limit: 0.01, unit: 'dB' });
      expect(ok.body.justification).toBe('The 0.01 dB limit is a stress setting; the programme tolerance is 1 dB.');
      sub.tight = ok.body.id;
    });
  });
});

describe('repeated wrong signature passwords', () => {
  it('pause signing after 8 in 15 minutes (the sign-in limit), even with the right password then', async () => {
    for (let i = 0; i < 8; i++) await approve(as.reviewer, sub.tight!, { password: `guess-${i}` }).expect(403);
    const res = await approve(as.reviewer, sub.tight!).expect(429);
    expect(res.body.error).toMatchObject({ code: 'too_many_attempts', message: '8 wrong passwords in 15 minutes: signing is paused; try again later.' });
    expect(await t.db('review_decisions').where({ submission_id: sub.tight })).toEqual([]);
  }, 30_000);
});

describe('the audit trail after all refusals', () => {
  it('holds one event per refusal and still verifies', async () => {
    const refusals = (await auditSince(t, auditStart)).filter((e) => /-refused$/.test(e.action)).map((e) => JSON.parse(e.after_json!).refused);
    expect(refusals.sort()).toEqual(
      [
        ...['role', 'role', 'role', 'self_approval', 'self_approval', 'signature_refused', 'stale_version', 'already_decided', 'author_cannot_decide', 'editor_cannot_decide', 'stale_version'],
        ...Array(8).fill('signature_refused'),
        'too_many_attempts',
      ].sort(),
    );
    expect((await as.auditor.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200)).body.ok).toBe(true);
  });
});
