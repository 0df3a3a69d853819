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
import { assembleStudy, SEED_STRIDE, type ComparisonAggregate, type RunResult } from '../../shared/engine/study';
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
}

const finite = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function comparison(c: ComparisonAggregate): AssembledComparison {
  const a = c.aggregate;
  return {
    pass: c.pass,
    criteria: c.criteria,
    modes: c.modes,
    figures: {
      seeds: a.seeds,
      lines: a.lines,
      overallCoverage: finite(a.overallCoverage),
      overallPhaseCoverage: finite(a.overallPhaseCoverage),
      medianRandomErrorRatio: finite(a.medianRandomErrorRatio),
    },
  };
}

function curvesOf(a: MonteCarloAggregate, prefix = ''): { kind: string; values: Float64Array }[] {
  return Object.entries(a)
    .filter((e): e is [string, Float64Array] => e[1] instanceof Float64Array)
    .map(([kind, values]) => ({ kind: prefix + kind, values }));
}

export function assembleScenarioTask(task: AssembleTask): AssembleOutcome {
  const r = assembleStudy(
    {
      recipe: parseRecipe(task.recipe),
      scenarios: [parseScenario(task.scenario)],
      seeds: task.seeds,
      // Run r of the scenario at position j has seed base + j·STRIDE + r: as a one-scenario
      // study, that is base' = base + j·STRIDE.
      baseSeed: task.baseSeed + task.position * SEED_STRIDE,
    },
    task.runs.map((b) => unpackValue<RunResult>(b)),
  ).results[0];
  return {
    curves: [...curvesOf(r.judged.aggregate), ...(r.plain ? curvesOf(r.plain.aggregate, 'plain.') : [])],
    reference: r.reference,
    referenceNote: r.referenceNote ?? null,
    warnings: r.warnings,
    judged: comparison(r.judged),
    plain: r.plain ? comparison(r.plain) : null,
  };
}
