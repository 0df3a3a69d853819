/**
 * Advice before running: a draft recipe for a scenario and the errors it should give.
 *
 * Rules and formulas (sources beside each):
 * - resolution: Δf ≤ B_r/4 for the narrowest half-power bandwidth B_r = 2ζf_n in the band
 *   (common practice); block length N = the next power of two ≥ fs/Δf. With Hann and random
 *   excitation N doubles while the predicted resolution bias exceeds half the tolerance;
 * - resolution bias at that resonance from the window's power kernel (scores/resolution-bias.ts),
 *   with Bendat & Piersol's ε_b ≈ −(1/3)(B_e/B_r)² (Random Data, 4th ed., ch. 8, quoted from
 *   memory) beside it. Periodic excitation whose period is the block has no resolution bias;
 * - random error ε = sqrt(1−γ²)/(|γ|·sqrt(2 n_d)) (Bendat & Piersol, ch. 9, quoted from memory)
 *   solved for n_d at the lowest expected coherence (noise, times the coherence lost to leakage for
 *   random excitation) among the band lines at or above a floor (0.5;
 *   scores/expected-coherence.ts), so that |bias| + 1.96·ε stays inside the tolerance
 *   1 − 10^(−X/20) there; lines below the floor are named in a warning; at least 10 averages
 *   (common practice: fewer make the coherence estimate itself meaningless);
 * - overlapped blocks: Welch's equivalent number of averages (welch.ts) decides the block count;
 * - transients: if the block is shorter than the slowest mode's 1 % decay time, an exponential
 *   window with the envelope reaching 1 % at the block end, adding ζ_add = 1/(ω_n τ) (common
 *   practice, quoted from memory); burst random needs the response to decay within the block.
 * - estimator: H1 with noise on the response only, H2 with noise on the force only, Hv with both
 *   (common practice); a channel delay costs magnitude, coherence and phase (delay-bias.ts);
 * - lines without force are promised nothing; the draft goes through the same pre-flight check as
 *   a study (preflight/check.ts), whose findings join the warnings.
 */
import type { ModeFacts, WindowName } from './types';
import { EngineInputError, requireFinite } from './errors';
import type { Recipe } from './recipe';
import { MAX_BLOCK_LENGTH } from './recipe';
import { NORMAL_95 } from './random-errors';
import { resolveScenario, type Scenario, type ScenarioInput } from './scenario';
import { effectiveAverages } from './welch';
import { windowSamples } from './windows';
import { expectedCoherence, forceSpectrumShape } from './scores/expected-coherence';
import { delayBias } from './delay-bias';
import { findingText, preflight } from './preflight/check';
import type { Preflight } from './preflight/findings';
import { leakageCoherence, powerKernel, resolutionBias, type ResolutionBias } from './scores/resolution-bias';

export interface AdviceOptions {
  /** Magnitude tolerance, dB (> 0): 95 % of measurements within ±X dB at every band line. */
  targetMagnitudeDb: number;
  /** Band of interest; default the excitation band (impact: up to min(0.4·fs, 1/pulse duration)). */
  band?: { lowHz: number; highHz: number };
  /** Window for random excitation (default 'hann'); periodic kinds and impacts use 'rectangular'. */
  window?: WindowName;
  /** Overlap for random excitation (default 0.5). */
  overlap?: number;
  /** Cap on the number of averages (default 1000). */
  maxAverages?: number;
  /** Lines with a lower expected coherence do not size the averages (default 0.5). */
  minSizingCoherence?: number;
  /**
   * Resonance-frequency tolerance, % of f_n: the line spacing is then also kept no coarser than
   * it at every mode in the band (a resonance read from the lines sits on the line grid).
   */
  resonanceFrequencyPercent?: number;
}

export interface Advice {
  scenarioName: string;
  targetMagnitudeDb: number;
  /** 1 − 10^(−X/20): the smaller side of ±X dB as a fraction. */
  toleranceFraction: number;
  governingMode: ModeFacts | null;
  frequencyResolutionHz: number;
  blockLength: number;
  blockDurationS: number;
  window: WindowName;
  overlap: number;
  /** Blocks to average, and Welch's equivalent number of independent averages. */
  blocks: number;
  effectiveAverages: number;
  recordLengthS: number;
  recordSamples: number;
  /** Predicted resolution bias at the governing resonance, fractions (null without one). */
  resolutionBias: ResolutionBias | null;
  /** Expected coherence and predicted normalised random error of |Ĥ| at the band lines. */
  lines: { frequenciesHz: Float64Array; expectedCoherence: Float64Array; predictedRandomError: Float64Array };
  /** The line that sized the averages: lowest expected coherence at or above the floor. */
  worstLineHz: number;
  /** Predicted |bias| + 1.96·ε at that line, as dB below the exact value (NaN past 100 %). */
  predicted95Db: number;
  transient?: { exponentialDecayFraction: number; tauS: number; addedDamping: { naturalFrequencyHz: number; addedDampingRatio: number }[] };
  recipe: Recipe;
  /** The pre-flight check of the draft recipe on the scenario; its findings are also in warnings. */
  preflight: Preflight;
  notes: string[];
  warnings: string[];
}

