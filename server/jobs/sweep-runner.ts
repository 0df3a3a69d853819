/**
 * Runs one sweep to its end, like a study (study-runner.ts): the grid comes from the stored recipe
 * and scenario versions through the engine (expandSweep), the runs not stored yet go to the same
 * executor (worker pool) with each point's recipe and scenario, every outcome is stored at once,
 * and at the end the stored runs alone are judged point by point in a fixed order — so a sweep
 * resumed after a stop gives the same numbers as one that ran straight through.
 *
 * A point with a failed run is judged "could not run" with the engine's message (until a
 * pre-flight check refuses such points before they run); the sweep still finishes.
 */
import type { StudyProgress } from '@/shared/api/work';
import type { SweepResults } from '@/shared/api/sweeps';
import { expandSweep, type SweepAxis, type SweepPlan } from '@/shared/engine/sweep';
import { assembleSweepPoint, cheapestPassing, failedSweepPoint, sweepStatement, type SweepPointResult } from '@/shared/engine/sweep-result';
import type { RunResult } from '@/shared/engine/study';
import { unpackValue } from '../db/float-blob';
import type { Db } from '../db/knex';
import { findSweepById, listSweepRuns, storeSweepRun, storedSweepRunKeys, sweepCancelRequested, updateSweep, type SweepRow } from '../db/sweeps';
import type { RunExecutor, RunOutcome, RunTask } from './run-task';
import type { StudyOutcome, StudyRunHooks } from './study-runner';

/** The grid of a stored sweep. */
export function sweepPlanOf(row: SweepRow): SweepPlan {
  return expandSweep(JSON.parse(row.recipe_body), JSON.parse(row.scenario_body), JSON.parse(row.axes) as SweepAxis[]);
}

/** The seed of run `seedIndex` at every point: a one-scenario study's seed rule. */
export const sweepSeed = (row: Pick<SweepRow, 'base_seed'>, seedIndex: number) => row.base_seed + seedIndex;

export async function runSweepJob(deps: { db: Db; executor: RunExecutor }, sweepId: string, hooks: StudyRunHooks): Promise<StudyOutcome> {
  const { db } = deps;
  const sweep = await findSweepById(db, sweepId);
  if (!sweep) return 'cancelled';
  if (['finished', 'failed', 'cancelled'].includes(sweep.status)) return sweep.status as StudyOutcome;
  if (sweep.cancel_requested_at) return endCancelled(db, sweep, hooks);
  await updateSweep(db, sweepId, { status: 'running', started_at: sweep.started_at ?? Date.now() });
  const plan = sweepPlanOf(sweep);
  const stored = await storedSweepRunKeys(db, sweepId);
  const todo: RunTask[] = [];
  for (const p of plan.points) {
    for (let i = 0; i < sweep.seeds; i++) {
      if (stored.has(`${p.index}:${i}`)) continue;
      todo.push({ studyId: sweepId, position: p.index, scenarioId: sweep.scenario_id, seedIndex: i, seed: sweepSeed(sweep, i), scenario: p.scenario, recipe: p.recipe });
    }
  }
  let done = sweep.runs_done;
  let failed = sweep.runs_failed;
  const progress = (status: StudyProgress['status']): StudyProgress => ({ status, done, failed, total: sweep.runs_total, currentScenario: null, etaSeconds: null });
  hooks.progress(sweepId, progress('running'));
  let next = 0;
  let cancelled = false;
  const lane = async () => {
    for (;;) {
      if (hooks.stopping.aborted || cancelled) return;
      if (await sweepCancelRequested(db, sweepId)) {
        cancelled = true;
        return;
      }
      const task = todo[next++];
      if (!task) return;
      const outcome = await deps.executor.run(task, hooks.stopping).catch((err: Error): RunOutcome | null =>
        hooks.stopping.aborted ? null : { ok: false, error: `worker: ${err.message}`, startedAt: Date.now(), finishedAt: Date.now() },
      );
      if (!outcome || hooks.stopping.aborted) return;
      const isNew = await storeSweepRun(db, sweepId, {
        point: task.position,
        seed_index: task.seedIndex,
        seed: task.seed,
        status: outcome.ok ? 'finished' : 'failed',
        result: outcome.ok ? Buffer.from(outcome.lineScores.buffer, outcome.lineScores.byteOffset, outcome.lineScores.byteLength) : null,
        error: outcome.ok ? null : outcome.error,
        started_at: outcome.startedAt,
        finished_at: outcome.finishedAt,
      });
      if (isNew) {
        done++;
        if (!outcome.ok) failed++;
      }
      hooks.progress(sweepId, progress('running'));
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, deps.executor.capacity) }, lane));
  if (hooks.stopping.aborted) return 'interrupted';
  if (cancelled) return endCancelled(db, sweep, hooks);
  const summary = await judgeStoredRuns(db, sweep, plan);
  if (hooks.stopping.aborted) return 'interrupted';
  await updateSweep(db, sweepId, { status: 'finished', summary: JSON.stringify(summary), error: null, finished_at: Date.now() });
  await hooks.settled?.('finished');
  hooks.end(sweepId, progress('finished'), null);
  return 'finished';
}

/** Judges every point from its stored runs only, in point order (module doc). */
export async function judgeStoredRuns(db: Db, sweep: SweepRow, plan: SweepPlan): Promise<Omit<SweepResults, 'sweepId' | 'status'>> {
  const runs = await listSweepRuns(db, sweep.id);
  const points: (SweepPointResult & { recipe: Record<string, unknown> })[] = [];
  for (const p of plan.points) {
    const mine = runs.filter((r) => r.point === p.index);
    const failedRun = mine.find((r) => r.status === 'failed');
    let judged: SweepPointResult;
    if (failedRun) judged = failedSweepPoint(p, failedRun.error ?? 'a run failed');
    else if (mine.length < sweep.seeds) judged = failedSweepPoint(p, `${sweep.seeds - mine.length} runs missing`);
    else judged = assembleSweepPoint(p, sweep.seeds, sweep.base_seed, mine.map((r) => unpackValue<RunResult>(r.result!)));
    points.push({ ...judged, recipe: p.recipe as Record<string, unknown> });
    // Let the API answer between points: judging is CPU work on this thread.
    await new Promise((resolve) => setImmediate(resolve));
  }
  const cheapest = cheapestPassing(plan, points);
  return {
    vary: plan.axes,
    seeds: Array.from({ length: sweep.seeds }, (_, i) => sweepSeed(sweep, i)),
    points: JSON.parse(JSON.stringify(points, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v))),
    cheapestPassing: cheapest,
    statement: sweepStatement(plan, cheapest, points),
  };
}

async function endCancelled(db: Db, sweep: SweepRow, hooks: StudyRunHooks): Promise<'cancelled'> {
  const fresh = (await findSweepById(db, sweep.id)) ?? sweep;
  await updateSweep(db, sweep.id, { status: 'cancelled', finished_at: Date.now() });
  await hooks.settled?.('cancelled');
  hooks.end(sweep.id, { status: 'cancelled', done: fresh.runs_done, failed: fresh.runs_failed, total: fresh.runs_total, currentScenario: null, etaSeconds: null }, null);
  return 'cancelled';
}
