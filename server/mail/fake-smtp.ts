/**
 * A local SMTP server that accepts every message and keeps it in memory, for `npm start` and the
 * tests. It speaks real SMTP (smtp-server), so the mail path is the same as with a real relay.
 */
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

export async function startFakeSmtp(port: number, host = '127.0.0.1'): Promise<FakeSmtp> {
  const messages: ReceivedMail[] = [];
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          messages.push({
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
