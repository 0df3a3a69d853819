/** Repository of labs, users and memberships. */
import { randomUUID } from 'node:crypto';
import type { Role } from '@/shared/api/auth';
import type { Db } from './knex';
import { insertRoleChange } from './role-history';

export interface UserRow {
  id: string;
  email: string;
  display_name: string;
  password_hash: string | null;
  created_at: number;
  disabled_at: number | null;
}

export function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  return db('users').where({ email: email.toLowerCase() }).whereNull('disabled_at').first();
}

export function listMemberships(db: Db, userId: string): Promise<{ lab_id: string; lab_name: string; role: Role }[]> {
  return db('memberships')
    .join('labs', 'labs.id', 'memberships.lab_id')
    .where('memberships.user_id', userId)
    .orderBy('labs.name')
    .select('memberships.lab_id', 'labs.name as lab_name', 'memberships.role');
}

export function findLabBySlug(db: Db, slug: string): Promise<{ id: string; name: string } | undefined> {
  return db('labs').where({ slug }).first('id', 'name');
}

export async function insertLab(db: Db, lab: { name: string; slug: string }): Promise<string> {
  const id = randomUUID();
  await db('labs').insert({ id, name: lab.name, slug: lab.slug, created_at: Date.now() });
  return id;
}

export async function insertUser(
  db: Db,
  user: { email: string; displayName: string; passwordHash: string | null },
): Promise<string> {
  const id = randomUUID();
  await db('users').insert({
    id,
    email: user.email.toLowerCase(),
    display_name: user.displayName,
    password_hash: user.passwordHash,
    created_at: Date.now(),
  });
  return id;
}

/** Adds a member and records the join in the role history (`by`: who granted it; null = the operator). */
export async function addMembership(db: Db, m: { labId: string; userId: string; role: Role; by?: string | null; at?: number }): Promise<void> {
  const at = m.at ?? Date.now();
  await db('memberships').insert({ lab_id: m.labId, user_id: m.userId, role: m.role, created_at: at });
  await insertRoleChange(db, { labId: m.labId, userId: m.userId, from: null, to: m.role, by: m.by ?? null, at });
}

export function findUserById(db: Db, id: string): Promise<UserRow | undefined> {
  return db('users').where({ id }).whereNull('disabled_at').first();
}

/** Every account's e-mail and password hash (the production start-up check reads them). */
export function listPasswordHashes(db: Db): Promise<{ email: string; password_hash: string | null }[]> {
  return db('users').select('email', 'password_hash');
}

/** A user by id, disabled ones included (a signature names its signer for good). */
export function findAnyUserById(db: Db, id: string): Promise<UserRow | undefined> {
  return db('users').where({ id }).first();
}
