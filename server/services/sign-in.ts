/**
 * Signing in: one answer for unknown e-mails and wrong passwords, rate limits kept in SQLite
 * (attempt-limits.ts: per account and client together, so nobody can lock another out), and a new
 * session every time (the old one, if any, is dropped: session rotation).
 */
import type { Auth } from '../auth/lucia';
import { decoyHash, verifyPassword } from '../auth/password';
import type { Db } from '../db/knex';
import { findUserByEmail, findUserById, listMemberships } from '../db/users';
import { AppError } from '../errors';
import { clearSignInFailures, recordSignInFailure, signInBlocked } from './attempt-limits';
import { recordAccountEvent } from './account-events';
import type { MeResponse, SignInRequest } from '@/shared/api/auth';

const WINDOW_MS = 15 * 60_000;
/** Failures allowed per e-mail address, and per client address (several people may share one). */
export const MAX_FAILURES_PER_ACCOUNT = 8;
export const MAX_FAILURES_PER_CLIENT = 40;

/** Failed attempts per key within a sliding window, in memory (the signature re-entry uses it). */
export class AttemptLimiter {
  private failures = new Map<string, number[]>();
  constructor(private readonly windowMs = WINDOW_MS) {}

  blocked(key: string, now = Date.now()): boolean {
    const max = key.startsWith('ip:') ? MAX_FAILURES_PER_CLIENT : MAX_FAILURES_PER_ACCOUNT;
    return this.recent(key, now).length >= max;
  }
  fail(key: string, now = Date.now()): void {
    this.failures.set(key, [...this.recent(key, now), now]);
  }
  clear(key: string): void {
    this.failures.delete(key);
  }
  private recent(key: string, now: number): number[] {
    return (this.failures.get(key) ?? []).filter((t) => now - t < this.windowMs);
  }
}

const wrongCredentials = () => new AppError(401, 'wrong_credentials', 'E-mail or password is not right.');

export async function signIn(
  deps: { db: Db; auth: Auth },
  input: SignInRequest,
  client: { ip: string; previousSessionId?: string },
): Promise<{ sessionId: string; me: MeResponse }> {
  if (await signInBlocked(deps.db, input.email, client.ip)) {
    throw new AppError(429, 'too_many_attempts', 'Too many failed sign-in attempts. Wait 15 minutes and try again.');
  }
  const user = await findUserByEmail(deps.db, input.email);
  const ok = user?.password_hash
    ? await verifyPassword(user.password_hash, input.password)
    : (await verifyPassword(await decoyHash(), input.password), false);
  if (!user || !ok) {
    await recordSignInFailure(deps.db, input.email, client.ip);
    // Lab-less event; the address is kept as typed so an admin can see guessing against it.
    await recordAccountEvent(deps.db, user?.id ?? null, {
      actorUserId: null, action: 'auth.sign-in-failed', targetType: 'user', targetId: user?.id ?? null,
      after: { email: input.email, ip: client.ip, reason: user ? 'wrong_password' : 'unknown_email' },
    });
    throw wrongCredentials();
  }
  await clearSignInFailures(deps.db, input.email, client.ip);
  if (client.previousSessionId) await deps.auth.invalidateSession(client.previousSessionId);
  const session = await deps.auth.createSession(user.id, { createdAt: Date.now() });
  await recordAccountEvent(deps.db, user.id, { actorUserId: user.id, action: 'auth.sign-in', targetType: 'user', targetId: user.id, after: { ip: client.ip } });
  return { sessionId: session.id, me: await describeUser(deps.db, user.id) };
}

export async function describeUser(db: Db, userId: string): Promise<MeResponse> {
  const user = await findUserById(db, userId);
  if (!user) throw new AppError(401, 'unauthorised', 'Sign in to continue.');
  const memberships = await listMemberships(db, userId);
  return {
    user: { id: user.id, email: user.email, displayName: user.display_name },
    memberships: memberships.map((m) => ({ labId: m.lab_id, labName: m.lab_name, role: m.role })),
  };
}
