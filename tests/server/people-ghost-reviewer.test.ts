/**
 * The ghost reviewer, step by step over HTTP against a real SQLite file: an admin invites an
 * address as reviewer and looks for the link in the lab's sent mail (withheld there, in the
 * outbox and anywhere in the database), the invitee cannot take an existing member's name (in any
 * case or spacing), and a signature shows the signer's e-mail and who invited them. Also: account
 * events in each member lab's trail (admin and auditor read them, an analyst does not), the audit
 * CSV with names and e-mails, and the field-level diff of a recipe update.
 */
import { startTestServer, tokenFromMail, type TestServer } from './helpers';
import { createWork, editRecipe, finishedStudy, frameScope, lastAuditId, signInAll, userId, type Agents } from './approval-fixtures';

let t: TestServer;
let as: Agents;
const GHOST = 'ghost.reviewer@example.test';
const NEW_PASSWORD = 'a-long-ghost-password-2026';

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
}, 60_000);
afterAll(() => t.close());

/** Every text cell of every table, to look for a token anywhere in the database. */
async function databaseText(): Promise<string> {
  const tables = (await t.db.raw("select name from sqlite_master where type = 'table'")) as { name: string }[];
  const parts: string[] = [];
  for (const { name } of tables) parts.push(JSON.stringify(await t.db(name).select('*')));
  return parts.join('\n');
}

describe('the ghost reviewer', () => {
  let token: string;

  it('finds no usable link in the sent-mail view, the outbox or anywhere in the database', async () => {
    await as.admin.post(`/api/v1/labs/${t.labId}/invitations`).send({ email: GHOST, role: 'reviewer' }).expect(201);
    token = tokenFromMail(await t.waitForMail(GHOST), 'accept-invitation');
    const view = await as.admin.get(`/api/v1/labs/${t.labId}/mail`).expect(200);
    const shown = view.body.items.find((m: { to: string }) => m.to === GHOST);
    expect(shown.text).toContain('(it works once and expires in 72 hours):\n[link withheld: only the recipient received it]\n');
    expect(shown.text).not.toContain('token=');
    expect(JSON.stringify(view.body)).not.toContain(token);
    const stored = await t.db('mail_outbox').where({ to_address: GHOST }).first();
    expect(stored.status).toBe('sent');
    expect(stored.body_text).not.toContain(token);
    expect(await databaseText()).not.toContain(token);
  });

  it('keeps password reset links out of the database too', async () => {
    await t.http.post('/api/v1/auth/password-reset').send({ email: 'analyst2@harborridge.test' }).expect(202);
    const reset = tokenFromMail(await t.waitForMail('analyst2@harborridge.test', (m) => m.subject.includes('Reset')), 'reset-password');
    const stored = await t.db('mail_outbox').where({ to_address: 'analyst2@harborridge.test', kind: 'password-reset' }).first();
    expect(stored.body_text).toContain('[link withheld: only the recipient received it]');
    expect(await databaseText()).not.toContain(reset);
  });

  it.each(['Dana Whitcombe', ' dana  WHITCOMBE ', 'DanaWhitcombe', 'Ｄａｎａ Whitcombe'])('refuses an existing member\'s name written as "%s", and records it', async (name) => {
    const before = await lastAuditId(t);
    const res = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: name, password: NEW_PASSWORD }).expect(409);
    expect(res.body.error).toMatchObject({
      code: 'display_name_taken',
      message: 'A member of this lab is already called "Dana Whitcombe". Names must tell people apart: use another form of your name, for example with a middle initial.',
    });
    expect(await t.db('users').where({ email: GHOST }).first()).toBeUndefined();
    const logged = await t.db('audit_events').where('id', '>', before).andWhere({ lab_id: t.labId, action: 'invitations.accept-refused' }).select('after_json');
    expect(logged.map((e) => JSON.parse(e.after_json))).toEqual([expect.objectContaining({ refused: 'display_name_taken', email: GHOST, displayName: name.trim() })]);
  });

  it('signs under its own name, e-mail and the admin who invited it, in the API, the standard and the report', async () => {
    await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Dana W. Ghost', password: NEW_PASSWORD }).expect(200);
    const ghost = await t.signIn(GHOST, NEW_PASSWORD);
    const w = await createWork(t, as.analyst);
    const study = await finishedStudy(as.analyst, w, 1);
    const sub = (await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [study], scope: frameScope }).expect(201)).body.id;
    const signed = await ghost.post(`${w.lab}/reviews/${sub}/decision`).send({ decision: 'approved', password: NEW_PASSWORD, meaning: 'Approved as lab standard for single-mode frames' }).expect(200);
    const invitation = await t.db('invitations').where({ email: GHOST }).first();
    const day = (ms: number) => new Date(Number(ms)).toISOString().slice(0, 10);
    const signer = {
      id: await userId(t, GHOST), displayName: 'Dana W. Ghost', email: GHOST,
      origin: {
        kind: 'invitation', invitedBy: { id: await userId(t, 'admin@harborridge.test'), displayName: 'Mara Okafor', email: 'admin@harborridge.test' },
        invitedAt: Number(invitation.created_at), joinedAt: Number(invitation.used_at),
        text: `invited by Mara Okafor (admin@harborridge.test) on ${day(invitation.created_at)}, accepted ${day(invitation.used_at)}`,
      },
    };
    expect(signed.body.decision.signer).toEqual(signer);
    const standard = await as.auditor.get(`${w.lab}/standards/${signed.body.standardId}`).expect(200);
    expect(standard.body.signature.signer).toEqual(signer);
    expect(standard.body.signature.rule).toContain('within the last 30 days cannot decide one.');
    const report = await as.auditor.get(`${w.lab}/standards/${signed.body.standardId}/report`).expect(200);
    expect(report.body.content.signature).toMatchObject({ signer, rule: standard.body.signature.rule });
  }, 90_000);
});

