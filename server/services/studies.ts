/**
 * Use cases of studies: start (stored with its job in one transaction, answered at once), list,
 * read with progress, list runs, cancel. The work itself happens in server/jobs.
 */
import type { Run, StartStudyRequest, Study, StudyListQuery, StudyProgress } from '@/shared/api/work';
import { startStudySchema } from '@/shared/api/work';
import { ENGINE_VERSION } from '@/shared/engine/version';
import type { z } from 'zod';
import { enqueueJob, openJobForStudy, finishJob } from '../db/jobs';
import type { Db } from '../db/knex';
import {
  findStudy,
  insertStudy,
  listRuns,
  listStudies,
  studyScenarios,
  updateStudy,
  type RunRow,
  type StudyRow,
  type StudyScenarioRow,
} from '../db/studies';
import { AppError, notFound } from '../errors';
import type { StudyQueue } from '../jobs/scheduler';
import { STUDY_JOB } from '../jobs/scheduler';
import { recordAudit } from './audit';
import { checkStudyPair, refuseIfCannotRun } from './study-preflight';

type StartInput = z.output<typeof startStudySchema>;

function storedProgress(row: StudyRow, names: Map<string, string>): StudyProgress {
  const current = row.current_scenario_id && ['queued', 'running'].includes(row.status) ? row.current_scenario_id : null;
  return {
    status: row.status,
    done: row.runs_done,
    failed: row.runs_failed,
    total: row.runs_total,
    currentScenario: current ? { id: current, name: names.get(current) ?? '' } : null,
    etaSeconds: null,
  };
}

/** The API view of a study; live progress (with ETA) from the scheduler while it runs here. */
export function studyView(row: StudyRow, scenarios: StudyScenarioRow[], live?: StudyProgress): Study {
  const names = new Map(scenarios.map((s) => [s.scenario_id, s.name]));
  const summary = row.summary ? (JSON.parse(row.summary) as { pass?: boolean | null }) : null;
  return {
    id: row.id,
    labId: row.lab_id,
    name: row.name,
    status: row.status,
    recipe: { id: row.recipe_id, version: row.recipe_version, name: row.recipe_name },
    scenarios: scenarios.map((s) => ({ id: s.scenario_id, version: s.scenario_version, name: s.name, position: s.position })),
    seeds: row.seeds,
    baseSeed: row.base_seed,
    adaptive: row.adaptive ? (JSON.parse(row.adaptive) as Study['adaptive']) : null,
    progress: live && row.status === 'running' ? live : storedProgress(row, names),
    engineVersion: row.engine_version,
    pass: summary?.pass ?? null,
    error: row.error,
    warnings: row.preflight_warnings ? (JSON.parse(row.preflight_warnings) as Study['warnings']) : [],
    createdBy: { id: row.created_by, displayName: row.created_by_name },
    createdAt: Number(row.created_at),
    startedAt: row.started_at === null ? null : Number(row.started_at),
    finishedAt: row.finished_at === null ? null : Number(row.finished_at),
  };
}

export async function getStudy(db: Db, queue: StudyQueue | undefined, labId: string, id: string): Promise<Study> {
  const row = await findStudy(db, labId, id);
  if (!row) throw notFound(`Study ${id}`);
  return studyView(row, await studyScenarios(db, id), queue?.liveProgress(id));
}

export async function startStudy(db: Db, queue: StudyQueue, labId: string, userId: string, input: StartInput | StartStudyRequest): Promise<Study> {
  const body = startStudySchema.parse(input);
  // Checked before anything is stored: a pair that cannot run leaves no study, audit entry or mail.
  const pair = await checkStudyPair(db, labId, body);
  refuseIfCannotRun(pair);
  const recipeVersion = pair.recipe.version;
  const scenarios = pair.scenarios.map((s) => ({ id: s.id, version: s.version }));
  const id = await db.transaction(async (trx) => {
    const studyId = await insertStudy(trx, {
      labId,
      name: body.name,
      recipeId: body.recipe.id,
      recipeVersion,
      scenarios,
      seeds: body.seeds,
      baseSeed: body.baseSeed,
      adaptive: body.adaptive,
      engineVersion: ENGINE_VERSION,
      createdBy: userId,
      at: Date.now(),
      preflightWarnings: pair.warnings,
    });
    await enqueueJob(trx, STUDY_JOB, { studyId });
    await recordAudit(trx, {
      labId,
      actorUserId: userId,
      action: 'studies.start',
      targetType: 'study',
      targetId: studyId,
      after: { name: body.name, recipe: { id: body.recipe.id, version: recipeVersion }, scenarios, seeds: body.seeds, baseSeed: body.baseSeed, adaptive: body.adaptive ?? null },
    });
    return studyId;
  });
  queue.enqueue(id);
  return getStudy(db, queue, labId, id);
}

export async function listLabStudies(db: Db, labId: string, query: StudyListQuery) {
  const { rows, total } = await listStudies(db, labId, query);
  const items = rows.map((r) => {
    const { scenarios: _omit, warnings: _stored, ...rest } = studyView(r, []);
    return rest;
  });
  return { items, total, limit: query.limit, offset: query.offset };
}

export function runView(r: RunRow): Run {
  return {
    id: r.id,
    scenarioId: r.scenario_id,
    scenarioVersion: r.scenario_version,
    position: r.position,
    seedIndex: r.seed_index,
    seed: r.seed,
    status: r.status,
    summary: r.summary ? JSON.parse(r.summary) : null,
    error: r.error,
    startedAt: Number(r.started_at),
    finishedAt: Number(r.finished_at),
  };
}

export async function listStudyRuns(db: Db, labId: string, id: string) {
  if (!(await findStudy(db, labId, id))) throw notFound(`Study ${id}`);
  return { items: (await listRuns(db, id)).map(runView) };
}

/**
 * Cancels a study: a queued one ends at once; a running one stops scheduling runs (the ones in
 * flight are still stored) and ends as cancelled shortly after. An ended study answers 409.
 */
export async function cancelStudy(db: Db, queue: StudyQueue, labId: string, userId: string, id: string): Promise<Study> {
  await db.transaction(async (trx) => {
    const row = await findStudy(trx, labId, id);
    if (!row) throw notFound(`Study ${id}`);
    if (!['queued', 'running'].includes(row.status)) {
      throw new AppError(409, 'study_ended', `This study has already ended (${row.status}); there is nothing to cancel.`);
    }
    const now = Date.now();
    await updateStudy(trx, id, { cancel_requested_at: row.cancel_requested_at ?? now });
    if (row.status === 'queued') {
      await updateStudy(trx, id, { status: 'cancelled', finished_at: now, current_scenario_id: null });
      const job = await openJobForStudy(trx, id);
      if (job) await finishJob(trx, job.id, 'cancelled');
    }
    await recordAudit(trx, { labId, actorUserId: userId, action: 'studies.cancel', targetType: 'study', targetId: id, before: { status: row.status } });
  });
  await queue.cancel(id);
  return getStudy(db, queue, labId, id);
}
