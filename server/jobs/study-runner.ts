/**
 * Runs one study to its end (or until cancelled or the server stops): works out which runs are
 * not stored yet, keeps `executor.capacity` of them in flight, stores each outcome at once, and
 * finally aggregates the stored runs into the study's results and mails its author.
 */
import type { StudyProgress } from '@/shared/api/work';
import { studySeed } from '@/shared/engine/study';
import type { Db } from '../db/knex';
import { cancelRequested, findStudyById, listRuns, storeRun, storedRunKeys, studyScenarios, updateStudy, type StudyRow, type StudyScenarioRow } from '../db/studies';
import { findVersion } from '../db/versioned';
import { findUserById } from '../db/users';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { finaliseStudy } from '../services/study-results';
import type { RunExecutor, RunOutcome, RunTask } from './run-task';

export interface StudyRunHooks {
  /** Aborted when the server shuts down: stop at once, store nothing more. */
  stopping: AbortSignal;
  progress(studyId: string, progress: StudyProgress): void;
  end(studyId: string, progress: StudyProgress, error: string | null): void;
  /** Called once the study's final state is stored, before the author is mailed. */
  settled?(outcome: 'finished' | 'failed' | 'cancelled'): Promise<void>;
}

export type StudyOutcome = 'finished' | 'failed' | 'cancelled' | 'interrupted';

interface RunnerDeps {
  db: Db;
  logger: Logger;
  mailer: Mailer;
  executor: RunExecutor;
}

const ENDED = new Set(['finished', 'failed', 'cancelled']);

export async function runStudy(deps: RunnerDeps, studyId: string, hooks: StudyRunHooks): Promise<StudyOutcome> {
  const { db } = deps;
  const study = await findStudyById(db, studyId);
  if (!study) return 'cancelled';
  if (ENDED.has(study.status)) return study.status as StudyOutcome;
  const scenarios = await studyScenarios(db, studyId);
  const names = new Map(scenarios.map((s) => [s.scenario_id, s.name]));
  if (study.cancel_requested_at) return endCancelled(deps, study, hooks);

  const recipe = await findVersion(db, 'recipes', study.recipe_id, study.recipe_version);
  if (!recipe) throw new Error(`recipe ${study.recipe_id} v${study.recipe_version} of study ${studyId} is missing`);
  await updateStudy(db, studyId, { status: 'running', started_at: study.started_at ?? Date.now() });

  const recipeBody = JSON.parse(recipe.body) as unknown;
  const adaptive = study.adaptive ? (JSON.parse(study.adaptive) as { batchSize: number; significantDigits: number }) : null;
  const stored = await storedRunKeys(db, studyId);
  const first = adaptive ? await nextBatch(deps, study, scenarios, recipeBody, adaptive) : missingRuns(study, scenarios, recipeBody, stored);
  const pace = { since: Date.now(), doneAtStart: study.runs_done };
  let done = study.runs_done;
  let failed = study.runs_failed;
  let current: string | null = first[0]?.scenarioId ?? study.current_scenario_id;
  const progress = (status: StudyProgress['status']): StudyProgress => ({
    status,
    done,
    failed,
    total: study.runs_total,
    currentScenario: current ? { id: current, name: names.get(current) ?? '' } : null,
    etaSeconds: eta(pace, done, study.runs_total),
  });
  hooks.progress(studyId, progress('running'));

  let cancelled = false;
  const runAll = async (todo: RunTask[]) => {
    let next = 0;
    const lane = async () => {
      for (;;) {
        if (hooks.stopping.aborted || cancelled) return;
        if (await cancelRequested(db, studyId)) {
          cancelled = true;
          return;
        }
        const task = todo[next++];
        if (!task) return;
        current = task.scenarioId;
        const outcome = await deps.executor.run(task, hooks.stopping).catch((err: Error): RunOutcome | null =>
          hooks.stopping.aborted ? null : { ok: false, error: `worker: ${err.message}`, startedAt: Date.now(), finishedAt: Date.now() },
        );
        if (!outcome || hooks.stopping.aborted) return;
        const isNew = await storeRun(db, {
          study_id: studyId,
          scenario_id: task.scenarioId,
          scenario_version: scenarios[task.position].scenario_version,
          position: task.position,
          seed_index: task.seedIndex,
          seed: task.seed,
          status: outcome.ok ? 'finished' : 'failed',
          summary: outcome.ok ? JSON.stringify(outcome.summary) : null,
          line_scores: outcome.ok ? Buffer.from(outcome.lineScores.buffer, outcome.lineScores.byteOffset, outcome.lineScores.byteLength) : null,
          error: outcome.ok ? null : outcome.error,
          started_at: outcome.startedAt,
          finished_at: outcome.finishedAt,
        });
        if (isNew) {
          done++;
          if (!outcome.ok) failed++;
        }
        hooks.progress(studyId, progress('running'));
      }
    };
    await Promise.all(Array.from({ length: Math.max(1, deps.executor.capacity) }, lane));
  };
  // Adaptive studies run batch after batch until every scenario has stopped (adaptiveBatch).
  const stopped = new Set<number>();
  for (let todo = first; todo.length > 0; ) {
    await runAll(todo);
    if (!adaptive || hooks.stopping.aborted || cancelled) break;
    todo = await nextBatch(deps, study, scenarios, recipeBody, adaptive, hooks.stopping, stopped);
  }
  if (adaptive && !hooks.stopping.aborted && !cancelled) {
    // The maximum was an upper bound: the study's total becomes the runs it took.
    study.runs_total = done;
    await updateStudy(db, studyId, { runs_total: done });
  }

  if (hooks.stopping.aborted) return 'interrupted';
  if (cancelled) return endCancelled(deps, study, hooks);
  const final = await finaliseStudy(db, studyId, (task) => deps.executor.assemble(task, hooks.stopping));
  if (hooks.stopping.aborted) return 'interrupted';
  current = null;
  const end = { ...progress(final.status), etaSeconds: null };
  await hooks.settled?.(final.status);
  hooks.end(studyId, end, final.error);
  await mailAuthor(deps, study, final.status, final.error);
  return final.status;
}

