/**
 * /labs/:labId/studies: start (202, runs in the background), list, read with progress, runs,
 * results, progress as server-sent events, cancel.
 */
import { Router, type Response } from 'express';
import { z } from 'zod';
import {
  runListSchema,
  startStudySchema,
  studyListQuerySchema,
  studyListSchema,
  studyResultsSchema,
  studySchema,
  type StudyEvent,
} from '@/shared/api/work';
import type { AppDeps } from '../deps';
import { labRoute, type LabRequest } from '../auth/permissions';
import { AppError } from '../errors';
import type { StudyQueue } from '../jobs/scheduler';
import { cancelStudy, getStudy, listLabStudies, listStudyRuns, startStudy } from '../services/studies';
import { getStudyResults } from '../services/study-results';
import { parseBody } from './parse';

const idParam = z.object({ id: z.string() });
const HEARTBEAT_MS = 15_000;

function queueOf(deps: AppDeps): StudyQueue {
  if (!deps.studyQueue) throw new AppError(503, 'studies_unavailable', 'Background studies are not running on this server.');
  return deps.studyQueue;
}

export function studyRoutes(deps: AppDeps): Router {
  const r = Router();
  const base = '/labs/:labId/studies';
  labRoute(r, deps.db, { method: 'get', path: base, action: 'studies.read', summary: 'List the studies of a lab', query: studyListQuerySchema, response: studyListSchema }, async (req, res) => {
    res.json(await listLabStudies(deps.db, req.lab.id, parseBody(studyListQuerySchema, req.query)));
  });
  labRoute(r, deps.db, { method: 'post', path: base, action: 'studies.start', summary: 'Start a study; it runs in the background', body: startStudySchema, response: studySchema, status: 202 }, async (req, res) => {
    const body = parseBody(startStudySchema, req.body);
    res.status(202).json(await startStudy(deps.db, queueOf(deps), req.lab.id, req.user.id, body));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id`, action: 'studies.read', summary: 'A study with its progress', response: studySchema }, async (req, res) => {
    res.json(await getStudy(deps.db, deps.studyQueue, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/runs`, action: 'studies.read', summary: 'The stored runs of a study, in order', response: runListSchema }, async (req, res) => {
    res.json(await listStudyRuns(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/results`, action: 'studies.read', summary: 'Aggregated results, criteria and per-line curves', response: studyResultsSchema }, async (req, res) => {
    res.json(await getStudyResults(deps.db, req.lab.id, parseBody(idParam, req.params).id));
  });
  labRoute(r, deps.db, { method: 'get', path: `${base}/:id/events`, action: 'studies.read', summary: 'Progress as server-sent events (progress…, then end)', produces: 'text/event-stream' }, async (req, res) => {
    await streamEvents(deps, req, res, parseBody(idParam, req.params).id);
  });
  labRoute(r, deps.db, { method: 'post', path: `${base}/:id/cancel`, action: 'studies.cancel', summary: 'Cancel a queued or running study', response: studySchema, status: 202 }, async (req, res) => {
    res.status(202).json(await cancelStudy(deps.db, queueOf(deps), req.lab.id, req.user.id, parseBody(idParam, req.params).id));
  });
  return r;
}

/** Server-sent events: the current progress at once, each change, and a final `end` event. */
async function streamEvents(deps: AppDeps, req: LabRequest, res: Response, id: string) {
  const queue = deps.studyQueue;
  const pending: StudyEvent[] = [];
  let ready = false;
  let closed = false;
  const send = (e: StudyEvent) => {
    if (closed) return;
    res.write(`event: ${e.type}\ndata: ${JSON.stringify(e)}\n\n`);
    if (e.type === 'end') finish();
  };
  // Subscribe before reading the study, so an end between the two is not missed.
  const unsubscribe = queue?.subscribe(id, (e: StudyEvent) => (ready ? send(e) : pending.push(e))) ?? (() => undefined);
  const timers: { heartbeat?: ReturnType<typeof setInterval> } = {};
  function finish() {
    if (closed) return;
    closed = true;
    unsubscribe();
    clearInterval(timers.heartbeat);
    res.end();
  }
  let study;
  try {
    study = await getStudy(deps.db, queue, req.lab.id, id);
  } catch (err) {
    unsubscribe();
    throw err;
  }
  res.writeHead(200, {
    'Content-Type': 'text/event-stream; charset=utf-8',
    'Cache-Control': 'no-cache, no-transform',
    Connection: 'keep-alive',
    'X-Accel-Buffering': 'no',
  });
  res.flushHeaders();
  req.on('close', finish);
  timers.heartbeat = setInterval(() => !closed && res.write(': still here\n\n'), HEARTBEAT_MS);
  ready = true;
  if (!['queued', 'running'].includes(study.status)) {
    send({ type: 'end', progress: study.progress, error: study.error });
    return;
  }
  send({ type: 'progress', progress: study.progress });
  for (const e of pending.splice(0)) send(e);
}
