/** Sign-in sessions (Lucia): httpOnly, SameSite=Lax cookie; Secure when the public URL is HTTPS. */
import { Lucia, TimeSpan } from 'lucia';
import type { Db } from '../db/knex';
import { createSessionStore } from '../db/sessions';

export function createAuth(db: Db, opts: { idleHours: number; secure: boolean }) {
  return new Lucia(createSessionStore(db), {
    sessionExpiresIn: new TimeSpan(opts.idleHours, 'h'),
    sessionCookie: { name: 'plumbline_session', attributes: { sameSite: 'lax', secure: opts.secure } },
    getUserAttributes: (a) => ({ email: a.email, displayName: a.displayName }),
    getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
  });
}

export type Auth = ReturnType<typeof createAuth>;

declare module 'lucia' {
  interface Register {
    Lucia: Auth;
    DatabaseUserAttributes: { email: string; displayName: string };
    DatabaseSessionAttributes: { createdAt: number };
  }
}
