import { Router } from 'express';
import { signInRequestSchema } from '@/shared/api/auth';
import { requireUser } from '../auth/middleware';
import type { Auth } from '../auth/lucia';
import type { Db } from '../db/knex';
import { describeUser, signIn, type AttemptLimiter } from '../services/sign-in';
import { parseBody } from './parse';

export function authRoutes(deps: { db: Db; auth: Auth; limiter: AttemptLimiter }): Router {
  const r = Router();
  r.post('/auth/sign-in', async (req, res) => {
    const input = parseBody(signInRequestSchema, req.body);
    const { sessionId, me } = await signIn(deps, input, { ip: req.ip ?? 'unknown', previousSessionId: req.session?.id });
    res.append('Set-Cookie', deps.auth.createSessionCookie(sessionId).serialize());
    res.json(me);
  });
  r.post('/auth/sign-out', async (req, res) => {
    if (req.session) await deps.auth.invalidateSession(req.session.id);
    res.append('Set-Cookie', deps.auth.createBlankSessionCookie().serialize());
    res.status(204).end();
  });
  r.get('/me', requireUser, async (req, res) => {
    res.json(await describeUser(deps.db, req.user!.id));
  });
  return r;
}
