/**
 * Repository of the single-use tokens: invitations to a lab and password resets. Only the sha256
 * of a token is stored; `used_at` is set by a conditional update, so a token is spent once even
 * when two requests race.
 */
import type { Role } from '@/shared/api/auth';
import type { Db } from './knex';

export interface InvitationRow {
  id: string;
  lab_id: string;
  email: string;
  role: Role;
  token_hash: string;
  invited_by: string | null;
  created_at: number;
  expires_at: number;
  used_at: number | null;
  accepted_user_id: string | null;
  revoked_at: number | null;
}

export async function insertInvitation(db: Db, row: InvitationRow): Promise<void> {
  await db('invitations').insert(row);
}

export function findInvitationByTokenHash(db: Db, tokenHash: string): Promise<InvitationRow | undefined> {
  return db('invitations').where({ token_hash: tokenHash }).first();
}

export function findInvitation(db: Db, labId: string, id: string): Promise<InvitationRow | undefined> {
  return db('invitations').where({ lab_id: labId, id }).first();
}

/** Pending (unused, unrevoked, unexpired) invitations of an address to a lab. */
export function pendingInvitationsFor(db: Db, labId: string, email: string, now: number): Promise<InvitationRow[]> {
  return db('invitations')
    .where({ lab_id: labId, email })
    .whereNull('used_at')
    .whereNull('revoked_at')
    .where('expires_at', '>', now);
}

export async function revokeInvitationRow(db: Db, id: string, now: number): Promise<boolean> {
  const n = await db('invitations').where({ id }).whereNull('used_at').whereNull('revoked_at').update({ revoked_at: now });
  return n === 1;
}

/** Spends the invitation; false when it was already used, revoked or has expired. */
/** Marks an open invitation used; false when another request spent, revoked or outlived it first. */
export async function claimInvitation(db: Db, id: string, now: number): Promise<boolean> {
  const n = await db('invitations')
    .where({ id })
    .whereNull('used_at')
    .whereNull('revoked_at')
    .where('expires_at', '>', now)
    .update({ used_at: now });
  return n === 1;
}

export async function setInvitationAcceptedUser(db: Db, id: string, userId: string): Promise<void> {
  await db('invitations').where({ id }).update({ accepted_user_id: userId });
}

export type InvitationStatus = 'pending' | 'accepted' | 'revoked' | 'expired';

function byStatus(q: ReturnType<Db>, status: InvitationStatus | undefined, now: number) {
  if (status === 'accepted') q.whereNotNull('invitations.used_at');
  if (status === 'revoked') q.whereNotNull('invitations.revoked_at');
  if (status === 'pending' || status === 'expired') {
    q.whereNull('invitations.used_at').whereNull('invitations.revoked_at');
    q.where('invitations.expires_at', status === 'pending' ? '>' : '<=', now);
  }
  return q;
}

export async function listInvitations(
  db: Db,
  labId: string,
  f: { status?: InvitationStatus; limit: number; offset: number },
  now: number,
): Promise<{ rows: (InvitationRow & { inviter_name: string | null })[]; total: number }> {
  const base = () => byStatus(db('invitations').where('invitations.lab_id', labId), f.status, now);
  const count = await base().count({ n: '*' }).first();
  const rows = await base()
    .leftJoin('users', 'users.id', 'invitations.invited_by')
    .orderBy([{ column: 'invitations.created_at', order: 'desc' }, { column: 'invitations.id', order: 'asc' }])
    .limit(f.limit)
    .offset(f.offset)
    .select('invitations.*', 'users.display_name as inviter_name');
  return { rows, total: Number(count?.n ?? 0) };
}

// ---- password resets ------------------------------------------------------------------------

export interface PasswordResetRow {
  id: string;
  user_id: string;
  token_hash: string;
  created_at: number;
  expires_at: number;
  used_at: number | null;
}

export async function insertPasswordReset(db: Db, row: PasswordResetRow): Promise<void> {
  await db('password_resets').insert(row);
}

export function findPasswordResetByTokenHash(db: Db, tokenHash: string): Promise<PasswordResetRow | undefined> {
  return db('password_resets').where({ token_hash: tokenHash }).first();
}

/** Spends this reset and every other open reset of the same user; false if this one was not open. */
export async function spendPasswordReset(db: Db, row: PasswordResetRow, now: number): Promise<boolean> {
  const n = await db('password_resets').where({ id: row.id }).whereNull('used_at').where('expires_at', '>', now).update({ used_at: now });
  if (n !== 1) return false;
  await db('password_resets').where({ user_id: row.user_id }).whereNull('used_at').update({ used_at: now });
  return true;
}

/** Ends every open reset link of a user (a newer request replaces them); returns how many. */
export function closeOpenPasswordResets(db: Db, userId: string, now: number): Promise<number> {
  return db('password_resets').where({ user_id: userId }).whereNull('used_at').where('expires_at', '>', now).update({ used_at: now });
}

/** The invitation by which a user joined a lab (the newest accepted one), with its inviter. */
export function acceptedInvitationOf(db: Db, labId: string, userId: string): Promise<
  { invited_by: string | null; inviter_name: string | null; inviter_email: string | null; created_at: number; used_at: number } | undefined
> {
  return db({ i: 'invitations' })
    .leftJoin({ u: 'users' }, 'u.id', 'i.invited_by')
    .where({ 'i.lab_id': labId, 'i.accepted_user_id': userId })
    .whereNotNull('i.used_at')
    .orderBy('i.used_at', 'desc')
    .first('i.invited_by', 'u.display_name as inviter_name', 'u.email as inviter_email', 'i.created_at', 'i.used_at');
}
