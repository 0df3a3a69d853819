/**
 * A local SMTP server that accepts every message and keeps it in memory, for `npm start` and the
 * tests. It speaks real SMTP (smtp-server), so the mail path is the same as with a real relay.
 */
import fs from 'node:fs';
import path from 'node:path';
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';

export interface ReceivedMail {
  from: string;
  to: string[];
  subject: string;
  text: string;
  receivedAt: number;
}

export interface FakeSmtp {
  port: number;
  messages: ReceivedMail[];
  close(): Promise<void>;
}

export interface FakeSmtpOptions {
  host?: string;
  /**
   * Where each received mail is also written as a text file, so a person running the product
   * locally can open an invitation or reset link (null: memory only, as in the tests).
   */
  saveDir?: string | null;
  logger?: { info(obj: object, msg: string): void };
}

export async function startFakeSmtp(port: number, options: FakeSmtpOptions = {}): Promise<FakeSmtp> {
  const { host = '127.0.0.1', saveDir = null, logger } = options;
  const messages: ReceivedMail[] = [];
  const keep = (m: ReceivedMail) => {
    messages.push(m);
    if (!saveDir) return;
    fs.mkdirSync(saveDir, { recursive: true, mode: 0o700 });
    const file = path.join(saveDir, `${new Date(m.receivedAt).toISOString().replace(/[:.]/g, '-')}-${messages.length}.txt`);
    fs.writeFileSync(file, `From: ${m.from}\nTo: ${m.to.join(', ')}\nSubject: ${m.subject}\n\n${m.text}`, { mode: 0o600 });
    logger?.info({ to: m.to, subject: m.subject, file }, 'mail kept by the local fake mail server');
  };
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          keep({
            from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
            to: session.envelope.rcptTo.map((r) => r.address),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            receivedAt: Date.now(),
          });
          callback();
        })
        .catch((err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve());
  });
  const address = server.server.address();
  const actual = typeof address === 'object' && address ? address.port : port;
  return {
    port: actual,
    messages,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
