/**
 * Sends mail over SMTP (nodemailer) and keeps every message in the outbox table. A single-use link
 * (an invitation or a password reset) goes to SMTP only: the stored copy has it withheld, so no
 * one can read a usable token in the database, its backups or the lab's sent-mail view.
 */
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
  /** Parts of `text` that only the recipient may see (single-use links); withheld in the stored copy. */
  secrets?: string[];
}

export const WITHHELD_LINK = '[link withheld: only the recipient received it]';

/** Any single-use link still in a text, as a pattern (a safety net behind `secrets`). */
const TOKEN_LINK = /\S*[?&]token=[A-Za-z0-9_-]+\S*/g;

/** The text as stored and shown: each secret, and any link carrying a token, withheld. */
export function storedCopy(text: string, secrets: string[] = []): string {
  let out = text;
  for (const secret of secrets) if (secret) out = out.split(secret).join(WITHHELD_LINK);
  return out.replace(TOKEN_LINK, WITHHELD_LINK);
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
      const id = await queueMail(deps.db, { ...mail, text: storedCopy(mail.text, mail.secrets) });
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
