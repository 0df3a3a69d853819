/**
 * Password reset by mail: a request answers the same whether or not the address has an account
 * (the mail, if any, is sent after the answer so timing does not tell either); the link works once,
 * for one hour, and only while it is the newest one; confirming sets the new password and ends every session of the user.
 * Requests are rate-limited per address and per client.
 */
import { randomUUID } from 'node:crypto';
import { passwordProblem } from '@/shared/api/people';
import type { Auth } from '../auth/lucia';
import { hashPassword } from '../auth/password';
import { closeOpenPasswordResets, findPasswordResetByTokenHash, insertPasswordReset, spendPasswordReset } from '../db/invitations';
import type { Db } from '../db/knex';
import { setPasswordHash } from '../db/members';
import { findUserByEmail, findUserById } from '../db/users';
import { AppError } from '../errors';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { resetRequestRefused } from './attempt-limits';
import { recordAccountEvent } from './account-events';
import { newToken, sameHash, tokenHash } from './invitations';

export const RESET_MINUTES = 60;
export const RESET_ANSWER = 'If an account uses this address, a message with a reset link is on its way.';

interface Deps {
  db: Db;
  auth: Auth;
  mailer: Mailer;
  logger: Logger;
  publicUrl: string;
}

export async function requestPasswordReset(deps: Deps, email: string, client: { ip: string }): Promise<{ message: string }> {
  if (await resetRequestRefused(deps.db, email, client.ip)) {
    throw new AppError(429, 'too_many_attempts', 'Too many password reset requests. Wait 15 minutes and try again.');
  }
  const user = await findUserByEmail(deps.db, email);
  if (!user) return { message: RESET_ANSWER };

  const { token, hash } = newToken();
  const now = Date.now();
  await deps.db.transaction(async (trx) => {
    // Only the newest link works: an older one found later in a mailbox is already closed.
    await closeOpenPasswordResets(trx, user.id, now);
    await insertPasswordReset(trx, { id: randomUUID(), user_id: user.id, token_hash: hash, created_at: now, expires_at: now + RESET_MINUTES * 60_000, used_at: null });
    await recordAccountEvent(trx, user.id, { actorUserId: null, action: 'auth.password-reset-requested', targetType: 'user', targetId: user.id, after: { ip: client.ip } });
  });
  const link = `${deps.publicUrl}/reset-password?token=${token}`;
  // Not awaited: the answer must not wait on SMTP, or its timing would reveal that the address exists.
  deps.mailer
    .send({
      to: user.email,
      kind: 'password-reset',
      secrets: [link],
      subject: 'Reset your Plumbline password',
      text:
        `Someone asked to reset the password of your Plumbline account (${user.email}).\n\n` +
        `Open this link to choose a new password (it works once and expires in ${RESET_MINUTES} minutes):\n${link}\n\n` +
        `If you did not ask for this, ignore this message; your password stays as it is.`,
    })
    .catch((err) => deps.logger.error({ err }, 'password reset mail failed'));
  return { message: RESET_ANSWER };
}

export async function confirmPasswordReset(deps: Pick<Deps, 'db' | 'auth'>, token: string, password: string): Promise<void> {
  const hash = tokenHash(token);
  const row = await findPasswordResetByTokenHash(deps.db, hash);
  const invalid = () => new AppError(410, 'reset_link_invalid', 'This reset link is not valid any more. Ask for a new one.');
  if (!row || !sameHash(row.token_hash, hash) || row.used_at || row.expires_at <= Date.now()) throw invalid();
  const user = await findUserById(deps.db, row.user_id);
  if (!user) throw invalid();
  const problem = passwordProblem(password, user.email);
  if (problem) throw new AppError(400, 'weak_password', `password: ${problem}`, { fields: [{ path: 'password', message: problem }] });
  const passwordHash = await hashPassword(password);
  await deps.db.transaction(async (trx) => {
    if (!(await spendPasswordReset(trx, row, Date.now()))) throw invalid();
    await setPasswordHash(trx, user.id, passwordHash);
    await recordAccountEvent(trx, user.id, { actorUserId: user.id, action: 'auth.password-reset', targetType: 'user', targetId: user.id });
  });
  await deps.auth.invalidateUserSessions(user.id);
}
