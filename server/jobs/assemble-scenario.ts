/**
 * Assembling one scenario of a study from its stored runs: unpack each run exactly, let the
 * engine aggregate them in its canonical seed order (assembleStudy), and return the per-line
 * curves and the judged figures as plain data. It is CPU work that grows with seeds × lines, so
 * the server runs it on the worker pool like the runs themselves (it would otherwise hold up the
 * event loop for a large study); the demo seed runs it in-thread. Relative imports only (workers).
 */
import { parseRecipe } from '../../shared/engine/recipe';
import { parseScenario } from '../../shared/engine/scenario';
import type { MonteCarloAggregate } from '../../shared/engine/scores/monte-carlo';
import { SEED_STRIDE, type ComparisonAggregate, type RunResult } from '../../shared/engine/study';
import { adaptiveCheck } from '../../shared/engine/adaptive-study';
import type { AdaptiveOptions, AdaptiveState } from '../../shared/engine/adaptive-stopping';
import { unpackValue } from '../db/float-blob';

export interface AssembleTask {
  recipe: unknown;
  scenario: unknown;
  /** Scenario position in the study (for the seed rule). */
  position: number;
  seeds: number;
  baseSeed: number;
  /** The scenario's runs, packed (db/float-blob.packValue), in any order. */
  runs: Uint8Array[];
  /** Adaptive studies: the option and the maximum seeds, to judge whether to stop. */
  adaptive?: { options: AdaptiveOptions; maxSeeds: number };
}

export interface AssembledComparison {
  pass: boolean;
  criteria: ComparisonAggregate['criteria'];
  modes: ComparisonAggregate['modes'];
  figures: Record<string, number | null>;
}

export interface AssembleOutcome {
  /** Curve name → values; the plain comparison's curves are prefixed 'plain.'. */
  curves: { kind: string; values: Float64Array }[];
  reference: string;
  referenceNote: string | null;
  warnings: { message: string; runs: number }[];
  judged: AssembledComparison;
  plain: AssembledComparison | null;
  /** Adaptive studies: the stability of each criterion and whether to stop. */
  adaptive: AdaptiveState | null;
}

const finite = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** The band figures stored per comparison (also rebuilt by re-verification). */
export function bandFiguresOf(a: MonteCarloAggregate): Record<string, number | null> {
  return {
    seeds: a.seeds,
    lines: a.lines,
    overallCoverage: finite(a.overallCoverage),
    overallPhaseCoverage: finite(a.overallPhaseCoverage),
    medianRandomErrorRatio: finite(a.medianRandomErrorRatio),
    overallCoverageSe: finite(a.band.overallCoverageSe),
    overallPhaseCoverageSe: finite(a.band.overallPhaseCoverageSe),
    overallExactRegionCoverage: finite(a.band.overallExactRegionCoverage),
    overallExactRegionCoverageSe: finite(a.band.overallExactRegionCoverageSe),
    medianRandomErrorRatioSe: finite(a.band.medianRandomErrorRatioSe),
  };
}

function comparison(c: ComparisonAggregate): AssembledComparison {
  return { pass: c.pass, criteria: c.criteria, modes: c.modes, figures: bandFiguresOf(c.aggregate) };
}

function curvesOf(a: MonteCarloAggregate, prefix = ''): { kind: string; values: Float64Array }[] {
  return Object.entries(a)
    .filter((e): e is [string, Float64Array] => e[1] instanceof Float64Array)
    .map(([kind, values]) => ({ kind: prefix + kind, values }));
}

export function assembleScenarioTask(task: AssembleTask): AssembleOutcome {
  const runs = task.runs.map((b) => unpackValue<RunResult>(b));
  if (runs.length !== task.seeds) throw new Error(`assemble: ${runs.length} runs given for ${task.seeds} seeds`);
  // Run r of the scenario at position j has seed base + j·STRIDE + r: as a one-scenario study,
  // that is base' = base + j·STRIDE.
  const options = task.adaptive?.options ?? { batchSize: Math.max(2, task.seeds), significantDigits: 1 };
  const { result: r, state } = adaptiveCheck(parseRecipe(task.recipe), parseScenario(task.scenario), task.baseSeed + task.position * SEED_STRIDE, runs, options, task.adaptive?.maxSeeds ?? task.seeds);
  return {
    curves: [...curvesOf(r.judged.aggregate), ...(r.plain ? curvesOf(r.plain.aggregate, 'plain.') : [])],
    reference: r.reference,
    referenceNote: r.referenceNote ?? null,
    warnings: r.warnings,
    judged: comparison(r.judged),
    plain: r.plain ? comparison(r.plain) : null,
    adaptive: task.adaptive ? state : null,
  };
}
