/**
 * The foundation over HTTP against a real SQLite file: config checking, health, JSON errors,
 * sign-in with sessions in the database, sign-out, and the mail path through the fake SMTP server.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { ConfigError, loadConfig } from '@/server/config';
import { startServer, type RunningServer } from '@/server/start';
import { DEMO_USERS } from '@/server/seed/demo-lab';

const PASSWORD = 'foundation-test-password';
let server: RunningServer;
let dataDir: string;

beforeAll(async () => {
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-foundation-'));
  const config = loadConfig({ PORT: '0', FAKE_SMTP_PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'silent', DEMO_PASSWORD: PASSWORD });
  server = await startServer(config);
}, 30_000);

afterAll(async () => {
  await server?.close();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

describe('config', () => {
  it.each([
    ['PORT', 'eighty', /PORT="eighty"/],
    ['PORT', '70000', /PORT="70000"/],
    ['PUBLIC_URL', 'not a url', /PUBLIC_URL="not a url"/],
    ['DEMO_PASSWORD', 'short', /DEMO_PASSWORD="short": must be at least 12 characters/],
    ['LOG_LEVEL', 'loud', /LOG_LEVEL="loud"/],
    ['AUDIT_KEY', 'too-short', /AUDIT_KEY="too-short": must be at least 32 characters/],
  ])('%s=%s stops with a message naming it', (name, value, pattern) => {
    expect(() => loadConfig({ [name]: value })).toThrow(ConfigError);
    expect(() => loadConfig({ [name]: value })).toThrow(pattern);
  });

  it('resolves the embedded defaults', () => {
    const c = loadConfig({}, '/srv/lab');
    expect(c.port).toBe(8080);
    expect(c.databaseFile).toBe('/srv/lab/data/plumbline.sqlite');
    expect(c.mail.smtp).toBeNull();
    expect(c.publicUrl).toBe('http://localhost:8080');
    expect(c.audit).toEqual({ key: null, keyFile: '/srv/lab/data/audit-key', checkpointFile: '/srv/lab/data/audit-checkpoints.log' });
  });

  it('takes the audit key one way only', () => {
    expect(() => loadConfig({ AUDIT_KEY: 'k'.repeat(40), AUDIT_KEY_FILE: '/etc/plumbline/key' })).toThrow(/AUDIT_KEY and AUDIT_KEY_FILE are both set/);
    expect(loadConfig({ AUDIT_KEY_FILE: '/etc/plumbline/key' }, '/srv/lab').audit.keyFile).toBe('/etc/plumbline/key');
  });
});

describe('health and errors', () => {
  it('reports status, version and database', async () => {
    const res = await request(server.url).get('/api/health').expect(200);
    expect(res.body).toEqual({ status: 'ok', version: expect.stringMatching(/^\d+\.\d+\.\d+/), database: 'ok' });
  });

  it('answers unknown API paths with a JSON 404', async () => {
    const res = await request(server.url).get('/api/v1/no-such-thing').expect(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: expect.stringContaining('/api/v1/no-such-thing') });
  });

  it('answers unreadable JSON with 400 and no stack trace', async () => {
    const res = await request(server.url)
      .post('/api/v1/auth/sign-in')
      .set('content-type', 'application/json')
      .send('{"email": ')
      .expect(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(JSON.stringify(res.body)).not.toMatch(/at .*\.ts:\d+/);
  });

  it('names the field of an invalid body', async () => {
    const res = await request(server.url).post('/api/v1/auth/sign-in').send({ email: 'nobody', password: 'x' }).expect(400);
    expect(res.body.error.details.fields[0].path).toBe('email');
  });

  it('refuses a body over the size limit', async () => {
    const res = await request(server.url)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'a@b.test', password: 'x'.repeat(2_000_000) })
      .expect(413);
    expect(res.body.error.code).toBe('body_too_large');
  });

  it('sends security headers', async () => {
    const res = await request(server.url).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});

describe('sign-in', () => {
  it('seeds the five demo users once, with argon2id hashes', async () => {
    const rows = await server.db('users').select('email', 'password_hash').orderBy('email');
    expect(rows.map((r) => r.email).sort()).toEqual(DEMO_USERS.map((u) => u.email).sort());
    for (const r of rows) expect(r.password_hash).toMatch(/^\$argon2id\$/);
  });

  it('signs in, keeps the session in SQLite, and signs out', async () => {
    const res = await request(server.url)
      .post('/api/v1/auth/sign-in')
      .send({ email: 'Analyst@HarborRidge.test', password: PASSWORD })
      .expect(200);
    expect(res.body.user.email).toBe('analyst@harborridge.test');
    expect(res.body.memberships).toEqual([{ labId: expect.any(String), labName: 'Harbor Ridge Test Lab', role: 'analyst' }]);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/plumbline_session=\w+/);
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    const sessionId = /plumbline_session=(\w+)/.exec(cookie)![1];
    expect(await server.db('sessions').where({ id: sessionId }).first()).toBeTruthy();

    const me = await request(server.url).get('/api/v1/me').set('Cookie', `plumbline_session=${sessionId}`).expect(200);
    expect(me.body.user.displayName).toBe('Tomas Lindqvist');

    await request(server.url).post('/api/v1/auth/sign-out').set('Cookie', `plumbline_session=${sessionId}`).expect(204);
    expect(await server.db('sessions').where({ id: sessionId }).first()).toBeUndefined();
    await request(server.url).get('/api/v1/me').set('Cookie', `plumbline_session=${sessionId}`).expect(401);
  });

  it('rotates the session at sign-in', async () => {
    const first = await request(server.url).post('/api/v1/auth/sign-in').send({ email: 'reviewer@harborridge.test', password: PASSWORD });
    const firstId = /plumbline_session=(\w+)/.exec(String(first.headers['set-cookie']))![1];
    const second = await request(server.url)
      .post('/api/v1/auth/sign-in')
      .set('Cookie', `plumbline_session=${firstId}`)
      .send({ email: 'reviewer@harborridge.test', password: PASSWORD })
      .expect(200);
    const secondId = /plumbline_session=(\w+)/.exec(String(second.headers['set-cookie']))![1];
    expect(secondId).not.toBe(firstId);
    expect(await server.db('sessions').where({ id: firstId }).first()).toBeUndefined();
  });

  it('answers the same for an unknown user and a wrong password', async () => {
    const unknown = await request(server.url).post('/api/v1/auth/sign-in').send({ email: 'ghost@harborridge.test', password: PASSWORD });
    const wrong = await request(server.url).post('/api/v1/auth/sign-in').send({ email: 'auditor@harborridge.test', password: 'not-the-password' });
    expect(unknown.status).toBe(401);
    expect(wrong.status).toBe(401);
    expect(unknown.body).toEqual(wrong.body);
  });

  it('refuses a sign-in from another site', async () => {
    const res = await request(server.url)
      .post('/api/v1/auth/sign-in')
      .set('Origin', 'https://elsewhere.example')
      .send({ email: 'analyst@harborridge.test', password: PASSWORD })
      .expect(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('locks an address out after repeated failures', async () => {
    const email = 'analyst2@harborridge.test';
    for (let i = 0; i < 8; i++) await request(server.url).post('/api/v1/auth/sign-in').send({ email, password: `wrong-${i}` }).expect(401);
    const res = await request(server.url).post('/api/v1/auth/sign-in').send({ email, password: PASSWORD }).expect(429);
    expect(res.body.error.code).toBe('too_many_attempts');
  });
});

describe('mail', () => {
  it('delivers through real SMTP to the fake server and keeps the message in the outbox', async () => {
    await server.mailer.send({ to: 'admin@harborridge.test', subject: 'Test message', text: 'Hello from the test.', kind: 'test' });
    const got = server.fakeSmtp!.messages.find((m) => m.subject === 'Test message');
    expect(got?.to).toEqual(['admin@harborridge.test']);
    expect(got?.text.trim()).toBe('Hello from the test.');
    const row = await server.db('mail_outbox').where({ subject: 'Test message' }).first();
    expect(row.status).toBe('sent');
  });
});
