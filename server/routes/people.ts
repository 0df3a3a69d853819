/** Members of a lab and their roles: /api/v1/labs/:labId/members. */
import { Router } from 'express';
import { changeRoleRequestSchema, memberListQuerySchema, memberListSchema, memberSchema } from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { changeMemberRole, listLabMembers, removeMember } from '../services/members';
import { parseBody } from './parse';

export function peopleRoutes(deps: AppDeps): Router {
  const r = Router();
  labRoute(r, deps.db, {
    method: 'get', path: '/labs/:labId/members', action: 'members.read',
    summary: 'List the members of a lab (paged, sorted, filtered by name, e-mail or role)',
    query: memberListQuerySchema, response: memberListSchema,
  }, async (req, res) => {
    res.json(await listLabMembers(deps.db, req.lab.id, parseBody(memberListQuerySchema, req.query)));
  });
  labRoute(r, deps.db, {
    method: 'patch', path: '/labs/:labId/members/:userId', action: 'members.change-role',
    summary: "Change a member's role (the last admin cannot be demoted)",
    body: changeRoleRequestSchema, response: memberSchema,
  }, async (req, res) => {
    const { role } = parseBody(changeRoleRequestSchema, req.body);
    res.json(await changeMemberRole(deps.db, { labId: req.lab.id, userId: String(req.params.userId), role, actorUserId: req.user.id, at: deps.clock.now() }));
  });
  labRoute(r, deps.db, {
    method: 'delete', path: '/labs/:labId/members/:userId', action: 'members.remove',
    summary: 'Remove a member from the lab (the last admin cannot be removed)', status: 204,
  }, async (req, res) => {
    await removeMember(deps.db, { labId: req.lab.id, userId: String(req.params.userId), actorUserId: req.user.id, at: deps.clock.now() });
    res.status(204).end();
  });
  return r;
}
