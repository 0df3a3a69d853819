/**
 * The default RunExecutor: a piscina pool of worker threads, so that neither the runs nor a
 * study's final aggregation (assemble-scenario.ts) block the event loop that serves the API.
 * Threads cannot see jest's or tsx's transforms of the main thread, so the pool loads a small .js
 * entry that registers tsx and then requires the TypeScript worker (study-run.ts).
 */
import path from 'node:path';
import Piscina from 'piscina';
import type { AssembleOutcome } from './assemble-scenario';
import type { RunExecutor, RunOutcome } from './run-task';

export const WORKER_ENTRY = path.join(__dirname, 'study-worker.js');

/**
 * `heapMb` caps each thread's old generation: a run that needs more is terminated with
 * ERR_WORKER_OUT_OF_MEMORY, which the runner stores as that run's failure; the server carries on.
 */
export function createPoolExecutor(threads: number, heapMb: number | null = null): RunExecutor {
  const pool = new Piscina({
    filename: WORKER_ENTRY,
    minThreads: 0,
    maxThreads: threads,
    idleTimeout: 30_000,
    ...(heapMb ? { resourceLimits: { maxOldGenerationSizeMb: heapMb } } : {}),
  });
  return {
    capacity: threads,
    run: (task, signal) => pool.run(task, { name: 'runStudyTask', signal }) as Promise<RunOutcome>,
    assemble: (task, signal) => pool.run(task, { name: 'assembleScenarioTask', signal }) as Promise<AssembleOutcome>,
    close: () => pool.destroy(),
  };
}
