/**
 * Results of a sweep (sweep.ts): each grid point judged as a one-scenario study over the same
 * seeds, each criterion also judged per seed (its Monte Carlo scatter), and the cheapest passing
 * choice by measurement time.
 *
 * Per-seed figures: a criterion judged on one seed's aggregate — the percentiles of a single seed
 * are that seed's values (scores/criteria.ts), so the per-seed figure is that run's own worst line.
 *
 * Cheapest passing: points with the same choices (differing only in a test condition) form one
 * choice; it passes only when every one of its points ran and passed. Among passing choices the
 * shortest measurement time wins; equal times go to the choice that comes first in grid order.
 * Null when no choice passes.
 */
import { EngineInputError } from './errors';
import { aggregateModes } from './scores/mode-aggregate';
import { aggregateRuns } from './scores/monte-carlo';
import { judgeCriteria, type Criterion } from './scores/criteria';
import { assembleStudy, runScenarioSeed, type RunResult } from './study';
import { expandSweep, SWEEP_SETTINGS, type SweepAxis, type SweepPlan, type SweepPoint, type SweepSetting, type SweepValue } from './sweep';
import type { Recipe } from './recipe';
import type { Scenario, ScenarioInput } from './scenario';

/** One grid point's outcome: judged over its seeds, or could not run (the engine's message). */
export interface SweepPointResult {
  index: number;
  settings: Partial<Record<SweepSetting, SweepValue>>;
  blockLength: number;
  frequencyResolutionHz: number;
  averages: number;
  measurementTimeS: number;
  /** False when a run of the point threw; `error` then holds the engine's message. */
  ran: boolean;
  error: string | null;
  pass: boolean;
  criteria: Criterion[];
  /** Criterion id → its figure on each seed, in seed order (null where not computable). */
  perSeed: Record<string, (number | null)[]>;
  warnings: { message: string; runs: number }[];
}

export interface CheapestPassing {
  /** The first grid point of the cheapest passing choice. */
  index: number;
  /** Every grid point of that choice (one per test condition value). */
  points: number[];
  settings: Partial<Record<SweepSetting, SweepValue>>;
  measurementTimeS: number;
}

export interface SweepResult {
  axes: SweepAxis[];
  seeds: number[];
  points: SweepPointResult[];
  cheapestPassing: CheapestPassing | null;
  /** One sentence naming the cheapest passing point, or saying none passed. */
  statement: string;
}

/** Each criterion judged on one run alone (module doc). */
export function seedCriteria(recipe: Recipe, run: RunResult): Criterion[] {
  const lines = run.judged.lines;
  const aggregate = aggregateRuns(run.judged.score.frequenciesHz, [lines]);
  return judgeCriteria(recipe.tolerances, aggregate, aggregateModes([run.judged.modes]));
}

/** Judges one point from its runs (any order; sorted by seed rule) as a one-scenario study. */
export function assembleSweepPoint(point: SweepPoint, seeds: number, baseSeed: number, runs: readonly RunResult[]): SweepPointResult {
  const study = assembleStudy({ recipe: point.recipe, scenarios: [point.scenario], seeds, baseSeed }, runs);
  const result = study.results[0];
  const bySeed = new Map(runs.map((r) => [r.seed, r]));
  const perSeed: Record<string, (number | null)[]> = {};
  for (const c of result.judged.criteria) perSeed[c.id] = [];
  for (const seed of result.seeds) {
    for (const c of seedCriteria(point.recipe, bySeed.get(seed)!)) perSeed[c.id]?.push(c.observed);
  }
  return { ...pointBase(point), ran: true, error: null, pass: result.judged.pass, criteria: result.judged.criteria, perSeed, warnings: result.warnings };
}

/** A point none of whose figures exist: a run threw `error`. */
export function failedSweepPoint(point: SweepPoint, error: string): SweepPointResult {
  return { ...pointBase(point), ran: false, error, pass: false, criteria: [], perSeed: {}, warnings: [] };
}

function pointBase(p: SweepPoint) {
  return {
    index: p.index,
    settings: p.settings,
    blockLength: p.blockLength,
    frequencyResolutionHz: p.frequencyResolutionHz,
    averages: p.averages,
    measurementTimeS: p.measurementTimeS,
  };
}

