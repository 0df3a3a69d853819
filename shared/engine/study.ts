/**
 * One run and whole studies: simulate a scenario for a seed, process it with a recipe, score the
 * estimate against the exact FRF on the recipe's band lines, and aggregate over seeds.
 *
 * Reference: the scenario's underlying linear FRF at the same lines. For a transient recipe the
 * exponential window adds damping on purpose, so the judged comparison is against the exact FRF
 * seen through that window (scores/windowed-reference.ts), and the plain comparison against H
 * itself — with half-power damping corrected by the window's added damping 1/(ω·τ) — is
 * reported beside it (`plain`). Criteria are judged on the first.
 *
 * Seeds (documented rule, same in every engine version): run r (0-based) of scenario j (0-based
 * position in the study) uses seed = baseSeed + j·1 000 000 + r, baseSeed = 1 unless given.
 * Nothing here reads a clock or Math.random: the same inputs give the same bytes, and runs are
 * independent, so they may be computed in any order or on other threads (worker-run.ts) and
 * assembled with `assembleStudy` to the identical result.
 */
import type { ComplexArray } from './types';
import { EngineInputError } from './errors';
import { ENGINE_VERSION } from './version';
import { processRecord } from './process';
import type { Recipe } from './recipe';
import { simulateScenario, parseScenario, type Scenario, type ScenarioInput } from './scenario';
import { systemModalTerms } from './systems';
import { scoreFrf, scoresAtFrequencies, type FrfScore, type PointScore } from './scores/line-scores';
import { exactModeReferences, modeErrors, type ModeError } from './scores/modes';
import { aggregateRuns, type MonteCarloAggregate, type SeedLineScores } from './scores/monte-carlo';
import { aggregateModes, type ModeAggregate } from './scores/mode-aggregate';
import { allPass, judgeCriteria, type Criterion } from './scores/criteria';
import { exponentialWindowReference } from './scores/windowed-reference';
import { decide, type DecidedCriterion } from './scores/decision-rules';
import { decisionFigureOf, focusOf } from './scores/decision-figures';
import { bootstrapIndices, BOOTSTRAP_RESAMPLES } from './scores/bootstrap';

export const SEED_STRIDE = 1_000_000;
export const SEED_RULE = 'seed = baseSeed + scenarioIndex·1000000 + run (both 0-based)';

/** The seed of run `run` of scenario `scenarioIndex` (module doc). */
export function studySeed(baseSeed: number, scenarioIndex: number, run: number): number {
  if (!Number.isInteger(run) || run < 0 || run >= SEED_STRIDE) {
    throw new EngineInputError('seeds', run + 1, `must be a whole number in [1, ${SEED_STRIDE}]`);
  }
  const seed = baseSeed + scenarioIndex * SEED_STRIDE + run;
  if (!Number.isSafeInteger(seed) || seed < 0) throw new EngineInputError('baseSeed', baseSeed, 'gives seeds outside the safe integers');
  return seed;
}

/** One side of a comparison: the per-line scores, the resonance scores, the aggregation input. */
export interface Comparison {
  score: FrfScore;
  modes: ModeError[];
  lines: SeedLineScores;
  /** Scores of the lines nearest each natural frequency and anti-resonance inside the band. */
  atResonances: PointScore[];
  atAntiResonances: PointScore[];
}

export interface RunResult {
  scenarioName: string;
  seed: number;
  engineVersion: string;
  /** What the judged comparison is against. */
  reference: 'linear-frf' | 'exponential-window';
  referenceNote?: string;
  /** The judged comparison. */
  judged: Comparison;
  /** Transient recipes: against the plain linear FRF, damping corrected for the window. */
  plain?: Comparison;
  exponentialTauS?: number;
  blocks: number;
  effectiveAverages: number;
  frequencyResolutionHz: number;
  warnings: string[];
  report: { inputClippedSamples: number; outputClippedSamples: number; nonlinear: boolean };
}

