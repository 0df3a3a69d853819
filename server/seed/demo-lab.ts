/**
 * The demo lab of the product brief (invented): Harbor Ridge Test Lab with five people. Runs once;
 * a second run finds the lab and does nothing.
 */
import type { Role } from '@/shared/api/auth';
import { hashPassword } from '../auth/password';
import type { Db } from '../db/knex';
import { addMembership, findLabBySlug, insertLab, insertUser } from '../db/users';
import { recordAudit } from '../services/audit';

export const DEMO_LAB = { name: 'Harbor Ridge Test Lab', slug: 'harbor-ridge' };

export const DEMO_USERS: { email: string; displayName: string; role: Role }[] = [
  { email: 'admin@harborridge.test', displayName: 'Mara Okafor', role: 'admin' },
  { email: 'analyst@harborridge.test', displayName: 'Tomas Lindqvist', role: 'analyst' },
  { email: 'analyst2@harborridge.test', displayName: 'Priya Venkat', role: 'analyst' },
  { email: 'reviewer@harborridge.test', displayName: 'Dana Whitcombe', role: 'reviewer' },
  { email: 'auditor@harborridge.test', displayName: 'Felix Aranda', role: 'auditor' },
];

/** Seeds the demo lab if it is absent. Returns true when it seeded. */
export async function seedDemoLab(db: Db, password: string): Promise<boolean> {
  const existing = await findLabBySlug(db, DEMO_LAB.slug);
  if (existing) return false;
  const passwordHash = await hashPassword(password);
  await db.transaction(async (trx) => {
    const labId = await insertLab(trx, DEMO_LAB);
    // The seed is the first entry of the lab's audit trail (actor: none, the system).
    await recordAudit(trx, { labId, actorUserId: null, action: 'lab.create', targetType: 'lab', targetId: labId, after: { ...DEMO_LAB, seed: true } });
    for (const u of DEMO_USERS) {
      const userId = await insertUser(trx, { email: u.email, displayName: u.displayName, passwordHash });
      await addMembership(trx, { labId, userId, role: u.role });
      await recordAudit(trx, { labId, actorUserId: null, action: 'members.add', targetType: 'user', targetId: userId, after: { email: u.email, role: u.role } });
    }
  });
  return true;
}
