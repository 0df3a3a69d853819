/**
 * Events of a person's account (sign-ins, failed sign-ins, password reset requests and resets)
 * belong to the operator's lab-less trail and to the trail of every lab the person is a member
 * of at that moment, so each lab's admin and auditor read them in that lab's audit trail
 * (action "auth.*") without seeing anything of another lab. A failed sign-in for an address
 * with no account stays in the lab-less trail only.
 */
import type { Db } from '../db/knex';
import { listMemberships } from '../db/users';
import { recordAudit, type AuditEvent } from './audit';

export async function recordAccountEvent(db: Db, userId: string | null, event: Omit<AuditEvent, 'labId'>): Promise<void> {
  if (!db.isTransaction) return db.transaction((trx) => recordAccountEvent(trx, userId, event));
  await recordAudit(db, { ...event, labId: null });
  if (!userId) return;
  for (const m of await listMemberships(db, userId)) await recordAudit(db, { ...event, labId: m.lab_id });
}
