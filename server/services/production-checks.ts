/**
 * Checks made before a production server accepts requests. The demo password is printed in the
 * README, so an account that still has it is an open door: the server refuses to start.
 */
import { verifyPassword } from '../auth/password';
import { PUBLISHED_DEMO_PASSWORD, type Config } from '../config';
import type { Db } from '../db/knex';
import { listPasswordHashes } from '../db/users';

export class UnsafeProductionError extends Error {}

/** Throws UnsafeProductionError naming the accounts that still sign in with the published password. */
export async function checkProductionSafety(db: Db, config: Config): Promise<void> {
  if (config.env !== 'production') return;
  if (config.demo.seed) {
    throw new UnsafeProductionError('DEMO_SEED is on in production. Set DEMO_SEED=false: the demo accounts and their password are public.');
  }
  const open: string[] = [];
  for (const u of await listPasswordHashes(db)) {
    if (u.password_hash && (await verifyPassword(u.password_hash, PUBLISHED_DEMO_PASSWORD))) open.push(u.email);
  }
  if (open.length > 0) {
    throw new UnsafeProductionError(
      `These accounts still have the published demo password: ${open.join(', ')}. ` +
        'Change their passwords (or remove the accounts) before running in production; see docs/operations.md.',
    );
  }
}
