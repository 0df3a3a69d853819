/** Password reset by mail: /api/v1/auth/password-reset and /api/v1/auth/password-reset/confirm. */
import { Router } from 'express';
import { passwordResetAnswerSchema, passwordResetConfirmSchema, passwordResetRequestSchema } from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { openRoute } from '../auth/permissions';
import { confirmPasswordReset, requestPasswordReset } from '../services/password-reset';
import { parseBody } from './parse';

/** Reset requests are limited per address and per client within 15 minutes (attempt-limits.ts). */
export function passwordResetRoutes(deps: AppDeps): Router {
  const r = Router();
  openRoute(r, {
    method: 'post', path: '/auth/password-reset', action: 'public', status: 202,
    summary: 'Ask for a password reset link by mail (the same answer for every address)',
    body: passwordResetRequestSchema, response: passwordResetAnswerSchema,
  }, async (req, res) => {
    const { email } = parseBody(passwordResetRequestSchema, req.body);
    const answer = await requestPasswordReset(
      { db: deps.db, auth: deps.auth, mailer: deps.mailer, logger: deps.logger, publicUrl: deps.config.publicUrl },
      email,
      { ip: req.ip ?? 'unknown' },
    );
    res.status(202).json(answer);
  });
  openRoute(r, {
    method: 'post', path: '/auth/password-reset/confirm', action: 'public', status: 204,
    summary: 'Set a new password with a reset link; ends every session of the account',
    body: passwordResetConfirmSchema,
  }, async (req, res) => {
    const { token, password } = parseBody(passwordResetConfirmSchema, req.body);
    await confirmPasswordReset(deps, token, password);
    res.append('Set-Cookie', deps.auth.createBlankSessionCookie().serialize());
    res.status(204).end();
  });
  return r;
}
