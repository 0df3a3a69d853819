/**
 * Who a signer is: the account's display name and e-mail, and how it came to the lab (an accepted
 * invitation, from whom and when; or the operator: seeded or created outside the product). Shown
 * with every signature, so a reader can tell two people of similar names apart and see who let
 * the signer in.
 */
import type { AccountOrigin, Signer } from '@/shared/api/approval';
import { acceptedInvitationOf } from '../db/invitations';
import type { Db } from '../db/knex';
import { firstJoined } from '../db/role-history';
import { findAnyUserById } from '../db/users';

const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);

export async function accountOrigin(db: Db, labId: string, userId: string): Promise<AccountOrigin> {
  const inv = await acceptedInvitationOf(db, labId, userId);
  if (inv) {
    const invitedBy = inv.invited_by ? { id: inv.invited_by, displayName: inv.inviter_name ?? '', email: inv.inviter_email ?? '' } : null;
    const by = invitedBy ? `${invitedBy.displayName} (${invitedBy.email})` : 'an admin no longer on record';
    return {
      kind: 'invitation', invitedBy, invitedAt: Number(inv.created_at), joinedAt: Number(inv.used_at),
      text: `invited by ${by} on ${day(Number(inv.created_at))}, accepted ${day(Number(inv.used_at))}`,
    };
  }
  const joined = await firstJoined(db, labId, userId);
  return {
    kind: 'operator', invitedBy: null, invitedAt: null, joinedAt: joined,
    text: `added by the operator (seeded or created outside Plumbline)${joined === null ? '' : ` on ${day(joined)}`}, not by an invitation`,
  };
}

export async function signerOf(db: Db, labId: string, userId: string): Promise<Signer> {
  const user = await findAnyUserById(db, userId);
  return { id: userId, displayName: user?.display_name ?? '(unknown account)', email: user?.email ?? '', origin: await accountOrigin(db, labId, userId) };
}

/** "Dana Whitcombe <reviewer@harborridge.test>, added by the operator … on 2026-12-05". */
export const signerText = (s: Signer) => `${s.displayName} <${s.email}>, ${s.origin.text}`;
