/**
 * Applies a recipe to one two-channel record (input = force, output = response): spectra,
 * all three estimators, the recipe's chosen one, the band's line range and 95 % confidence bands.
 *
 * Stationary records: Welch averaging (welch.ts). Transient records (recipe.transient): blocks
 * opened by a level trigger on the input, input × force window, output × exponential window,
 * each also × the recipe's window (normally rectangular for impacts); the scale is that of the
 * recipe's window alone, the same for both channels (transient.ts). The exponential window's
 * added damping ζ_add = 1/(ωτ) is reported so that damping estimates can be corrected.
 */
import type { ComplexArray } from './types';
import { EngineInputError, requireFinite } from './errors';
import { accumulateCrossSpectra, requireFiniteSamples, welchCrossSpectra, type CrossSpectra } from './welch';
import { estimateFrf, type FrfEstimate } from './estimators';
import { confidence95, type Confidence95 } from './random-errors';
import { h1ExactRegionRadius } from './exact-frf-region';
import { parseRecipe, resolveRecipe, type Recipe, type ResolvedRecipe } from './recipe';
import { windowSamples } from './windows';
import { addedDampingRatio, exponentialWindow, forceWindow, triggeredBlockStarts } from './transient';

export interface TwoChannelRecord {
  sampleRateHz: number;
  input: Float64Array;
  output: Float64Array;
}

export interface ProcessedFrf {
  frequenciesHz: Float64Array;
  spectra: CrossSpectra;
  estimate: FrfEstimate;
  /** The recipe's estimator (H1, H2 or Hv). */
  chosen: ComplexArray;
  /** Lines inside the recipe's band, inclusive–exclusive. */
  bandIndices: { start: number; end: number };
  /** 95 % bands of the chosen estimate's magnitude and phase (random error only). */
  confidence95: Confidence95;
  /** Radius of H1's exact 95 % confidence region (Goodman 1965; exact-frf-region.ts), FRF units. */
  h1Region95Radius: Float64Array;
  /** Damping ratio the exponential window adds at f (transient recipes only). */
  addedDampingRatio?: (fHz: number) => number;
  /** Decay time τ of the exponential window, s (transient recipes only). */
  exponentialTauS?: number;
  warnings: string[];
}

/** Runs `recipe` on `record` (recipe validated again here, so a hand-built object is safe too). */
export function processRecord(record: TwoChannelRecord, recipe: Recipe): ProcessedFrf {
  const r = parseRecipe(recipe);
  requireRecord(record);
  const resolved = resolveRecipe(r, { sampleRateHz: record.sampleRateHz, samples: record.input.length });
  const warnings = [...resolved.warnings];
  let spectra: CrossSpectra;
  let exponentialTauS: number | undefined;
  if (r.transient) {
    const t = transientSpectra(record, r, resolved);
    spectra = t.spectra;
    exponentialTauS = t.tauS;
  } else {
    spectra = welchCrossSpectra(record.input, record.output, {
      sampleRateHz: record.sampleRateHz,
      blockLength: resolved.blockLength,
      window: r.window,
      windowParams: r.windowParams,
      overlap: r.overlap,
      averages: resolved.averages,
      detrend: r.detrend,
      scaling: r.scaling,
    });
  }
  warnings.push(...spectra.warnings);
  const estimate = estimateFrf(spectra, { hvWeight: r.hvWeight });
  const chosen = r.estimator === 'H1' ? estimate.h1 : r.estimator === 'H2' ? estimate.h2 : estimate.hv;
  const magnitude = new Float64Array(chosen.re.length);
  for (let k = 0; k < magnitude.length; k++) magnitude[k] = Math.hypot(chosen.re[k], chosen.im[k]);
  const result: ProcessedFrf = {
    frequenciesHz: spectra.frequenciesHz,
    spectra,
    estimate,
    chosen,
    bandIndices: resolved.bandIndices,
    confidence95: confidence95(magnitude, estimate.randomError.magnitude, estimate.randomError.phaseRad),
    h1Region95Radius: h1ExactRegionRadius(estimate.h1, estimate.coherence, spectra.effectiveAverages),
    warnings,
  };
  if (exponentialTauS !== undefined) {
    const tau = exponentialTauS;
    result.exponentialTauS = tau;
    result.addedDampingRatio = (fHz: number) => addedDampingRatio(fHz, tau);
  }
  return result;
}

function transientSpectra(
  record: TwoChannelRecord,
  r: Recipe,
  resolved: ResolvedRecipe,
): { spectra: CrossSpectra; tauS: number } {
  const t = r.transient!;
  const n = resolved.blockLength;
  const fs = record.sampleRateHz;
  const blocks = triggeredBlockStarts(
    record.input,
    n,
    t.triggerLevelFraction,
    resolved.pretriggerSamples,
    resolved.averages,
  );
  const tauS = t.exponentialDecayFraction * (n / fs);
  const w = windowSamples(r.window, n, r.windowParams);
  const force = forceWindow(n, t.forceWindowFraction);
  const decay = exponentialWindow(n, fs, tauS, resolved.pretriggerSamples);
  const inputWindow = new Float64Array(n);
  const outputWindow = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    inputWindow[i] = w[i] * force[i];
    outputWindow[i] = w[i] * decay[i];
  }
  const spectra = accumulateCrossSpectra(record.input, record.output, {
    sampleRateHz: fs,
    blockStarts: blocks.starts,
    inputWindow,
    outputWindow,
    scaleWindow: w,
    detrend: r.detrend,
    scaling: r.scaling,
  });
  spectra.warnings.push(...blocks.warnings);
  return { spectra, tauS };
}

function requireRecord(record: TwoChannelRecord): void {
  requireFinite('record.sampleRateHz', record.sampleRateHz);
  if (record.sampleRateHz <= 0) throw new EngineInputError('record.sampleRateHz', record.sampleRateHz, 'must be > 0');
  if (!(record.input instanceof Float64Array)) {
    throw new EngineInputError('record.input', typeof record.input, 'must be a Float64Array');
  }
  if (!(record.output instanceof Float64Array)) {
    throw new EngineInputError('record.output', typeof record.output, 'must be a Float64Array');
  }
  if (record.output.length !== record.input.length) {
    throw new EngineInputError(
      'record.output.length',
      record.output.length,
      `must equal record.input.length=${record.input.length}`,
    );
  }
  requireFiniteSamples('record.input', record.input);
  requireFiniteSamples('record.output', record.output);
}