function sliceComplex(h: ComplexArray, start: number, end: number): ComplexArray {
  return { re: h.re.slice(start, end), im: h.im.slice(start, end) };
}

/** Simulates, processes and scores one seed of one scenario (module doc). */
export function runScenarioSeed(scenarioInput: Scenario | ScenarioInput, recipe: Recipe, seed: number): RunResult {
  const scenario = parseScenario(scenarioInput);
  const record = simulateScenario(scenario, seed);
  const processed = processRecord(record, recipe);
  const { start, end } = processed.bandIndices;
  const f = processed.frequenciesHz.slice(start, end);
  const estimate = sliceComplex(processed.chosen, start, end);
  const coherence = processed.estimate.coherence.slice(start, end);
  const predicted = processed.estimate.randomError.magnitude.slice(start, end);
  const c95 = processed.confidence95;
  const h1 = processed.estimate.h1;
  const region = processed.h1Region95Radius;
  const band = { start: 0, end: f.length };
  const lowHz = f[0];
  const highHz = f[f.length - 1];

  const linear = record.reference;
  const compare = (
    exactFrf: (fHz: Float64Array) => ComplexArray,
    modes: typeof record.reference.modes,
    dampingCorrection?: (fHz: number) => number,
  ): Comparison => {
    const exact = exactFrf(f);
    const score = scoreFrf({ frequenciesHz: f, exact, estimate, band });
    const references = exactModeReferences(modes, exactFrf, lowHz, highHz);
    const modeList = modeErrors({ frequenciesHz: f, estimate, modes, band, references, dampingCorrection });
    const inside = new Uint8Array(f.length);
    const insidePhase = new Uint8Array(f.length);
    const insideRegion = new Uint8Array(f.length);
    for (let i = 0; i < f.length; i++) {
      const h = Math.hypot(exact.re[i], exact.im[i]);
      inside[i] = h >= c95.magnitudeLow[start + i] && h <= c95.magnitudeHigh[start + i] ? 1 : 0;
      const phaseRad = (Math.abs(score.phaseErrorDeg[i]) * Math.PI) / 180;
      insidePhase[i] = phaseRad <= c95.phaseHalfWidthRad[start + i] ? 1 : 0;
      // H1's exact region is a disc about Ĥ1, whatever estimator the recipe judges.
      const dist = Math.hypot(h1.re[start + i] - exact.re[i], h1.im[start + i] - exact.im[i]);
      insideRegion[i] = dist <= region[start + i] ? 1 : 0;
    }
    const lines: SeedLineScores = {
      magnitudeErrorDb: score.magnitudeErrorDb,
      phaseErrorDeg: score.phaseErrorDeg,
      complexRelativeError: score.complexRelativeError,
      coherence,
      predictedMagnitudeError: predicted,
      insideMagnitudeBand: inside,
      insidePhaseBand: insidePhase,
      insideExactRegion: insideRegion,
    };
    return {
      score,
      modes: modeList,
      lines,
      atResonances: scoresAtFrequencies(score, modes.map((m) => m.naturalFrequencyHz)),
      atAntiResonances: scoresAtFrequencies(score, linear.antiResonancesHz),
    };
  };

  const tau = processed.exponentialTauS;
  let judged: Comparison;
  let plain: Comparison | undefined;
  if (tau !== undefined) {
    const windowed = exponentialWindowReference(systemModalTerms(scenario.system), linear.quantity, tau);
    judged = compare(windowed.frf, windowed.modes);
    plain = compare(linear.frf, linear.modes, processed.addedDampingRatio);
  } else {
    judged = compare(linear.frf, linear.modes);
  }
  const result: RunResult = {
    scenarioName: scenario.name,
    seed,
    engineVersion: ENGINE_VERSION,
    reference: tau !== undefined ? 'exponential-window' : 'linear-frf',
    judged,
    blocks: processed.spectra.blocks,
    effectiveAverages: processed.spectra.effectiveAverages,
    frequencyResolutionHz: processed.frequenciesHz[1] - processed.frequenciesHz[0],
    warnings: [...record.report.warnings, ...processed.warnings],
    report: {
      inputClippedSamples: record.report.inputClippedSamples,
      outputClippedSamples: record.report.outputClippedSamples,
      nonlinear: record.report.nonlinear,
    },
  };
  if (plain) result.plain = plain;
  if (tau !== undefined) result.exponentialTauS = tau;
  if (record.referenceNote) result.referenceNote = record.referenceNote;
  return result;
}

