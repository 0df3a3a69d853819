/**
 * Sweep throughput: a 4 × 3 grid (block length × overlap) × 20 seeds = 240 runs, in this thread,
 * against the same 240 runs done as 12 plain studies (one per grid recipe, 20 seeds each). Each
 * prints its wall time and runs per second; the study workload also prints the sweep's speed as a
 * fraction of the plain studies' (goal ≥ 0.9: the grid, per-seed criteria and the cheapest-point
 * search should cost little beside the runs themselves).
 */
import { performance } from 'node:perf_hooks';
import { runStudy } from '../../shared/engine/study';
import { expandSweep, type SweepAxis } from '../../shared/engine/sweep';
import { runSweep } from '../../shared/engine/sweep-result';
import { hannRecipe, sdofRandomScenario } from '../engine/study-helpers';
import type { Workload } from './run';

const SEEDS = 20;
const recipe = hannRecipe({ averages: 8 });
const scenario = sdofRandomScenario({ durationS: 32, snrDb: 30 });
const vary: SweepAxis[] = [
  { setting: 'blockLength', values: [256, 512, 1024, 2048] },
  { setting: 'overlap', values: [0, 0.5, 0.75] },
];
const RUNS = 12 * SEEDS;
const times: { sweep?: number; study?: number } = {};

function report(label: string, ms: number): void {
  process.stderr.write(`    ${label}: ${RUNS} runs in ${(ms / 1000).toFixed(2)} s = ${((RUNS * 1000) / ms).toFixed(1)} runs/s\n`);
}

export const workloads: Workload[] = [
  {
    name: 'sweep-4x3-x20-seeds-main-thread',
    repeats: 3,
    run: () => {
      const t0 = performance.now();
      runSweep({ recipe, scenario, vary, seeds: SEEDS });
      times.sweep = performance.now() - t0;
      report('sweep', times.sweep);
    },
  },
  {
    name: 'study-12-recipes-x20-same-runs-main-thread',
    repeats: 3,
    run: () => {
      const t0 = performance.now();
      for (const p of expandSweep(recipe, scenario, vary).points) runStudy({ recipe: p.recipe, scenarios: [p.scenario], seeds: SEEDS });
      times.study = performance.now() - t0;
      report('plain studies', times.study);
      if (times.sweep) process.stderr.write(`    sweep speed ÷ plain studies' speed: ${(times.study / times.sweep).toFixed(2)} (goal ≥ 0.9)\n`);
    },
  },
];
