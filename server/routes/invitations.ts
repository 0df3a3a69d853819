/** Invitations: created, listed and revoked by a lab admin; previewed and accepted by the invitee. */
import { Router } from 'express';
import { meResponseSchema } from '@/shared/api/auth';
import {
  acceptInvitationRequestSchema, createInvitationRequestSchema, invitationListQuerySchema, invitationListSchema,
  invitationPreviewSchema, invitationSchema,
} from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { labRoute, openRoute } from '../auth/permissions';
import { acceptInvitation, createInvitation, listLabInvitations, previewInvitation, revokeInvitation } from '../services/invitations';
import { describeUser } from '../services/sign-in';
import { parseBody } from './parse';

export function invitationRoutes(deps: AppDeps): Router {
  const r = Router();
  const { db } = deps;
  labRoute(r, db, {
    method: 'post', path: '/labs/:labId/invitations', action: 'members.invite',
    summary: 'Invite an e-mail address to the lab with a role (mails a single-use link valid 72 h)',
    body: createInvitationRequestSchema, response: invitationSchema, status: 201,
  }, async (req, res) => {
    const input = parseBody(createInvitationRequestSchema, req.body);
    const invitation = await createInvitation(
      { db, mailer: deps.mailer, publicUrl: deps.config.publicUrl },
      { labId: req.lab.id, email: input.email, role: input.role, inviterId: req.user.id },
    );
    res.status(201).json(invitation);
  });
  labRoute(r, db, {
    method: 'get', path: '/labs/:labId/invitations', action: 'invitations.read',
    summary: "List the lab's invitations, newest first", query: invitationListQuerySchema, response: invitationListSchema,
  }, async (req, res) => {
    res.json(await listLabInvitations(db, req.lab.id, parseBody(invitationListQuerySchema, req.query)));
  });
  labRoute(r, db, {
    method: 'delete', path: '/labs/:labId/invitations/:invitationId', action: 'invitations.revoke',
    summary: 'Revoke a pending invitation', status: 204,
  }, async (req, res) => {
    await revokeInvitation(db, { labId: req.lab.id, id: String(req.params.invitationId), actorUserId: req.user.id });
    res.status(204).end();
  });
  openRoute(r, {
    method: 'get', path: '/invitations/:token', action: 'public',
    summary: 'What an invitation link offers (lab, address, role), before accepting', response: invitationPreviewSchema,
  }, async (req, res) => {
    res.json(await previewInvitation(db, String(req.params.token)));
  });
  openRoute(r, {
    method: 'post', path: '/invitations/:token/accept', action: 'public',
    summary: 'Accept an invitation: creates the account (or adds the membership) and signs in',
    body: acceptInvitationRequestSchema, response: meResponseSchema,
  }, async (req, res) => {
    const input = parseBody(acceptInvitationRequestSchema, req.body);
    const { userId } = await acceptInvitation(db, String(req.params.token), input);
    if (req.session) await deps.auth.invalidateSession(req.session.id);
    const session = await deps.auth.createSession(userId, { createdAt: Date.now() });
    res.append('Set-Cookie', deps.auth.createSessionCookie(session.id).serialize());
    res.json(await describeUser(db, userId));
  });
  return r;
}