/** The cheapest passing choice (module doc), or null. */
export function cheapestPassing(plan: SweepPlan, points: readonly Pick<SweepPointResult, 'index' | 'ran' | 'pass'>[]): CheapestPassing | null {
  if (points.length !== plan.points.length) throw new EngineInputError('points', points.length, `must hold the sweep's ${plan.points.length} grid points`);
  const groups = new Map<string, SweepPoint[]>();
  for (const p of plan.points) groups.set(p.choiceKey, [...(groups.get(p.choiceKey) ?? []), p]);
  let best: CheapestPassing | null = null;
  for (const members of groups.values()) {
    if (!members.every((m) => points[m.index].ran && points[m.index].pass)) continue;
    const first = members[0];
    const time = Math.max(...members.map((m) => m.measurementTimeS));
    if (best === null || time < best.measurementTimeS) {
      const settings: Partial<Record<SweepSetting, SweepValue>> = {};
      for (const [k, v] of Object.entries(first.settings)) if (SWEEP_SETTINGS[k as SweepSetting].kind === 'choice') settings[k as SweepSetting] = v;
      best = { index: first.index, points: members.map((m) => m.index), settings, measurementTimeS: time };
    }
  }
  return best;
}

/** "block length 1024 samples" — a setting and its value in words. */
export function settingWords(setting: SweepSetting, value: SweepValue): string {
  const info = SWEEP_SETTINGS[setting];
  const unit = info.unit && typeof value === 'number' ? ` ${info.unit}` : '';
  return `${info.label.toLowerCase()} ${value}${unit}`;
}

function seconds(t: number): string {
  return `${Number(t.toPrecision(4))} s`;
}

/** The one sentence a reader gets: the cheapest passing point, or that nothing passed. */
export function sweepStatement(plan: SweepPlan, cheapest: CheapestPassing | null, points: readonly SweepPointResult[]): string {
  if (!cheapest) {
    const couldNot = points.filter((p) => !p.ran).length;
    const tail = couldNot > 0 ? ` (${couldNot} of ${points.length} points could not run)` : '';
    return `No point of this sweep passes every criterion${tail}.`;
  }
  const p = plan.points[cheapest.index];
  const choice = Object.entries(cheapest.settings).map(([k, v]) => settingWords(k as SweepSetting, v));
  const what = choice.length ? choice.join(' with ') : 'the recipe as it is';
  const conditions = plan.axes.filter((a) => SWEEP_SETTINGS[a.setting].kind === 'condition');
  const across = conditions.length ? ` at every ${SWEEP_SETTINGS[conditions[0].setting].label.toLowerCase()} tried` : '';
  return `The cheapest passing point is ${what}: ${seconds(cheapest.measurementTimeS)} of record (${p.averages} averages of ${p.blockLength} samples) passes every criterion${across}.`;
}

export interface RunSweepInput {
  recipe: Recipe | unknown;
  scenario: Scenario | ScenarioInput;
  vary: readonly SweepAxis[];
  seeds: number;
  baseSeed?: number;
  onProgress?: (p: { completed: number; total: number; point: number }) => void;
}

/**
 * Runs a whole sweep in this thread (the CLI and the benchmark; the server spreads the same runs
 * over its worker pool): every point over the same seeds, a point whose runs throw marked as
 * unable to run with the engine's message.
 */
export function runSweep(input: RunSweepInput): SweepResult & { plan: SweepPlan } {
  const plan = expandSweep(input.recipe, input.scenario, input.vary);
  const base = input.baseSeed ?? 1;
  const seeds = Array.from({ length: input.seeds }, (_, r) => base + r);
  if (!Number.isInteger(input.seeds) || input.seeds < 1) throw new EngineInputError('seeds', input.seeds, 'must be a whole number ≥ 1');
  const total = plan.points.length * input.seeds;
  let completed = 0;
  const points = plan.points.map((point) => {
    const runs: RunResult[] = [];
    for (const seed of seeds) {
      try {
        runs.push(runScenarioSeed(point.scenario, point.recipe, seed));
      } catch (error) {
        if (!(error instanceof EngineInputError)) throw error;
        completed += input.seeds - runs.length;
        input.onProgress?.({ completed, total, point: point.index });
        return failedSweepPoint(point, error.message);
      }
      input.onProgress?.({ completed: ++completed, total, point: point.index });
    }
    return assembleSweepPoint(point, input.seeds, base, runs);
  });
  const cheapest = cheapestPassing(plan, points);
  return { plan, axes: plan.axes, seeds, points, cheapestPassing: cheapest, statement: sweepStatement(plan, cheapest, points) };
}
