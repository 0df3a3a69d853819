/**
 * Validation and sizing of a scenario: one resolver for `parseScenario` and `simulateScenario`.
 * Every rule throws EngineInputError naming the JSON field path; adjustments are warnings.
 *
 * Sizes: record N = round(durationS·fs) samples. A steady-state record takes the first N samples
 * of a synthesis record of L = max(next power of two ≥ N, the excitation period) samples; a record
 * from rest is followed by Z zeros, Z ≥ the 1e-6 decay time ln(1e6)/(ζω_n)_min plus |delay|, and
 * L = next power of two ≥ N + Z (docs/engine.md, exact synthesis).
 */
import { EngineInputError } from '../errors';
import { isPowerOfTwo } from '../fft';
import { buildSystem, valueAt, type LinearSystem } from '../systems';
import { slowestDecayRate } from '../systems/facts';
import { balanceNyquist, bandLines, impactOffsetSamples, wholeSamples } from './excitation';
import type { Band } from './excitation-schema';
import { restPaddingSamples } from './exact';
import { scenarioSchema, type Scenario } from './scenario-schema';
import { nextPowerOfTwo } from './spectrum';

export const MIN_RECORD_SAMPLES = 64;
export const MAX_RECORD_SAMPLES = 2 ** 23;
export const MAX_SYNTHESIS_SAMPLES = 2 ** 24;
/** Largest oversampled force table for time integration (doubles). */
export const MAX_OVERSAMPLED_SAMPLES = 2 ** 25;

export interface SynthesisPlan {
  sampleRateHz: number;
  recordSamples: number;
  synthesisSamples: number;
  start: 'steady-state' | 'from-rest';
  /** Zeros after the excitation (from rest), samples. */
  paddingSamples: number;
  /** Excitation period in samples (periodic kinds, impact, burst block), else 0. */
  periodSamples: number;
  /** Band the SNR of noise refers to by default. */
  defaultNoiseBand: Band;
  /** Runge–Kutta sub-steps per sample (cubic stiffness only). */
  oversampling: number;
  /** Samples integrated before the record (cubic stiffness only). */
  preRollSamples: number;
  system: LinearSystem;
  warnings: string[];
}

const isBlockPowerOfTwo = (n: number) => isPowerOfTwo(n) && n >= 4;

