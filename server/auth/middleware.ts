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
const LOOPBACK = new Set(['localhost', '127.0.0.1', '[::1]']);

/**
 * The host names this server answers to: PUBLIC_URL's, and outside production the loopback names
 * (a developer's browser at http://127.0.0.1:PORT). A DNS-rebinding page reaches the server under
 * its own name, so refusing every other Host closes that path.
 */
export function hostPolicy(publicUrl: string, env: 'development' | 'production' | 'test') {
  const pub = new URL(publicUrl);
  const allowsHost = (hostHeader: string | undefined): boolean => {
    if (!hostHeader) return false;
    let url: URL;
    try {
      url = new URL(`http://${hostHeader}`);
    } catch {
      return false;
    }
    if (url.hostname === pub.hostname) return true;
    return env !== 'production' && LOOPBACK.has(url.hostname);
  };
  const allowsOrigin = (origin: string): boolean => {
    if (origin === pub.origin) return true;
    let url: URL;
    try {
      url = new URL(origin);
    } catch {
      return false;
    }
    return env !== 'production' && (url.protocol === 'http:' || url.protocol === 'https:') && LOOPBACK.has(url.hostname);
  };
  return { allowsHost, allowsOrigin };
}

/** Refuses a request addressed to a host name that is not this server's (421, in words). */
export function checkHost(policy: ReturnType<typeof hostPolicy>, publicUrl: string) {
  return (req: Request, res: Response, next: NextFunction) => {
    if (policy.allowsHost(req.headers.host)) return next();
    res
      .status(421)
      .type('text/plain')
      .send(`This server answers only at ${publicUrl}. If that is not the address you use, set PUBLIC_URL to it.`);
  };
}

/** The origin of a Referer, or null when the header is not a URL (refused like a foreign one). */
function refererOrigin(referer: string): string | null {
  try {
    return new URL(referer).origin;
  } catch {
    return null;
  }
}

/** Refuses a state-changing request whose Origin (or Referer) is not this server's. */
export function checkOrigin(policy: ReturnType<typeof hostPolicy>) {
  return (req: Request, _res: Response, next: NextFunction) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.headers.origin ?? (req.headers.referer !== undefined ? refererOrigin(req.headers.referer) : undefined);
    // Requests without Origin/Referer come from non-browser clients (CLI, tests); a browser
    // always sends Origin on cross-site POSTs, so those are the ones that must match.
    if (origin === undefined) return next();
    if (origin !== null && policy.allowsOrigin(origin)) return next();
    throw new AppError(403, 'bad_origin', 'This request came from another site and was refused.');
  };
}
