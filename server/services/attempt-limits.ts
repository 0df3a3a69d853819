/**
 * Rate limits for signing in and asking for reset links, kept in SQLite (they survive a restart).
 *
 * Sign-in failures are counted per account AND client together (8 in 15 minutes), per client
 * (40, several people may share an address) and per account over all clients (40). A client is
 * stopped by its own pair or client count; the account count stops only clients that have failed
 * against that account themselves, so a stranger typing wrong passwords cannot lock its owner out:
 * the right password from a client with no failures still gets in.
 */
import type { Db } from '../db/knex';
import { addAttempts, clearAttempts, countAttempts, pruneAttempts } from '../db/attempts';

export const WINDOW_MS = 15 * 60_000;
export const MAX_FAILURES_PER_PAIR = 8;
export const MAX_FAILURES_PER_CLIENT = 40;
export const MAX_FAILURES_PER_ACCOUNT = 40;
/** Reset requests per address and per client in the window. */
export const MAX_RESET_REQUESTS = 8;
export const MAX_RESET_REQUESTS_PER_CLIENT = 40;

const keysOf = (email: string, ip: string) => ({ pair: `pair:${email}|${ip}`, client: `ip:${ip}`, account: `email:${email}` });

export async function signInBlocked(db: Db, email: string, ip: string, now = Date.now()): Promise<boolean> {
  const k = keysOf(email, ip);
  const since = now - WINDOW_MS;
  const pair = await countAttempts(db, k.pair, since);
  if (pair >= MAX_FAILURES_PER_PAIR) return true;
  if ((await countAttempts(db, k.client, since)) >= MAX_FAILURES_PER_CLIENT) return true;
  return pair > 0 && (await countAttempts(db, k.account, since)) >= MAX_FAILURES_PER_ACCOUNT;
}

export async function recordSignInFailure(db: Db, email: string, ip: string, now = Date.now()): Promise<void> {
  const k = keysOf(email, ip);
  await addAttempts(db, [k.pair, k.client, k.account], now);
  await pruneAttempts(db, now - WINDOW_MS);
}

/** After a right password: this client's failures against the account are forgiven. */
export async function clearSignInFailures(db: Db, email: string, ip: string): Promise<void> {
  await clearAttempts(db, keysOf(email, ip).pair);
}

/** Counts a reset request; true when the address or the client has asked too often already. */
export async function resetRequestRefused(db: Db, email: string, ip: string, now = Date.now()): Promise<boolean> {
  const since = now - WINDOW_MS;
  const keys = [`reset:${email}`, `ip:reset:${ip}`];
  if ((await countAttempts(db, keys[0], since)) >= MAX_RESET_REQUESTS) return true;
  if ((await countAttempts(db, keys[1], since)) >= MAX_RESET_REQUESTS_PER_CLIENT) return true;
  await addAttempts(db, keys, now);
  return false;
}
