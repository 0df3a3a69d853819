/**
 * Invitations: an admin invites an e-mail address with a role; the invitee gets a mail with a
 * single-use link that expires after 72 h, and accepting it creates the account (or, for an
 * address that already has one, adds the membership after checking its current password).
 * Tokens are 256 random bits; only their sha256 is stored.
 */
import { createHash, randomBytes, randomUUID, timingSafeEqual } from 'node:crypto';
import type { Role } from '@/shared/api/auth';
import { passwordProblem, type AcceptInvitationRequest, type Invitation, type InvitationPreview } from '@/shared/api/people';
import { hashPassword, verifyPassword } from '../auth/password';
import {
  findInvitation, findInvitationByTokenHash, insertInvitation, listInvitations, pendingInvitationsFor,
  revokeInvitationRow, claimInvitation, setInvitationAcceptedUser, type InvitationRow, type InvitationStatus,
} from '../db/invitations';
import type { Db } from '../db/knex';
import { findAnyUserByEmail, findLab, findMember, findMemberByEmail } from '../db/members';
import { addMembership, insertUser } from '../db/users';
import { AppError, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { recordAudit } from './audit';
import { displayNameClash } from './display-names';

export const INVITATION_HOURS = 72;

/** A new random token (base64url, 43 characters) and the sha256 hex that is stored. */
export function newToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: tokenHash(token) };
}

export const tokenHash = (token: string) => createHash('sha256').update(token, 'utf8').digest('hex');

/** Constant-time comparison of two hex digests (the lookup is by hash; this double-checks it). */
export function sameHash(a: string, b: string): boolean {
  const x = Buffer.from(a, 'hex');
  const y = Buffer.from(b, 'hex');
  return x.length === y.length && x.length > 0 && timingSafeEqual(x, y);
}

export function invitationStatus(row: InvitationRow, now = Date.now()): InvitationStatus {
  if (row.used_at) return 'accepted';
  if (row.revoked_at) return 'revoked';
  return row.expires_at <= now ? 'expired' : 'pending';
}

const toInvitation = (r: InvitationRow & { inviter_name?: string | null }, now: number): Invitation => ({
  id: r.id,
  email: r.email,
  role: r.role,
  status: invitationStatus(r, now),
  invitedBy: r.invited_by ? { userId: r.invited_by, displayName: r.inviter_name ?? '' } : null,
  createdAt: Number(r.created_at),
  expiresAt: Number(r.expires_at),
  usedAt: r.used_at === null ? null : Number(r.used_at),
});

interface Deps {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
}

export async function createInvitation(
  deps: Deps,
  input: { labId: string; email: string; role: Role; inviterId: string },
): Promise<Invitation> {
  const now = Date.now();
  if (await findMemberByEmail(deps.db, input.labId, input.email)) {
    throw new AppError(409, 'already_member', `${input.email} is already a member of this lab.`);
  }
  const lab = await findLab(deps.db, input.labId);
  if (!lab) throw notFound('The lab');
  const { token, hash } = newToken();
  const row: InvitationRow = {
    id: randomUUID(), lab_id: input.labId, email: input.email, role: input.role, token_hash: hash,
    invited_by: input.inviterId, created_at: now, expires_at: now + INVITATION_HOURS * 3600_000,
    used_at: null, accepted_user_id: null, revoked_at: null,
  };
  await deps.db.transaction(async (trx) => {
    // A new invitation replaces any earlier pending one of the same address.
    for (const old of await pendingInvitationsFor(trx, input.labId, input.email, now)) {
      await revokeInvitationRow(trx, old.id, now);
      await recordAudit(trx, { labId: input.labId, actorUserId: input.inviterId, action: 'invitations.revoke', targetType: 'invitation', targetId: old.id, after: { reason: 'replaced' } });
    }
    await insertInvitation(trx, row);
    await recordAudit(trx, {
      labId: input.labId, actorUserId: input.inviterId, action: 'invitations.create', targetType: 'invitation',
      targetId: row.id, after: { email: row.email, role: row.role, expiresAt: row.expires_at },
    });
  });
  const link = `${deps.publicUrl}/accept-invitation?token=${token}`;
  await deps.mailer.send({
    labId: input.labId,
    to: input.email,
    kind: 'invitation',
    secrets: [link],
    subject: `You are invited to ${lab.name} on Plumbline`,
    text:
      `You have been invited to join ${lab.name} on Plumbline as ${input.role}.\n\n` +
      `Open this link to accept and set your password (it works once and expires in ${INVITATION_HOURS} hours):\n${link}\n\n` +
      `If you did not expect this invitation, ignore this message.`,
  });
  return toInvitation(row, now);
}

export async function listLabInvitations(db: Db, labId: string, f: { status?: InvitationStatus; limit: number; offset: number }) {
  const now = Date.now();
  const { rows, total } = await listInvitations(db, labId, f, now);
  return { items: rows.map((r) => toInvitation(r, now)), total, limit: f.limit, offset: f.offset };
}

