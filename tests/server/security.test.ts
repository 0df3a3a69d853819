/**
 * Security checks of issue 7 not already in foundation.test.ts (HttpOnly/SameSite, sign-out ends
 * the session, rotation at sign-in, same answer for unknown user and wrong password, lockout of an
 * address, nosniff and CSP default-src), people-password-reset.test.ts (reset: same answer, rate
 * limit) and exports-csv.test.ts (formula-injection escaping of export cells, end to end):
 * - the Secure cookie flag follows PUBLIC_URL (https: set, http: not);
 * - every state-changing route of the registry refuses a foreign Origin or Referer: 403 bad_origin;
 * - a locked-out known address and an unknown one answer alike (no enumeration through lockout);
 * - password rules on reset confirm and invitation accept (weak_password naming the field);
 * - frame-ancestors, X-Frame-Options, Referrer-Policy on API and web answers;
 * - upload file names with path tricks are never written outside DATA_DIR/uploads;
 * - no password, token or session id in the logs of sign-in, invitation and reset at level trace.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import request from 'supertest';
import type { Role } from '@/shared/api/auth';
import { routeRegistry, type RouteSpec } from '@/server/auth/permissions';
import { loadConfig } from '@/server/config';
import { createLogger } from '@/server/logger';
import { startServer, type RunningServer } from '@/server/start';
import { buildRegistry, countChanges, pathFor, roleFor, tableCounts, VOLATILE_TABLES } from './fuzz-support';
import { startTestServer, TEST_PASSWORD, tokenFromMail, type TestServer } from './helpers';
import { smallRecipe } from './work-fixtures';

const registry = buildRegistry();
let t: TestServer;
const agents = {} as Record<Role, Awaited<ReturnType<TestServer['signIn']>>>;

beforeAll(async () => {
  t = await startTestServer();
  for (const role of ['admin', 'analyst', 'reviewer', 'auditor'] as Role[]) agents[role] = await t.signIn(role);
});
afterAll(async () => {
  await t?.close();
  await registry.destroy();
});

const cookieOf = (res: { headers: Record<string, unknown> }) => String(res.headers['set-cookie'] ?? '');

describe('session cookie', () => {
  it('is not Secure over http, and HttpOnly, SameSite=Lax, Path=/', async () => {
    const res = await t.http.post('/api/v1/auth/sign-in').send({ email: 'auditor@harborridge.test', password: TEST_PASSWORD }).expect(200);
    const cookie = cookieOf(res);
    expect(cookie).toMatch(/plumbline_session=\w+/);
    expect(cookie).not.toMatch(/;\s*Secure/i);
    expect(cookie).toMatch(/Path=\//);
  });

  it('is Secure when PUBLIC_URL is https', async () => {
    const https = await startTestServer({ PUBLIC_URL: 'https://plumbline.test' });
    try {
      const res = await https.http.post('/api/v1/auth/sign-in').send({ email: 'auditor@harborridge.test', password: TEST_PASSWORD }).expect(200);
      expect(cookieOf(res)).toMatch(/;\s*Secure/i);
      expect(cookieOf(res)).toMatch(/HttpOnly/i);
      expect(cookieOf(res)).toMatch(/SameSite=Lax/i);
    } finally {
      await https.close();
    }
  });
});

const stateChanging = [...routeRegistry.values()].filter((r) => r.method !== 'get');

describe('Origin check on every state-changing route', () => {
  it('covers the registry', () => expect(stateChanging.length).toBeGreaterThanOrEqual(15));

  it.each(stateChanging.map((r) => [`${r.method.toUpperCase()} ${r.path}`, r] as const))('%s refuses a foreign Origin and Referer', async (_n, spec: RouteSpec) => {
    const role = roleFor(spec);
    const agent = role ? agents[role] : t.http;
    const url = pathFor(spec, t.labId, {});
    const before = await tableCounts(t.db);
    for (const header of [{ Origin: 'https://evil.example' }, { Referer: 'https://evil.example/page' }, { Origin: 'null' }]) {
      const res = await agent[spec.method](url).set(header).send({});
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('bad_origin');
    }
    expect(countChanges(before, await tableCounts(t.db), VOLATILE_TABLES)).toEqual([]);
    // The server's own origin passes the check (whatever the route then answers).
    const own = await agent[spec.method](url).set({ Origin: 'http://plumbline.test' }).send({});
    expect(own.body?.error?.code).not.toBe('bad_origin');
  });
});

describe('no user enumeration through the lockout', () => {
  it('answers a locked-out known address and an unknown one alike', async () => {
    const attempt = (email: string) => t.http.post('/api/v1/auth/sign-in').send({ email, password: 'wrong-password-123' });
    const known: { status: number; body: unknown }[] = [];
    const unknown: { status: number; body: unknown }[] = [];
    for (let i = 0; i < 10; i++) {
      known.push(await attempt('analyst2@harborridge.test'));
      unknown.push(await attempt('nobody-here@harborridge.test'));
    }
    expect(known.map((r) => [r.status, r.body])).toEqual(unknown.map((r) => [r.status, r.body]));
    expect(known.at(-1)!.status).toBe(429);
  });
});

describe('password rules', () => {
  it('refuses short, e-mail and common passwords on reset confirm, naming the field', async () => {
    const email = 'reviewer@harborridge.test';
    await t.http.post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const token = tokenFromMail(await t.waitForMail(email, (m) => /reset/i.test(m.subject)), 'reset-password');
    for (const password of ['short', email, 'reviewer', 'plumbline2026']) {
      const res = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password }).expect(400);
      expect(res.body.error).toMatchObject({ code: 'weak_password', details: { fields: [{ path: 'password' }] } });
      expect(res.body.error.message).toMatch(/^password: /);
    }
    await t.http.post('/api/v1/auth/password-reset/confirm').send({ token, password: 'a-long-enough-passphrase' }).expect(204);
  });

  it('refuses them on invitation accept too, and accepts a good one', async () => {
    const email = 'rule.check@harborridge.test';
    await agents.admin.post(`/api/v1/labs/${t.labId}/invitations`).send({ email, role: 'auditor' }).expect(201);
    const token = tokenFromMail(await t.waitForMail(email), 'accept-invitation');
    for (const password of ['short', email, 'rule.check', 'plumbline2026']) {
      const res = await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Rule Check', password }).expect(400);
      expect(res.body.error).toMatchObject({ code: 'weak_password', details: { fields: [{ path: 'password' }] } });
    }
    await t.http.post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'Rule Check', password: 'a-long-enough-passphrase' }).expect(200);
  });
});

describe('security headers', () => {
  it.each([['API', '/api/health'], ['API error', '/api/v1/no-such-route'], ['web app', '/studies']])('on the %s answer', async (_n, url) => {
    const res = await t.http.get(url);
    expect(res.headers['content-security-policy']).toMatch(/frame-ancestors '(self|none)'/);
    expect(res.headers['content-security-policy']).toMatch(/object-src 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toMatch(/^(SAMEORIGIN|DENY)$/);
    expect(res.headers['referrer-policy']).toMatch(/no-referrer|same-origin|strict-origin/);
  });
});

describe('upload file names with path tricks', () => {
  const marker = `evil-${process.pid}`;
  const tricks = [`../../${marker}.csv`, `..\\..\\${marker}.csv`, `/tmp/${marker}.csv`, `%2e%2e%2f${marker}.csv`, `C:\\${marker}.csv`, `${marker}\u0000.csv`];

  /** Every file under a folder, recursively. */
  const walk = (dir: string): string[] =>
    fs.existsSync(dir) ? fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)])) : [];

  it('stores every upload inside DATA_DIR/uploads under a generated name', async () => {
    const lab = `/api/v1/labs/${t.labId}`;
    const recipeId = (await agents.analyst.post(`${lab}/recipes`).send({ definition: smallRecipe('Path trick recipe') }).expect(201)).body.id;
    const x = Array.from({ length: 1024 }, (_v, i) => Math.sin(i / 7));
    const csv = ['time_s,input,output', ...x.map((v, i) => `${i / 512},${v},${2 * v}`)].join('\n') + '\n';
    for (const name of tricks) {
      const res = await agents.analyst.post(`${lab}/uploads`).field('kind', 'time-data').field('recipeId', recipeId).attach('file', Buffer.from(csv), name);
      expect({ name, status: res.status, body: res.status >= 500 ? res.body : null }).toEqual({ name, status: expect.any(Number), body: null });
    }
    const uploads = path.join(t.config.dataDir, 'uploads');
    const files = walk(t.config.dataDir);
    expect(files.filter((f) => f.includes(marker))).toEqual([]);
    const outside = files.filter((f) => !f.startsWith(uploads + path.sep) && !/plumbline\.sqlite(-wal|-shm|-journal)?$/.test(f) && !/audit-(key|checkpoints\.log)$/.test(f));
    expect(outside.filter((f) => !f.startsWith(path.join(t.config.dataDir, 'web')))).toEqual([]);
    expect(fs.readdirSync(os.tmpdir()).filter((f) => f.includes(marker))).toEqual([]);
    expect(fs.existsSync(`/tmp/${marker}.csv`)).toBe(false);
    expect(walk(uploads).filter((f) => !f.includes(`${path.sep}incoming${path.sep}`)).length).toBeGreaterThan(0);
  });
});

