/**
 * The lab's sent mail (the outbox), readable by an admin while the local fake SMTP server is in use.
 * Single-use links are withheld when stored (mail/mailer.ts) and once more here, for any row
 * stored before that.
 */
import { Router } from 'express';
import { mailListQuerySchema, mailListSchema, type MailMessage } from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { listLabMail } from '../db/members';
import { AppError } from '../errors';
import { storedCopy } from '../mail/mailer';
import { parseBody } from './parse';

export function mailRoutes(deps: AppDeps): Router {
  const r = Router();
  labRoute(r, deps.db, {
    method: 'get', path: '/labs/:labId/mail', action: 'mail.read',
    summary: "The lab's sent mail, newest first (only while mail goes to the local fake server)",
    query: mailListQuerySchema, response: mailListSchema,
  }, async (req, res) => {
    if (deps.config.mail.smtp) {
      throw new AppError(409, 'mail_view_off', 'Mail goes to a real SMTP server; read it in the recipients\' mailboxes.');
    }
    const page = parseBody(mailListQuerySchema, req.query);
    const { rows, total } = await listLabMail(deps.db, req.lab.id, page);
    const items: MailMessage[] = rows.map((m) => ({
      id: Number(m.id), to: m.to_address, subject: m.subject, text: storedCopy(m.body_text), kind: m.kind, status: m.status,
      error: m.error ?? null, createdAt: Number(m.created_at), sentAt: m.sent_at === null ? null : Number(m.sent_at),
    }));
    res.json({ items, total, limit: page.limit, offset: page.offset });
  });
  return r;
}