export async function revokeInvitation(db: Db, input: { labId: string; id: string; actorUserId: string }): Promise<void> {
  const row = await findInvitation(db, input.labId, input.id);
  if (!row) throw notFound('The invitation');
  await db.transaction(async (trx) => {
    if (!(await revokeInvitationRow(trx, row.id, Date.now()))) {
      throw new AppError(409, 'invitation_closed', `This invitation is already ${invitationStatus(row)}.`);
    }
    await recordAudit(trx, { labId: input.labId, actorUserId: input.actorUserId, action: 'invitations.revoke', targetType: 'invitation', targetId: row.id, before: { email: row.email, role: row.role } });
  });
}

/** The open invitation a token names, or the error the accept page shows. */
async function openInvitation(db: Db, token: string): Promise<InvitationRow> {
  const hash = tokenHash(token);
  const row = await findInvitationByTokenHash(db, hash);
  if (!row || !sameHash(row.token_hash, hash)) throw new AppError(404, 'invitation_not_found', 'This invitation link is not valid.');
  const status = invitationStatus(row);
  if (status === 'accepted') throw new AppError(410, 'invitation_used', 'This invitation has already been used. Sign in instead.');
  if (status === 'revoked') throw new AppError(410, 'invitation_revoked', 'This invitation was withdrawn. Ask the lab admin for a new one.');
  if (status === 'expired') throw new AppError(410, 'invitation_expired', 'This invitation has expired. Ask the lab admin for a new one.');
  return row;
}

export async function previewInvitation(db: Db, token: string): Promise<InvitationPreview> {
  const row = await openInvitation(db, token);
  const lab = await findLab(db, row.lab_id);
  // Whether the address has an account elsewhere is not said: the preview is the same either way.
  return { labName: lab?.name ?? '', email: row.email, role: row.role, expiresAt: Number(row.expires_at) };
}

/** Accepts an invitation; returns the user id to sign in. */
export async function acceptInvitation(db: Db, token: string, input: AcceptInvitationRequest): Promise<{ userId: string; labId: string }> {
  const inv = await openInvitation(db, token);
  const existing = await findAnyUserByEmail(db, inv.email);
  let newAccount: { passwordHash: string; displayName: string } | null = null;
  if (existing) {
    if (existing.disabled_at) throw new AppError(409, 'account_disabled', 'This account is disabled. Ask the lab admin.');
    if (!existing.password_hash || !(await verifyPassword(existing.password_hash, input.password))) {
      throw new AppError(401, 'wrong_credentials', 'This address already has an account: enter its current password.');
    }
  } else {
    if (!input.displayName) throw new AppError(400, 'invalid_request', 'Enter your name to create your account.', { fields: [{ path: 'displayName', message: 'Enter your name' }] });
    const problem = passwordProblem(input.password, inv.email);
    if (problem) throw new AppError(400, 'weak_password', `password: ${problem}`, { fields: [{ path: 'password', message: problem }] });
    newAccount = { passwordHash: await hashPassword(input.password), displayName: input.displayName };
  }
  // A simultaneous accept of the same link may have won while this one hashed its password: the
  // loser is told the link is used (410), not that the name it chose is now taken.
  await openInvitation(db, token);
  const clash = await displayNameClash(db, inv.lab_id, existing ? existing.display_name : newAccount!.displayName, existing?.id ?? null);
  if (clash) {
    await recordAudit(db, {
      labId: inv.lab_id, actorUserId: existing?.id ?? null, action: 'invitations.accept-refused', targetType: 'invitation', targetId: inv.id,
      after: { refused: clash.code, message: clash.message, email: inv.email, displayName: existing ? existing.display_name : newAccount!.displayName },
    });
    throw clash;
  }
  return db.transaction(async (trx) => {
    // Simultaneous accepts of one link: the invitation is spent first, so the losers get 410
    // before any account is written (inserting first made them fail on the unique e-mail: 500).
    const used = () => new AppError(410, 'invitation_used', 'This invitation has already been used. Sign in instead.');
    if (!(await claimInvitation(trx, inv.id, Date.now()))) throw used();
    if (!existing && (await findAnyUserByEmail(trx, inv.email))) throw used();
    const userId = existing
      ? existing.id
      : await insertUser(trx, { email: inv.email, displayName: newAccount!.displayName, passwordHash: newAccount!.passwordHash });
    await setInvitationAcceptedUser(trx, inv.id, userId);
    await recordAudit(trx, { labId: inv.lab_id, actorUserId: userId, action: 'invitations.accept', targetType: 'invitation', targetId: inv.id, after: { newAccount: !existing } });
    if (!(await findMember(trx, inv.lab_id, userId))) {
      await addMembership(trx, { labId: inv.lab_id, userId, role: inv.role, by: inv.invited_by });
      await recordAudit(trx, { labId: inv.lab_id, actorUserId: userId, action: 'members.add', targetType: 'user', targetId: userId, after: { email: inv.email, role: inv.role } });
    }
    return { userId, labId: inv.lab_id };
  });
}
