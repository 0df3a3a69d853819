/**
 * Starts a whole Plumbline server from a config: database (migrated), demo lab (seeded once),
 * mail (fake SMTP unless a real relay is configured) and HTTP. Used by main.ts and the tests.
 */
import http from 'node:http';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { createAuth } from './auth/lucia';
import { systemClock, type Clock } from './clock';
import type { Config } from './config';
import { createDb, migrate, type Db } from './db/knex';
import { createLogger, type Logger } from './logger';
import { startFakeSmtp, type FakeSmtp } from './mail/fake-smtp';
import { createMailer, type Mailer } from './mail/mailer';
import { createPoolExecutor } from './jobs/pool';
import { createStudyScheduler, type StudyScheduler } from './jobs/scheduler';
import { checkProductionSafety } from './services/production-checks';
import { openAuditTrail } from './services/audit-trail';
import { startReviewReminders } from './services/review-reminders';
import { sweepIncoming } from './services/upload-files';
import { seedDemoLab } from './seed/demo-lab';
import { seedDemoWork } from './seed/demo-work';
import { APP_VERSION } from './version';

export interface RunningServer {
  url: string;
  db: Db;
  logger: Logger;
  mailer: Mailer;
  fakeSmtp: FakeSmtp | null;
  studies: StudyScheduler;
  close(): Promise<void>;
}

export async function startServer(config: Config, logger = createLogger(config.logLevel), clock: Clock = systemClock): Promise<RunningServer> {
  const db = createDb(config.databaseFile);
  await migrate(db);
  try {
    await checkProductionSafety(db, config);
    // Before the seed: every event, the demo lab's too, is sealed with the key.
    await openAuditTrail(db, config.audit, { info: (m) => logger.info(m), warn: (m) => logger.warn(m) });
  } catch (err) {
    await db.destroy();
    throw err;
  }
  if (config.demo.seed && (await seedDemoLab(db, config.demo.password))) logger.info('demo lab seeded');
  // The demo study is computed here (about a second); test servers leave it out (seed/demo-work.ts).
  if (config.demo.seed && (await seedDemoWork(db, { withStudy: config.env !== 'test' }))) logger.info('demo work seeded');

  // No upload is in flight before the server listens: anything in uploads/incoming was left
  // half-received by a process that stopped mid-upload (one server per DATA_DIR), so all of it goes.
  sweepIncoming(config.dataDir, 0);

  const fakeSmtp = config.mail.smtp ? null : await startFakeSmtp(config.mail.fakePort, { saveDir: config.env === 'test' ? null : path.join(config.dataDir, 'fake-mail'), logger });
  const smtp = config.mail.smtp ?? { host: '127.0.0.1', port: fakeSmtp!.port, secure: false };
  const mailer = createMailer({ db, logger }, smtp, config.mail.from);

  const auth = createAuth(db, { idleHours: config.session.idleHours, secure: config.publicUrl.startsWith('https:') });
  const studies = createStudyScheduler({ db, logger, mailer, executor: createPoolExecutor(config.studyWorkers, config.studyWorkerHeapMb) });
  const app = createApp({ config, db, auth, logger, mailer, version: APP_VERSION, studyQueue: studies, clock });
  const server = http.createServer(app);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(config.port, config.host, () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  const url = `http://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${port}`;
  studies.start(); // resumes any study left running when the server last stopped
  const reminders = startReviewReminders({ db, logger, mailer, publicUrl: config.publicUrl }); // now, then daily

  let closing: Promise<void> | null = null;
  const close = () =>
    (closing ??= (async () => {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      await studies.close();
      await reminders.stop();
      mailer.close();
      await fakeSmtp?.close();
      await db.destroy();
    })());
  return { url, db, logger, mailer, fakeSmtp, studies, close };
}
