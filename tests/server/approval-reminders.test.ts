/**
 * The review-due reminder: sendReviewReminders called with a fake "now" mails the lab's admins and
 * reviewers once per due date when an active standard falls due within 30 days (and records it in
 * the audit trail); nothing before that window, nothing twice, nothing for a retired standard.
 * startReviewReminders runs it at once and then daily on a timer that does not hold the process.
 */
import { createLogger } from '@/server/logger';
import { REMINDER_LEAD_DAYS, sendReviewReminders, startReviewReminders } from '@/server/services/review-reminders';
import { startTestServer, TEST_PASSWORD, type TestServer } from './helpers';
import { auditSince, createWork, finishedStudy, frameScope, lastAuditId, signInAll, type Agents, type WorkIds } from './approval-fixtures';

const DAY = 86_400_000;
let t: TestServer;
let as: Agents;
let w: WorkIds;
let standardId: string;
let dueAt: number;
const deps = () => ({ db: t.db, mailer: t.running.mailer, logger: createLogger('silent'), publicUrl: 'http://plumbline.test' });

beforeAll(async () => {
  t = await startTestServer();
  as = await signInAll(t);
  w = await createWork(t, as.analyst);
  const studyId = await finishedStudy(as.analyst, w, 1);
  const sub = await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: w.recipe, version: 1 }, studyIds: [studyId], scope: frameScope }).expect(201);
  const ok = await as.reviewer.post(`${w.lab}/reviews/${sub.body.id}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames', reviewMonths: 3 }).expect(200);
  standardId = ok.body.standardId;
  dueAt = Number((await t.db('standards').where({ id: standardId }).first('review_due_at')).review_due_at);
}, 60_000);
afterAll(() => t.close());

const reminderMail = () => t.mail().filter((m) => m.subject.startsWith('Standard review'));

describe('review-due reminders', () => {
  it('sends nothing while the due date is more than 30 days away', async () => {
    expect(REMINDER_LEAD_DAYS).toBe(30);
    expect(await sendReviewReminders(deps(), Date.now())).toEqual({ reminded: [] });
    expect(await sendReviewReminders(deps(), dueAt - 31 * DAY)).toEqual({ reminded: [] });
    expect(reminderMail()).toEqual([]);
  });

  it('at start-up (fake clock inside the window) mails the admins and reviewers once, records it, then runs daily on an unref\'d timer', async () => {
    const before = await lastAuditId(t);
    const now = dueAt - 10 * DAY;
    const spy = jest.spyOn(global, 'setInterval');
    try {
      const timer = startReviewReminders(deps(), DAY, () => now);
      expect(spy).toHaveBeenCalledTimes(1);
      expect(spy.mock.calls[0]![1]).toBe(DAY);
      expect((spy.mock.results[0]!.value as NodeJS.Timeout).hasRef()).toBe(false);
      await timer.stop(); // waits for the start-up pass
    } finally {
      spy.mockRestore();
    }
    const day = new Date(dueAt).toISOString().slice(0, 10);
    for (const to of ['admin@harborridge.test', 'reviewer@harborridge.test']) {
      const m = await t.waitForMail(to, (x) => x.subject.startsWith('Standard review due'));
      expect(m.subject).toBe(`Standard review due on ${day}: Hann 2048, H1, frames v1`);
      expect(m.text).toContain(`(Single-mode test frame) is due for review on ${day}`);
    }
    expect(reminderMail().flatMap((m) => m.to)).not.toContain('analyst@harborridge.test');
    expect(await t.db('standards').where({ id: standardId }).first('reminded_for_due_at')).toEqual({ reminded_for_due_at: dueAt });
    const events = (await auditSince(t, before)).filter((e) => e.action === 'standards.review-reminder');
    expect(events.map((e) => e.target_id)).toEqual([standardId]);
    expect(JSON.parse(events[0]!.after_json!)).toMatchObject({ reviewDueAt: dueAt, recipients: ['admin@harborridge.test', 'reviewer@harborridge.test'], now });
  });

  it('does not remind twice for the same due date, also once it is overdue', async () => {
    const count = reminderMail().length;
    expect(await sendReviewReminders(deps(), dueAt - 5 * DAY)).toEqual({ reminded: [] });
    expect(await sendReviewReminders(deps(), dueAt + 5 * DAY)).toEqual({ reminded: [] });
    expect(reminderMail()).toHaveLength(count);
  });

  it('skips a retired standard', async () => {
    const other = await createWork(t, as.analyst);
    const studyId = await finishedStudy(as.analyst, other, 1);
    const sub = await as.analyst.post(`${w.lab}/reviews`).send({ recipe: { id: other.recipe, version: 1 }, studyIds: [studyId], scope: frameScope }).expect(201);
    const ok = await as.reviewer.post(`${w.lab}/reviews/${sub.body.id}/decision`).send({ decision: 'approved', password: TEST_PASSWORD, meaning: 'Approved as lab standard for single-mode frames', reviewMonths: 3 }).expect(200);
    await as.admin.post(`${w.lab}/standards/${ok.body.standardId}/retire`).send({ reason: 'Withdrawn before its first review.' }).expect(200);
    expect(await sendReviewReminders(deps(), dueAt + 60 * DAY)).toEqual({ reminded: [] });
  }, 60_000);
});
