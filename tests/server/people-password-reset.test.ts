/**
 * Password reset over HTTP with the mail read back from the fake SMTP server: the same answer for
 * known and unknown addresses, a one-hour single-use link, every session ended on confirm, the old
 * password refused afterwards, and the request rate limit.
 */
import { createHash } from 'node:crypto';
import { startTestServer, tokenFromMail, TEST_PASSWORD, type TestServer } from './helpers';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer();
});
afterAll(() => t.close());

const NEW_PASSWORD = 'drone-arm-mode-340hz';

describe('password reset', () => {
  it('answers the same for an unknown address and sends no mail for it', async () => {
    const known = await t.http.post('/api/v1/auth/password-reset').send({ email: 'analyst2@harborridge.test' });
    const unknown = await t.http.post('/api/v1/auth/password-reset').send({ email: 'nobody@harborridge.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    await t.waitForMail('analyst2@harborridge.test');
    // The known address's mail has arrived; nothing was queued or sent for the unknown one.
    expect(await t.db('mail_outbox').where({ to_address: 'nobody@harborridge.test' }).first()).toBeUndefined();
    expect(t.mail().some((m) => m.to.includes('nobody@harborridge.test'))).toBe(false);
  });

  it('resets with the mailed link once, ends every session and refuses the old password', async () => {
    const sessionA = await t.signIn('auditor');
    const sessionB = await t.signIn('auditor');
    await sessionA.get('/api/v1/me').expect(200);
    const before = t.mail().length;

    await t.http.post('/api/v1/auth/password-reset').send({ email: 'Auditor@HarborRidge.test' }).expect(202);
    const mail = await t.waitForMail('auditor@harborridge.test', (m) => t.mail().indexOf(m) >= before);
    expect(mail.subject).toBe('Reset your Plumbline password');
    expect(mail.text).toContain('http://plumbline.test/reset-password?token=');
    const token = tokenFromMail(mail, 'reset-password');
    const row = await t.db('password_resets').where({ token_hash: createHash('sha256').update(token).digest('hex') }).first();
    expect(row.expires_at - row.created_at).toBe(3600_000);

    const weak = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password: 'auditor@harborridge.test' });
    expect(weak.status).toBe(400);
    expect(weak.body.error.code).toBe('weak_password');

    await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password: NEW_PASSWORD }).expect(204);
    const user = await t.db('users').where({ email: 'auditor@harborridge.test' }).first();
    expect(await t.db('sessions').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual({ n: 0 });
    await sessionA.get('/api/v1/me').expect(401);
    await sessionB.get('/api/v1/me').expect(401);

    const old = await t.http.post('/api/v1/auth/sign-in').send({ email: 'auditor@harborridge.test', password: TEST_PASSWORD });
    expect(old.status).toBe(401);
    await t.signIn('auditor@harborridge.test', NEW_PASSWORD);

    const reuse = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password: 'yet-another-password-77' });
    expect(reuse.status).toBe(410);
    expect(reuse.body.error.code).toBe('reset_link_invalid');

    const actions = (await t.db('audit_events').whereNull('lab_id').where({ target_id: user.id }).select('action')).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['auth.password-reset-requested', 'auth.password-reset', 'auth.sign-in-failed']));
  });

  it('refuses an expired link and an invented one', async () => {
    const before = t.mail().length;
    await t.http.post('/api/v1/auth/password-reset').send({ email: 'analyst@harborridge.test' }).expect(202);
    const token = tokenFromMail(await t.waitForMail('analyst@harborridge.test', (m) => t.mail().indexOf(m) >= before), 'reset-password');
    await t.db('password_resets').where({ token_hash: createHash('sha256').update(token).digest('hex') }).update({ expires_at: Date.now() - 1 });
    const expired = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password: NEW_PASSWORD });
    expect(expired.status).toBe(410);
    const invented = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token: 'A'.repeat(43), password: NEW_PASSWORD });
    expect(invented.status).toBe(410);
    await t.signIn('analyst'); // the password did not change
  });

  it('rate-limits requests per address (8 in 15 minutes, the sign-in limiter rule)', async () => {
    const codes: number[] = [];
    for (let i = 0; i < 9; i++) codes.push((await t.http.post('/api/v1/auth/password-reset').send({ email: 'someone.else@example.test' })).status);
    expect(codes.slice(0, 8)).toEqual(Array(8).fill(202));
    expect(codes[8]).toBe(429);
  });

  it('names the field of a malformed request', async () => {
    const res = await t.http.post('/api/v1/auth/password-reset').send({ email: 'not an address' });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields[0].path).toBe('email');
  });
});
