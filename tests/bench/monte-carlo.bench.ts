/**
 * Monte Carlo throughput: one recipe × 6 scenarios × 100 seeds (600 runs of simulate → process →
 * score, then the aggregation), in this thread, on 1 worker thread and on 2 worker threads.
 * Each workload prints its runs per second; the warm-up of each threaded workload also checks
 * that its assembled study is byte-identical to the in-thread one (determinism across threads).
 *
 * The runner's `run` is synchronous, so the main thread posts the chunks and blocks in
 * Atomics.wait until every worker raises its flag, then takes the replies with
 * receiveMessageOnPort. Workers are started once in `setup` (not timed) and unref'd.
 */
import { resolve } from 'node:path';
import { MessageChannel, Worker, receiveMessageOnPort, type MessagePort } from 'node:worker_threads';
import { assembleStudy, planStudy, runStudy, type RunResult, type StudyResult } from '../../shared/engine/study';
import { splitTasks, type StudyChunkOutput } from '../../shared/engine/worker-run';
import { toBytes } from '../engine/study-helpers';
import { benchRecipe, benchScenarios, SEEDS_PER_SCENARIO } from './monte-carlo-scenarios';
import type { Workload } from './run';

const input = { recipe: benchRecipe, scenarios: benchScenarios, seeds: SEEDS_PER_SCENARIO };
const RUNS = benchScenarios.length * SEEDS_PER_SCENARIO;

interface Pool {
  ports: MessagePort[];
  flags: Int32Array;
  workers: Worker[];
}

function startPool(size: number): Pool {
  const flags = new Int32Array(new SharedArrayBuffer(4 * size));
  const ports: MessagePort[] = [];
  const workers: Worker[] = [];
  for (let i = 0; i < size; i++) {
    const { port1, port2 } = new MessageChannel();
    const w = new Worker(resolve(__dirname, 'monte-carlo-worker.js'), {
      workerData: { port: port2, flags, index: i },
      transferList: [port2],
    });
    w.unref();
    ports.push(port1);
    workers.push(w);
  }
  return { ports, flags, workers };
}

/** Runs the whole study on the pool's workers and assembles it here. */
function runOnPool(pool: Pool): StudyResult {
  const chunks = splitTasks(planStudy(input), pool.ports.length);
  chunks.forEach((tasks, i) => {
    Atomics.store(pool.flags, i, 0);
    pool.ports[i].postMessage({ recipe: benchRecipe, scenarios: benchScenarios, tasks });
  });
  const runs: RunResult[] = [];
  chunks.forEach((_, i) => {
    Atomics.wait(pool.flags, i, 0);
    const reply = receiveMessageOnPort(pool.ports[i]);
    if (!reply) throw new Error(`worker ${i} raised its flag without a reply`);
    const out = reply.message as StudyChunkOutput;
    if (out.failures.length) throw new Error(`worker ${i}: ${out.failures[0].error}`);
    runs.push(...out.runs);
  });
  return assembleStudy(input, runs);
}

let reference = '';
function report(label: string, t0: number): void {
  const s = (performance.now() - t0) / 1000;
  process.stderr.write(`    ${label}: ${RUNS} runs in ${s.toFixed(2)} s = ${(RUNS / s).toFixed(1)} runs/s\n`);
}

function threaded(size: number): Workload {
  let pool: Pool | null = null;
  let checked = false;
  return {
    name: `monte-carlo-6x100-${size}-worker${size > 1 ? 's' : ''}`,
    repeats: 3,
    setup: () => {
      pool = startPool(size);
    },
    run: () => {
      const t0 = performance.now();
      const study = runOnPool(pool!);
      report(`${size} worker thread${size > 1 ? 's' : ''}`, t0);
      if (!checked) {
        if (reference && toBytes(study) !== reference) throw new Error(`the ${size}-worker study differs from the in-thread one`);
        checked = true;
      }
    },
  };
}

export const workloads: Workload[] = [
  {
    name: 'monte-carlo-6x100-main-thread',
    repeats: 3,
    run: () => {
      const t0 = performance.now();
      const study = runStudy(input);
      report('main thread', t0);
      if (!reference) reference = toBytes(study);
    },
  },
  threaded(1),
  threaded(2),
];
