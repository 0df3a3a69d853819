/**
 * Repository of studies, their scenario versions, runs and result curves. A study's runs and
 * results always come back in one fixed order (scenario position, then seed index), which is what
 * makes a resumed study aggregate to the same numbers as an uninterrupted one.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from './knex';
import { pageOf, type ListQuery } from './list-query';

export type StudyStatus = 'queued' | 'running' | 'finished' | 'failed' | 'cancelled';
export const ACTIVE_STATUSES: StudyStatus[] = ['queued', 'running'];

export interface StudyRow {
  id: string;
  lab_id: string;
  name: string;
  recipe_id: string;
  recipe_version: number;
  recipe_name: string;
  seeds: number;
  base_seed: number;
  /** JSON of the adaptive option (shared/engine/adaptive-stopping.ts), null for fixed seeds. */
  adaptive: string | null;
  status: StudyStatus;
  runs_done: number;
  runs_failed: number;
  runs_total: number;
  current_scenario_id: string | null;
  engine_version: string;
  summary: string | null;
  error: string | null;
  created_by: string;
  created_by_name: string;
  created_at: number;
  started_at: number | null;
  finished_at: number | null;
  cancel_requested_at: number | null;
  /** JSON array of the pre-flight warnings stored at start (null before the check existed). */
  preflight_warnings: string | null;
}

export interface StudyScenarioRow {
  position: number;
  scenario_id: string;
  scenario_version: number;
  name: string;
  body: string;
}

export interface RunRow {
  id: number;
  study_id: string;
  scenario_id: string;
  scenario_version: number;
  position: number;
  seed_index: number;
  seed: number;
  status: 'finished' | 'failed';
  summary: string | null;
  line_scores: Buffer | null;
  error: string | null;
  started_at: number;
  finished_at: number;
}

const RUN_COLUMNS: (keyof RunRow)[] = [
  'id', 'study_id', 'scenario_id', 'scenario_version', 'position', 'seed_index', 'seed', 'status', 'summary', 'line_scores', 'error', 'started_at', 'finished_at',
];

const STUDY_COLUMNS = ['s.*', 'rv.name as recipe_name', 'u.display_name as created_by_name'];

function studies(db: Db) {
  return db({ s: 'studies' })
    .join({ rv: 'recipe_versions' }, (j) => j.on('rv.recipe_id', 's.recipe_id').andOn('rv.version', 's.recipe_version'))
    .join({ u: 'users' }, 'u.id', 's.created_by');
}

export const STUDY_SORTS = {
  name: 's.name collate nocase',
  createdAt: 's.created_at',
  status: 's.status',
  finishedAt: 's.finished_at',
} as const;

export function listStudies(db: Db, labId: string, query: ListQuery & { status?: StudyStatus }) {
  const base = studies(db).where('s.lab_id', labId);
  if (query.status) base.where('s.status', query.status);
  return pageOf<StudyRow>(base, query, { sortColumns: STUDY_SORTS, nameColumn: 's.name', idColumn: 's.id', select: STUDY_COLUMNS });
}

export function findStudy(db: Db, labId: string, id: string): Promise<StudyRow | undefined> {
  return studies(db).where({ 's.lab_id': labId, 's.id': id }).first(STUDY_COLUMNS);
}

export function findStudyById(db: Db, id: string): Promise<StudyRow | undefined> {
  return studies(db).where('s.id', id).first(STUDY_COLUMNS);
}

/** Whether someone asked to cancel the study (read between runs by the study runner). */
export async function cancelRequested(db: Db, studyId: string): Promise<boolean> {
  const row = await db('studies').where({ id: studyId }).first('cancel_requested_at');
  return Boolean(row?.cancel_requested_at);
}

export function studyScenarios(db: Db, studyId: string): Promise<StudyScenarioRow[]> {
  return db({ ss: 'study_scenarios' })
    .join({ sv: 'scenario_versions' }, (j) => j.on('sv.scenario_id', 'ss.scenario_id').andOn('sv.version', 'ss.scenario_version'))
    .where('ss.study_id', studyId)
    .orderBy('ss.position')
    .select('ss.position', 'ss.scenario_id', 'ss.scenario_version', 'sv.name', 'sv.body');
}