export interface StudyProgress {
  completed: number;
  total: number;
  scenarioIndex: number;
  seed: number;
}

export interface StudyInput {
  recipe: Recipe;
  scenarios: readonly (Scenario | ScenarioInput)[];
  /** Seeds per scenario (runs 0 … seeds − 1). */
  seeds: number;
  baseSeed?: number;
  onProgress?: (p: StudyProgress) => void;
}

/** One run to do: scenario position, run number, seed. */
export interface StudyTask {
  scenarioIndex: number;
  run: number;
  seed: number;
}

/** Every run of a study in its canonical order (scenario by scenario, run by run). */
export function planStudy(input: Pick<StudyInput, 'scenarios' | 'seeds' | 'baseSeed'>): StudyTask[] {
  const base = input.baseSeed ?? 1;
  if (!Number.isSafeInteger(base) || base < 0) throw new EngineInputError('baseSeed', base, 'must be a whole number ≥ 0');
  if (!Number.isInteger(input.seeds) || input.seeds < 1 || input.seeds > SEED_STRIDE) {
    throw new EngineInputError('seeds', input.seeds, `must be a whole number in [1, ${SEED_STRIDE}]`);
  }
  if (input.scenarios.length === 0) throw new EngineInputError('scenarios', 0, 'must hold at least one scenario');
  const tasks: StudyTask[] = [];
  input.scenarios.forEach((_, j) => {
    for (let r = 0; r < input.seeds; r++) tasks.push({ scenarioIndex: j, run: r, seed: studySeed(base, j, r) });
  });
  return tasks;
}

export interface ComparisonAggregate {
  aggregate: MonteCarloAggregate;
  modes: ModeAggregate[];
  criteria: DecidedCriterion[];
  pass: boolean;
}

export interface RunSummary {
  seed: number;
  maxAbsMagnitudeDb: number;
  maxAbsPhaseDeg: number;
  maxComplexRelative: number;
  worstLineHz: number;
  effectiveAverages: number;
}

export interface ScenarioStudyResult {
  scenarioIndex: number;
  scenarioName: string;
  seeds: number[];
  reference: RunResult['reference'];
  referenceNote?: string;
  judged: ComparisonAggregate;
  plain?: ComparisonAggregate;
  runs: RunSummary[];
  /** Distinct warnings with the number of runs that gave each, in first-seen order. */
  warnings: { message: string; runs: number }[];
}

export interface StudyResult {
  engineVersion: string;
  recipe: Recipe;
  scenarios: (Scenario | ScenarioInput)[];
  seedRule: { rule: string; baseSeed: number; stride: number; seedsPerScenario: number };
  results: ScenarioStudyResult[];
  /** Every judged criterion of every scenario passes. */
  pass: boolean;
}

function aggregateComparison(recipe: Recipe, list: Comparison[]): ComparisonAggregate {
  const aggregate = aggregateRuns(list[0].score.frequenciesHz, list.map((c) => c.lines));
  const modes = aggregateModes(list.map((c) => c.modes));
  const criteria = decideCriteria(recipe, judgeCriteria(recipe.tolerances, aggregate, modes), list, aggregate);
  return { aggregate, modes, criteria, pass: allPass(criteria) };
}

/**
 * Each criterion's decision under the recipe's rule, with the bootstrap replicates of its decision
 * figure (scores/decision-rules.ts; one shared set of resamples of the seeds, fixed seed).
 */
