/**
 * Invitations over HTTP against a real SQLite file, with the mail read back from the fake SMTP
 * server: invite → mail with a single-use link → accept (new account, signed in) → link refused the
 * second time; expiry, revocation, an existing account joining a second lab, and what was stored.
 */
import { createHash } from 'node:crypto';
import { createOtherLab, startTestServer, tokenFromMail, TEST_PASSWORD, type TestServer } from './helpers';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer();
});
afterAll(() => t.close());

const NEW_PASSWORD = 'ridge-frame-mount-0042';

async function invite(email: string, role = 'analyst') {
  const admin = await t.signIn('admin');
  const res = await admin.post(`/api/v1/labs/${t.labId}/invitations`).send({ email, role });
  return { admin, res };
}

describe('inviting and accepting', () => {
  it('mails a 72 h single-use link, stores only the token hash, and accepting signs the new user in', async () => {
    const { res } = await invite('Nadia.Quell@example.test', 'reviewer');
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ email: 'nadia.quell@example.test', role: 'reviewer', status: 'pending', usedAt: null });
    expect(res.body.expiresAt - res.body.createdAt).toBe(72 * 3600_000);

    const mail = await t.waitForMail('nadia.quell@example.test');
    expect(mail.subject).toBe('You are invited to Harbor Ridge Test Lab on Plumbline');
    expect(mail.text).toContain('http://plumbline.test/accept-invitation?token=');
    const token = tokenFromMail(mail, 'accept-invitation');

    const stored = await t.db('invitations').where({ id: res.body.id }).first();
    expect(stored.token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(JSON.stringify(stored)).not.toContain(token);
    const outbox = await t.db('mail_outbox').where({ kind: 'invitation', to_address: 'nadia.quell@example.test' }).first();
    expect(outbox).toMatchObject({ lab_id: t.labId, status: 'sent' });

    const preview = await t.http.get(`/api/v1/invitations/${token}`).expect(200);
    expect(preview.body).toMatchObject({ labName: 'Harbor Ridge Test Lab', role: 'reviewer' });
    expect(preview.body).not.toHaveProperty('accountExists');

    const invitee = t.agent();
    const accepted = await invitee.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Nadia Quell', password: NEW_PASSWORD });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email: 'nadia.quell@example.test', displayName: 'Nadia Quell' });
    expect(accepted.body.memberships).toEqual([{ labId: t.labId, labName: 'Harbor Ridge Test Lab', role: 'reviewer' }]);
    expect(String(accepted.headers['set-cookie'])).toMatch(/plumbline_session=\w+.*HttpOnly/i);
    // The cookie it set is a working session.
    await invitee.get('/api/v1/me').expect(200);
    // The new account signs in with its password, which is stored as an argon2id hash.
    const user = await t.db('users').where({ email: 'nadia.quell@example.test' }).first();
    expect(user.password_hash).toMatch(/^\$argon2id\$/);
    await t.signIn('nadia.quell@example.test', NEW_PASSWORD);

    const again = await t.agent().post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Someone Else', password: 'another-long-password-9' });
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('invitation_used');
    expect(await t.db('users').where({ display_name: 'Someone Else' }).count({ n: '*' }).first()).toEqual({ n: 0 });

    const events = await t.db('audit_events')
      .where({ lab_id: t.labId })
      .whereIn('target_id', [res.body.id, user.id])
      .orderBy('id')
      .select('action', 'actor_user_id');
    // The sign-in after accepting is an account event of each lab the new member belongs to.
    expect(events.map((e) => e.action)).toEqual(['invitations.create', 'invitations.accept', 'members.add', 'auth.sign-in']);
    expect(events[2].actor_user_id).toBe(user.id);
  });

  it('refuses weak passwords with the field named, and keeps the invitation open', async () => {
    await invite('weak.pick@example.test');
    const token = tokenFromMail(await t.waitForMail('weak.pick@example.test'), 'accept-invitation');
    for (const password of ['short-pw', 'weak.pick@example.test', 'password1234']) {
      const res = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Weak Pick', password });
      expect(res.status).toBe(400);
      expect(res.body.error.details.fields[0].path).toBe('password');
    }
    const missingName = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ password: NEW_PASSWORD });
    expect(missingName.status).toBe(400);
    await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Weak Pick', password: NEW_PASSWORD }).expect(200);
  });

  it('refuses an expired link', async () => {
    await invite('late.reply@example.test');
    const token = tokenFromMail(await t.waitForMail('late.reply@example.test'), 'accept-invitation');
    await t.db('invitations').where({ email: 'late.reply@example.test' }).update({ expires_at: Date.now() - 1 });
    const res = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Late Reply', password: NEW_PASSWORD });
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_expired');
    expect(await t.db('users').where({ email: 'late.reply@example.test' }).first()).toBeUndefined();
  });

  it('lists invitations and revokes one; a revoked link no longer works', async () => {
    const { admin, res } = await invite('withdrawn@example.test', 'auditor');
    const token = tokenFromMail(await t.waitForMail('withdrawn@example.test'), 'accept-invitation');
    const list = await admin.get(`/api/v1/labs/${t.labId}/invitations?status=pending`).expect(200);
    expect(list.body.items.map((i: { email: string }) => i.email)).toContain('withdrawn@example.test');
    expect(list.body.items.every((i: { status: string }) => i.status === 'pending')).toBe(true);

    await admin.delete(`/api/v1/labs/${t.labId}/invitations/${res.body.id}`).expect(204);
    const row = await t.db('invitations').where({ id: res.body.id }).first();
    expect(row.revoked_at).toEqual(expect.any(Number));
    const accept = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'W', password: NEW_PASSWORD });
    expect(accept.body.error.code).toBe('invitation_revoked');
    const twice = await admin.delete(`/api/v1/labs/${t.labId}/invitations/${res.body.id}`);
    expect(twice.status).toBe(409);
  });

  it('refuses to invite a current member and an unknown token', async () => {
    const { res } = await invite('analyst@harborridge.test');
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('already_member');
    const bad = await t.http.get('/api/v1/invitations/not-a-real-token-value');
    expect(bad.status).toBe(404);
  });

  it('adds a membership for an address that already has an account, after its current password', async () => {
    const other = await createOtherLab(t.db);
    const otherAdmin = await t.signIn(other.emails.admin);
    await otherAdmin.post(`/api/v1/labs/${other.labId}/invitations`).send({ email: 'reviewer@harborridge.test', role: 'analyst' }).expect(201);
    const mail = await t.waitForMail('reviewer@harborridge.test', (m) => m.subject.includes('Quarry Point'));
    const token = tokenFromMail(mail, 'accept-invitation');
    // The preview is the same as for a new address: it does not tell that an account exists.
    expect(Object.keys((await t.http.get(`/api/v1/invitations/${token}`)).body).sort()).toEqual(['email', 'expiresAt', 'labName', 'role']);

    const wrong = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ password: 'not-the-password-1' });
    expect(wrong.status).toBe(401);
    const ok = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ password: TEST_PASSWORD }).expect(200);
    const roles = Object.fromEntries(ok.body.memberships.map((m: { labId: string; role: string }) => [m.labId, m.role]));
    expect(roles).toEqual({ [t.labId]: 'reviewer', [other.labId]: 'analyst' });
    expect(await t.db('users').where({ email: 'reviewer@harborridge.test' }).count({ n: '*' }).first()).toEqual({ n: 1 });
  });
});
