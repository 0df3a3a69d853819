/**
 * Use cases of sweep studies: start (checked by the engine's grid expansion, stored with its job
 * in one transaction, answered at once), list, read with progress, read the judged points, cancel.
 * The runs happen in server/jobs like a study's.
 */
import type { z } from 'zod';
import { startSweepSchema, type Sweep, type SweepResults } from '@/shared/api/sweeps';
import type { StudyProgress } from '@/shared/api/work';
import { EngineInputError } from '@/shared/engine/errors';
import { expandSweep, type SweepAxis } from '@/shared/engine/sweep';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { enqueueJob, finishJob } from '../db/jobs';
import type { Db } from '../db/knex';
import { findSweep, insertSweep, listSweeps, openSweepJobId, updateSweep, type SweepRow } from '../db/sweeps';
import { findResource, findVersion, type VersionedKind } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { SWEEP_JOB, type StudyQueue } from '../jobs/scheduler';
import { recordAudit } from './audit';

type StartInput = z.input<typeof startSweepSchema>;

export function sweepView(row: SweepRow, live?: StudyProgress): Sweep {
  const stored: StudyProgress = { status: row.status, done: row.runs_done, failed: row.runs_failed, total: row.runs_total, currentScenario: null, etaSeconds: null };
  return {
    id: row.id,
    labId: row.lab_id,
    name: row.name,
    status: row.status,
    recipe: { id: row.recipe_id, version: row.recipe_version, name: row.recipe_name },
    scenario: { id: row.scenario_id, version: row.scenario_version, name: row.scenario_name },
    vary: JSON.parse(row.axes),
    points: row.points,
    seeds: row.seeds,
    baseSeed: row.base_seed,
    progress: live && row.status === 'running' ? live : stored,
    engineVersion: row.engine_version,
    error: row.error,
    createdAt: Number(row.created_at),
    finishedAt: row.finished_at === null ? null : Number(row.finished_at),
  };
}

async function versionBody(db: Db, kind: VersionedKind, noun: string, labId: string, ref: { id: string; version?: number }) {
  const head = await findResource(db, kind, labId, ref.id);
  if (!head) throw notFound(`${noun} ${ref.id}`);
  const version = ref.version ?? head.latest_version;
  const row = await findVersion(db, kind, ref.id, version);
  if (!row) throw notFound(`Version ${version} of ${noun.toLowerCase()} ${ref.id}`);
  return { id: ref.id, version, body: JSON.parse(row.body) as unknown };
}

export async function getSweep(db: Db, queue: StudyQueue | undefined, labId: string, id: string): Promise<Sweep> {
  const row = await findSweep(db, labId, id);
  if (!row) throw notFound(`Sweep ${id}`);
  return sweepView(row, queue?.liveProgress(id));
}

export async function listLabSweeps(db: Db, labId: string) {
  return { items: (await listSweeps(db, labId)).map((r) => sweepView(r)) };
}

export async function startSweep(db: Db, queue: StudyQueue, labId: string, userId: string, input: StartInput): Promise<Sweep> {
  const body = startSweepSchema.parse(input);
  const recipe = await versionBody(db, 'recipes', 'Recipe', labId, body.recipe);
  const scenario = await versionBody(db, 'scenarios', 'Scenario', labId, body.scenario);
  let points: number;
  try {
    points = expandSweep(recipe.body, scenario.body as never, body.vary as SweepAxis[]).points.length;
  } catch (err) {
    if (err instanceof EngineInputError) throw new AppError(422, 'sweep_invalid', `This sweep cannot run: ${err.message}`, { field: err.field });
    throw err;
  }
  const id = await db.transaction(async (trx) => {
    const sweepId = await insertSweep(trx, {
      labId,
      name: body.name,
      recipe,
      scenario,
      axes: body.vary,
      points,
      seeds: body.seeds,
      baseSeed: body.baseSeed,
      engineVersion: ENGINE_VERSION,
      createdBy: userId,
      at: Date.now(),
    });
    await enqueueJob(trx, SWEEP_JOB, { sweepId });
    await recordAudit(trx, {
      labId,
      actorUserId: userId,
      action: 'sweeps.start',
      targetType: 'sweep',
      targetId: sweepId,
      after: { name: body.name, recipe: { id: recipe.id, version: recipe.version }, scenario: { id: scenario.id, version: scenario.version }, vary: body.vary, seeds: body.seeds, baseSeed: body.baseSeed },
    });
    return sweepId;
  });
  queue.enqueue(id);
  return getSweep(db, queue, labId, id);
}

/** GET /sweeps/:id/results: the points judged from the stored runs at the sweep's end. */
export async function getSweepResults(db: Db, labId: string, id: string): Promise<SweepResults> {
  const row = await findSweep(db, labId, id);
  if (!row) throw notFound(`Sweep ${id}`);
  if (row.status !== 'finished' || !row.summary) {
    throw new AppError(409, 'sweep_not_finished', `This sweep is ${row.status}; results exist once it has finished.`);
  }
  return { sweepId: id, status: row.status, ...JSON.parse(row.summary) };
}

/** Cancels a queued or running sweep (a running one stops scheduling runs). */
export async function cancelSweep(db: Db, queue: StudyQueue, labId: string, userId: string, id: string): Promise<Sweep> {
  await db.transaction(async (trx) => {
    const row = await findSweep(trx, labId, id);
    if (!row) throw notFound(`Sweep ${id}`);
    if (!['queued', 'running'].includes(row.status)) throw new AppError(409, 'sweep_ended', `This sweep has already ended (${row.status}); there is nothing to cancel.`);
    const now = Date.now();
    await updateSweep(trx, id, { cancel_requested_at: row.cancel_requested_at ?? now });
    if (row.status === 'queued') {
      await updateSweep(trx, id, { status: 'cancelled', finished_at: now });
      const jobId = await openSweepJobId(trx, SWEEP_JOB, id);
      if (jobId) await finishJob(trx, jobId, 'cancelled');
    }
    await recordAudit(trx, { labId, actorUserId: userId, action: 'sweeps.cancel', targetType: 'sweep', targetId: id, before: { status: row.status } });
  });
  await queue.cancel(id);
  return getSweep(db, queue, labId, id);
}
