/**
 * The what-if bench's computation, all in the browser with the shared engine: the scenario with
 * the bench's noise placement and level, delay and record length; simulated for one seed; a
 * stationary recipe (block length, window, 50 % overlap, every block, estimator) over the
 * excitation band; all three estimators, coherence, the chosen estimator's 95 % band and its
 * errors against the exact FRF. Pure apart from the clock passed in.
 */
import { processRecord } from '@/shared/engine/process';
import type { Recipe } from '@/shared/engine/recipe';
import { parseScenario, simulateScenario, type Scenario, type ScenarioInput } from '@/shared/engine/scenario';
import { scoreFrf } from '@/shared/engine/scores/line-scores';
import type { ComplexArray, Estimator, WindowName } from '@/shared/engine/types';
import { NORMAL_95 } from '@/shared/engine/random-errors';

export type NoisePlacement = 'none' | 'input' | 'output' | 'both';

export interface WhatIfSettings {
  noise: NoisePlacement;
  snrDb: number;
  delayMs: number;
  blockLength: number;
  window: WindowName;
  estimator: Estimator;
  durationS: number;
  seed: number;
  toleranceDb: number;
}

export interface WhatIfResult {
  frequenciesHz: Float64Array;
  exact: ComplexArray;
  h1: ComplexArray;
  h2: ComplexArray;
  hv: ComplexArray;
  coherence: Float64Array;
  chosen: ComplexArray;
  confidence: { magnitudeLow: Float64Array; magnitudeHigh: Float64Array; phaseHalfWidthRad: Float64Array };
  magnitudeErrorDb: Float64Array;
  /** ±1.96·ε of |Ĥ| in dB around 0 (Bendat & Piersol's random error at the estimated coherence). */
  randomErrorDb: { low: Float64Array; high: Float64Array };
  unit: string;
  summary: { maxAbsMagnitudeDb: number; worstLineHz: number; meanCoherence: number; blocks: number; effectiveAverages: number; resolutionHz: number; samples: number };
  warnings: string[];
  millis: number;
}

/** The base scenario's band of interest: its excitation band (stationary kinds only). */
export function benchBand(s: Scenario): { lowHz: number; highHz: number } | null {
  return s.excitation.kind === 'impact' ? null : { ...s.excitation.band };
}

/** The scenario as the bench's settings change it (noise as SNR over the excitation band). */
export function benchScenario(base: Scenario, s: WhatIfSettings): ScenarioInput {
  const errors = { ...base.errors };
  delete errors.inputNoise;
  delete errors.outputNoise;
  if (s.noise === 'input' || s.noise === 'both') errors.inputNoise = { snrDb: s.snrDb };
  if (s.noise === 'output' || s.noise === 'both') errors.outputNoise = { snrDb: s.snrDb };
  if (s.delayMs !== 0) errors.delayS = s.delayMs / 1000;
  else delete errors.delayS;
  return { ...base, errors, acquisition: { ...base.acquisition, durationS: s.durationS } };
}

export function benchRecipe(band: { lowHz: number; highHz: number }, s: WhatIfSettings): Recipe {
  return {
    name: 'What-if bench',
    blockLength: s.blockLength,
    window: s.window,
    overlap: 0.5,
    averages: 'all',
    detrend: 'none',
    estimator: s.estimator,
    band,
    scaling: 'density',
    tolerances: { magnitudeDb: s.toleranceDb },
  };
}

const slice = (c: ComplexArray, a: number, b: number): ComplexArray => ({ re: c.re.slice(a, b), im: c.im.slice(a, b) });

/** Simulates and processes (module doc); throws the engine's EngineInputError for bad settings. */
export function runWhatIf(baseInput: unknown, settings: WhatIfSettings, clock: () => number): WhatIfResult {
  const started = clock();
  const base = parseScenario(baseInput);
  const band = benchBand(base);
  if (!band) throw new Error('The bench handles stationary excitation; open an impact scenario in a study instead.');
  const record = simulateScenario(benchScenario(base, settings), settings.seed);
  const processed = processRecord(record, benchRecipe(band, settings));
  const { start, end } = processed.bandIndices;
  const f = processed.frequenciesHz.slice(start, end);
  const exact = record.reference.frf(f);
  const e = processed.estimate;
  const chosen = slice(processed.chosen, start, end);
  const score = scoreFrf({ frequenciesHz: f, exact, estimate: chosen });
  const coherence = e.coherence.slice(start, end);
  const eps = e.randomError.magnitude.slice(start, end);
  const low = Float64Array.from(eps, (v) => (NORMAL_95 * v < 1 ? 20 * Math.log10(1 - NORMAL_95 * v) : NaN));
  const high = Float64Array.from(eps, (v) => 20 * Math.log10(1 + NORMAL_95 * v));
  let sum = 0;
  for (let i = 0; i < coherence.length; i++) sum += coherence[i];
  return {
    frequenciesHz: f,
    exact,
    h1: slice(e.h1, start, end),
    h2: slice(e.h2, start, end),
    hv: slice(e.hv, start, end),
    coherence,
    chosen,
    confidence: {
      magnitudeLow: processed.confidence95.magnitudeLow.slice(start, end),
      magnitudeHigh: processed.confidence95.magnitudeHigh.slice(start, end),
      phaseHalfWidthRad: processed.confidence95.phaseHalfWidthRad.slice(start, end),
    },
    magnitudeErrorDb: score.magnitudeErrorDb,
    randomErrorDb: { low, high },
    unit: record.reference.unit,
    summary: {
      maxAbsMagnitudeDb: score.summary.maxAbsMagnitudeDb,
      worstLineHz: score.summary.worstLineHz,
      meanCoherence: coherence.length ? sum / coherence.length : NaN,
      blocks: processed.spectra.blocks,
      effectiveAverages: processed.spectra.effectiveAverages,
      resolutionHz: record.sampleRateHz / settings.blockLength,
      samples: record.input.length,
    },
    warnings: [...record.report.warnings, ...processed.warnings],
    millis: clock() - started,
  };
}
