/**
 * Two small bridges to Knex's transaction objects, kept here because only server/db knows Knex:
 * the identity a database shares with every transaction opened on it, and a hook that runs once
 * the outermost transaction has committed (never after a rollback).
 */
import type { Db } from './knex';

interface Transactor {
  isTransaction?: boolean;
  executionPromise?: Promise<unknown>;
  parentTransaction?: Transactor;
  client?: { config?: object };
}

/**
 * An object shared by a database and all of its transactions (Knex hands every transaction client
 * the same config object), to key per-database state such as the audit key.
 */
export function databaseIdentity(db: Db): object {
  const config = (db as unknown as Transactor).client?.config;
  if (!config) throw new Error('This database handle has no client configuration.');
  return config;
}

const pending = new WeakMap<object, Map<string, () => void>>();

/**
 * Runs `fn` after the outermost transaction of `trx` commits. Hooks share a key: a later one with
 * the same key replaces the earlier one, so a transaction that appends three events writes one
 * checkpoint. Hooks run in the order their keys were first registered.
 */
export function onCommit(trx: Db, key: string, fn: () => void): void {
  let root = trx as unknown as Transactor;
  if (!root.isTransaction) throw new Error('onCommit needs a transaction.');
  while (root.parentTransaction) root = root.parentTransaction;
  const done = root.executionPromise;
  if (!done) throw new Error('This transaction does not expose when it commits.');
  let hooks = pending.get(root);
  if (!hooks) {
    const fresh = new Map<string, () => void>();
    pending.set(root, fresh);
    hooks = fresh;
    done.then(
      () => {
        for (const hook of fresh.values()) hook();
      },
      () => undefined, // rolled back: nothing was stored, nothing to run
    );
  }
  hooks.set(key, fn);
}
