/**
 * Request authentication: reads the session cookie, validates it (idle expiry by Lucia, absolute
 * lifetime here), refreshes the cookie when Lucia extends the session, and checks the Origin of
 * state-changing requests.
 */
import type { NextFunction, Request, Response } from 'express';
import type { Session, User } from 'lucia';
import { AppError, unauthorised } from '../errors';
import type { Auth } from './lucia';

declare module 'express-serve-static-core' {
  interface Request {
    user?: User;
    session?: Session;
  }
}

export function loadSession(auth: Auth, absoluteHours: number) {
  return async (req: Request, res: Response, next: NextFunction) => {
    const id = auth.readSessionCookie(req.headers.cookie ?? '');
    if (!id) return next();
    const { session, user } = await auth.validateSession(id);
    if (session && Date.now() - session.createdAt > absoluteHours * 3600_000) {
      await auth.invalidateSession(session.id);
      res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
      return next();
    }
    if (session?.fresh) res.append('Set-Cookie', auth.createSessionCookie(session.id).serialize());
    if (!session) res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
    if (session && user) {
      req.session = session;
      req.user = user;
    }
    next();
  };
}

export function requireUser(req: Request, _res: Response, next: NextFunction) {
  if (!req.user) throw unauthorised();
  next();
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** Refuses a state-changing request whose Origin (or Referer) is not this server's. */
export function checkOrigin(publicUrl: string) {
  const allowed = new URL(publicUrl).origin;
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.headers.origin ?? (req.headers.referer ? new URL(req.headers.referer).origin : undefined);
    // Requests without Origin/Referer come from non-browser clients (CLI, tests); a browser
    // always sends Origin on cross-site POSTs, so those are the ones that must match.
    if (!origin) return next();
    const host = req.headers.host;
    if (origin === allowed || (host && (origin === `http://${host}` || origin === `https://${host}`))) return next();
    throw new AppError(403, 'bad_origin', 'This request came from another site and was refused.');
  };
}
