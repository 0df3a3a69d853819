/**
 * createApp(deps): the Express application without listening, so tests can start it on port 0.
 * API under /api; the web export (single-page app) is served for every other GET.
 */
import fs from 'node:fs';
import path from 'node:path';
import express, { type ErrorRequestHandler, type Express } from 'express';
import helmet from 'helmet';
import type { Auth } from './auth/lucia';
import type { Clock } from './clock';
import { checkOrigin, loadSession } from './auth/middleware';
import type { Config } from './config';
import type { Db } from './db/knex';
import { AppError } from './errors';
import type { Logger } from './logger';
import { healthRoutes } from './routes/health';
import { v1Routes } from './routes';
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
}

export function createApp(deps: AppDeps): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'", "'unsafe-inline'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
        },
      },
    }),
  );

  const api = express.Router();
  api.use(express.json({ limit: '1mb' }));
  api.use(loadSession(deps.auth, deps.config.session.absoluteHours));
  api.use(checkOrigin(deps.config.publicUrl));
  api.use(healthRoutes(deps));
  api.use('/v1', v1Routes(deps));
  api.use((req) => {
    throw new AppError(404, 'not_found', `No API route for ${req.method} ${req.originalUrl}.`);
  });
  app.use('/api', api);

  serveWeb(app, deps.config.webDir);
  app.use(errorHandler(deps.logger));
  return app;
}

function serveWeb(app: Express, webDir: string) {
  const index = path.join(webDir, 'index.html');
  app.use(express.static(webDir, { index: false, maxAge: '1h' }));
  app.get('/{*splat}', (_req, res) => {
    if (!fs.existsSync(index)) {
      res.status(503).type('text/plain').send('The web app has not been built yet: run npm start (it builds it).');
      return;
    }
    res.sendFile(index);
  });
}

function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (err instanceof AppError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, details: err.details } });
      return;
    }
    // Body-parser errors carry a status and type (bad JSON, too large, wrong charset).
    const status = typeof err?.status === 'number' ? err.status : 500;
    if (status >= 400 && status < 500) {
      const code = err.type === 'entity.too.large' ? 'body_too_large' : 'bad_request';
      const message = code === 'body_too_large' ? 'The request body is too large.' : 'The request body could not be read as JSON.';
      res.status(status).json({ error: { code, message } });
      return;
    }
    const storage = storageError(err);
    if (storage) {
      logger.error({ err, method: req.method, url: req.originalUrl }, 'database refused a write');
      res.status(503).json({ error: storage });
      return;
    }
    logger.error({ err, method: req.method, url: req.originalUrl }, 'unhandled error');
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server. It has been logged.' } });
  };
}

/**
 * SQLite errors that say the storage, not the request, is at fault (SQLite result codes,
 * sqlite.org/rescode.html): answered 503 with the cause in words. SQLite rolls the statement
 * back, so nothing half-written is left.
 */
function storageError(err: unknown): { code: string; message: string } | null {
  const code = typeof (err as { code?: unknown })?.code === 'string' ? (err as { code: string }).code : '';
  if (code === 'SQLITE_FULL') return { code: 'storage_full', message: 'The database is full (no space left for it); nothing was saved. Free disk space and try again.' };
  if (code.startsWith('SQLITE_READONLY')) return { code: 'storage_read_only', message: 'The database is read-only (file or folder permissions, or read-only mode); nothing was saved.' };
  if (code.startsWith('SQLITE_IOERR') || code === 'SQLITE_CANTOPEN') return { code: 'storage_error', message: 'The database file could not be written (disk or file error); nothing was saved.' };
  if (code.startsWith('SQLITE_BUSY')) return { code: 'storage_busy', message: 'The database is busy; nothing was saved. Try again in a moment.' };
  return null;
}