/** Every (scenario, seed) not stored yet, scenario-major, seeds by the engine's seed rule. */
export function missingRuns(study: StudyRow, scenarios: StudyScenarioRow[], recipe: unknown, stored: Set<string>): RunTask[] {
  const out: RunTask[] = [];
  for (const s of scenarios) {
    const scenario = JSON.parse(s.body);
    for (let i = 0; i < study.seeds; i++) {
      if (stored.has(`${s.position}:${i}`)) continue;
      out.push({ studyId: study.id, position: s.position, scenarioId: s.scenario_id, seedIndex: i, seed: studySeed(study.base_seed, s.position, i), scenario, recipe });
    }
  }
  return out;
}

/**
 * The next batch of an adaptive study (JCGM 101 §7.9, shared/engine/adaptive-stopping.ts): for each
 * scenario that has not stopped, the runs that complete its current batch of `batchSize` seeds. A
 * scenario stops when its stored runs reach the maximum, when one of them failed, or when, after
 * at least two complete batches, the engine judges every criterion stable. The judgement uses the
 * stored runs only, so a resumed study takes the same decisions and the same seeds.
 */
export async function nextBatch(
  deps: RunnerDeps,
  study: StudyRow,
  scenarios: StudyScenarioRow[],
  recipe: unknown,
  adaptive: { batchSize: number; significantDigits: number },
  signal?: AbortSignal,
  stopped = new Set<number>(),
): Promise<RunTask[]> {
  const h = adaptive.batchSize;
  const runs = await listRuns(deps.db, study.id, { withScores: true });
  const out: RunTask[] = [];
  for (const s of scenarios) {
    if (stopped.has(s.position)) continue;
    const mine = runs.filter((r) => r.position === s.position);
    const n = mine.length;
    const scenario = JSON.parse(s.body);
    const task = (i: number): RunTask => ({ studyId: study.id, position: s.position, scenarioId: s.scenario_id, seedIndex: i, seed: studySeed(study.base_seed, s.position, i), scenario, recipe });
    const reached = n > 0 ? mine[n - 1].seed_index + 1 : 0;
    if (reached > n) {
      // Runs lost in flight when the server stopped: fill the gaps of the sequence first.
      const have = new Set(mine.map((r) => r.seed_index));
      for (let i = 0; i < reached; i++) if (!have.has(i)) out.push(task(i));
      continue;
    }
    if (n >= study.seeds || mine.some((r) => r.status === 'failed')) {
      stopped.add(s.position);
      continue;
    }
    if (n > 0 && n % h === 0 && n >= 2 * h) {
      const check = await deps.executor.assemble(
        {
          recipe,
          scenario: JSON.parse(s.body),
          position: s.position,
          seeds: n,
          baseSeed: study.base_seed,
          runs: mine.map((r) => new Uint8Array(r.line_scores!.buffer, r.line_scores!.byteOffset, r.line_scores!.byteLength)),
          adaptive: { options: adaptive, maxSeeds: study.seeds },
        },
        signal,
      );
      if (check.adaptive?.stop) {
        stopped.add(s.position);
        continue;
      }
    }
    const end = Math.min(study.seeds, (Math.floor(n / h) + 1) * h);
    for (let i = n; i < end; i++) out.push(task(i));
  }
  return out;
}

/** Seconds left at the pace of this session's runs; null before the first one. */
function eta(pace: { since: number; doneAtStart: number }, done: number, total: number): number | null {
  const ran = done - pace.doneAtStart;
  if (ran <= 0 || done >= total) return done >= total ? 0 : null;
  const perRun = (Date.now() - pace.since) / 1000 / ran;
  return Math.round(perRun * (total - done) * 10) / 10;
}

async function endCancelled(deps: RunnerDeps, study: StudyRow, hooks: StudyRunHooks): Promise<'cancelled'> {
  const fresh = (await findStudyById(deps.db, study.id)) ?? study;
  await updateStudy(deps.db, study.id, { status: 'cancelled', finished_at: Date.now(), current_scenario_id: null });
  await hooks.settled?.('cancelled');
  hooks.end(
    study.id,
    {
      status: 'cancelled',
      done: fresh.runs_done,
      failed: fresh.runs_failed,
      total: fresh.runs_total,
      currentScenario: null,
      etaSeconds: null,
    },
    null,
  );
  return 'cancelled';
}

async function mailAuthor(deps: RunnerDeps, study: StudyRow, status: 'finished' | 'failed', error: string | null) {
  const author = await findUserById(deps.db, study.created_by);
  if (!author) return;
  const subject = status === 'finished' ? `Study finished: ${study.name}` : `Study failed: ${study.name}`;
  const text = [
    `Hello ${author.display_name},`,
    '',
    status === 'finished'
      ? `The study "${study.name}" has finished: ${study.runs_total} runs of recipe "${study.recipe_name}" v${study.recipe_version}.`
      : `The study "${study.name}" has failed. ${error ?? ''}`,
    '',
    'Open it in Plumbline to read the results.',
  ].join('\n');
  await deps.mailer
    .send({ labId: study.lab_id, to: author.email, subject, text, kind: status === 'finished' ? 'study-finished' : 'study-failed' })
    .catch((err) => deps.logger.warn({ err, studyId: study.id }, 'study mail not sent'));
}
