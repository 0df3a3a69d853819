/**
 * The default RunExecutor: a piscina pool of worker threads, so that runs never block the event
 * loop that serves the API. Threads cannot see jest's or tsx's transforms of the main thread, so
 * the pool loads a small .js entry that registers tsx and then requires the TypeScript worker.
 */
import path from 'node:path';
import Piscina from 'piscina';
import type { RunExecutor, RunOutcome, RunTask } from './run-task';

export const WORKER_ENTRY = path.join(__dirname, 'study-worker.js');

export function createPoolExecutor(threads: number): RunExecutor {
  const pool = new Piscina<RunTask, RunOutcome>({
    filename: WORKER_ENTRY,
    name: 'runStudyTask',
    minThreads: 0,
    maxThreads: threads,
    idleTimeout: 30_000,
  });
  return {
    capacity: threads,
    run: (task, signal) => pool.run(task, signal ? { signal } : undefined),
    close: () => pool.destroy(),
  };
}
