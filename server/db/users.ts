/** Repository of labs, users and memberships. */
import { randomUUID } from 'node:crypto';
import type { Role } from '@/shared/api/auth';
import type { Db } from './knex';

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

export async function addMembership(db: Db, m: { labId: string; userId: string; role: Role }): Promise<void> {
  await db('memberships').insert({ lab_id: m.labId, user_id: m.userId, role: m.role, created_at: Date.now() });
}

export function findUserById(db: Db, id: string): Promise<UserRow | undefined> {
  return db('users').where({ id }).whereNull('disabled_at').first();
}

/** Every account's e-mail and password hash (the production start-up check reads them). */
export function listPasswordHashes(db: Db): Promise<{ email: string; password_hash: string | null }[]> {
  return db('users').select('email', 'password_hash');
}
