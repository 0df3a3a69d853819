/**
 * Session lifetimes over HTTP: idle expiry (Lucia's expires_at) and the absolute lifetime from the
 * session's creation (SESSION_ABSOLUTE_HOURS), both checked against the rows in SQLite.
 */
import { startTestServer, type TestServer } from './helpers';

let t: TestServer;
beforeAll(async () => {
  t = await startTestServer({ SESSION_IDLE_HOURS: '2', SESSION_ABSOLUTE_HOURS: '24' });
});
afterAll(() => t.close());

const sessionsOf = async (email: string) => {
  const user = await t.db('users').where({ email }).first('id');
  return t.db('sessions').where({ user_id: user.id }).select('*');
};

describe('session lifetimes', () => {
  it('stores a session that expires after the idle time', async () => {
    const before = Date.now();
    const agent = await t.signIn('analyst');
    await agent.get('/api/v1/me').expect(200);
    const [s] = await sessionsOf('analyst@harborridge.test');
    // Lucia sets expires_at = now + idle time (2 h here).
    expect(s.expires_at - before).toBeGreaterThanOrEqual(2 * 3600_000 - 5_000);
    expect(s.expires_at - before).toBeLessThanOrEqual(2 * 3600_000 + 5_000);
  });

  it('refuses a session idle beyond its expiry', async () => {
    const agent = await t.signIn('reviewer');
    const [s] = await sessionsOf('reviewer@harborridge.test');
    await t.db('sessions').where({ id: s.id }).update({ expires_at: Date.now() - 1 });
    await agent.get('/api/v1/me').expect(401);
  });

  it('refuses and deletes a session older than the absolute lifetime, even when recently used', async () => {
    const agent = await t.signIn('auditor');
    const [s] = await sessionsOf('auditor@harborridge.test');
    await t.db('sessions').where({ id: s.id }).update({ created_at: Date.now() - 24 * 3600_000 - 60_000, expires_at: Date.now() + 3600_000 });
    const res = await agent.get('/api/v1/me');
    expect(res.status).toBe(401);
    expect(await t.db('sessions').where({ id: s.id }).first()).toBeUndefined();
  });
});
