/**
 * Test server for tests/server: a real Plumbline server on port 0 over a fresh SQLite file in a
 * temp DATA_DIR (migrated, demo lab seeded) with the fake SMTP server on port 0.
 *
 *   let t: TestServer;
 *   beforeAll(async () => { t = await startTestServer(); });
 *   afterAll(() => t.close());
 *   const admin = await t.signIn('admin');           // a supertest agent holding the session cookie
 *   await admin.get(`/api/v1/labs/${t.labId}/members`).expect(200);
 *   t.db('memberships')...                            // the server's own Knex, to check what was stored
 *   t.mail()                                          // messages the fake SMTP server received
 *   t.clock.set(Date.now() + 31 * 86_400_000)         // the server's clock for time-based rules
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import type { Role } from '@/shared/api/auth';
import { hashPassword } from '@/server/auth/password';
import { loadConfig, type Config } from '@/server/config';
import type { Db } from '@/server/db/knex';
import { addMembership, insertLab, insertUser } from '@/server/db/users';
import type { ReceivedMail } from '@/server/mail/fake-smtp';
import { DEMO_LAB, DEMO_USERS } from '@/server/seed/demo-lab';
import { startServer, type RunningServer } from '@/server/start';

export const TEST_PASSWORD = 'test-demo-password-2026';

export interface TestServer {
  url: string;
  config: Config;
  running: RunningServer;
  db: Db;
  /** The demo lab's id. */
  labId: string;
  /** Anonymous requests (no cookie jar). */
  http: ReturnType<typeof request>;
  /** A fresh agent (cookie jar) for a request sequence. */
  agent(): request.Agent;
  /** Signs in a demo user of the given role (first one of that role) or by e-mail; returns the agent. */
  signIn(who: Role | string, password?: string): Promise<request.Agent>;
  /** The server's clock for time-based rules: real time until `set`, then that time until `reset`. */
  clock: { now(): number; set(ms: number): void; reset(): void };
  /** Messages received by the fake SMTP server so far. */
  mail(): ReceivedMail[];
  /** Waits until a message to `to` arrives (the mailer sends after the answer in some flows). */
  waitForMail(to: string, predicate?: (m: ReceivedMail) => boolean, timeoutMs?: number): Promise<ReceivedMail>;
  close(): Promise<void>;
}

export async function startTestServer(env: Record<string, string> = {}): Promise<TestServer> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-test-'));
  const config = loadConfig(
    {
      NODE_ENV: 'test',
      PORT: '0',
      FAKE_SMTP_PORT: '0',
      DATA_DIR: dataDir,
      LOG_LEVEL: 'silent',
      DEMO_PASSWORD: TEST_PASSWORD,
      PUBLIC_URL: 'http://plumbline.test',
      WEB_DIR: path.join(dataDir, 'web'),
      ...env,
    },
    dataDir,
  );
  let fixed: number | null = null;
  const clock = { now: () => fixed ?? Date.now(), set: (ms: number) => void (fixed = ms), reset: () => void (fixed = null) };
  const running = await startServer(config, undefined, clock);
  const lab = await running.db('labs').where({ slug: DEMO_LAB.slug }).first('id');
  const http = request(running.url);
  const agent = () => request.agent(running.url);
  const t: TestServer = {
    url: running.url,
    config,
    running,
    db: running.db,
    labId: lab?.id,
    http,
    agent,
    clock,
    async signIn(who, password = TEST_PASSWORD) {
      const email = who.includes('@') ? who : DEMO_USERS.find((u) => u.role === who)?.email;
      if (!email) throw new Error(`No demo user for ${who}`);
      const a = agent();
      await a.post('/api/v1/auth/sign-in').send({ email, password }).expect(200);
      return a;
    },
    mail: () => running.fakeSmtp?.messages ?? [],
    async waitForMail(to, predicate = () => true, timeoutMs = 5000) {
      const start = Date.now();
      for (;;) {
        const found = t.mail().find((m) => m.to.includes(to.toLowerCase()) && predicate(m));
        if (found) return found;
        if (Date.now() - start > timeoutMs) throw new Error(`No mail to ${to} within ${timeoutMs} ms`);
        await new Promise((r) => setTimeout(r, 20));
      }
    },
    async close() {
      await running.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
  return t;
}

/**
 * A second lab with one member per role (e-mails `<role>@otherlab.test`, password TEST_PASSWORD),
 * for cross-lab isolation tests. Returns the lab id and the e-mails by role.
 */
export async function createOtherLab(
  db: Db,
  name = 'Quarry Point Vibration Lab',
): Promise<{ labId: string; emails: Record<Role, string> }> {
  const passwordHash = await hashPassword(TEST_PASSWORD);
  const slug = name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
  const domain = `${slug.split('-')[0]}lab.test`;
  const emails = {} as Record<Role, string>;
  const labId = await db.transaction(async (trx) => {
    const id = await insertLab(trx, { name, slug });
    for (const role of ['admin', 'analyst', 'reviewer', 'auditor'] as Role[]) {
      emails[role] = `${role}@${domain}`;
      const userId = await insertUser(trx, { email: emails[role], displayName: `${role} of ${name}`, passwordHash });
      await addMembership(trx, { labId: id, userId, role });
    }
    return id;
  });
  return { labId, emails };
}

/** Extracts the token of a link `${publicUrl}/<page>?token=...` from a mail body. */
export function tokenFromMail(mail: ReceivedMail, page: string): string {
  const m = new RegExp(`/${page}\\?token=([A-Za-z0-9_-]+)`).exec(mail.text);
  if (!m) throw new Error(`No ${page} link in mail "${mail.subject}": ${mail.text}`);
  return m[1]!;
}
