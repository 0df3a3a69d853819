/** Repository of the mail outbox: every message the server sends, with its delivery status. */
import type { Db } from './knex';

export async function queueMail(
  db: Db,
  m: { labId?: string | null; to: string; subject: string; text: string; kind: string },
): Promise<number> {
  const [id] = await db('mail_outbox').insert({
    lab_id: m.labId ?? null,
    to_address: m.to,
    subject: m.subject,
    body_text: m.text,
    kind: m.kind,
    status: 'queued',
    created_at: Date.now(),
  });
  return Number(id);
}

export async function markMail(db: Db, id: number, outcome: { sent: true } | { sent: false; error: string }) {
  await db('mail_outbox')
    .where({ id })
    .update(outcome.sent ? { status: 'sent', sent_at: Date.now() } : { status: 'failed', error: outcome.error });
}
