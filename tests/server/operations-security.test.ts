/**
 * What a lab or a hosting team meets when they run Plumbline for real: the Host header, proxies,
 * lockout that cannot be aimed at another person, rate limits that survive a restart, invitation
 * races, reset links, text and file names the server cannot store, uploads that can give no
 * result, messages that grow with the file, caching and the Content-Security-Policy.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import request from 'supertest';
import { loadConfig } from '@/server/config';
import { createLogger } from '@/server/logger';
import { startServer } from '@/server/start';
import { startTestServer, TEST_PASSWORD, tokenFromMail, type TestServer } from './helpers';
import { smallRecipe, smallScenario } from './work-fixtures';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer();
}, 60_000);
afterAll(() => t.close());

describe('Host header (DNS rebinding)', () => {
  it('refuses a request addressed to a name that is not PUBLIC_URL or loopback, with 421 in words', async () => {
    const res = await t.http.get('/api/health').set('Host', 'attacker.example:8080');
    expect(res.status).toBe(421);
    expect(res.text).toContain('http://plumbline.test');
    const signIn = await t.http.post('/api/v1/auth/sign-in').set('Host', 'attacker.example').set('Origin', 'http://attacker.example').send({ email: 'admin@harborridge.test', password: TEST_PASSWORD });
    expect(signIn.status).toBe(421);
  });

  it('answers at the name of PUBLIC_URL and, outside production, at loopback names', async () => {
    await t.http.get('/api/health').set('Host', 'plumbline.test').expect(200);
    await t.http.get('/api/health').set('Host', '127.0.0.1:9').expect(200);
    await t.http.get('/api/health').set('Host', 'localhost').expect(200);
  });

  it('no longer accepts an Origin that merely equals the Host header', async () => {
    const res = await t.http.post('/api/v1/auth/sign-in').set('Host', 'localhost').set('Origin', 'http://rebound.example').send({ email: 'admin@harborridge.test', password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('answers a malformed Referer without Origin with 403, not 500', async () => {
    const res = await t.http.post('/api/v1/auth/sign-in').set('Referer', 'not a url at all').send({ email: 'admin@harborridge.test', password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });
});

describe('caching and the Content-Security-Policy', () => {
  it('marks API answers no-store', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.get('/api/v1/auth/session').expect(200);
    expect(res.headers['cache-control']).toBe('no-store');
  });

  it('sends upgrade-insecure-requests and HSTS only when PUBLIC_URL is https', async () => {
    const plain = await t.http.get('/api/health').expect(200);
    expect(plain.headers['content-security-policy']).not.toContain('upgrade-insecure-requests');
    expect(plain.headers['strict-transport-security']).toBeUndefined();
    const secure = await startTestServer({ PUBLIC_URL: 'https://plumbline.test' });
    try {
      const res = await secure.http.get('/api/health').expect(200);
      expect(res.headers['content-security-policy']).toContain('upgrade-insecure-requests');
      expect(res.headers['strict-transport-security']).toBeDefined();
    } finally {
      await secure.close();
    }
  }, 60_000);
});

describe('lockout aimed at another person', () => {
  it('a stranger’s wrong passwords from one client do not lock the owner out of another client', async () => {
    const proxied = await startTestServer({ TRUST_PROXY: 'loopback' });
    try {
      const from = (ip: string) => ({ 'X-Forwarded-For': ip });
      const email = 'analyst2@harborridge.test';
      for (let i = 0; i < 8; i++) {
        await proxied.http.post('/api/v1/auth/sign-in').set(from('203.0.113.7')).send({ email, password: `wrong-${i}-password` }).expect(401);
      }
      // The attacker's client is stopped, even with the right password...
      await proxied.http.post('/api/v1/auth/sign-in').set(from('203.0.113.7')).send({ email, password: TEST_PASSWORD }).expect(429);
      // ...while the owner, from a client with no failures, gets in.
      await proxied.http.post('/api/v1/auth/sign-in').set(from('198.51.100.20')).send({ email, password: TEST_PASSWORD }).expect(200);
    } finally {
      await proxied.close();
    }
  }, 60_000);

  it('ignores X-Forwarded-For unless TRUST_PROXY is set (a client cannot pick a fresh address)', async () => {
    const email = 'auditor@harborridge.test';
    for (let i = 0; i < 8; i++) {
      await t.http.post('/api/v1/auth/sign-in').set('X-Forwarded-For', `192.0.2.${i}`).send({ email, password: `wrong-${i}-password` }).expect(401);
    }
    await t.http.post('/api/v1/auth/sign-in').set('X-Forwarded-For', '192.0.2.200').send({ email, password: TEST_PASSWORD }).expect(429);
  });

  it('keeps the counts in SQLite, so a restart does not reset them', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-limits-'));
    const config = loadConfig({ NODE_ENV: 'test', PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'silent', DEMO_PASSWORD: TEST_PASSWORD, PUBLIC_URL: 'http://plumbline.test', WEB_DIR: path.join(dataDir, 'web') }, dataDir);
    const email = 'reviewer@harborridge.test';
    try {
      const first = await startServer(config);
      for (let i = 0; i < 8; i++) await request(first.url).post('/api/v1/auth/sign-in').send({ email, password: `wrong-${i}-password` }).expect(401);
      await first.close();
      const second = await startServer(config);
      try {
        await request(second.url).post('/api/v1/auth/sign-in').send({ email, password: TEST_PASSWORD }).expect(429);
      } finally {
        await second.close();
      }
    } finally {
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 60_000);
});

describe('reset links and invitations', () => {
  it('a new reset link closes the older ones', async () => {
    const email = 'reviewer@harborridge.test';
    await t.http.post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const first = tokenFromMail(await t.waitForMail(email, (m) => /reset/i.test(m.subject)), 'reset-password');
    const before = t.mail().length;
    await t.http.post('/api/v1/auth/password-reset').send({ email }).expect(202);
    const second = tokenFromMail(await t.waitForMail(email, (m) => /reset/i.test(m.subject) && !m.text.includes(first), 15_000), 'reset-password');
    expect(t.mail().length).toBeGreaterThan(before);
    const old = await t.http.post('/api/v1/auth/password-reset/confirm').send({ token: first, password: 'a brand new passphrase' });
    expect(old.status).toBe(410);
    await t.http.post('/api/v1/auth/password-reset/confirm').send({ token: second, password: 'a brand new passphrase' }).expect(204);
  }, 30_000);

  it('three simultaneous accepts of one invitation: one 200, two 410, and no SQL values in the logs', async () => {
    const lines: string[] = [];
    const sink = new Writable({ write(chunk, _enc, done) { lines.push(String(chunk)); done(); } });
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-race-'));
    const config = loadConfig({ NODE_ENV: 'test', PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'trace', DEMO_PASSWORD: TEST_PASSWORD, PUBLIC_URL: 'http://plumbline.test', WEB_DIR: path.join(dataDir, 'web') }, dataDir);
    const running = await startServer(config, createLogger('trace', sink));
    try {
      const admin = request.agent(running.url);
      await admin.post('/api/v1/auth/sign-in').send({ email: 'admin@harborridge.test', password: TEST_PASSWORD }).expect(200);
      const labId = (await running.db('labs').first('id')).id;
      await admin.post(`/api/v1/labs/${labId}/invitations`).send({ email: 'new.person@example.test', role: 'analyst' }).expect(201);
      const deadline = Date.now() + 10_000;
      let mail = running.fakeSmtp!.messages.find((m) => m.to.includes('new.person@example.test'));
      while (!mail && Date.now() < deadline) {
        await new Promise((r) => setTimeout(r, 20));
        mail = running.fakeSmtp!.messages.find((m) => m.to.includes('new.person@example.test'));
      }
      expect(mail).toBeDefined();
      const token = tokenFromMail(mail!, 'accept-invitation');
      const accept = () => request(running.url).post(`/api/v1/invitations/${token}/accept`).send({ displayName: 'New Person', password: 'a long enough passphrase' });
      const statuses = (await Promise.all([accept(), accept(), accept()])).map((r) => r.status).sort();
      expect(statuses).toEqual([200, 410, 410]);
      expect(await running.db('users').where({ email: 'new.person@example.test' }).count({ n: '*' }).first()).toEqual({ n: 1 });
      const log = lines.join('');
      expect(log).not.toMatch(/\$argon2/);
      expect(log).not.toContain('a long enough passphrase');
    } finally {
      await running.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 60_000);
});

describe('text the server cannot store', () => {
  it('refuses a lone UTF-16 surrogate in JSON with 400, storing nothing', async () => {
    const analyst = await t.signIn('analyst');
    const before = await t.db('recipes').count({ n: '*' }).first();
    const body = JSON.stringify({ definition: smallRecipe('placeholder') }).replace('placeholder', 'Frame \\ud800 survey');
    const res = await analyst.post(`/api/v1/labs/${t.labId}/recipes`).set('Content-Type', 'application/json').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_text');
    expect(res.body.error.message).toMatch(/not valid Unicode/);
    expect(await t.db('recipes').count({ n: '*' }).first()).toEqual(before);
  });

  it('keeps a non-ASCII upload file name as sent (UTF-8)', async () => {
    const analyst = await t.signIn('analyst');
    const scenarioId = (await analyst.post(`/api/v1/labs/${t.labId}/scenarios`).send({ definition: smallScenario('Name test') }).expect(201)).body.id;
    const res = await analyst
      .post(`/api/v1/labs/${t.labId}/uploads`)
      .field('kind', 'frf')
      .field('scenarioId', scenarioId)
      .attach('file', Buffer.from('frequency_hz,h_re,h_im\n1,1e-6,0\n2,1e-6,0\n'), '👾中文 Рама.csv')
      .expect(201);
    const row = await t.db('uploads').where({ id: res.body.upload.id }).first('original_name');
    expect(row.original_name).toBe('👾中文 Рама.csv');
  });
});

describe('uploads that can give no result', () => {
  let analyst: request.Agent;
  let scenarioId: string;
  let recipeId: string;
  beforeAll(async () => {
    analyst = await t.signIn('analyst');
    scenarioId = (await analyst.post(`/api/v1/labs/${t.labId}/scenarios`).send({ definition: smallScenario('No result') }).expect(201)).body.id;
    recipeId = (await analyst.post(`/api/v1/labs/${t.labId}/recipes`).send({ definition: smallRecipe('No result') }).expect(201)).body.id;
  });
  const count = async () => Number((await t.db('uploads').count({ n: '*' }).first())?.n);
  const timeCsv = (value: (i: number) => string) => ['time_s,input,output', ...Array.from({ length: 4096 }, (_, i) => `${i / 512},${value(i)},${value(i)}`)].join('\n') + '\n';

  it.each([
    ['all zeros', () => '0', /every value is zero/],
    ['values of 1e300', (i: number) => (i % 2 ? '1e300' : '-1e300'), /overflow/],
    ['denormal values', (i: number) => (i % 2 ? '4e-320' : '-4e-320'), /underflow/],
  ])('refuses time data with %s, naming the column', async (_name, value, message) => {
    const before = await count();
    const res = await analyst.post(`/api/v1/labs/${t.labId}/uploads`).field('kind', 'time-data').field('recipeId', recipeId).attach('file', Buffer.from(timeCsv(value)), 'r.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.message).toContain('column "input"');
    expect(await count()).toBe(before);
  });

  it.each([
    ['an FRF of 1e308 dB', 'frequency_hz,magnitude_db,phase_deg\n1,1e308,0\n2,0,0\n', /too large/],
    ['an all-zero FRF', 'frequency_hz,h_re,h_im\n1,0,0\n2,0,0\n', /no line has a usable FRF magnitude/],
  ])('refuses %s', async (_name, csv, message) => {
    const before = await count();
    const res = await analyst.post(`/api/v1/labs/${t.labId}/uploads`).field('kind', 'frf').field('scenarioId', scenarioId).attach('file', Buffer.from(csv), 'f.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(message);
    expect(await count()).toBe(before);
  });

  it('caps what a message echoes of a 200 000-column header', async () => {
    const header = Array.from({ length: 200_000 }, (_, i) => `column_with_a_long_name_${i}`).join(',');
    const res = await analyst.post(`/api/v1/labs/${t.labId}/uploads`).field('kind', 'frf').field('scenarioId', scenarioId).attach('file', Buffer.from(`${header}\n${header.replace(/[a-z_]+/g, '')}\n`), 'wide.csv');
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body).length).toBeLessThan(2_000);
    expect(res.body.error.message).toMatch(/and \d+ more/);
  }, 30_000);
});

describe('production defaults', () => {
  const prodConfig = (dataDir: string, env: Record<string, string> = {}) =>
    loadConfig({ NODE_ENV: 'production', PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'silent', PUBLIC_URL: 'https://lab.example.test', WEB_DIR: path.join(dataDir, 'web'), ...env }, dataDir);

  it('seeds no demo lab by default in production', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-prod-'));
    try {
      const config = prodConfig(dataDir);
      expect(config.demo.seed).toBe(false);
      const running = await startServer(config);
      try {
        expect(await running.db('users').count({ n: '*' }).first()).toEqual({ n: 0 });
      } finally {
        await running.close();
      }
    } finally {
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 60_000);

  it('refuses to start while an account has the published demo password, naming it', async () => {
    const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-prod-'));
    try {
      // A database that was once run with the demo seed (development defaults).
      const dev = await startServer(loadConfig({ NODE_ENV: 'development', PORT: '0', DATA_DIR: dataDir, LOG_LEVEL: 'silent', WEB_DIR: path.join(dataDir, 'web') }, dataDir));
      await dev.close();
      await expect(startServer(prodConfig(dataDir))).rejects.toThrow(/published demo password: admin@harborridge\.test/);
      await expect(startServer(prodConfig(dataDir, { DEMO_SEED: 'true' }))).rejects.toThrow(/DEMO_SEED/);
    } finally {
      fs.rmSync(dataDir, { recursive: true, force: true });
    }
  }, 120_000);

  it('two instances with default mail settings start side by side (the fake SMTP port is free-picked)', async () => {
    const dirs = [0, 1].map(() => fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-twin-')));
    const servers = [];
    try {
      for (const d of dirs) servers.push(await startServer(loadConfig({ NODE_ENV: 'test', PORT: '0', DATA_DIR: d, LOG_LEVEL: 'silent', DEMO_SEED: 'false', WEB_DIR: path.join(d, 'web') }, d)));
      expect(servers[0].fakeSmtp!.port).not.toBe(servers[1].fakeSmtp!.port);
    } finally {
      for (const s of servers) await s.close();
      for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
    }
  }, 60_000);
});