describe('account events of a lab\'s members', () => {
  it('are in the lab\'s trail for its admin and auditor, not for an analyst', async () => {
    const analystId = await userId(t, 'analyst@harborridge.test');
    await t.http.post('/api/v1/auth/sign-in').send({ email: 'analyst@harborridge.test', password: 'not-the-password' }).expect(401);
    await t.signIn('analyst');
    for (const reader of [as.admin, as.auditor]) {
      const res = await reader.get(`/api/v1/labs/${t.labId}/audit?action=auth.*&limit=200`).expect(200);
      const mine = res.body.items.filter((e: { targetId: string }) => e.targetId === analystId).map((e: { action: string }) => e.action);
      expect(mine.slice(0, 2)).toEqual(['auth.sign-in', 'auth.sign-in-failed']);
      // analyst2 asked for a reset link above.
      const resets = res.body.items.filter((e: { action: string }) => e.action === 'auth.password-reset-requested').map((e: { targetId: string }) => e.targetId);
      expect(resets).toEqual([await userId(t, 'analyst2@harborridge.test')]);
    }
    await as.analyst.get(`/api/v1/labs/${t.labId}/audit?action=auth.*`).expect(403);
  });

  it('carry names and e-mails in the audit CSV, and a recipe update its field-level diff', async () => {
    const w = await createWork(t, as.analyst2);
    await editRecipe(as.analyst2, w, 1, { overlap: 0.6, tolerances: { magnitudeDb: 1, phaseDeg: 15, minCoherence: 0.5 } });
    const update = await t.db('audit_events').where({ lab_id: t.labId, action: 'recipes.update', target_id: w.recipe }).first();
    expect(JSON.parse(update.after_json).changes).toEqual([
      { path: 'overlap', old: 0.5, new: 0.6 },
      { path: 'tolerances.magnitudeDb', old: 1.5, new: 1 },
    ]);
    const csv = (await as.auditor.get(`/api/v1/labs/${t.labId}/audit/export`).expect(200)).text.split('\r\n');
    expect(csv[0]).toBe('id,at_iso,actor_user_id,actor_name,actor_email,action,target_type,target_id,target_name,target_email,before_json,after_json,prev_hash,hash');
    const signIn = csv.find((l) => l.includes(',auth.sign-in,') && l.includes('Tomas Lindqvist'));
    expect(signIn).toContain(',Tomas Lindqvist,analyst@harborridge.test,auth.sign-in,user,');
    expect(csv.find((l) => l.includes(',recipes.update,'))).toContain(',Priya Venkat,analyst2@harborridge.test,recipes.update,recipe,');
  });
});
