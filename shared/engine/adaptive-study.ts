/**
 * A study with an adaptive number of seeds per scenario (adaptive-stopping.ts, JCGM 101:2008
 * §7.9): each scenario runs batches of seeds in the study's seed order until every criterion's
 * decision figure is stable or the maximum is reached. Each scenario's result is exactly the
 * fixed-seed study of the same scenario with the seeds it used, so it reproduces bit for bit.
 */
import { adaptiveState, type AdaptiveOptions, type AdaptiveState } from './adaptive-stopping';
import type { Recipe } from './recipe';
import type { Scenario, ScenarioInput } from './scenario';
import { assembleStudy, runScenarioSeed, SEED_STRIDE, studySeed, type RunResult, type ScenarioStudyResult, type StudyInput } from './study';

/** Assembles one scenario's runs (seed order from run 0) and judges whether to stop. */
export function adaptiveCheck(
  recipe: Recipe,
  scenario: Scenario | ScenarioInput,
  scenarioBaseSeed: number,
  runs: readonly RunResult[],
  options: AdaptiveOptions,
  maxSeeds: number,
): { result: ScenarioStudyResult; state: AdaptiveState } {
  const result = assembleStudy({ recipe, scenarios: [scenario], seeds: runs.length, baseSeed: scenarioBaseSeed }, runs).results[0];
  const bySeed = [...runs].sort((a, b) => a.seed - b.seed);
  const state = adaptiveState(result.judged.criteria, bySeed.map((r) => r.judged), options, maxSeeds);
  return { result, state };
}

export interface AdaptiveScenarioResult {
  result: ScenarioStudyResult;
  state: AdaptiveState;
}

/** Runs every scenario of `input` adaptively; `input.seeds` is the maximum per scenario. */
export function runAdaptiveStudy(input: Omit<StudyInput, 'onProgress'> & { adaptive: AdaptiveOptions }): AdaptiveScenarioResult[] {
  const base = input.baseSeed ?? 1;
  return input.scenarios.map((scenario, j) => {
    const runs: RunResult[] = [];
    for (;;) {
      const end = Math.min(input.seeds, runs.length + input.adaptive.batchSize);
      for (let r = runs.length; r < end; r++) runs.push(runScenarioSeed(scenario, input.recipe, studySeed(base, j, r)));
      const checked = adaptiveCheck(input.recipe, scenario, base + j * SEED_STRIDE, runs, input.adaptive, input.seeds);
      if (checked.state.stop) return { result: { ...checked.result, scenarioIndex: j }, state: checked.state };
    }
  });
}
