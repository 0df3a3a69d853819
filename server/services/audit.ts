/**
 * The audit trail: every state change calls `recordAudit(trx, event)` inside the transaction of the
 * change itself, so the event is stored exactly when the change is.
 *
 *   await db.transaction(async (trx) => {
 *     await trx('systems').insert(row);
 *     await recordAudit(trx, { labId, actorUserId: req.user.id, action: 'systems.create',
 *       targetType: 'system', targetId: row.id, after: { name: row.name } });
 *   });
 *
 * Called with the plain `db` it opens its own transaction. Events without a lab (a failed sign-in)
 * pass `labId: null`.
 *
 * Tamper evidence: each lab's events form a chain. hash = sha256_hex(prev_hash + canonicalJson(row))
 * where row is every column but `hash` (prev_hash "" for the first event) and canonicalJson is
 * JSON with object keys sorted at every level. The table's triggers refuse UPDATE and DELETE.
 */
import { createHash } from 'node:crypto';
import type { Db } from '../db/knex';
import { chainRows, insertAuditRow, lastChainHash, nextAuditId, type AuditRow } from '../db/audit';

export interface AuditEvent {
  labId: string | null;
  actorUserId: string | null;
  /** What happened, e.g. 'members.change-role', 'auth.sign-in-failed', 'systems.create'. */
  action: string;
  targetType: string;
  targetId?: string | null;
  before?: unknown;
  after?: unknown;
  /** Milliseconds since the epoch; now unless given (tests). */
  at?: number;
}

/** JSON with sorted object keys at every level, so equal values give equal text. */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value));
}

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys);
  if (value && typeof value === 'object' && !(value instanceof Date)) {
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(value).sort()) {
      const v = (value as Record<string, unknown>)[k];
      if (v !== undefined) out[k] = sortKeys(v);
    }
    return out;
  }
  return value;
}

/** sha256 over prev_hash + the canonical JSON of the row without its hash (see the top). */
export function hashAuditRow(row: Omit<AuditRow, 'hash'>): string {
  const { id, lab_id, actor_user_id, action, target_type, target_id, before_json, after_json, at, prev_hash } = row;
  const body = canonicalJson({
    id: Number(id),
    lab_id,
    actor_user_id,
    action,
    target_type,
    target_id,
    before_json,
    after_json,
    at: Number(at),
    prev_hash,
  });
  return createHash('sha256').update((prev_hash ?? '') + body).digest('hex');
}

/** Appends one event to its lab's chain; returns the stored row. */
export async function recordAudit(db: Db, event: AuditEvent): Promise<AuditRow> {
  // The read of the chain's head and the insert must not interleave with another append.
  if (!db.isTransaction) return db.transaction((trx) => recordAudit(trx, event));
  const labId = event.labId ?? null;
  const prev = await lastChainHash(db, labId);
  const draft: Omit<AuditRow, 'hash'> = {
    id: await nextAuditId(db),
    lab_id: labId,
    actor_user_id: event.actorUserId ?? null,
    action: event.action,
    target_type: event.targetType,
    target_id: event.targetId ?? null,
    before_json: event.before === undefined ? null : canonicalJson(event.before),
    after_json: event.after === undefined ? null : canonicalJson(event.after),
    at: event.at ?? Date.now(),
    prev_hash: prev,
  };
  const row: AuditRow = { ...draft, hash: hashAuditRow(draft) };
  await insertAuditRow(db, row);
  return row;
}

export interface ChainVerdict {
  ok: boolean;
  checked: number;
  /** The first event whose hash or link does not hold, and why. */
  firstBroken: { id: number; reason: 'hash_mismatch' | 'link_mismatch' } | null;
}

/** Recomputes a lab's chain from its first event and reports the first broken link. */
export async function verifyAuditChain(db: Db, labId: string | null): Promise<ChainVerdict> {
  const rows = await chainRows(db, labId);
  let prev: string | null = null;
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i]!;
    if ((row.prev_hash ?? null) !== prev) return { ok: false, checked: i + 1, firstBroken: { id: Number(row.id), reason: 'link_mismatch' } };
    if (hashAuditRow(row) !== row.hash) return { ok: false, checked: i + 1, firstBroken: { id: Number(row.id), reason: 'hash_mismatch' } };
    prev = row.hash;
  }
  return { ok: true, checked: rows.length, firstBroken: null };
}
