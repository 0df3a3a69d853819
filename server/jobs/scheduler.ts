/**
 * The study scheduler: takes study jobs from the jobs table one at a time (oldest first), runs
 * each study's missing runs on a RunExecutor, and tells SSE subscribers how far it has got.
 *
 * Durability: every finished run is stored at once, in its own transaction with the study's
 * progress (db/studies.storeRun). A study that was running when the server stopped is found in
 * the jobs table at the next start and resumes with the runs not yet stored; its results are
 * aggregated from stored runs only, in a fixed order, so they equal an uninterrupted study's.
 *
 * Services see only the StudyQueue interface (enqueue, cancel, subscribe), so the in-process pool
 * can be swapped for workers behind a distributed queue without touching them.
 */
import { EventEmitter } from 'node:events';
import type { StudyEvent, StudyProgress } from '@/shared/api/work';
import type { Db } from '../db/knex';
import { claimJob, finishJob, pendingJobs } from '../db/jobs';
import { updateStudy } from '../db/studies';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import type { RunExecutor } from './run-task';
import { runStudy, type StudyRunHooks } from './study-runner';
import { runSweepJob } from './sweep-runner';
import { updateSweep } from '../db/sweeps';

export interface StudyQueue {
  /** Wakes the scheduler after a study and its job were committed. */
  enqueue(studyId: string): void;
  /** Passes on a cancellation already stored on the study (cancel_requested_at). */
  cancel(studyId: string): Promise<void>;
  /** Live progress events of a study; returns the unsubscribe function. */
  subscribe(studyId: string, listener: (e: StudyEvent) => void): () => void;
  /** The latest progress seen for a running study (with ETA), if it is running here. */
  liveProgress(studyId: string): StudyProgress | undefined;
}

export interface StudyScheduler extends StudyQueue {
  /** Resumes every study left queued or running, then keeps taking new ones. */
  start(): void;
  /** Stops taking work, abandons runs in flight (they are not stored) and closes the executor. */
  close(): Promise<void>;
  /** Resolves when no study is queued or running (tests and the demo seed). */
  idle(): Promise<void>;
}

export interface SchedulerDeps {
  db: Db;
  logger: Logger;
  mailer: Mailer;
  executor: RunExecutor;
}

export const STUDY_JOB = 'study';
/** A sweep study (sweep-runner.ts): the same queue, pool, progress events and resumption. */
export const SWEEP_JOB = 'sweep';

export function createStudyScheduler(deps: SchedulerDeps): StudyScheduler {
  const events = new EventEmitter();
  events.setMaxListeners(0);
  const live = new Map<string, StudyProgress>();
  const shutdown = new AbortController();
  let started = false;
  let loop: Promise<void> | null = null;
  let wake = false;
  let idleWaiters: (() => void)[] = [];

  const hooks: StudyRunHooks = {
    stopping: shutdown.signal,
    progress(id, progress) {
      live.set(id, progress);
      events.emit(id, { type: 'progress', progress } satisfies StudyEvent);
    },
    end(id, progress, error) {
      live.delete(id);
      events.emit(id, { type: 'end', progress, error } satisfies StudyEvent);
    },
  };

  async function drain() {
    do {
      wake = false;
      const jobs = await pendingJobs(deps.db, [STUDY_JOB, SWEEP_JOB]);
      for (const job of jobs) {
        if (shutdown.signal.aborted) return;
        const isSweep = job.type === SWEEP_JOB;
        const payload = JSON.parse(job.payload) as { studyId?: string; sweepId?: string };
        const studyId = (isSweep ? payload.sweepId : payload.studyId) ?? '';
        if (!(await claimJob(deps.db, job.id))) continue;
        try {
          let done = false;
          const settled = async (o: 'finished' | 'failed' | 'cancelled') => {
            done = true;
            await finishJob(deps.db, job.id, o === 'finished' ? 'done' : o);
          };
          const outcome = isSweep ? await runSweepJob(deps, studyId, { ...hooks, settled }) : await runStudy(deps, studyId, { ...hooks, settled });
          if (outcome === 'interrupted') return; // shutting down: the job stays running for the next start
          if (!done) await settled(outcome);
        } catch (err) {
          if (shutdown.signal.aborted) return;
          deps.logger.error({ err, studyId }, 'study job failed');
          const message = String((err as Error).message ?? err);
          await finishJob(deps.db, job.id, 'failed', message);
          // The study must not stay "running" for ever: it ends as failed with the reason.
          const failure = { status: 'failed' as const, error: `The ${isSweep ? 'sweep' : 'study'} could not be completed: ${message}`, finished_at: Date.now() };
          await (isSweep ? updateSweep(deps.db, studyId, failure) : updateStudy(deps.db, studyId, failure));
          const last = live.get(studyId);
          hooks.end(studyId, { ...(last ?? { done: 0, failed: 0, total: 0, currentScenario: null }), status: 'failed', currentScenario: null, etaSeconds: null }, message);
        }
      }
    } while (wake && !shutdown.signal.aborted);
  }

  function kick() {
    if (!started || shutdown.signal.aborted) return;
    if (loop) {
      wake = true;
      return;
    }
    loop = drain()
      .catch((err) => deps.logger.error({ err }, 'study scheduler stopped on an error'))
      .finally(() => {
        loop = null;
        if (wake && !shutdown.signal.aborted) kick();
        else {
          const waiters = idleWaiters;
          idleWaiters = [];
          waiters.forEach((w) => w());
        }
      });
  }

  return {
    start() {
      started = true;
      kick();
    },
    enqueue() {
      kick();
    },
    async cancel() {
      // The request is stored on the study (cancel_requested_at); the runner checks it before it
      // schedules each run, so nothing is needed here beyond waking a queued study's turn.
      kick();
    },
    subscribe(studyId, listener) {
      events.on(studyId, listener);
      return () => events.off(studyId, listener);
    },
    liveProgress: (studyId) => live.get(studyId),
    idle() {
      if (!loop) return Promise.resolve();
      return new Promise((resolve) => idleWaiters.push(resolve));
    },
    async close() {
      shutdown.abort();
      await deps.executor.close().catch(() => undefined);
      await loop?.catch(() => undefined);
      events.removeAllListeners();
    },
  };
}