describe('no secrets in the logs', () => {
  let running: RunningServer;
  let dataDir: string;
  const lines: string[] = [];
  afterAll(async () => {
    await running?.close();
    if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
  });

  it('at level trace, sign-in, invitation and reset write no password, token or session id', async () => {
    dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-logs-'));
    const config = loadConfig({ NODE_ENV: 'test', PORT: '0', FAKE_SMTP_PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'trace', DEMO_PASSWORD: TEST_PASSWORD, PUBLIC_URL: 'http://plumbline.test', WEB_DIR: path.join(dataDir, 'web') }, dataDir);
    const sink = new Writable({ write(chunk, _enc, cb) { lines.push(String(chunk)); cb(); } });
    running = await startServer(config, createLogger('trace', sink));
    const http = request(running.url);
    const mails = () => running.fakeSmtp?.messages ?? [];
    const waitMail = async (to: string) => {
      for (let i = 0; i < 250; i++) {
        const m = mails().find((x) => x.to.includes(to));
        if (m) return m;
        await new Promise((r) => setTimeout(r, 20));
      }
      throw new Error(`no mail to ${to}`);
    };
    const secrets: string[] = [TEST_PASSWORD];
    const admin = request.agent(running.url);
    const signIn = await admin.post('/api/v1/auth/sign-in').send({ email: 'admin@harborridge.test', password: TEST_PASSWORD }).expect(200);
    secrets.push(/plumbline_session=(\w+)/.exec(cookieOf(signIn))![1]!);
    await http.post('/api/v1/auth/sign-in').send({ email: 'admin@harborridge.test', password: 'a-wrong-password-9' }).expect(401);
    secrets.push('a-wrong-password-9');
    const labId = (await running.db('labs').first('id')).id as string;
    await admin.post(`/api/v1/labs/${labId}/invitations`).send({ email: 'new.person@harborridge.test', role: 'auditor' }).expect(201);
    const invitation = tokenFromMail(await waitMail('new.person@harborridge.test'), 'accept-invitation');
    secrets.push(invitation);
    const accepted = await http.post(`/api/v1/invitations/${invitation}/accept`).send({ displayName: 'New Person', password: 'new-person-passphrase-1' }).expect(200);
    secrets.push('new-person-passphrase-1', /plumbline_session=(\w+)/.exec(cookieOf(accepted))![1]!);
    await http.post('/api/v1/auth/password-reset').send({ email: 'auditor@harborridge.test' }).expect(202);
    const reset = tokenFromMail(await waitMail('auditor@harborridge.test'), 'reset-password');
    secrets.push(reset);
    await http.post('/api/v1/auth/password-reset/confirm').send({ token: reset, password: 'reset-passphrase-22' }).expect(204);
    secrets.push('reset-passphrase-22');
    await admin.post('/api/v1/auth/sign-out').expect(204);

    expect(lines.length).toBeGreaterThan(0); // the sink is wired: start-up lines at least
    const log = lines.join('');
    for (const secret of secrets) expect({ secret, found: log.includes(secret) }).toEqual({ secret, found: false });
  }, 30_000);
});
