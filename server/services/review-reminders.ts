/**
 * Review mail: "review requested" to the lab's reviewers, "review decided" to the version's author,
 * the submitter and the lab admins, and the reminder before an approved standard's review falls
 * due. `sendReviewReminders(deps, now)` mails the admins and reviewers of each active standard due
 * within REMINDER_LEAD_DAYS once per due date (and records it in the audit trail);
 * `startReviewReminders` runs it at start-up and then daily on an unref'd timer.
 */
import type { Db } from '../db/knex';
import { membersWithRoles } from '../db/approval';
import { markReminded, standardsDueForReminder } from '../db/standards';
import type { Logger } from '../logger';
import type { Mailer, OutgoingMail } from '../mail/mailer';
import { recordAudit } from './audit';

export const REMINDER_LEAD_DAYS = 30;
const DAY_MS = 86_400_000;
const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
type Person = { email: string; display_name: string };

export const reviewMail = {
  requested(publicUrl: string, labId: string, to: Person, m: { recipe: string; version: number; by: string; scope: string; failing: number }): OutgoingMail {
    return {
      labId, to: to.email, kind: 'review-requested', subject: `Review requested: ${m.recipe} v${m.version}`,
      text: [
        `Hello ${to.display_name},`, '',
        `${m.by} submitted version ${m.version} of the recipe "${m.recipe}" for review as a standard for ${m.scope}.`,
        m.failing ? `${m.failing} acceptance criterion(s) failed in the evidence; the submission carries a written justification.` : 'Every acceptance criterion of the evidence passed.',
        '', `Read the evidence and decide: ${publicUrl}/reviews`,
      ].join('\n'),
    };
  },
  decided(
    publicUrl: string, labId: string, to: Person,
    m: { recipe: string; version: number; decision: 'approved' | 'returned'; by: string; meaning: string | null; reason: string | null; comment: string },
  ): OutgoingMail {
    const approved = m.decision === 'approved';
    return {
      labId, to: to.email, kind: 'review-decided', subject: `Review ${approved ? 'approved' : 'returned'}: ${m.recipe} v${m.version}`,
      text: [
        `Hello ${to.display_name},`, '',
        approved
          ? `${m.by} approved version ${m.version} of "${m.recipe}" with an electronic signature. Meaning of the signature: ${m.meaning}`
          : `${m.by} returned version ${m.version} of "${m.recipe}". Reason: ${m.reason}`,
        ...(m.comment ? [`Comment: ${m.comment}`] : []),
        '', approved ? `It is now in the lab's standards: ${publicUrl}/standards` : `Edit the recipe (a new draft version) or add evidence and submit again: ${publicUrl}/reviews`,
      ].join('\n'),
    };
  },
  reminder(publicUrl: string, labId: string, to: Person, m: { recipe: string; version: number; structureType: string; dueAt: number; now: number }): OutgoingMail {
    const overdue = m.dueAt <= m.now;
    return {
      labId, to: to.email, kind: 'standard-review-due', subject: `Standard review ${overdue ? 'overdue' : 'due'} on ${day(m.dueAt)}: ${m.recipe} v${m.version}`,
      text: [
        `Hello ${to.display_name},`, '',
        `The approved standard "${m.recipe}" v${m.version} (${m.structureType}) ${overdue ? 'was' : 'is'} due for review on ${day(m.dueAt)}.`,
        'Re-verify it on the current engine and decide whether it stays, or submit a new version.',
        '', `${publicUrl}/standards`,
      ].join('\n'),
    };
  },
};

export interface ReminderDeps {
  db: Db;
  mailer: Mailer;
  logger: Logger;
  publicUrl: string;
}

/** Sends the reminders due at `now` (module doc); returns the standards it reminded about. */
export async function sendReviewReminders(deps: ReminderDeps, now = Date.now()): Promise<{ reminded: string[] }> {
  const due = await standardsDueForReminder(deps.db, now + REMINDER_LEAD_DAYS * DAY_MS);
  const reminded: string[] = [];
  for (const s of due) {
    const to = await membersWithRoles(deps.db, s.lab_id, ['admin', 'reviewer']);
    for (const person of to) {
      await deps.mailer.send(
        reviewMail.reminder(deps.publicUrl, s.lab_id, person, { recipe: s.recipe_name, version: s.recipe_version, structureType: s.structure_type, dueAt: Number(s.review_due_at), now }),
      );
    }
    await deps.db.transaction(async (trx) => {
      await markReminded(trx, s.id, Number(s.review_due_at));
      await recordAudit(trx, {
        labId: s.lab_id, actorUserId: null, action: 'standards.review-reminder', targetType: 'standard', targetId: s.id,
        after: { reviewDueAt: Number(s.review_due_at), recipients: to.map((p) => p.email), now },
      });
    });
    reminded.push(s.id);
  }
  return { reminded };
}

/**
 * Runs the reminders now and then every `everyMs` (a day); `stop` clears the timer and waits for a
 * pass in flight. `clock` gives "now" (tests pass a fake one).
 */
export function startReviewReminders(deps: ReminderDeps, everyMs = DAY_MS, clock: () => number = Date.now): { stop(): Promise<void> } {
  let running: Promise<unknown> = Promise.resolve();
  const pass = () => {
    running = running.then(() => sendReviewReminders(deps, clock())).catch((err) => deps.logger.warn({ err }, 'review reminders failed'));
  };
  pass();
  const timer = setInterval(pass, everyMs);
  // Node's timer (the DOM typing of setInterval in this project says number): never keeps the process up.
  (timer as unknown as { unref?: () => void }).unref?.();
  return {
    async stop() {
      clearInterval(timer);
      await running;
    },
  };
}
