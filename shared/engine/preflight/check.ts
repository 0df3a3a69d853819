/**
 * The pre-flight check of a recipe against a scenario, run before anything is simulated: by the
 * study form (live), the API (a refused pair is answered 422 and nothing is stored), the what-if
 * bench, the advice and the CLI. Refusals are pairs that cannot run; warnings are pairs whose
 * result would mislead unless read with them (refusals.ts, warnings.ts). The figures (block,
 * line spacing, blocks, Welch's effective averages, excitation band) follow the run's own rules
 * (figures.ts).
 *
 * The recipe and the scenario are each validated first (parseRecipe, resolveScenario); a recipe
 * or scenario that is invalid on its own throws EngineInputError as everywhere else.
 */
import { parseRecipe, type Recipe } from '../recipe';
import { resolveScenario, type Scenario, type ScenarioInput } from '../scenario';
import { recipeBlockLength } from '../recipe';
import { preflightFigures } from './figures';
import type { Finding, Preflight } from './findings';
import { bandAboveNyquist, bandWithoutLines, blockLongerThanRecord, nothingExcitedInBand, tooFewBlocks } from './refusals';
import {
  bandOutsideExcitation,
  fewEffectiveAverages,
  modesOutOfReach,
  noCriteria,
  periodNotWholeInBlock,
  resolutionCoarserThanTolerance,
} from './warnings';

/** Refusals and warnings of `recipe` on `scenario` (module doc). */
export function preflight(recipeInput: Recipe, scenarioInput: Scenario | ScenarioInput): Preflight {
  const recipe = parseRecipe(recipeInput);
  const { scenario, plan } = resolveScenario(scenarioInput);
  const blockLength = recipeBlockLength(recipe, plan.sampleRateHz);
  const figures = preflightFigures(recipe, scenario, plan);
  const refusals: Finding[] = [
    ...bandAboveNyquist(recipe, plan),
    ...blockLongerThanRecord(recipe, plan, blockLength),
    ...nothingExcitedInBand(recipe, scenario),
  ];
  if (figures) {
    refusals.push(...tooFewBlocks(recipe, plan, figures));
    if (recipe.band.highHz <= figures.nyquistHz) refusals.push(...bandWithoutLines(recipe, figures));
  }
  const warnings: Finding[] = [...bandOutsideExcitation(recipe, scenario, figures, plan)];
  if (figures) warnings.push(...periodNotWholeInBlock(recipe, scenario, plan, figures));
  warnings.push(...modesOutOfReach(recipe, plan));
  if (figures) {
    warnings.push(...resolutionCoarserThanTolerance(recipe, plan, figures));
    if (!refusals.some((r) => r.code === 'too-few-blocks')) warnings.push(...fewEffectiveAverages(recipe, figures));
  }
  warnings.push(...noCriteria(recipe));
  return { scenarioName: scenario.name, refusals, warnings, figures };
}

/** One line per finding, for logs, the CLI and stored messages: the sentence and its fix. */
export function findingText(f: Pick<Finding, 'message' | 'fix'>): string {
  return `${f.message} ${f.fix}`;
}
