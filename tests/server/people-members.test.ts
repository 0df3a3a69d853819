/**
 * Members, roles, lab settings and the mail view over HTTP against a real SQLite file: paging,
 * sorting and filtering done by the server; role changes and removal stored and audited; the last
 * admin kept; cross-lab isolation of every people route.
 */
import { DEMO_USERS } from '@/server/seed/demo-lab';
import { createOtherLab, startTestServer, type TestServer } from './helpers';

let t: TestServer;
let other: Awaited<ReturnType<typeof createOtherLab>>;
beforeAll(async () => {
  t = await startTestServer();
  other = await createOtherLab(t.db);
});
afterAll(() => t.close());

const userId = async (email: string) => (await t.db('users').where({ email }).first('id')).id as string;

describe('listing members', () => {
  it('sorts, pages and filters on the server', async () => {
    const analyst = await t.signIn('analyst');
    const all = await analyst.get(`/api/v1/labs/${t.labId}/members?sort=email&order=asc`).expect(200);
    expect(all.body.total).toBe(DEMO_USERS.length);
    expect(all.body.items.map((m: { email: string }) => m.email)).toEqual(DEMO_USERS.map((u) => u.email).sort());
    // Only this lab's people: none of the other lab's members.
    expect(all.body.items.some((m: { email: string }) => m.email.endsWith('quarrylab.test'))).toBe(false);

    const page = await analyst.get(`/api/v1/labs/${t.labId}/members?sort=email&order=desc&limit=2&offset=1`).expect(200);
    expect(page.body).toMatchObject({ total: 5, limit: 2, offset: 1 });
    expect(page.body.items.map((m: { email: string }) => m.email)).toEqual(DEMO_USERS.map((u) => u.email).sort().reverse().slice(1, 3));

    const analysts = await analyst.get(`/api/v1/labs/${t.labId}/members?role=analyst`).expect(200);
    expect(analysts.body.items.map((m: { role: string }) => m.role)).toEqual(['analyst', 'analyst']);

    const byName = await analyst.get(`/api/v1/labs/${t.labId}/members?q=${encodeURIComponent('okaf')}`).expect(200);
    expect(byName.body.items.map((m: { email: string }) => m.email)).toEqual(['admin@harborridge.test']);
    // LIKE wildcards in q are taken literally.
    const wildcard = await analyst.get(`/api/v1/labs/${t.labId}/members?q=%25`).expect(200);
    expect(wildcard.body.total).toBe(0);

    const bad = await analyst.get(`/api/v1/labs/${t.labId}/members?sort=password_hash`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields[0].path).toBe('sort');
    const tooMany = await analyst.get(`/api/v1/labs/${t.labId}/members?limit=1000`);
    expect(tooMany.status).toBe(400);
  });
});

