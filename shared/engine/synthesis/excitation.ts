/**
 * Excitation samples (before level scaling). Definitions are Plumbline's own, built from the
 * trade's usual excitation types:
 * - random: X[k] = a_k + j·b_k with a_k, b_k independent N(0, 1) on every line k·fs/P inside the
 *   band (P = next power of two ≥ the length, DC and Nyquist excluded), x = IFFT(X), so x is
 *   Gaussian and P-periodic; a shorter length takes the first samples;
 * - burst random: the random signal above, kept for round(burstFraction·B) samples from the
 *   offset of each block of B samples and zero elsewhere;
 * - periodic random: per realisation, Gaussian line values on the lines k·fs/M in the band
 *   (M = period in samples, a power of two), one period by IFFT, repeated periodsPerRealisation
 *   times, then a new realisation;
 * - pseudo-random: one period of a flat-magnitude multisine, X[k] = exp(jθ_k), θ_k uniform on
 *   [0, 2π), repeated over the whole record;
 * - chirp: sin φ(t) over each period T, linear φ = 2π(f₀t + (f₁ − f₀)t²/(2T)) or logarithmic
 *   φ = 2π·f₀T/ln(f₁/f₀)·((f₁/f₀)^(t/T) − 1), restarting every period;
 * - impact: a half-sine pulse sin(π(t − t₀)/d) on [t₀, t₀ + d], an optional second hit of
 *   relative amplitude r at t₀ + delay, repeated every period; each period's samples are then
 *   Nyquist-balanced (`balanceNyquist`) so the force stays exactly zero between hits once the
 *   synthesis removes the Nyquist line (samples change by about ±1/(fs·d)²: ±2.5 % for a
 *   10-sample pulse, ±0.3 % for 20; the scenario warns above 1 %).
 * The level (RMS or peak force over the record, N) is applied by `levelFactor`.
 */
import type { RandomSource } from '../random';
import { EngineInputError } from '../errors';
import type { Band, ExcitationSpec, Level } from './excitation-schema';
import { nextPowerOfTwo, realFromSpectrum } from './spectrum';

/** Line indices [first, last] of a band on a grid of `length` samples (DC and Nyquist excluded). */
export function bandLines(band: Band, length: number, sampleRateHz: number): [number, number] {
  const first = Math.max(1, Math.ceil((band.lowHz * length) / sampleRateHz - 1e-9));
  const last = Math.min(length / 2 - 1, Math.floor((band.highHz * length) / sampleRateHz + 1e-9));
  return [first, last];
}

function requireLines(band: Band, length: number, sampleRateHz: number): [number, number] {
  const [first, last] = bandLines(band, length, sampleRateHz);
  if (last < first) {
    throw new EngineInputError(
      'excitation.band',
      band,
      `holds no spectral line of spacing ${sampleRateHz / length} Hz below Nyquist`,
    );
  }
  return [first, last];
}

/** Stationary band-limited Gaussian noise of `length` samples (see the module doc). */
export function bandLimitedRandom(band: Band, length: number, sampleRateHz: number, random: RandomSource): Float64Array {
  const p = nextPowerOfTwo(Math.max(4, length));
  const [first, last] = requireLines(band, p, sampleRateHz);
  const spectrum = { re: new Float64Array(p / 2 + 1), im: new Float64Array(p / 2 + 1) };
  for (let k = first; k <= last; k++) {
    spectrum.re[k] = random.gaussian();
    spectrum.im[k] = random.gaussian();
  }
  return realFromSpectrum(spectrum, p).slice(0, length);
}

/** One period (M samples, a power of two) of a multisine on the band's lines. */
export function multisinePeriod(
  band: Band,
  period: number,
  sampleRateHz: number,
  random: RandomSource,
  magnitude: 'flat' | 'gaussian',
): Float64Array {
  const [first, last] = requireLines(band, period, sampleRateHz);
  const spectrum = { re: new Float64Array(period / 2 + 1), im: new Float64Array(period / 2 + 1) };
  for (let k = first; k <= last; k++) {
    if (magnitude === 'flat') {
      const theta = 2 * Math.PI * random.uniform();
      spectrum.re[k] = Math.cos(theta);
      spectrum.im[k] = Math.sin(theta);
    } else {
      spectrum.re[k] = random.gaussian();
      spectrum.im[k] = random.gaussian();
    }
  }
  return realFromSpectrum(spectrum, period);
}

/** Whole number of samples in `seconds`, or EngineInputError naming `field`. */
export function wholeSamples(field: string, seconds: number, sampleRateHz: number): number {
  const exact = seconds * sampleRateHz;
  const n = Math.round(exact);
  if (Math.abs(exact - n) > 1e-6 * Math.max(1, n)) {
    throw new EngineInputError(field, seconds, `must be a whole number of samples at ${sampleRateHz} Hz`);
  }
  return n;
}

