/**
 * A lab's members: listing (paged, sorted and filtered in SQL), changing a role, removing a member.
 * A lab always keeps at least one admin: demoting or removing the last one is refused. No one
 * changes their own role to one that may decide reviews (administration and approval stay apart:
 * docs/approval.md). Every change lands in the role history; every refusal in the audit trail.
 */
import type { Role } from '@/shared/api/auth';
import { can } from '../auth/permissions';
import type { Lab, Member, MemberList, MemberListQuery, UpdateLabRequest } from '@/shared/api/people';
import type { Db } from '../db/knex';
import { countAdmins, deleteMembership, findLab, findMember, listMembers, setMemberRole, updateLab, type MemberRow } from '../db/members';
import { AppError, notFound } from '../errors';
import { recordAudit } from './audit';

const toMember = (r: MemberRow): Member => ({
  userId: r.user_id,
  email: r.email,
  displayName: r.display_name,
  role: r.role,
  joinedAt: Number(r.created_at),
});

export async function listLabMembers(db: Db, labId: string, query: MemberListQuery): Promise<MemberList> {
  const { rows, total } = await listMembers(db, labId, query);
  return { items: rows.map(toMember), total, limit: query.limit, offset: query.offset };
}

const lastAdmin = () =>
  new AppError(409, 'last_admin', 'A lab needs at least one admin: make someone else admin first.');

const selfGrant = (role: Role) =>
  new AppError(403, 'self_grant_refused', `You cannot give yourself the ${role} role: a ${role} decides reviews, and the one who administers the lab must not approve its work. Ask another admin.`);

/** Records a refused change of a member in its own transaction (the refusal is kept) and throws it. */
async function refuse(db: Db, input: { labId: string; userId: string; actorUserId: string }, action: string, err: AppError, detail: object): Promise<never> {
  await recordAudit(db, { labId: input.labId, actorUserId: input.actorUserId, action, targetType: 'user', targetId: input.userId, after: { refused: err.code, message: err.message, ...detail } });
  throw err;
}

export async function changeMemberRole(
  db: Db,
  input: { labId: string; userId: string; role: Role; actorUserId: string; at: number },
): Promise<Member> {
  if (input.userId === input.actorUserId && can(input.role, 'reviews.decide')) {
    return refuse(db, input, 'members.change-role-refused', selfGrant(input.role), { role: input.role });
  }
  const outcome = await db.transaction(async (trx) => {
    const member = await findMember(trx, input.labId, input.userId);
    if (!member) throw notFound('The member');
    if (member.role === input.role) return toMember(member);
    if (member.role === 'admin' && (await countAdmins(trx, input.labId)) <= 1) return { refusal: lastAdmin(), from: member.role };
    await setMemberRole(trx, { labId: input.labId, userId: input.userId, from: member.role, to: input.role, by: input.actorUserId, at: input.at });
    await recordAudit(trx, {
      labId: input.labId, actorUserId: input.actorUserId, action: 'members.change-role', targetType: 'user',
      targetId: input.userId, before: { role: member.role }, after: { role: input.role }, at: input.at,
    });
    return toMember({ ...member, role: input.role });
  });
  if ('refusal' in outcome) return refuse(db, input, 'members.change-role-refused', outcome.refusal, { from: outcome.from, role: input.role });
  return outcome;
}

export async function removeMember(db: Db, input: { labId: string; userId: string; actorUserId: string; at: number }): Promise<void> {
  const refusal = await db.transaction(async (trx) => {
    const member = await findMember(trx, input.labId, input.userId);
    if (!member) throw notFound('The member');
    if (member.role === 'admin' && (await countAdmins(trx, input.labId)) <= 1) return lastAdmin();
    await deleteMembership(trx, { labId: input.labId, userId: input.userId, from: member.role, by: input.actorUserId, at: input.at });
    await recordAudit(trx, {
      labId: input.labId, actorUserId: input.actorUserId, action: 'members.remove', targetType: 'user',
      targetId: input.userId, before: { email: member.email, role: member.role }, at: input.at,
    });
    return null;
  });
  if (refusal) await refuse(db, input, 'members.remove-refused', refusal, {});
}

export async function describeLab(db: Db, labId: string, role: Role): Promise<Lab> {
  const lab = await findLab(db, labId);
  if (!lab) throw notFound('The lab');
  return {
    id: lab.id, name: lab.name, slug: lab.slug, reportFooter: lab.report_footer ?? '',
    createdAt: Number(lab.created_at), updatedAt: lab.updated_at === null ? null : Number(lab.updated_at), role,
  };
}

export async function updateLabSettings(
  db: Db,
  input: { labId: string; role: Role; actorUserId: string; patch: UpdateLabRequest },
): Promise<Lab> {
  await db.transaction(async (trx) => {
    const lab = await findLab(trx, input.labId);
    if (!lab) throw notFound('The lab');
    const patch: { name?: string; report_footer?: string } = {};
    const before: Record<string, string> = {};
    if (input.patch.name !== undefined && input.patch.name !== lab.name) {
      patch.name = input.patch.name;
      before.name = lab.name;
    }
    if (input.patch.reportFooter !== undefined && input.patch.reportFooter !== lab.report_footer) {
      patch.report_footer = input.patch.reportFooter;
      before.reportFooter = lab.report_footer;
    }
    if (Object.keys(patch).length === 0) return;
    await updateLab(trx, input.labId, patch);
    const after = { ...(patch.name !== undefined && { name: patch.name }), ...(patch.report_footer !== undefined && { reportFooter: patch.report_footer }) };
    await recordAudit(trx, { labId: input.labId, actorUserId: input.actorUserId, action: 'lab.settings', targetType: 'lab', targetId: input.labId, before, after });
  });
  return describeLab(db, input.labId, input.role);
}
