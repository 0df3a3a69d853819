/** Repository of a lab's members (memberships joined with users), the lab row and the outbox list. */
import type { Role } from '@/shared/api/auth';
import type { MemberListQuery } from '@/shared/api/people';
import type { Db } from './knex';
import { insertRoleChange } from './role-history';

export interface MemberRow {
  user_id: string;
  email: string;
  display_name: string;
  role: Role;
  created_at: number;
}

const SORT_COLUMNS = {
  displayName: 'users.display_name',
  email: 'users.email',
  role: 'memberships.role',
  joinedAt: 'memberships.created_at',
} as const;

/** Escapes LIKE wildcards so a search for "a_b" matches the text "a_b" only. */
export const likeEscaped = (s: string) => `%${s.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;

function members(db: Db, labId: string, f: Pick<MemberListQuery, 'q' | 'role'>) {
  const q = db('memberships').join('users', 'users.id', 'memberships.user_id').where('memberships.lab_id', labId);
  if (f.role) q.where('memberships.role', f.role);
  if (f.q) {
    const pattern = likeEscaped(f.q.toLowerCase());
    q.where((w) =>
      w.whereRaw("lower(users.display_name) like ? escape '\\'", [pattern]).orWhereRaw("users.email like ? escape '\\'", [pattern]),
    );
  }
  return q;
}

export async function listMembers(db: Db, labId: string, query: MemberListQuery): Promise<{ rows: MemberRow[]; total: number }> {
  const count = await members(db, labId, query).count({ n: '*' }).first();
  const rows = await members(db, labId, query)
    .orderBy([
      { column: SORT_COLUMNS[query.sort], order: query.order },
      { column: 'users.id', order: 'asc' },
    ])
    .limit(query.limit)
    .offset(query.offset)
    .select('users.id as user_id', 'users.email', 'users.display_name', 'memberships.role', 'memberships.created_at');
  return { rows, total: Number(count?.n ?? 0) };
}

/** The role of a user in a lab, or undefined when they are not a member (the permission check). */
export async function memberRole(db: Db, labId: string, userId: string): Promise<Role | undefined> {
  const row = await db('memberships').where({ lab_id: labId, user_id: userId }).first('role');
  return row?.role as Role | undefined;
}

export function findMember(db: Db, labId: string, userId: string): Promise<MemberRow | undefined> {
  return members(db, labId, {})
    .where('memberships.user_id', userId)
    .first('users.id as user_id', 'users.email', 'users.display_name', 'memberships.role', 'memberships.created_at');
}

export function findMemberByEmail(db: Db, labId: string, email: string): Promise<MemberRow | undefined> {
  return members(db, labId, {})
    .where('users.email', email.toLowerCase())
    .first('users.id as user_id', 'users.email', 'users.display_name', 'memberships.role', 'memberships.created_at');
}

export async function countAdmins(db: Db, labId: string): Promise<number> {
  const row = await db('memberships').where({ lab_id: labId, role: 'admin' }).count({ n: '*' }).first();
  return Number(row?.n ?? 0);
}

/** Changes a member's role and records it in the role history (who, when, from what). */
export async function setMemberRole(db: Db, c: { labId: string; userId: string; from: Role; to: Role; by: string; at: number }): Promise<void> {
  await db('memberships').where({ lab_id: c.labId, user_id: c.userId }).update({ role: c.to });
  await insertRoleChange(db, c);
}

/** Removes a member; the role history keeps that they left (to_role NULL). */
export async function deleteMembership(db: Db, c: { labId: string; userId: string; from: Role; by: string; at: number }): Promise<void> {
  await db('memberships').where({ lab_id: c.labId, user_id: c.userId }).delete();
  await insertRoleChange(db, { ...c, to: null });
}

/** Any user with this e-mail, disabled ones included (e-mails are unique across accounts). */
export function findAnyUserByEmail(db: Db, email: string) {
  return db('users').where({ email: email.toLowerCase() }).first<
    { id: string; email: string; display_name: string; password_hash: string | null; disabled_at: number | null } | undefined
  >();
}

export async function setPasswordHash(db: Db, userId: string, passwordHash: string): Promise<void> {
  await db('users').where({ id: userId }).update({ password_hash: passwordHash });
}

// ---- the lab row -----------------------------------------------------------------------------

export interface LabRow {
  id: string;
  name: string;
  slug: string;
  report_footer: string;
  created_at: number;
  updated_at: number | null;
}

export function findLab(db: Db, labId: string): Promise<LabRow | undefined> {
  return db('labs').where({ id: labId }).first();
}

export async function updateLab(db: Db, labId: string, patch: { name?: string; report_footer?: string }): Promise<void> {
  await db('labs').where({ id: labId }).update({ ...patch, updated_at: Date.now() });
}

// ---- the outbox, read side ------------------------------------------------------------------

export interface OutboxRow {
  id: number;
  to_address: string;
  subject: string;
  body_text: string;
  kind: string;
  status: 'queued' | 'sent' | 'failed';
  error: string | null;
  created_at: number;
  sent_at: number | null;
}

export async function listLabMail(db: Db, labId: string, page: { limit: number; offset: number }): Promise<{ rows: OutboxRow[]; total: number }> {
  const count = await db('mail_outbox').where({ lab_id: labId }).count({ n: '*' }).first();
  const rows = await db('mail_outbox')
    .where({ lab_id: labId })
    .orderBy([{ column: 'created_at', order: 'desc' }, { column: 'id', order: 'desc' }])
    .limit(page.limit)
    .offset(page.offset)
    .select('*');
  return { rows, total: Number(count?.n ?? 0) };
}

/** The display names of a lab's members. */
export function labDisplayNames(db: Db, labId: string): Promise<{ user_id: string; display_name: string }[]> {
  return db('memberships').join('users', 'users.id', 'memberships.user_id').where('memberships.lab_id', labId).select('users.id as user_id', 'users.display_name');
}
