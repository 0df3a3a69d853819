/**
 * The figures the pre-flight check derives from a recipe and a resolved scenario, with the same
 * rules the run itself applies, so the check and the run cannot disagree:
 * - block length: recipeBlockLength (recipe.ts), line spacing Δf = fs/N;
 * - stationary recipes: blocks start every S = N − round(overlap·N) samples and the record holds
 *   K = floor((L − N)/S) + 1 of them (welch.ts); the effective number of averages is Welch's
 *   n_eff = K / [1 + 2 Σ_j (1 − j/K)·c(j·S)²] (P. D. Welch, IEEE Trans. Audio Electroacoust.
 *   AU-15(2), 1967; `effectiveAverages` in welch.ts);
 * - transient recipes: one triggered block per hit that still has a whole block after it, the
 *   next search starting after the block (transient.ts), hits at the scenario's offset plus
 *   whole periods; no overlap, so n_eff = K;
 * - excitation band: the scenario's band; for an impact, 0 to the first zero 3/(2T) of a
 *   half-sine of duration T, whose transform is ∝ |cos(πfT)/(1 − 4f²T²)| (any signals text);
 *   beyond it only side lobes put force in.
 */
import type { Recipe } from '../recipe';
import { recipeBlockLength } from '../recipe';
import type { Scenario, SynthesisPlan } from '../scenario';
import { impactOffsetSamples } from '../synthesis/excitation';
import { effectiveAverages } from '../welch';
import { windowSamples } from '../windows';
import type { PreflightFigures } from './findings';

/** Blocks a stationary recipe of block N and overlap holds in `record` samples, and their step. */
export function stationaryBlocks(blockLength: number, overlap: number, record: number): { step: number; available: number } {
  const step = Math.max(1, blockLength - Math.round(overlap * blockLength));
  const available = blockLength > record ? 0 : Math.floor((record - blockLength) / step) + 1;
  return { step, available };
}

/** The figures of `recipe` on the scenario (module doc); null when the block exceeds the record. */
export function preflightFigures(recipe: Recipe, scenario: Scenario, plan: SynthesisPlan): PreflightFigures | null {
  const fs = plan.sampleRateHz;
  const nyquistHz = fs / 2;
  const record = plan.recordSamples;
  const blockLength = recipeBlockLength(recipe, fs);
  const e = scenario.excitation;
  const excitationBand =
    e.kind === 'impact' ? { lowHz: 0, highHz: Math.min(nyquistHz, 1.5 / e.pulseDurationS) } : { lowHz: e.band.lowHz, highHz: e.band.highHz };
  if (blockLength > record) return null;
  const asked = typeof recipe.averages === 'number' ? recipe.averages : undefined;
  let step: number;
  let available: number;
  let used: number;
  let neff: number;
  if (recipe.transient) {
    // Hits come every period; a block longer than the period skips the hits it covers.
    const period = e.kind === 'impact' && plan.periodSamples > 0 ? plan.periodSamples : blockLength;
    step = period * Math.ceil(blockLength / period);
    available = triggeredBlocks(recipe, scenario, plan, blockLength);
    used = asked === undefined ? available : Math.min(asked, available);
    neff = used;
  } else {
    ({ step, available } = stationaryBlocks(blockLength, recipe.overlap, record));
    used = asked === undefined ? available : Math.min(asked, available);
    neff = effectiveAverages(windowSamples(recipe.window, blockLength, recipe.windowParams), step, used);
  }
  return {
    sampleRateHz: fs,
    nyquistHz,
    recordSamples: record,
    blockLength,
    frequencyResolutionHz: fs / blockLength,
    stepSamples: step,
    blocksAvailable: available,
    blocksUsed: used,
    effectiveAverages: neff,
    excitationBand,
  };
}

/** Triggered blocks a transient recipe finds: one per hit followed by a whole block (module doc). */
function triggeredBlocks(recipe: Recipe, scenario: Scenario, plan: SynthesisPlan, blockLength: number): number {
  const e = scenario.excitation;
  const record = plan.recordSamples;
  const pretrigger = Math.round((recipe.transient?.pretriggerFraction ?? 0) * blockLength);
  if (e.kind !== 'impact' || plan.periodSamples <= 0) {
    // Anything else triggers once per level crossing; count back-to-back blocks as an upper bound.
    return Math.floor(record / blockLength);
  }
  const offset = impactOffsetSamples(e, plan.sampleRateHz);
  let count = 0;
  let from = 0;
  for (let hit = offset; hit < record; hit += plan.periodSamples) {
    if (hit < from) continue;
    const start = Math.max(0, hit - pretrigger);
    if (start + blockLength > record) break;
    count++;
    from = start + blockLength;
  }
  return count;
}
