/**
 * What the HTTP application is built from: createApp(deps) and every router take these. Kept out of
 * app.ts so that routes depend on a plain list of collaborators, not on the module that builds the
 * Express app (and so that nothing has to augment it from elsewhere).
 */
import type { Auth } from './auth/lucia';
import type { Clock } from './clock';
import type { Config } from './config';
import type { Db } from './db/knex';
import type { StudyQueue } from './jobs/scheduler';
import type { Logger } from './logger';
import type { Mailer } from './mail/mailer';

export interface AppDeps {
  config: Config;
  db: Db;
  auth: Auth;
  logger: Logger;
  mailer: Mailer;
  version: string;
  /** Time for rules that depend on elapsed time (tests set it). */
  clock: Clock;
  /** Background studies; absent when the server runs without a scheduler. */
  studyQueue?: StudyQueue;
}
