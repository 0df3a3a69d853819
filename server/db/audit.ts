/**
 * Repository of the audit trail (audit_events). Append-only: the table's triggers refuse UPDATE and
 * DELETE. Each lab has its own hash chain (lab-less events, such as failed sign-ins, form one more
 * chain with lab_id NULL); rows are ordered by the integer id.
 */
import type { Db } from './knex';

export interface AuditRow {
  id: number;
  lab_id: string | null;
  actor_user_id: string | null;
  action: string;
  target_type: string;
  target_id: string | null;
  before_json: string | null;
  after_json: string | null;
  at: number;
  prev_hash: string | null;
  hash: string;
}

const chain = (db: Db, labId: string | null) =>
  labId === null ? db('audit_events').whereNull('lab_id') : db('audit_events').where({ lab_id: labId });

/** The hash of the newest event of a lab's chain, or null for an empty chain. */
export async function lastChainHash(db: Db, labId: string | null): Promise<string | null> {
  const row = await chain(db, labId).orderBy('id', 'desc').first('hash');
  return row ? String(row.hash) : null;
}

/** The next id of the table (call inside the transaction that inserts it). */
export async function nextAuditId(db: Db): Promise<number> {
  const row = await db('audit_events').max({ max: 'id' }).first();
  return Number(row?.max ?? 0) + 1;
}

export async function insertAuditRow(db: Db, row: AuditRow): Promise<void> {
  await db('audit_events').insert(row);
}

export interface AuditFilter {
  labId: string;
  action?: string;
  actorUserId?: string;
  from?: number;
  to?: number;
}

function filtered(db: Db, f: AuditFilter) {
  const q = db('audit_events').where('audit_events.lab_id', f.labId);
  if (f.action) {
    // "members.*" style prefixes select a whole family of actions.
    if (f.action.endsWith('*')) q.where('action', 'like', `${f.action.slice(0, -1).replace(/[%_]/g, '')}%`);
    else q.where('action', f.action);
  }
  if (f.actorUserId) q.where('actor_user_id', f.actorUserId);
  if (f.from !== undefined) q.where('at', '>=', f.from);
  if (f.to !== undefined) q.where('at', '<', f.to);
  return q;
}

/** A page of a lab's events, newest first, with the actor's name and the total count. */
export async function listAudit(
  db: Db,
  f: AuditFilter,
  page: { limit: number; offset: number },
): Promise<{ rows: (AuditRow & { actor_display_name: string | null; actor_email: string | null })[]; total: number }> {
  const countRow = await filtered(db, f).count({ n: '*' }).first();
  const rows = await filtered(db, f)
    .leftJoin('users', 'users.id', 'audit_events.actor_user_id')
    .orderBy('audit_events.id', 'desc')
    .limit(page.limit)
    .offset(page.offset)
    .select('audit_events.*', 'users.display_name as actor_display_name', 'users.email as actor_email');
  return { rows, total: Number(countRow?.n ?? 0) };
}

/** A lab's whole chain in order (for verification and export). */
export function chainRows(db: Db, labId: string | null): Promise<AuditRow[]> {
  return chain(db, labId).orderBy('id', 'asc').select('*');
}

/** How many events a lab's chain holds. */
export async function chainLength(db: Db, labId: string | null): Promise<number> {
  const row = await chain(db, labId).count({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

/** The labs (and null, for lab-less events) that have a chain. */
export async function chainLabs(db: Db): Promise<(string | null)[]> {
  const rows = await db('audit_events').distinct('lab_id');
  return rows.map((r: { lab_id: string | null }) => r.lab_id);
}

/** The newest event of a lab's chain. */
export function chainHead(db: Db, labId: string | null): Promise<AuditRow | undefined> {
  return chain(db, labId).orderBy('id', 'desc').first('*');
}

export type AuditRowWithPeople = AuditRow & { actor_name: string | null; actor_email: string | null; target_name: string | null; target_email: string | null };

/** A lab's whole chain in order, with the names and e-mails of the actor and of a user target. */
export function chainRowsWithPeople(db: Db, labId: string): Promise<AuditRowWithPeople[]> {
  return db('audit_events')
    .where('audit_events.lab_id', labId)
    .leftJoin({ a: 'users' }, 'a.id', 'audit_events.actor_user_id')
    .leftJoin({ t: 'users' }, function () {
      this.on('t.id', '=', 'audit_events.target_id').andOnVal('audit_events.target_type', '=', 'user');
    })
    .orderBy('audit_events.id', 'asc')
    .select('audit_events.*', 'a.display_name as actor_name', 'a.email as actor_email', 't.display_name as target_name', 't.email as target_email');
}
