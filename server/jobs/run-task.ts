/**
 * The unit of background work: one run of a study, a scenario version × one seed, processed with
 * the study's recipe version. Tasks and outcomes are plain data (structured-clone safe) so that
 * they can cross to a worker thread, or to a worker on another machine through a distributed queue.
 */
import type { AssembleOutcome, AssembleTask } from './assemble-scenario';

export interface RunTask {
  studyId: string;
  position: number;
  scenarioId: string;
  seedIndex: number;
  seed: number;
  /** The scenario version's definition, as stored. */
  scenario: unknown;
  /** The recipe version's definition, as stored. */
  recipe: unknown;
}

export type RunOutcome =
  | {
      ok: true;
      /** JSON-ready band figures of the run (maxima, worst lines, modal errors). */
      summary: Record<string, unknown>;
      /** The per-line scores the aggregation is made from, encoded by encodeArrays. */
      lineScores: Uint8Array;
      startedAt: number;
      finishedAt: number;
    }
  | { ok: false; error: string; startedAt: number; finishedAt: number };

/** Runs tasks somewhere (a thread pool here; another queue in a larger deployment). */
export interface RunExecutor {
  /** Parallel capacity: how many tasks are worth having in flight at once. */
  readonly capacity: number;
  run(task: RunTask, signal?: AbortSignal): Promise<RunOutcome>;
  /** Aggregates one scenario's stored runs (assemble-scenario.ts). */
  assemble(task: AssembleTask, signal?: AbortSignal): Promise<AssembleOutcome>;
  close(): Promise<void>;
}
