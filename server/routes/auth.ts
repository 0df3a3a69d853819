import { Router } from 'express';
import { meResponseSchema, sessionResponseSchema, signInRequestSchema } from '@/shared/api/auth';
import { openRoute } from '../auth/permissions';
import type { Auth } from '../auth/lucia';
import type { Db } from '../db/knex';
import { recordAudit } from '../services/audit';
import { describeUser, signIn } from '../services/sign-in';
import { parseBody } from './parse';

export function authRoutes(deps: { db: Db; auth: Auth }): Router {
  const r = Router();
  openRoute(r, {
    method: 'post', path: '/auth/sign-in', action: 'public',
    summary: 'Sign in with e-mail and password (rate-limited; one answer for unknown users and wrong passwords)',
    body: signInRequestSchema, response: meResponseSchema,
  }, async (req, res) => {
    const input = parseBody(signInRequestSchema, req.body);
    const { sessionId, me } = await signIn(deps, input, { ip: req.ip ?? 'unknown', previousSessionId: req.session?.id });
    res.append('Set-Cookie', deps.auth.createSessionCookie(sessionId).serialize());
    res.json(me);
  });
  openRoute(r, {
    method: 'post', path: '/auth/sign-out', action: 'public', status: 204, summary: 'Sign out (ends this session)',
  }, async (req, res) => {
    if (req.session) {
      await deps.auth.invalidateSession(req.session.id);
      await recordAudit(deps.db, { labId: null, actorUserId: req.user?.id ?? null, action: 'auth.sign-out', targetType: 'user', targetId: req.user?.id ?? null });
    }
    res.append('Set-Cookie', deps.auth.createBlankSessionCookie().serialize());
    res.status(204).end();
  });
  openRoute(r, {
    method: 'get', path: '/auth/session', action: 'public',
    summary: 'Who is signed in on this session, or null (always 200)', response: sessionResponseSchema,
  }, async (req, res) => {
    res.json({ me: req.user ? await describeUser(deps.db, req.user.id) : null });
  });
  openRoute(r, {
    method: 'get', path: '/me', action: 'signed-in', summary: 'The signed-in user, with their labs and roles', response: meResponseSchema,
  }, async (req, res) => {
    res.json(await describeUser(deps.db, req.user.id));
  });
  return r;
}