export function decideCriteria(recipe: Recipe, criteria: Criterion[], list: readonly Pick<Comparison, 'lines' | 'modes'>[], aggregate: MonteCarloAggregate): DecidedCriterion[] {
  const S = list.length;
  const resamples = S > 1 ? BOOTSTRAP_RESAMPLES : 0;
  const idx = bootstrapIndices(S, resamples);
  return criteria.map((c) => {
    const figure = decisionFigureOf(c.id, list);
    const focus = focusOf(c.id, aggregate);
    const replicates = new Float64Array(resamples);
    for (let b = 0; b < resamples; b++) replicates[b] = figure(idx.subarray(b * S, (b + 1) * S), focus);
    return decide(c, replicates, recipe.decisionRules?.[c.id as keyof NonNullable<Recipe['decisionRules']>]);
  });
}

/**
 * Assembles a study from its runs, given in any order (they are sorted into the canonical order
 * of `planStudy` first). Throws if a planned run is missing.
 */
export function assembleStudy(input: Omit<StudyInput, 'onProgress'>, runs: readonly RunResult[]): StudyResult {
  const tasks = planStudy(input);
  const bySeed = new Map<number, RunResult>();
  for (const r of runs) bySeed.set(r.seed, r);
  const results: ScenarioStudyResult[] = input.scenarios.map((_, j) => {
    const mine = tasks.filter((t) => t.scenarioIndex === j).map((t) => {
      const run = bySeed.get(t.seed);
      if (!run) throw new EngineInputError('runs', t.seed, `is missing the run of scenario ${j} with this seed`);
      return run;
    });
    const first = mine[0];
    const warnings: { message: string; runs: number }[] = [];
    for (const run of mine) {
      for (const message of new Set(run.warnings)) {
        const w = warnings.find((x) => x.message === message);
        if (w) w.runs++;
        else warnings.push({ message, runs: 1 });
      }
    }
    const result: ScenarioStudyResult = {
      scenarioIndex: j,
      scenarioName: first.scenarioName,
      seeds: mine.map((r) => r.seed),
      reference: first.reference,
      judged: aggregateComparison(input.recipe, mine.map((r) => r.judged)),
      runs: mine.map((r) => ({
        seed: r.seed,
        maxAbsMagnitudeDb: r.judged.score.summary.maxAbsMagnitudeDb,
        maxAbsPhaseDeg: r.judged.score.summary.maxAbsPhaseDeg,
        maxComplexRelative: r.judged.score.summary.maxComplexRelative,
        worstLineHz: r.judged.score.summary.worstLineHz,
        effectiveAverages: r.effectiveAverages,
      })),
      warnings,
    };
    if (first.referenceNote) result.referenceNote = first.referenceNote;
    if (mine.every((r) => r.plain)) result.plain = aggregateComparison(input.recipe, mine.map((r) => r.plain!));
    return result;
  });
  return {
    engineVersion: ENGINE_VERSION,
    recipe: structuredClone(input.recipe),
    scenarios: structuredClone([...input.scenarios]),
    seedRule: { rule: SEED_RULE, baseSeed: input.baseSeed ?? 1, stride: SEED_STRIDE, seedsPerScenario: input.seeds },
    results,
    pass: results.every((r) => r.judged.pass),
  };
}

/** Runs every planned seed of every scenario in order, reporting progress, and assembles them. */
export function runStudy(input: StudyInput): StudyResult {
  const tasks = planStudy(input);
  const runs: RunResult[] = [];
  tasks.forEach((t, i) => {
    runs.push(runScenarioSeed(input.scenarios[t.scenarioIndex], input.recipe, t.seed));
    input.onProgress?.({ completed: i + 1, total: tasks.length, scenarioIndex: t.scenarioIndex, seed: t.seed });
  });
  return assembleStudy(input, runs);
}
