/** Attempt counts per key (sign-in failures, reset requests) for the rate limits. */
import type { Db } from './knex';

export async function countAttempts(db: Db, key: string, since: number): Promise<number> {
  const row = await db('attempts').where({ key }).where('at', '>', since).count<{ n: number }[]>({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

export async function addAttempts(db: Db, keys: string[], at: number): Promise<void> {
  if (keys.length > 0) await db('attempts').insert(keys.map((key) => ({ key, at })));
}

export async function clearAttempts(db: Db, key: string): Promise<void> {
  await db('attempts').where({ key }).delete();
}

/** Drops counts older than the window, so the table stays small. */
export async function pruneAttempts(db: Db, before: number): Promise<void> {
  await db('attempts').where('at', '<=', before).delete();
}