/** Parses, checks every cross-field rule and sizes the synthesis. */
export function resolveScenario(json: unknown): { scenario: Scenario; plan: SynthesisPlan } {
  const parsed = scenarioSchema.safeParse(json);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new EngineInputError(issue.path.map(String).join('.') || 'scenario', valueAt(json, issue.path), issue.message);
  }
  const s = parsed.data;
  const warnings: string[] = [];
  const fs = s.acquisition.sampleRateHz;
  const nyquist = fs / 2;
  const exact = s.acquisition.durationS * fs;
  const n = Math.round(exact);
  if (n < MIN_RECORD_SAMPLES || n > MAX_RECORD_SAMPLES) {
    throw new EngineInputError('acquisition.durationS', s.acquisition.durationS, `must give ${MIN_RECORD_SAMPLES}…2^23 samples at ${fs} Hz (gives ${n})`);
  }
  if (Math.abs(exact - n) > 1e-9 * n) warnings.push(`durationS=${s.acquisition.durationS} rounded to ${n} samples`);

  const system = buildSystem(s.system); // eigen-solution errors name 'system…'
  const e = s.excitation;
  const start = s.acquisition.start ?? (e.kind === 'burst-random' || e.kind === 'impact' ? 'from-rest' : 'steady-state');
  let band: Band = { lowHz: 0, highHz: nyquist };
  let period = 0;
  if (e.kind !== 'impact') {
    band = e.band;
    if (e.band.highHz >= nyquist) {
      throw new EngineInputError('excitation.band.highHz', e.band.highHz, `must be below fs/2 = ${nyquist} Hz`);
    }
  }
  if (e.kind === 'chirp' && e.sweep === 'log' && !(e.band.lowHz > 0)) {
    throw new EngineInputError('excitation.band.lowHz', e.band.lowHz, 'must be > 0 for a log sweep');
  }
  if (e.kind === 'periodic-random' || e.kind === 'pseudo-random') {
    period = wholeSamples('excitation.periodS', e.periodS, fs);
    if (!isBlockPowerOfTwo(period)) {
      throw new EngineInputError('excitation.periodS', e.periodS, `must be a power-of-two number of samples (gives ${period})`);
    }
    requireBandLines(band, period, fs);
  }
  if (e.kind === 'chirp' || e.kind === 'impact') period = wholeSamples('excitation.periodS', e.periodS, fs);
  if (e.kind === 'burst-random') {
    period = wholeSamples('excitation.blockLengthS', e.blockLengthS, fs);
    const on = Math.max(1, Math.round(e.burstFraction * period));
    if (Math.round(e.offsetS * fs) + on > period) {
      throw new EngineInputError('excitation.offsetS', e.offsetS, 'must leave the burst inside its block');
    }
  }
  if (e.kind === 'impact') checkImpact(e, fs, period);
  if (start === 'steady-state' && period > 0 && !isBlockPowerOfTwo(period)) {
    const field = e.kind === 'burst-random' ? 'excitation.blockLengthS' : 'excitation.periodS';
    throw new EngineInputError(field, period / fs, "must be a power-of-two number of samples for a steady-state record (or set acquisition.start to 'from-rest')");
  }
  if (period > n) warnings.push(`the excitation period (${period} samples) is longer than the record (${n} samples)`);

  const errors = s.errors;
  const delayS = errors.delayS ?? 0;
  if (Math.abs(delayS) >= s.acquisition.durationS) {
    throw new EngineInputError('errors.delayS', delayS, 'must be shorter than the record');
  }
  for (const channel of ['inputNoise', 'outputNoise'] as const) {
    const noise = errors[channel];
    if (noise && 'snrDb' in noise && noise.bandHz && noise.bandHz.highHz > nyquist) {
      throw new EngineInputError(`errors.${channel}.bandHz.highHz`, noise.bandHz.highHz, `must be at most fs/2 = ${nyquist} Hz`);
    }
  }

  const rate = slowestDecayRate(system.modes);
  const decay1 = Math.log(100) / rate;
  const paddingSamples = start === 'from-rest' ? restPaddingSamples(rate, fs, delayS) : 0;
  const synthesisSamples =
    start === 'from-rest' ? nextPowerOfTwo(n + paddingSamples) : Math.max(nextPowerOfTwo(n), period);
  if (synthesisSamples > MAX_SYNTHESIS_SAMPLES) {
    throw new EngineInputError(
      'acquisition.durationS',
      s.acquisition.durationS,
      `needs a synthesis record of ${synthesisSamples} samples (with ${paddingSamples} samples of decay padding), above 2^24`,
    );
  }
  if (e.kind === 'random' || e.kind === 'burst-random') {
    requireBandLines(band, start === 'from-rest' ? nextPowerOfTwo(n) : synthesisSamples, fs);
  }
  transientWarnings(s, fs, period, decay1, n, start, warnings);

  let oversampling = 0;
  let preRollSamples = 0;
  if (errors.cubicStiffness) {
    oversampling = checkCubic(s, synthesisSamples, warnings);
    const delaySamples = Math.ceil(Math.abs(delayS) * fs) + 1;
    // Also from rest: the band-limited force between samples is not exactly zero before a hit,
    // so the integration starts a 1e-6 decay time early, as the periodic exact synthesis does.
    preRollSamples = Math.ceil((Math.log(1e6) / rate) * fs) + delaySamples;
  }
  return {
    scenario: s,
    plan: {
      sampleRateHz: fs,
      recordSamples: n,
      synthesisSamples,
      start,
      paddingSamples,
      periodSamples: period,
      defaultNoiseBand: band,
      oversampling,
      preRollSamples,
      system,
      warnings,
    },
  };
}

function requireBandLines(band: Band, length: number, fs: number): void {
  const [first, last] = bandLines(band, length, fs);
  if (last < first) {
    throw new EngineInputError('excitation.band', band, `holds no spectral line of spacing ${fs / length} Hz below Nyquist`);
  }
}

