/** /labs/:labId/systems: versioned known-answer systems (thin: parse, call the service, answer). */
import { Router } from 'express';
import { z } from 'zod';
import {
  systemCreateSchema,
  systemUpdateSchema,
  systemVersionSchema,
  resourceListQuerySchema,
  resourceListSchema,
  versionListSchema,
  versionParamSchema,
} from '@/shared/api/work';
import { parseSystemSpec } from '@/shared/engine/systems';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { resourceService } from '../services/versioned-resources';
import { parseBody } from './parse';

export const systems = resourceService({ kind: 'systems', noun: 'system', parse: (d) => parseSystemSpec(d) });
const idParam = z.object({ id: z.string() });

export function systemRoutes(deps: Pick<AppDeps, 'db'>): Router {
  const r = Router();
  const base = '/labs/:labId/systems';
  labRoute(r, deps.db, { method: 'get', path: base, action: 'systems.read', summary: 'List the systems of a lab', query: resourceListQuerySchema, response: resourceListSchema }, async (req, res) => {
    res.json(await systems.list(deps.db, req.lab.id, parseBody(resourceListQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'post', path: base, action: 'systems.write', summary: 'Create a system (version 1)', body: systemCreateSchema, response: systemVersionSchema, status: 201 }, async (req, res) => {
    res.status(201).json(await systems.create(deps.db, req.lab.id, req.user.id, parseBody(systemCreateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'systems.read', summary: 'The latest version of a system', response: systemVersionSchema }, async (req, res) => {
    res.json(await systems.get(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'put', path: `${base}/:id`, action: 'systems.write', summary: 'Change a system: stores a new version', body: systemUpdateSchema, response: systemVersionSchema }, async (req, res) => {
    res.json(await systems.update(deps.db, req.lab.id, req.user.id, parseBody(idParam, req.params).id, parseBody(systemUpdateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions`, action: 'systems.read', summary: 'Every version of a system, newest first', response: versionListSchema }, async (req, res) => {
    res.json(await systems.versions(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions/:version`, action: 'systems.read', summary: 'One version of a system', response: systemVersionSchema }, async (req, res) => {
    const { version } = parseBody(versionParamSchema, req.params);
    res.json(await systems.get(deps.db, req.lab.id, parseBody(idParam, req.params).id, version));
  });
  return r;
}
