/** The lab itself and its settings: /api/v1/labs/:labId. */
import { Router } from 'express';
import { labSchema, updateLabRequestSchema } from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { describeLab, updateLabSettings } from '../services/members';
import { parseBody } from './parse';

export function labRoutes(deps: AppDeps): Router {
  const r = Router();
  labRoute(r, deps.db, {
    method: 'get', path: '/labs/:labId', action: 'lab.read',
    summary: "The lab's name and settings, and the caller's role in it", response: labSchema,
  }, async (req, res) => {
    res.json(await describeLab(deps.db, req.lab.id, req.lab.role));
  });
  labRoute(r, deps.db, {
    method: 'patch', path: '/labs/:labId', action: 'lab.settings',
    summary: "Change the lab's name or report footer", body: updateLabRequestSchema, response: labSchema,
  }, async (req, res) => {
    const patch = parseBody(updateLabRequestSchema, req.body);
    res.json(await updateLabSettings(deps.db, { labId: req.lab.id, role: req.lab.role, actorUserId: req.user.id, patch }));
  });
  return r;
}
