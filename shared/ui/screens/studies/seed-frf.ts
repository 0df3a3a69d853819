/**
 * One seed of a study's scenario, recomputed in the browser by the shared engine: the same
 * simulation and recipe the server ran for that seed (the engine is deterministic per seed), so
 * the three estimators, the exact FRF and the 95 % band of the recipe's estimator can be drawn.
 */
import { processRecord, simulateScenario, studySeed, type Recipe, type Scenario } from '@/shared/engine';

export type SeedFrf = {
  seed: number;
  unit: string;
  frequenciesHz: Float64Array;
  exact: { re: Float64Array; im: Float64Array };
  h1: { re: Float64Array; im: Float64Array };
  h2: { re: Float64Array; im: Float64Array };
  hv: { re: Float64Array; im: Float64Array };
  estimator: 'H1' | 'H2' | 'Hv';
  confidence: { magnitudeLow: Float64Array; magnitudeHigh: Float64Array; phaseHalfWidthRad: Float64Array };
  warnings: string[];
};

const slice = (h: { re: Float64Array; im: Float64Array }, a: number, b: number) => ({ re: h.re.slice(a, b), im: h.im.slice(a, b) });

/** Simulates run 0 of the scenario at `position` with the study's seed rule and processes it. */
export function computeSeedFrf(scenario: Scenario, recipe: Recipe, baseSeed: number, position: number): SeedFrf {
  const seed = studySeed(baseSeed, position, 0);
  const record = simulateScenario(scenario, seed);
  const processed = processRecord(record, recipe);
  const { start, end } = processed.bandIndices;
  const f = processed.frequenciesHz.slice(start, end);
  const exact = record.reference.frf(f);
  return {
    seed,
    unit: `${record.outputUnit}/N`,
    frequenciesHz: f,
    exact: { re: Float64Array.from(exact.re), im: Float64Array.from(exact.im) },
    h1: slice(processed.estimate.h1, start, end),
    h2: slice(processed.estimate.h2, start, end),
    hv: slice(processed.estimate.hv, start, end),
    estimator: recipe.estimator as SeedFrf['estimator'],
    confidence: {
      magnitudeLow: processed.confidence95.magnitudeLow.slice(start, end),
      magnitudeHigh: processed.confidence95.magnitudeHigh.slice(start, end),
      phaseHalfWidthRad: processed.confidence95.phaseHalfWidthRad.slice(start, end),
    },
    warnings: [...record.report.warnings, ...processed.warnings],
  };
}

/** A stored curve with nulls (no value at that line) as NaN, which the plots leave as gaps. */
export function toFloat(values: readonly (number | null)[] | undefined): Float64Array {
  const out = new Float64Array(values?.length ?? 0);
  values?.forEach((v, i) => (out[i] = v === null ? Number.NaN : v));
  return out;
}
