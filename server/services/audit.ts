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
 * Tamper evidence: each lab's events form a chain, sealed with the audit key (audit-key.ts), a
 * secret kept outside the database:
 *   hash = HMAC-SHA-256(key, prev_hash + canonicalJson(row))
 * where row is every column but `hash` (prev_hash "" for the first event) and canonicalJson is
 * JSON with object keys sorted at every level. Events stored before the key existed kept their
 * plain sha256 (`legacyAuditHash`); the first start with the key sealed them under one keyed
 * `audit.seal` event (audit-trail.ts). After each commit a checkpoint of the lab's chain goes to a
 * file outside SQLite (audit-checkpoints.ts). The table's triggers refuse UPDATE and DELETE.
 * Verification: audit-verify.ts.
 */
import { createHash, createHmac } from 'node:crypto';
import { chainLength, insertAuditRow, lastChainHash, nextAuditId, type AuditRow } from '../db/audit';
import { databaseIdentity, onCommit } from '../db/commit-hooks';
import type { Db } from '../db/knex';
import type { CheckpointLog } from './audit-checkpoints';

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

/** The text a hash is taken over: prev_hash + the canonical JSON of the row without its hash. */
function hashedText(row: Omit<AuditRow, 'hash'>): string {
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
  return (prev_hash ?? '') + body;
}

/** The keyed hash of an event: HMAC-SHA-256 with the audit key (see the top). */
export function sealAuditRow(key: Buffer, row: Omit<AuditRow, 'hash'>): string {
  return createHmac('sha256', key).update(hashedText(row)).digest('hex');
}

/** The plain sha256 events carried before the audit key existed (kept to verify them). */
export function legacyAuditHash(row: Omit<AuditRow, 'hash'>): string {
  return createHash('sha256').update(hashedText(row)).digest('hex');
}

/** The key and the checkpoint file of one database. */
export interface AuditTrail {
  key: Buffer;
  checkpoints: CheckpointLog;
}

const trails = new WeakMap<object, AuditTrail>();

/** Binds a database (and every transaction on it) to its audit key and checkpoint file. */
export function bindAuditTrail(db: Db, trail: AuditTrail): void {
  trails.set(databaseIdentity(db), trail);
}

export function auditTrailOf(db: Db): AuditTrail {
  const trail = trails.get(databaseIdentity(db));
  if (!trail) throw new Error('No audit key is bound to this database: the server loads it at start (openAuditTrail).');
  return trail;
}

/** Appends one event to its lab's chain; returns the stored row. */
export async function recordAudit(db: Db, event: AuditEvent): Promise<AuditRow> {
  // The read of the chain's head and the insert must not interleave with another append.
  if (!db.isTransaction) return db.transaction((trx) => recordAudit(trx, event));
  const trail = auditTrailOf(db);
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
  const row: AuditRow = { ...draft, hash: sealAuditRow(trail.key, draft) };
  await insertAuditRow(db, row);
  const events = await chainLength(db, labId);
  onCommit(db, `audit-checkpoint:${JSON.stringify(labId)}`, () => trail.checkpoints.append(labId, events, row.hash));
  return row;
}
