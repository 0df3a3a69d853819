/**
 * Study runs as plain, serialisable work for other threads or processes: a chunk of planned runs
 * in, their RunResults out (objects, numbers, strings and typed arrays only, so they pass through
 * postMessage / structured clone unchanged). Pure: no thread or process code lives here; the
 * caller owns the pool. Chunks may run anywhere in any order: `assembleStudy` puts the runs back
 * in the canonical order, so the assembled study is the same bytes as `runStudy`'s.
 */
import type { Recipe } from './recipe';
import type { Scenario, ScenarioInput } from './scenario';
import { runScenarioSeed, type RunResult, type StudyTask } from './study';
import { ENGINE_VERSION } from './version';

export interface StudyChunkInput {
  recipe: Recipe;
  scenarios: (Scenario | ScenarioInput)[];
  tasks: StudyTask[];
}

export interface StudyChunkFailure {
  scenarioIndex: number;
  seed: number;
  error: string;
}

export interface StudyChunkOutput {
  engineVersion: string;
  runs: RunResult[];
  failures: StudyChunkFailure[];
}

/** Runs every task of the chunk; an engine error fails that run only and is reported by seed. */
export function runStudyChunk(input: StudyChunkInput): StudyChunkOutput {
  const runs: RunResult[] = [];
  const failures: StudyChunkFailure[] = [];
  for (const t of input.tasks) {
    try {
      runs.push(runScenarioSeed(input.scenarios[t.scenarioIndex], input.recipe, t.seed));
    } catch (err) {
      failures.push({ scenarioIndex: t.scenarioIndex, seed: t.seed, error: err instanceof Error ? err.message : String(err) });
    }
  }
  return { engineVersion: ENGINE_VERSION, runs, failures };
}

/** Splits tasks into `parts` contiguous chunks whose sizes differ by at most one. */
export function splitTasks<T>(tasks: readonly T[], parts: number): T[][] {
  const n = Math.max(1, Math.min(Math.floor(parts), tasks.length || 1));
  const out: T[][] = [];
  let start = 0;
  for (let i = 0; i < n; i++) {
    const size = Math.floor(tasks.length / n) + (i < tasks.length % n ? 1 : 0);
    out.push(tasks.slice(start, start + size));
    start += size;
  }
  return out;
}
