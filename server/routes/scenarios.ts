/** /labs/:labId/scenarios: versioned scenarios (system, acquisition, excitation, error sources). */
import { Router } from 'express';
import { z } from 'zod';
import {
  scenarioCreateSchema,
  scenarioUpdateSchema,
  scenarioVersionSchema,
  resourceListQuerySchema,
  resourceListSchema,
  versionListSchema,
  versionParamSchema,
} from '@/shared/api/work';
import { parseScenario } from '@/shared/engine/scenario';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { resourceService } from '../services/versioned-resources';
import { parseBody } from './parse';

export const scenarios = resourceService({ kind: 'scenarios', noun: 'scenario', parse: parseScenario });
const idParam = z.object({ id: z.string() });

export function scenarioRoutes(deps: Pick<AppDeps, 'db'>): Router {
  const r = Router();
  const base = '/labs/:labId/scenarios';
  labRoute(r, deps.db, { method: 'get', path: base, action: 'scenarios.read', summary: 'List the scenarios of a lab', query: resourceListQuerySchema, response: resourceListSchema }, async (req, res) => {
    res.json(await scenarios.list(deps.db, req.lab.id, parseBody(resourceListQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'post', path: base, action: 'scenarios.write', summary: 'Create a scenario (version 1)', body: scenarioCreateSchema, response: scenarioVersionSchema, status: 201 }, async (req, res) => {
    res.status(201).json(await scenarios.create(deps.db, req.lab.id, req.user.id, parseBody(scenarioCreateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'scenarios.read', summary: 'The latest version of a scenario', response: scenarioVersionSchema }, async (req, res) => {
    res.json(await scenarios.get(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'put', path: `${base}/:id`, action: 'scenarios.write', summary: 'Change a scenario: stores a new version', body: scenarioUpdateSchema, response: scenarioVersionSchema }, async (req, res) => {
    res.json(await scenarios.update(deps.db, req.lab.id, req.user.id, parseBody(idParam, req.params).id, parseBody(scenarioUpdateSchema, req.body)));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions`, action: 'scenarios.read', summary: 'Every version of a scenario, newest first', response: versionListSchema }, async (req, res) => {
    res.json(await scenarios.versions(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/versions/:version`, action: 'scenarios.read', summary: 'One version of a scenario', response: scenarioVersionSchema }, async (req, res) => {
    const { version } = parseBody(versionParamSchema, req.params);
    res.json(await scenarios.get(deps.db, req.lab.id, parseBody(idParam, req.params).id, version));
  });
  return r;
}
