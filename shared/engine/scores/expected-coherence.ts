/**
 * The coherence a scenario's noise should give, per line, before anything is simulated.
 *
 * With uncorrelated noise n on the measured force and m on the measured response,
 *   γ²(f) = 1 / ((1 + Gnn/Gxx)·(1 + Gmm/(|H|²·Gxx)))
 * (J. S. Bendat & A. G. Piersol, Random Data, 4th ed., ch. 9, quoted from memory; it follows from
 * Gxx,measured = Gxx + Gnn, Gyy,measured = |H|²Gxx + Gmm, Gyx = H·Gxx). The noise is white. Sized by
 * an SNR over a band [f₁, f₂] (synthesis/noise.ts), the noise level is the channel's mean in-band
 * PSD over 10^(SNR/10), so the line SNR is s(f) = 10^(SNR/10)·S(f)/mean_band(S) with S the clean
 * channel's PSD shape (Gxx for the force, |H|²Gxx for the response).
 *
 * Force spectrum shapes: flat over the excitation band for the random, periodic and linear-chirp
 * kinds; ∝ 1/f for a log chirp (the sweep spends time ∝ 1/f at each frequency); for an impact
 * the energy spectrum of a half-sine pulse of duration T, |cos(πfT)/(1 − 4f²T²)|² (its Fourier
 * transform; any signals text), times |1 + a·e^(−j2πfd)|² for a second hit a at delay d.
 * Simplifications, stated in `notes`: leakage and the exponential window's noise reduction are
 * left out; a PSD-sized noise needs an RMS force level (random kinds) or a peak force (impact).
 */
import type { ComplexArray } from '../types';
import type { Band, ExcitationSpec } from '../synthesis/excitation-schema';
import type { NoiseSpec } from '../synthesis/noise';

/** Relative (or, with `absolute`, one-sided N²/Hz) force PSD shape at each frequency. */
export function forceSpectrumShape(e: ExcitationSpec, fHz: Float64Array): Float64Array {
  const out = new Float64Array(fHz.length);
  for (let i = 0; i < fHz.length; i++) {
    const f = fHz[i];
    if (e.kind === 'impact') {
      const T = e.pulseDurationS;
      const x = 2 * f * T;
      const c = Math.abs(1 - x * x) < 1e-9 ? Math.PI / 4 : Math.cos(Math.PI * f * T) / (1 - x * x);
      let g = c * c;
      if (e.doubleHit) {
        const ph = -2 * Math.PI * f * e.doubleHit.delayS;
        const a = e.doubleHit.amplitudeRatio;
        g *= (1 + a * Math.cos(ph)) ** 2 + (a * Math.sin(ph)) ** 2;
      }
      out[i] = g;
    } else {
      const inBand = f >= e.band.lowHz && f <= e.band.highHz;
      out[i] = inBand ? (e.kind === 'chirp' && e.sweep === 'log' ? 1 / f : 1) : 0;
    }
  }
  return out;
}

/** Mean of g over a band, on an even grid of 4097 points. */
function bandMean(g: (f: Float64Array) => Float64Array, band: Band): number {
  const n = 4097;
  const f = new Float64Array(n);
  for (let i = 0; i < n; i++) f[i] = band.lowHz + ((band.highHz - band.lowHz) * i) / (n - 1);
  const v = g(f);
  let s = 0;
  for (let i = 0; i < n; i++) s += v[i];
  return s / n;
}

export interface ExpectedCoherenceInput {
  fHz: Float64Array;
  frf: (fHz: Float64Array) => ComplexArray;
  excitation: ExcitationSpec;
  inputNoise?: NoiseSpec;
  outputNoise?: NoiseSpec;
  /** Band an SNR refers to when the noise spec gives none. */
  defaultNoiseBand: Band;
  /** Block duration, s: turns an impact's energy spectrum into a per-block PSD (PSD noise only). */
  blockDurationS: number;
}

export interface ExpectedCoherence {
  coherence: Float64Array;
  /** Line SNR of each channel (power ratio; Infinity without noise). */
  inputSnr: Float64Array;
  outputSnr: Float64Array;
  notes: string[];
}

/** Expected coherence per line from the scenario's noise (module doc). */
export function expectedCoherence(input: ExpectedCoherenceInput): ExpectedCoherence {
  const { fHz, frf, excitation: e } = input;
  const notes: string[] = [];
  const shape = (f: Float64Array) => forceSpectrumShape(e, f);
  const response = (f: Float64Array) => {
    const s = shape(f);
    const h = frf(f);
    for (let i = 0; i < f.length; i++) s[i] *= h.re[i] * h.re[i] + h.im[i] * h.im[i];
    return s;
  };
  /** Absolute force PSD scale (N²/Hz per unit of shape), or null when the level cannot give it. */
  const absoluteScale = (): number | null => {
    if (e.kind === 'impact') {
      if (!('peakN' in e.level)) return null;
      // |F(f)| = peak·(2T/π)·|cos(πfT)/(1 − 4f²T²)|; per-block one-sided PSD 2|F|²/T_block.
      const a = (e.level.peakN * 2 * e.pulseDurationS) / Math.PI;
      return (2 * a * a) / input.blockDurationS;
    }
    if (!('rmsN' in e.level)) return null;
    // RMS² spread over the band with the shape's weighting.
    return (e.level.rmsN * e.level.rmsN) / (bandMean(shape, e.band) * (e.band.highHz - e.band.lowHz));
  };
  const lineSnr = (noise: NoiseSpec | undefined, clean: (f: Float64Array) => Float64Array, name: string): Float64Array => {
    const out = new Float64Array(fHz.length).fill(Infinity);
    if (!noise) return out;
    const s = clean(fHz);
    if ('snrDb' in noise) {
      const mean = bandMean(clean, noise.bandHz ?? input.defaultNoiseBand);
      const ratio = Math.pow(10, noise.snrDb / 10);
      for (let i = 0; i < out.length; i++) out[i] = (ratio * s[i]) / mean;
      return out;
    }
    const scale = absoluteScale();
    if (scale === null) {
      notes.push(`${name} noise is given as a PSD but the force level is not an RMS (random kinds) or a peak (impact): that channel is taken as noise-free here`);
      return out;
    }
    for (let i = 0; i < out.length; i++) out[i] = (scale * s[i]) / noise.psd;
    return out;
  };
  const inputSnr = lineSnr(input.inputNoise, shape, 'input');
  const outputSnr = lineSnr(input.outputNoise, response, 'output');
  const coherence = new Float64Array(fHz.length);
  for (let i = 0; i < fHz.length; i++) coherence[i] = 1 / ((1 + 1 / inputSnr[i]) * (1 + 1 / outputSnr[i]));
  if (e.kind === 'impact') notes.push('the force and exponential windows reduce the noise in each block further; the coherence here leaves that out (conservative)');
  return { coherence, inputSnr, outputSnr, notes };
}
