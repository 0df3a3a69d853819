/**
 * /labs/:labId/standards: the lab's register of approved standards (filter by scope: structure
 * type, band, damping, excitation; status; review due), one standard, retire, re-verify.
 */
import { Router } from 'express';
import { z } from 'zod';
import { retireSchema, reverifySchema, standardListQuerySchema, standardListSchema, standardSchema } from '@/shared/api/approval';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { reverifyStandard } from '../services/reverify';
import { getStandard, listLabStandards, retireStandard } from '../services/standards';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });

export function standardRoutes(deps: Pick<AppDeps, 'db'>): Router {
  const r = Router();
  const { db } = deps;
  const base = '/labs/:labId/standards';
  labRoute(r, db, { method: 'get', path: base, action: 'standards.read', summary: 'The register of approved standards; which one covers a structure like this?', query: standardListQuerySchema, response: standardListSchema }, async (req, res) => {
    res.json(await listLabStandards(db, req.lab.id, parseBody(standardListQuerySchema, req.query)));
  });
  labRoute(r, db, { method: 'get', path: `${base}/:id`, action: 'standards.read', summary: 'One standard with its scope, signature and evidence', response: standardSchema }, async (req, res) => {
    res.json(await getStandard(db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, db, { method: 'post', path: `${base}/:id/retire`, action: 'standards.retire', summary: 'Retire an active standard (its record stays)', body: retireSchema, response: standardSchema }, async (req, res) => {
    const { reason } = parseBody(retireSchema, req.body);
    res.json(await retireStandard(db, req.lab.id, req.user.id, parseBody(idParam, req.params).id, reason));
  });
  labRoute(r, db, { method: 'post', path: `${base}/:id/reverify`, action: 'reverify.run', summary: "Re-run a standard's evidence on today's engine and compare line by line", response: reverifySchema }, async (req, res) => {
    res.json(await reverifyStandard(db, req.lab.id, req.user.id, parseBody(idParam, req.params).id));
  });
  return r;
}
