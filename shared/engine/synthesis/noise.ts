/**
 * Uncorrelated measurement noise: white Gaussian noise added to a channel after synthesis.
 *
 * White noise of variance σ² sampled at fs has the one-sided PSD G = 2σ²/fs (unit²/Hz) from 0 to
 * fs/2 (Parseval's theorem), so its power inside a band of width B is G·B = 2σ²B/fs.
 * - Given a PSD level G:  σ = sqrt(G·fs/2).
 * - Given an SNR in dB over a band [f₁, f₂]: the noise power in the band is the clean channel's
 *   in-band power P_s divided by 10^(SNR/10), so σ² = P_s·10^(−SNR/10)·fs/(2(f₂ − f₁)).
 * P_s is the record's mean-square value restricted to the band, from a periodogram of the record
 * zero-padded to a power of two (Parseval: Σ_k |X_k|² = L·Σ_n x_n²).
 */
import { z } from 'zod';
import type { RandomSource } from '../random';
import { bandSchema, type Band } from './excitation-schema';
import { nextPowerOfTwo, oneSidedSpectrum } from './spectrum';

export const noiseSchema = z
  .union([
    z
      .object({
        snrDb: z.number().min(-40).max(200).describe('signal-to-noise ratio over the band, dB'),
        bandHz: bandSchema.optional().describe('band of the SNR, Hz (default: the excitation band, or 0…fs/2 for impact)'),
      })
      .strict(),
    z
      .object({
        psd: z.number().positive().describe('one-sided noise PSD level, channel unit²/Hz (N²/Hz on the input)'),
      })
      .strict(),
  ])
  .describe('white Gaussian noise on a channel: { snrDb, bandHz? } or { psd }');

export type NoiseSpec = z.infer<typeof noiseSchema>;

/** Mean-square value of x inside [lowHz, highHz] (unit²), from its zero-padded periodogram. */
export function bandPower(x: Float64Array, sampleRateHz: number, band: Band): number {
  const length = nextPowerOfTwo(x.length);
  const padded = new Float64Array(length);
  padded.set(x);
  const s = oneSidedSpectrum(padded);
  let sum = 0;
  for (let k = 0; k <= length / 2; k++) {
    const f = (k * sampleRateHz) / length;
    if (f < band.lowHz || f > band.highHz) continue;
    const weight = k === 0 || k === length / 2 ? 1 : 2; // both sides of the two-sided spectrum
    sum += weight * (s.re[k] * s.re[k] + s.im[k] * s.im[k]);
  }
  return sum / (length * x.length);
}

/** Noise standard deviation for a spec, given the clean channel record (unit of the channel). */
export function noiseSigma(spec: NoiseSpec, clean: Float64Array, sampleRateHz: number, defaultBand: Band): number {
  if ('psd' in spec) return Math.sqrt((spec.psd * sampleRateHz) / 2);
  const band = spec.bandHz ?? defaultBand;
  const signal = bandPower(clean, sampleRateHz, band);
  const noiseInBand = signal * Math.pow(10, -spec.snrDb / 10);
  return Math.sqrt((noiseInBand * sampleRateHz) / (2 * (band.highHz - band.lowHz)));
}

/** Adds independent N(0, σ²) samples from `random` to `target` in place; returns it. */
export function addWhiteNoise(target: Float64Array, sigma: number, random: RandomSource): Float64Array {
  for (let i = 0; i < target.length; i++) target[i] += sigma * random.gaussian();
  return target;
}
