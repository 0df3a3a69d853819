/**
 * Repository of member_role_changes: every role a member held in a lab, who granted it and when.
 * Append-only (triggers refuse UPDATE and DELETE). from_role NULL = joined, to_role NULL = left.
 */
import type { Role } from '@/shared/api/auth';
import type { Db } from './knex';

export interface RoleChange {
  labId: string;
  userId: string;
  from: Role | null;
  to: Role | null;
  /** Who granted the change; null for the operator (seed, command line) or the system. */
  by: string | null;
  at: number;
}

export async function insertRoleChange(db: Db, c: RoleChange): Promise<void> {
  await db('member_role_changes').insert({ lab_id: c.labId, user_id: c.userId, from_role: c.from, to_role: c.to, by_user_id: c.by, at: c.at });
}

/** When the member last stopped holding `role` in the lab (or null if they never gave it up). */
export async function lastLeftRole(db: Db, labId: string, userId: string, role: Role): Promise<number | null> {
  const row = await db('member_role_changes').where({ lab_id: labId, user_id: userId, from_role: role }).max({ at: 'at' }).first();
  return row?.at === null || row?.at === undefined ? null : Number(row.at);
}

/** When the member first joined the lab (null when the history does not hold it). */
export async function firstJoined(db: Db, labId: string, userId: string): Promise<number | null> {
  const row = await db('member_role_changes').where({ lab_id: labId, user_id: userId }).whereNull('from_role').min({ at: 'at' }).first();
  return row?.at === null || row?.at === undefined ? null : Number(row.at);
}