const MIN_AVERAGES = 10;
const nextPow2 = (x: number) => 2 ** Math.max(3, Math.ceil(Math.log2(x) - 1e-12));

/** A draft recipe and its predicted errors for `scenario` (module doc). */
export function adviseRecipe(scenarioInput: Scenario | ScenarioInput, options: AdviceOptions): Advice {
  requireFinite('targetMagnitudeDb', options.targetMagnitudeDb);
  if (!(options.targetMagnitudeDb > 0)) throw new EngineInputError('targetMagnitudeDb', options.targetMagnitudeDb, 'must be > 0');
  const { scenario: s, plan } = resolveScenario(scenarioInput);
  const fs = plan.sampleRateHz;
  const e = s.excitation;
  const notes: string[] = [];
  const warnings: string[] = [];
  const tol = 1 - Math.pow(10, -options.targetMagnitudeDb / 20);
  const band = options.band ?? (e.kind === 'impact' ? { lowHz: 0, highHz: Math.min(0.4 * fs, 1 / e.pulseDurationS) } : { ...e.band });
  const system = plan.system;
  const inBand = system.modes.filter((m) => m.naturalFrequencyHz >= band.lowHz && m.naturalFrequencyHz <= band.highHz);
  const governing = inBand.reduce<ModeFacts | null>((a, m) => (!a || m.halfPowerBandwidthHz < a.halfPowerBandwidthHz ? m : a), null);
  const periodic = e.kind === 'pseudo-random' || e.kind === 'periodic-random' || e.kind === 'chirp';
  const transient = e.kind === 'impact';
  const window: WindowName = periodic || transient || e.kind === 'burst-random' ? 'rectangular' : (options.window ?? 'hann');
  const overlap = e.kind === 'random' ? (options.overlap ?? 0.5) : 0;

  // Block length.
  let targetDf = governing ? governing.halfPowerBandwidthHz / 4 : (band.highHz - band.lowHz) / 400;
  if (!governing) notes.push('no mode inside the band: the resolution is set to 400 lines over the band');
  let targetWhy = 'B_r/4';
  const rfTol = options.resonanceFrequencyPercent;
  if (rfTol !== undefined && inBand.length > 0) {
    const lowest = Math.min(...inBand.map((m) => m.naturalFrequencyHz));
    if ((rfTol * lowest) / 100 < targetDf) {
      targetDf = (rfTol * lowest) / 100;
      targetWhy = 'the resonance-frequency tolerance';
      notes.push(`Δf ≤ ${fmt(targetDf)} Hz: the resonance-frequency tolerance of ${fmt(rfTol)} % at ${fmt(lowest)} Hz is finer than B_r/4`);
    }
  }
  let N = nextPow2(fs / targetDf);
  if (transient) {
    // A triggered block must fit inside one impact period (with its pretrigger).
    const fit = 2 ** Math.floor(Math.log2(0.9 * plan.periodSamples));
    if (N > fit) {
      warnings.push(`the impact period (${fmt(plan.periodSamples / fs)} s) limits the block to ${fit} samples: Δf = ${fmt(fs / fit)} Hz, coarser than ${targetWhy} = ${fmt(targetDf)} Hz`);
      N = fit;
    }
  }
  if (periodic || e.kind === 'burst-random') {
    N = plan.periodSamples;
    if (governing && fs / N > targetDf) {
      warnings.push(`the excitation period gives Δf = ${fmt(fs / N)} Hz, coarser than ${targetWhy} = ${fmt(targetDf)} Hz: lengthen the period to ${nextPow2(fs / targetDf) / fs} s`);
    }
  }
  let bias: ResolutionBias | null = null;
  if (governing && e.kind === 'random') {
    const frf = system.frf;
    for (;;) {
      bias = resolutionBias(frf, governing.naturalFrequencyHz, governing.halfPowerBandwidthHz, powerKernel(window, N, { halfWidthBins: Math.min(32, N / 4) }), fs / N);
      if (Math.abs(bias.kernel) <= tol / 2 || 2 * N > MAX_BLOCK_LENGTH) break;
      N *= 2;
    }
    if (fs / N < targetDf) notes.push(`Δf refined below B_r/4 to ${fmt(fs / N)} Hz so the resolution bias stays within half the tolerance`);
  } else if (periodic) {
    notes.push('periodic excitation with the period equal to the block and a rectangular window: no leakage, no resolution bias');
  }
  const df = fs / N;
  const blockS = N / fs;

  // Transient windows.
  let transientAdvice: Advice['transient'];
  let recipeTransient: Recipe['transient'];
  const slowest = system.modes.reduce((a, m) => Math.max(a, m.decayTimeS.to1Percent), 0);
  if (transient) {
    if (blockS < slowest) {
      const sigma = Math.log(100) / slowest; // ζω_n of the slowest mode, from t₁% = ln(100)/(ζω_n)
      const tau = 1 / (Math.log(100) / blockS - sigma);
      transientAdvice = {
        exponentialDecayFraction: tau / blockS,
        tauS: tau,
        addedDamping: inBand.map((m) => ({ naturalFrequencyHz: m.naturalFrequencyHz, addedDampingRatio: 1 / (2 * Math.PI * m.naturalFrequencyHz * tau) })),
      };
      notes.push(`the block (${fmt(blockS)} s) is shorter than the 1 % decay time (${fmt(slowest)} s): exponential window τ = ${fmt(tau)} s; correct the damping by ζ_add = 1/(ω_n τ)`);
    } else {
      notes.push('the response decays to 1 % within the block: no exponential window needed');
    }
    recipeTransient = {
      forceWindowFraction: Math.min(1, Math.max(0.02, (4 * e.pulseDurationS) / blockS + 0.02)),
      exponentialDecayFraction: transientAdvice?.exponentialDecayFraction ?? 1000,
      triggerLevelFraction: 0.1,
      pretriggerFraction: 0.01,
    };
  } else if (e.kind === 'burst-random') {
    const onEnd = e.offsetS + e.burstFraction * blockS;
    if (blockS - onEnd < slowest) warnings.push(`the response needs ${fmt(slowest)} s to decay to 1 % but the burst ends ${fmt(blockS - onEnd)} s before the block does: shorten the burst or lengthen the block`);
  } else if (e.kind === 'random' && blockS < slowest) {
    notes.push(`the block (${fmt(blockS)} s) is shorter than the 1 % decay time (${fmt(slowest)} s): leakage is what the Hann window and the resolution bias figure account for; burst random or periodic random would avoid it`);
  }

  // Expected coherence and averages.
  const lo = Math.max(1, Math.ceil(band.lowHz / df - 1e-9));
  const hi = Math.min(N / 2, Math.floor(band.highHz / df + 1e-9));
  const f = new Float64Array(Math.max(0, hi - lo + 1));
  for (let i = 0; i < f.length; i++) f[i] = (lo + i) * df;
  const ec = expectedCoherence({
    fHz: f,
    frf: system.frf,
    excitation: e,
    inputNoise: s.errors.inputNoise,
    outputNoise: s.errors.outputNoise,
    defaultNoiseBand: plan.defaultNoiseBand,
    blockDurationS: blockS,
  });
  notes.push(...ec.notes);
  if (e.kind === 'random') {
    // Leakage lowers the coherence near resonances as well (scores/resolution-bias.ts).
    const leak = leakageCoherence(system.frf, f, powerKernel(window, N, { halfWidthBins: Math.min(32, N / 4), oversample: 8 }), df);
    for (let i = 0; i < f.length; i++) ec.coherence[i] *= leak[i];
  }
  // Lines the excitation puts no force into show leakage and noise only: nothing can be promised
  // there, whatever the noise (a noise-free scenario would otherwise predict coherence 1).
  const force = forceSpectrumShape(e, f);
  for (let i = 0; i < f.length; i++) if (!(force[i] > 0)) ec.coherence[i] = 0;
  const delay = s.errors.delayS ? delayBias(window, N, fs, s.errors.delayS, band.highHz) : null;
  if (delay) for (let i = 0; i < f.length; i++) ec.coherence[i] *= delay.coherenceFactor;
  // Size on the lowest expected coherence among lines at or above the floor; lines below it are
  // named in a warning (no number of averages makes a promise there worth giving).
  const floor = options.minSizingCoherence ?? 0.5;
  let worst = -1;
  let below = 0;
  let best = 0;
  for (let i = 0; i < f.length; i++) {
    if (ec.coherence[i] > ec.coherence[best]) best = i;
    if (ec.coherence[i] < floor) {
      below++;
      continue;
    }
    if (worst < 0 || ec.coherence[i] < ec.coherence[worst]) worst = i;
  }
  if (below > 0) {
    warnings.push(`${below} of ${f.length} band lines have an expected coherence below ${floor}: the tolerance is not promised there`);
  }
  if (worst < 0) worst = best;
  const g2 = Math.min(1, ec.coherence[worst] ?? 1);
  const delayLoss = delay ? 1 - delay.magnitudeFactor : 0;
  const budget = tol - Math.abs(bias?.kernel ?? 0) - delayLoss;
  const maxAverages = options.maxAverages ?? 1000;
  let nd = MIN_AVERAGES;
  if (g2 < 1 && budget > 0) nd = Math.max(nd, Math.ceil((1 - g2) / (2 * g2 * (budget / NORMAL_95) ** 2)));
  if (budget <= 0) warnings.push('the predicted resolution bias alone exceeds the tolerance');
  if (nd > maxAverages) {
    warnings.push(`the worst line (${fmt(f[worst])} Hz, expected coherence ${fmt(g2)}) needs ${nd} averages; capped at ${maxAverages}`);
    nd = maxAverages;
  }
  const step = Math.max(1, Math.round(N * (1 - overlap)));
  let blocks = nd;
  let neff = nd;
  if (overlap > 0) {
    const w = windowSamples(window, N);
    blocks = 1;
    while (effectiveAverages(w, step, blocks) < nd) blocks++;
    neff = effectiveAverages(w, step, blocks);
  }
  const recordSamples = transient ? plan.periodSamples * blocks : N + (blocks - 1) * step;
  const predicted = new Float64Array(f.length);
  for (let i = 0; i < f.length; i++) {
    const c = Math.min(1, ec.coherence[i]);
    predicted[i] = Math.sqrt(1 - c) / (Math.sqrt(c) * Math.sqrt(2 * neff));
  }
  const worst95 = Math.abs(bias?.kernel ?? 0) + delayLoss + NORMAL_95 * (predicted[worst] ?? 0);

  const noisyIn = s.errors.inputNoise !== undefined;
  const noisyOut = s.errors.outputNoise !== undefined;
  const estimator = noisyIn && noisyOut ? 'Hv' : noisyIn ? 'H2' : 'H1';
  if (delay) {
    notes.push(`a channel delay of ${s.errors.delayS} s biases |Ĥ| by ${fmt(delay.magnitudeDb)} dB with the ${window} window over ${fmt(blockS)} s blocks (the window's correlation at the lag; 1 − τ/T for rectangular), lowers the coherence by the square of that, and shifts the phase by −360·f·τ, ${fmt(delay.phaseDegAt)}° at ${fmt(band.highHz)} Hz, which no averaging removes; compensate it before processing`);
  }
  if (s.errors.gainMismatch) notes.push(`the gain mismatch adds ${fmt(20 * Math.log10(s.errors.gainMismatch))} dB at every line; no processing removes it`);

  const recipe: Recipe = {
    name: `Advised for ${s.name}`.slice(0, 200),
    blockLength: N,
    window,
    overlap,
    averages: blocks,
    detrend: 'none',
    estimator,
    band: { lowHz: band.lowHz, highHz: band.highHz },
    scaling: 'density',
    tolerances: { magnitudeDb: options.targetMagnitudeDb, ...(rfTol !== undefined ? { resonanceFrequencyPercent: rfTol } : {}) },
    ...(recipeTransient ? { transient: recipeTransient } : {}),
  };
  // The same rules as a study: findings of the pre-flight check on the draft recipe.
  const check = preflight(recipe, s);
  for (const finding of [...check.refusals, ...check.warnings]) warnings.push(findingText(finding));
  return {
    scenarioName: s.name,
    targetMagnitudeDb: options.targetMagnitudeDb,
    toleranceFraction: tol,
    governingMode: governing,
    frequencyResolutionHz: df,
    blockLength: N,
    blockDurationS: blockS,
    window,
    overlap,
    blocks,
    effectiveAverages: neff,
    recordLengthS: recordSamples / fs,
    recordSamples,
    resolutionBias: bias,
    lines: { frequenciesHz: f, expectedCoherence: ec.coherence, predictedRandomError: predicted },
    worstLineHz: f[worst] ?? NaN,
    predicted95Db: worst95 < 1 ? -20 * Math.log10(1 - worst95) : NaN,
    ...(transientAdvice ? { transient: transientAdvice } : {}),
    recipe,
    preflight: check,
    notes,
    warnings,
  };
}

function fmt(x: number): string {
  return Number(x.toPrecision(4)).toString();
}