/** Default time of the first hit of an impact: 5 % of the period, in whole samples. */
export function impactOffsetSamples(spec: Extract<ExcitationSpec, { kind: 'impact' }>, sampleRateHz: number): number {
  return spec.offsetS !== undefined
    ? Math.round(spec.offsetS * sampleRateHz)
    : Math.round(0.05 * spec.periodS * sampleRateHz);
}

/** Unscaled excitation samples of `length` at `sampleRateHz` (module doc), from `random`. */
export function excitationSamples(
  spec: ExcitationSpec,
  length: number,
  sampleRateHz: number,
  random: RandomSource,
): Float64Array {
  const fs = sampleRateHz;
  switch (spec.kind) {
    case 'random':
      return bandLimitedRandom(spec.band, length, fs, random);
    case 'burst-random': {
      const x = bandLimitedRandom(spec.band, length, fs, random);
      const block = wholeSamples('excitation.blockLengthS', spec.blockLengthS, fs);
      const on = Math.max(1, Math.round(spec.burstFraction * block));
      const start = Math.round(spec.offsetS * fs);
      for (let n = 0; n < length; n++) {
        const inBlock = n % block;
        if (inBlock < start || inBlock >= start + on) x[n] = 0;
      }
      return x;
    }
    case 'periodic-random':
    case 'pseudo-random': {
      const period = wholeSamples('excitation.periodS', spec.periodS, fs);
      const repeats = spec.kind === 'periodic-random' ? spec.periodsPerRealisation : Infinity;
      const x = new Float64Array(length);
      let one: Float64Array = new Float64Array(0);
      for (let n = 0; n < length; n++) {
        const p = Math.floor(n / period);
        if (n % period === 0 && (p === 0 || (Number.isFinite(repeats) && p % repeats === 0))) {
          one = multisinePeriod(spec.band, period, fs, random, spec.kind === 'pseudo-random' ? 'flat' : 'gaussian');
        }
        x[n] = one[n % period];
      }
      return x;
    }
    case 'chirp': {
      const period = wholeSamples('excitation.periodS', spec.periodS, fs);
      const t1 = period / fs;
      const f0 = spec.band.lowHz;
      const f1 = spec.band.highHz;
      const x = new Float64Array(length);
      for (let n = 0; n < length; n++) {
        const t = (n % period) / fs;
        const phase =
          spec.sweep === 'log'
            ? ((2 * Math.PI * f0 * t1) / Math.log(f1 / f0)) * (Math.pow(f1 / f0, t / t1) - 1)
            : 2 * Math.PI * (f0 * t + ((f1 - f0) * t * t) / (2 * t1));
        x[n] = Math.sin(phase);
      }
      return x;
    }
    case 'impact': {
      const period = wholeSamples('excitation.periodS', spec.periodS, fs);
      const duration = spec.pulseDurationS * fs;
      const start = impactOffsetSamples(spec, fs);
      const hits: [number, number][] = [[start, 1]];
      if (spec.doubleHit) hits.push([start + spec.doubleHit.delayS * fs, spec.doubleHit.amplitudeRatio]);
      const x = new Float64Array(length);
      for (let n = 0; n < length; n++) {
        const inPeriod = n % period;
        for (const [t0, amplitude] of hits) {
          const s = inPeriod - t0;
          if (s >= 0 && s <= duration) x[n] += amplitude * Math.sin((Math.PI * s) / duration);
        }
      }
      for (let p0 = 0; p0 < length; p0 += period) balanceNyquist(x, p0, Math.min(length, p0 + period));
      return x;
    }
  }
}

/**
 * Removes the Nyquist content of the samples [from, to) without touching the zeros around a
 * pulse: x[n] ← x[n]·(1 − α·(−1)^n) with α = Σx[n](−1)^n / Σx[n], so Σx[n](−1)^n = 0 there.
 * Returns α (0 when the span holds no force).
 */
export function balanceNyquist(x: Float64Array, from: number, to: number): number {
  let alternating = 0;
  let total = 0;
  for (let n = from; n < to; n++) {
    alternating += n % 2 === 0 ? x[n] : -x[n];
    total += x[n];
  }
  if (total === 0) return 0;
  const alpha = alternating / total;
  for (let n = from; n < to; n++) x[n] *= 1 - (n % 2 === 0 ? alpha : -alpha);
  return alpha;
}

/** The factor that gives `level` over the first `count` samples of x (RMS or peak, N). */
export function levelFactor(level: Level, x: Float64Array, count: number): number {
  let measured = 0;
  if ('rmsN' in level) {
    let s = 0;
    for (let i = 0; i < count; i++) s += x[i] * x[i];
    measured = Math.sqrt(s / count);
  } else {
    for (let i = 0; i < count; i++) measured = Math.max(measured, Math.abs(x[i]));
  }
  if (!(measured > 0)) {
    throw new EngineInputError('excitation', 'no force in the record', 'must put some force inside the record');
  }
  return ('rmsN' in level ? level.rmsN : level.peakN) / measured;
}