function checkImpact(e: Extract<Scenario['excitation'], { kind: 'impact' }>, fs: number, period: number): void {
  const duration = e.pulseDurationS * fs;
  if (duration < 2) {
    throw new EngineInputError('excitation.pulseDurationS', e.pulseDurationS, `must last at least 2 samples (${2 / fs} s)`);
  }
  const offset = impactOffsetSamples(e, fs);
  if (offset + duration > period) {
    throw new EngineInputError(e.offsetS !== undefined ? 'excitation.offsetS' : 'excitation.pulseDurationS', e.offsetS ?? e.pulseDurationS, 'must leave the pulse inside its period');
  }
  if (e.doubleHit && offset + e.doubleHit.delayS * fs + duration > period) {
    throw new EngineInputError('excitation.doubleHit.delayS', e.doubleHit.delayS, 'must leave the second pulse inside its period');
  }
}

function checkCubic(s: Scenario, synthesisSamples: number, warnings: string[]): number {
  const cubic = s.errors.cubicStiffness!;
  if (s.system.kind === 'modal') {
    throw new EngineInputError('errors.cubicStiffness', cubic, "needs an 'sdof' or 'physical' system (a modal model has no spring to make nonlinear)");
  }
  const springs = s.system.kind === 'physical' ? s.system.springs.length : 1;
  if (cubic.springIndex >= springs) {
    throw new EngineInputError('errors.cubicStiffness.springIndex', cubic.springIndex, `must name a spring 0…${springs - 1}`);
  }
  let r = cubic.oversampling;
  while (2 * r * synthesisSamples > MAX_OVERSAMPLED_SAMPLES && r > 4) r = Math.max(4, Math.floor(r / 2));
  if (2 * r * synthesisSamples > MAX_OVERSAMPLED_SAMPLES) {
    throw new EngineInputError('errors.cubicStiffness.oversampling', cubic.oversampling, `needs ${2 * r * synthesisSamples} oversampled force values even at 4 sub-steps; shorten the record`);
  }
  if (r !== cubic.oversampling) warnings.push(`cubic stiffness: oversampling reduced from ${cubic.oversampling} to ${r} sub-steps per sample to bound memory`);
  return r;
}

function transientWarnings(
  s: Scenario,
  fs: number,
  period: number,
  decay1: number,
  n: number,
  start: string,
  warnings: string[],
): void {
  const e = s.excitation;
  const t = (x: number) => `${Number(x.toPrecision(4))} s`;
  if (e.kind === 'burst-random') {
    const off = (period - Math.max(1, Math.round(e.burstFraction * period))) / fs;
    if (off < decay1) warnings.push(`burst random: the ${t(off)} off-time is shorter than the 1 % decay time ${t(decay1)}; the response carries into the next block`);
  }
  if (e.kind === 'impact') {
    // Half-sine spectrum envelope at fs/2 relative to DC: 1/((fs·d)² − 1); Nyquist balancing α.
    const d = e.pulseDurationS * fs;
    const pulse = Float64Array.from({ length: Math.floor(d) + 1 }, (_, i) => Math.sin((Math.PI * i) / d));
    const alpha = Math.abs(balanceNyquist(pulse, 0, pulse.length));
    if (alpha > 0.01) {
      warnings.push(
        `impact: the pulse lasts ${Number(d.toPrecision(3))} samples; its spectrum at fs/2 is still ${Number((100 / (d * d - 1)).toPrecision(2))} % of DC, removing the Nyquist line alters its samples by ±${Number((100 * alpha).toPrecision(2))} %, and the band-limited response rings slightly ahead of each hit (about 20 samples per pulse keeps this below 1 %)`,
      );
    }
  }
  if (e.kind === 'impact' && period / fs < decay1) {
    warnings.push(`impact: the ${t(period / fs)} period is shorter than the 1 % decay time ${t(decay1)}; each response runs into the next hit`);
  }
  if (start === 'from-rest' && n / fs < decay1) {
    warnings.push(`the ${t(n / fs)} record ends before the response decays to 1 % (${t(decay1)})`);
  }
}