export interface NewStudy {
  labId: string;
  name: string;
  recipeId: string;
  recipeVersion: number;
  scenarios: { id: string; version: number }[];
  seeds: number;
  baseSeed: number;
  adaptive?: { batchSize: number; significantDigits: number };
  engineVersion: string;
  createdBy: string;
  at: number;
  /** Pre-flight warnings to store with the study. */
  preflightWarnings?: unknown[];
}

export async function insertStudy(trx: Db, s: NewStudy): Promise<string> {
  const id = randomUUID();
  await trx('studies').insert({
    id,
    lab_id: s.labId,
    name: s.name,
    recipe_id: s.recipeId,
    recipe_version: s.recipeVersion,
    seeds: s.seeds,
    base_seed: s.baseSeed,
    adaptive: s.adaptive ? JSON.stringify(s.adaptive) : null,
    status: 'queued',
    runs_total: s.scenarios.length * s.seeds,
    engine_version: s.engineVersion,
    created_by: s.createdBy,
    created_at: s.at,
    preflight_warnings: JSON.stringify(s.preflightWarnings ?? []),
  });
  await trx('study_scenarios').insert(
    s.scenarios.map((sc, position) => ({ study_id: id, position, scenario_id: sc.id, scenario_version: sc.version })),
  );
  return id;
}

export async function updateStudy(db: Db, id: string, patch: Partial<Omit<StudyRow, 'id' | 'recipe_name' | 'created_by_name'>>) {
  await db('studies').where({ id }).update(patch);
}

/** Runs of a study in the fixed order (position, seed index), optionally without their blobs. */
export function listRuns(db: Db, studyId: string, opts: { withScores?: boolean } = {}): Promise<RunRow[]> {
  const q = db('runs').where({ study_id: studyId }).orderBy([{ column: 'position' }, { column: 'seed_index' }]);
  if (opts.withScores) return q.select('*');
  // The lists never need the blobs: leave them on disk.
  return q.select(RUN_COLUMNS.filter((c) => c !== 'line_scores')).then((rows: RunRow[]) => rows.map((r) => ({ ...r, line_scores: null })));
}

/** The (position, seed index) pairs already stored, as "position:seedIndex" keys. */
export async function storedRunKeys(db: Db, studyId: string): Promise<Set<string>> {
  const rows = await db('runs').where({ study_id: studyId }).select('position', 'seed_index');
  return new Set(rows.map((r: { position: number; seed_index: number }) => `${r.position}:${r.seed_index}`));
}

export type NewRun = Omit<RunRow, 'id'>;

/**
 * Stores one finished or failed run and moves the study's progress, in one transaction: either
 * both are stored or neither. A run already stored (the same study, scenario and seed index) is
 * left as it is and reported as false.
 */
export async function storeRun(db: Db, run: NewRun): Promise<boolean> {
  return db.transaction(async (trx) => {
    const known = await trx('runs').where({ study_id: run.study_id, scenario_id: run.scenario_id, seed_index: run.seed_index }).first('id');
    if (known) return false;
    await trx('runs').insert(run);
    const counts = await trx('runs')
      .where({ study_id: run.study_id })
      .select(trx.raw('count(*) as done'), trx.raw("sum(case when status = 'failed' then 1 else 0 end) as failed"))
      .first();
    await trx('studies')
      .where({ id: run.study_id })
      .update({ runs_done: Number(counts.done), runs_failed: Number(counts.failed ?? 0), current_scenario_id: run.scenario_id });
    return true;
  });
}

export interface CurveRow {
  scenario_id: string;
  kind: string;
  length: number;
  data: Buffer;
}

export async function replaceCurves(trx: Db, studyId: string, curves: CurveRow[]) {
  await trx('result_curves').where({ study_id: studyId }).delete();
  if (curves.length) await trx.batchInsert('result_curves', curves.map((c) => ({ study_id: studyId, ...c })), 50);
}

export function listCurves(db: Db, studyId: string): Promise<CurveRow[]> {
  return db('result_curves').where({ study_id: studyId }).orderBy([{ column: 'scenario_id' }, { column: 'kind' }]).select('scenario_id', 'kind', 'length', 'data');
}
