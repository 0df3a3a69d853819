/** Sends mail over SMTP (nodemailer) and keeps every message in the outbox table. */
import nodemailer from 'nodemailer';
import type { Db } from '../db/knex';
import { markMail, queueMail } from '../db/outbox';
import type { Logger } from '../logger';

export interface OutgoingMail {
  labId?: string | null;
  to: string;
  subject: string;
  text: string;
  kind: string;
}

export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export function createMailer(
  deps: { db: Db; logger: Logger },
  smtp: { host: string; port: number; secure: boolean; user?: string; password?: string },
  from: string,
): Mailer {
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: smtp.secure,
    auth: smtp.user ? { user: smtp.user, pass: smtp.password ?? '' } : undefined,
    // The local fake server offers no TLS; a real relay gets STARTTLS when it offers it.
    ignoreTLS: smtp.host === '127.0.0.1' && !smtp.user,
  });
  return {
    async send(mail) {
      const id = await queueMail(deps.db, mail);
      try {
        await transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text });
        await markMail(deps.db, id, { sent: true });
      } catch (err) {
        deps.logger.warn({ err, kind: mail.kind }, 'mail not sent');
        await markMail(deps.db, id, { sent: false, error: String((err as Error).message) });
      }
    },
    close: () => transport.close(),
  };
}
