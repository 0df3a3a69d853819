/**
 * Repository of the job queue table. A job is queued, then claimed (running, locked_at set,
 * attempts counted), then done, failed or cancelled. A job found running when the server starts
 * was left by a process that stopped; it is claimed again and picks up where it was.
 */
import type { Db } from './knex';

export type JobStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

export interface JobRow {
  id: number;
  type: string;
  payload: string;
  status: JobStatus;
  attempts: number;
  locked_at: number | null;
  progress: string | null;
  error: string | null;
  created_at: number;
  updated_at: number;
}

export async function enqueueJob(trx: Db, type: string, payload: unknown, at = Date.now()): Promise<number> {
  const [id] = await trx('jobs').insert({ type, payload: JSON.stringify(payload), status: 'queued', created_at: at, updated_at: at });
  return Number(id);
}

/** Jobs of a type (or types) still to do (queued, or running when the server stopped), oldest first. */
export function pendingJobs(db: Db, type: string | readonly string[]): Promise<JobRow[]> {
  return db('jobs').whereIn('type', typeof type === 'string' ? [type] : [...type]).whereIn('status', ['queued', 'running']).orderBy('id');
}

/** Marks a job running; false when it is no longer queued or running (cancelled meanwhile). */
export async function claimJob(db: Db, id: number, at = Date.now()): Promise<boolean> {
  const n = await db('jobs')
    .where({ id })
    .whereIn('status', ['queued', 'running'])
    .update({ status: 'running', locked_at: at, updated_at: at, attempts: db.raw('attempts + 1') });
  return n === 1;
}

export async function finishJob(db: Db, id: number, status: Exclude<JobStatus, 'queued' | 'running'>, error: string | null = null, at = Date.now()) {
  await db('jobs').where({ id }).update({ status, error, locked_at: null, updated_at: at });
}

/** The open job of a study, if any (for cancellation). */
export function openJobForStudy(db: Db, studyId: string): Promise<JobRow | undefined> {
  return db('jobs')
    .where({ type: 'study' })
    .whereIn('status', ['queued', 'running'])
    .whereRaw("json_extract(payload, '$.studyId') = ?", [studyId])
    .first();
}
