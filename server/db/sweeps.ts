/**
 * Repository of sweep studies and their runs. Runs come back in one fixed order (point, then seed
 * index), and a run already stored is never stored twice, so a resumed sweep judges exactly the
 * runs an uninterrupted one would.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from './knex';
import type { StudyStatus } from './studies';

export interface SweepRow {
  id: string;
  lab_id: string;
  name: string;
  recipe_id: string;
  recipe_version: number;
  recipe_name: string;
  recipe_body: string;
  scenario_id: string;
  scenario_version: number;
  scenario_name: string;
  scenario_body: string;
  axes: string;
  points: number;
  seeds: number;
  base_seed: number;
  status: StudyStatus;
  runs_done: number;
  runs_failed: number;
  runs_total: number;
  engine_version: string;
  summary: string | null;
  error: string | null;
  created_by: string;
  created_at: number;
  started_at: number | null;
  finished_at: number | null;
  cancel_requested_at: number | null;
}

export interface SweepRunRow {
  point: number;
  seed_index: number;
  seed: number;
  status: 'finished' | 'failed';
  result: Buffer | null;
  error: string | null;
  started_at: number;
  finished_at: number;
}

const COLUMNS = ['w.*', 'rv.name as recipe_name', 'rv.body as recipe_body', 'sv.name as scenario_name', 'sv.body as scenario_body'];

function sweeps(db: Db) {
  return db({ w: 'sweeps' })
    .join({ rv: 'recipe_versions' }, (j) => j.on('rv.recipe_id', 'w.recipe_id').andOn('rv.version', 'w.recipe_version'))
    .join({ sv: 'scenario_versions' }, (j) => j.on('sv.scenario_id', 'w.scenario_id').andOn('sv.version', 'w.scenario_version'));
}

export function findSweep(db: Db, labId: string, id: string): Promise<SweepRow | undefined> {
  return sweeps(db).where({ 'w.lab_id': labId, 'w.id': id }).first(COLUMNS);
}

export function findSweepById(db: Db, id: string): Promise<SweepRow | undefined> {
  return sweeps(db).where('w.id', id).first(COLUMNS);
}

/** The lab's sweeps, newest first (at most `limit`). */
export function listSweeps(db: Db, labId: string, limit = 50): Promise<SweepRow[]> {
  return sweeps(db).where('w.lab_id', labId).orderBy([{ column: 'w.created_at', order: 'desc' }, { column: 'w.id' }]).limit(limit).select(COLUMNS);
}

export interface NewSweep {
  labId: string;
  name: string;
  recipe: { id: string; version: number };
  scenario: { id: string; version: number };
  axes: unknown;
  points: number;
  seeds: number;
  baseSeed: number;
  engineVersion: string;
  createdBy: string;
  at: number;
}

export async function insertSweep(trx: Db, s: NewSweep): Promise<string> {
  const id = randomUUID();
  await trx('sweeps').insert({
    id,
    lab_id: s.labId,
    name: s.name,
    recipe_id: s.recipe.id,
    recipe_version: s.recipe.version,
    scenario_id: s.scenario.id,
    scenario_version: s.scenario.version,
    axes: JSON.stringify(s.axes),
    points: s.points,
    seeds: s.seeds,
    base_seed: s.baseSeed,
    status: 'queued',
    runs_total: s.points * s.seeds,
    engine_version: s.engineVersion,
    created_by: s.createdBy,
    created_at: s.at,
  });
  return id;
}

export async function updateSweep(db: Db, id: string, patch: Partial<Pick<SweepRow, 'status' | 'summary' | 'error' | 'started_at' | 'finished_at' | 'cancel_requested_at'>>) {
  await db('sweeps').where({ id }).update(patch);
}

/** The (point, seed index) pairs already stored, as "point:seedIndex" keys. */
export async function storedSweepRunKeys(db: Db, sweepId: string): Promise<Set<string>> {
  const rows = await db('sweep_runs').where({ sweep_id: sweepId }).select('point', 'seed_index');
  return new Set(rows.map((r: { point: number; seed_index: number }) => `${r.point}:${r.seed_index}`));
}

/** Runs of a sweep in the fixed order (point, seed index), with their packed results. */
export function listSweepRuns(db: Db, sweepId: string): Promise<SweepRunRow[]> {
  return db('sweep_runs')
    .where({ sweep_id: sweepId })
    .orderBy([{ column: 'point' }, { column: 'seed_index' }])
    .select('point', 'seed_index', 'seed', 'status', 'result', 'error', 'started_at', 'finished_at');
}

/** Stores one run and the sweep's progress in one transaction; false if it was already stored. */
export async function storeSweepRun(db: Db, sweepId: string, run: SweepRunRow): Promise<boolean> {
  return db.transaction(async (trx) => {
    const known = await trx('sweep_runs').where({ sweep_id: sweepId, point: run.point, seed_index: run.seed_index }).first('id');
    if (known) return false;
    await trx('sweep_runs').insert({ sweep_id: sweepId, ...run });
    const counts = await trx('sweep_runs')
      .where({ sweep_id: sweepId })
      .select(trx.raw('count(*) as done'), trx.raw("sum(case when status = 'failed' then 1 else 0 end) as failed"))
      .first();
    await trx('sweeps').where({ id: sweepId }).update({ runs_done: Number(counts.done), runs_failed: Number(counts.failed ?? 0) });
    return true;
  });
}

/** Whether a cancellation was asked for. */
export async function sweepCancelRequested(db: Db, sweepId: string): Promise<boolean> {
  const row = await db('sweeps').where({ id: sweepId }).first('cancel_requested_at');
  return Boolean(row?.cancel_requested_at);
}

/** The queued or running job of a sweep, if any. */
export async function openSweepJobId(db: Db, type: string, sweepId: string): Promise<number | undefined> {
  const job = await db('jobs').where({ type }).whereIn('status', ['queued', 'running']).whereRaw("json_extract(payload, '$.sweepId') = ?", [sweepId]).first('id');
  return job?.id;
}
