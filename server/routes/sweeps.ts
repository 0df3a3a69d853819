/** /labs/:labId/sweeps: start (202, runs in the background), list, read with progress, results, cancel. */
import { Router } from 'express';
import { z } from 'zod';
import { startSweepSchema, sweepListSchema, sweepResultsSchema, sweepSchema } from '@/shared/api/sweeps';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { AppError } from '../errors';
import type { StudyQueue } from '../jobs/scheduler';
import { cancelSweep, getSweep, getSweepResults, listLabSweeps, startSweep } from '../services/sweeps';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });

function queueOf(deps: AppDeps): StudyQueue {
  if (!deps.studyQueue) throw new AppError(503, 'studies_unavailable', 'Background studies are not running on this server.');
  return deps.studyQueue;
}

export function sweepRoutes(deps: AppDeps): Router {
  const r = Router();
  const base = '/labs/:labId/sweeps';
  labRoute(r, deps.db, { method: 'get', path: base, action: 'sweeps.read', summary: 'List the sweeps of a lab, newest first', response: sweepListSchema }, async (req, res) => {
    res.json(await listLabSweeps(deps.db, req.lab!.id));
  });
  labRoute(r, deps.db, { method: 'post', path: base, action: 'sweeps.start', summary: 'Start a sweep over a grid of settings; it runs in the background', body: startSweepSchema, response: sweepSchema, status: 202 }, async (req, res) => {
    const body = parseBody(startSweepSchema, req.body);
    res.status(202).json(await startSweep(deps.db, queueOf(deps), req.lab!.id, req.user!.id, body));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'sweeps.read', summary: 'A sweep with its progress', response: sweepSchema }, async (req, res) => {
    res.json(await getSweep(deps.db, deps.studyQueue, req.lab!.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/results`, action: 'sweeps.read', summary: 'Each grid point judged, with per-seed figures and the cheapest passing point', response: sweepResultsSchema }, async (req, res) => {
    res.json(await getSweepResults(deps.db, req.lab!.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'post', path: `${base}/:id/cancel`, action: 'sweeps.cancel', summary: 'Cancel a queued or running sweep', response: sweepSchema, status: 202 }, async (req, res) => {
    res.status(202).json(await cancelSweep(deps.db, queueOf(deps), req.lab!.id, req.user!.id, parseBody(idParam, req.params).id));
  });
  return r;
}