describe('changing roles and removing members', () => {
  it('changes a role, stores it and audits before/after', async () => {
    const admin = await t.signIn('admin');
    const id = await userId('analyst2@harborridge.test');
    const res = await admin.patch(`/api/v1/labs/${t.labId}/members/${id}`).send({ role: 'reviewer' }).expect(200);
    expect(res.body).toMatchObject({ userId: id, role: 'reviewer' });
    expect((await t.db('memberships').where({ lab_id: t.labId, user_id: id }).first()).role).toBe('reviewer');
    const event = await t.db('audit_events').where({ lab_id: t.labId, action: 'members.change-role', target_id: id }).first();
    expect(JSON.parse(event.before_json)).toEqual({ role: 'analyst' });
    expect(JSON.parse(event.after_json)).toEqual({ role: 'reviewer' });
    expect(event.actor_user_id).toBe(await userId('admin@harborridge.test'));
    const invalid = await admin.patch(`/api/v1/labs/${t.labId}/members/${id}`).send({ role: 'owner' });
    expect(invalid.status).toBe(400);
  });

  it('keeps the last admin: neither demoted nor removed', async () => {
    const admin = await t.signIn('admin');
    const adminId = await userId('admin@harborridge.test');
    const demote = await admin.patch(`/api/v1/labs/${t.labId}/members/${adminId}`).send({ role: 'analyst' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_admin');
    const remove = await admin.delete(`/api/v1/labs/${t.labId}/members/${adminId}`);
    expect(remove.status).toBe(409);
    expect((await t.db('memberships').where({ lab_id: t.labId, user_id: adminId }).first()).role).toBe('admin');

    // With a second admin, the first may step down.
    const reviewerId = await userId('reviewer@harborridge.test');
    await admin.patch(`/api/v1/labs/${t.labId}/members/${reviewerId}`).send({ role: 'admin' }).expect(200);
    await admin.patch(`/api/v1/labs/${t.labId}/members/${adminId}`).send({ role: 'analyst' }).expect(200);
    // Now the one who stepped down has no admin rights left: refused by the permission table.
    await admin.patch(`/api/v1/labs/${t.labId}/members/${reviewerId}`).send({ role: 'auditor' }).expect(403);
    const newAdmin = await t.signIn('reviewer@harborridge.test');
    await newAdmin.patch(`/api/v1/labs/${t.labId}/members/${adminId}`).send({ role: 'admin' }).expect(200);
    // No one gives themselves a role that decides reviews: the other admin does it.
    expect((await newAdmin.patch(`/api/v1/labs/${t.labId}/members/${reviewerId}`).send({ role: 'reviewer' }).expect(403)).body.error.code).toBe('self_grant_refused');
    await admin.patch(`/api/v1/labs/${t.labId}/members/${reviewerId}`).send({ role: 'reviewer' }).expect(200);
  });

  it('removes a membership; the removed user then sees the lab as absent', async () => {
    const admin = await t.signIn('admin');
    const auditor = await t.signIn('auditor');
    await auditor.get(`/api/v1/labs/${t.labId}`).expect(200);
    const id = await userId('auditor@harborridge.test');
    await admin.delete(`/api/v1/labs/${t.labId}/members/${id}`).expect(204);
    expect(await t.db('memberships').where({ lab_id: t.labId, user_id: id }).first()).toBeUndefined();
    await auditor.get(`/api/v1/labs/${t.labId}`).expect(404);
    const event = await t.db('audit_events').where({ lab_id: t.labId, action: 'members.remove', target_id: id }).first();
    expect(JSON.parse(event.before_json)).toEqual({ email: 'auditor@harborridge.test', role: 'auditor' });
    await admin.delete(`/api/v1/labs/${t.labId}/members/${id}`).expect(404);
  });
});

describe('cross-lab isolation', () => {
  it("answers 404 for another lab's member, even for the other lab's admin", async () => {
    const foreignAdmin = await t.signIn(other.emails.admin);
    const targetId = await userId('analyst@harborridge.test');
    for (const [method, path] of [
      ['get', `/api/v1/labs/${t.labId}`],
      ['get', `/api/v1/labs/${t.labId}/members`],
      ['patch', `/api/v1/labs/${t.labId}/members/${targetId}`],
      ['delete', `/api/v1/labs/${t.labId}/members/${targetId}`],
      ['get', `/api/v1/labs/${t.labId}/invitations`],
      ['get', `/api/v1/labs/${t.labId}/mail`],
      ['get', `/api/v1/labs/${t.labId}/audit`],
    ] as const) {
      const res = await foreignAdmin[method](path).send({ role: 'admin' });
      expect([path, res.status, res.body.error?.message]).toEqual([path, 404, 'This lab was not found.']);
    }
    // A lab id that does not exist answers exactly the same.
    const missing = await foreignAdmin.get('/api/v1/labs/no-such-lab/members');
    expect(missing.status).toBe(404);
    expect(missing.body).toEqual((await foreignAdmin.get(`/api/v1/labs/${t.labId}/members`)).body);
    expect((await t.db('memberships').where({ lab_id: t.labId, user_id: targetId }).first()).role).toBe('analyst');
    // Acting on a member of another lab through one's own lab finds nobody.
    await foreignAdmin.delete(`/api/v1/labs/${other.labId}/members/${targetId}`).expect(404);
  });
});

describe('lab settings and the mail view', () => {
  it('reads and changes the settings, audited', async () => {
    const admin = await t.signIn('admin');
    const lab = await admin.get(`/api/v1/labs/${t.labId}`).expect(200);
    expect(lab.body).toMatchObject({ name: 'Harbor Ridge Test Lab', slug: 'harbor-ridge', reportFooter: '', role: 'admin', updatedAt: null });
    const changed = await admin.patch(`/api/v1/labs/${t.labId}`).send({ reportFooter: 'Harbor Ridge Test Lab, quality office' }).expect(200);
    expect(changed.body.reportFooter).toBe('Harbor Ridge Test Lab, quality office');
    expect((await t.db('labs').where({ id: t.labId }).first()).report_footer).toBe('Harbor Ridge Test Lab, quality office');
    const event = await t.db('audit_events').where({ lab_id: t.labId, action: 'lab.settings' }).first();
    expect(JSON.parse(event.after_json)).toEqual({ reportFooter: 'Harbor Ridge Test Lab, quality office' });
    await admin.patch(`/api/v1/labs/${t.labId}`).send({}).expect(400);
    const analyst = await t.signIn('analyst');
    expect((await analyst.get(`/api/v1/labs/${t.labId}`).expect(200)).body.role).toBe('analyst');
    await analyst.patch(`/api/v1/labs/${t.labId}`).send({ name: 'Renamed' }).expect(403);
  });

  it("shows the admin the lab's outbox, not other labs' mail", async () => {
    const admin = await t.signIn('admin');
    await admin.post(`/api/v1/labs/${t.labId}/invitations`).send({ email: 'outbox.check@example.test', role: 'auditor' }).expect(201);
    const foreignAdmin = await t.signIn(other.emails.admin);
    await foreignAdmin.post(`/api/v1/labs/${other.labId}/invitations`).send({ email: 'elsewhere@example.test', role: 'auditor' }).expect(201);
    const mail = await admin.get(`/api/v1/labs/${t.labId}/mail`).expect(200);
    expect(mail.body.items[0]).toMatchObject({ to: 'outbox.check@example.test', kind: 'invitation', status: 'sent' });
    // The single-use link is withheld: only the recipient's mailbox has it.
    expect(mail.body.items[0].text).toContain('[link withheld: only the recipient received it]');
    expect(mail.body.items[0].text).not.toContain('token=');
    expect(mail.body.items.some((m: { to: string }) => m.to === 'elsewhere@example.test')).toBe(false);
  });
});

describe('the seed, Origin check and the mail view with a real relay', () => {
  it('starts the demo lab audit trail with its creation and five members, and verifies', async () => {
    const first = await t.db('audit_events').where({ lab_id: t.labId }).orderBy('id').limit(6).select('action', 'prev_hash');
    expect(first.map((e) => e.action)).toEqual(['lab.create', ...Array(5).fill('members.add')]);
    expect(first[0].prev_hash).toBeNull();
    const admin = await t.signIn('admin');
    expect((await admin.get(`/api/v1/labs/${t.labId}/audit/verify`).expect(200)).body.ok).toBe(true);
  });

  it('refuses a state-changing request from another site', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.post(`/api/v1/labs/${t.labId}/invitations`).set('Origin', 'http://elsewhere.test').send({ email: 'csrf@example.test', role: 'admin' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
    expect(await t.db('invitations').where({ email: 'csrf@example.test' }).first()).toBeUndefined();
  });

  it('answers 409 for the mail view when mail goes to a real SMTP server', async () => {
    // A relay address that is never contacted: nothing in this test sends mail.
    const relayed = await startTestServer({ SMTP_HOST: '127.0.0.1', SMTP_PORT: '9' });
    try {
      expect(relayed.running.fakeSmtp).toBeNull();
      const admin = await relayed.signIn('admin');
      const res = await admin.get(`/api/v1/labs/${relayed.labId}/mail`);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('mail_view_off');
    } finally {
      await relayed.close();
    }
  });
});
