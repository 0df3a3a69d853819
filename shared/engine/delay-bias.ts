/**
 * What a time delay τ of the response channel against the force channel does to a Welch FRF
 * estimate with window w over blocks of N samples:
 * - magnitude: the delayed block shares only part of its input with the force block, weighted by
 *   the window, so E[Ĝyx] is scaled by the window's normalised autocorrelation at the lag,
 *   c(τ) = Σ_n w[n]·w[n + τ·fs] / Σ_n w[n]² (the overlap correlation of windows.ts); for the
 *   rectangular window c = 1 − τ/T, T = N/fs, the known |Ĥ1| ≈ (1 − τ/T)·|H| and
 *   γ̂² ≈ (1 − τ/T)² (J. S. Bendat & A. G. Piersol, Random Data, 4th ed., ch. 9, quoted from
 *   memory); a fractional lag is interpolated linearly between whole samples;
 * - phase: the delay multiplies H by exp(−2πi f τ), a phase error of −360·f·τ degrees that no
 *   averaging removes (the shift theorem of the Fourier transform).
 */
import type { WindowName } from './types';
import { overlapCorrelation, windowSamples } from './windows';

export interface DelayBias {
  /** E|Ĥ|/|H| from the delay alone. */
  magnitudeFactor: number;
  /** The same in dB. */
  magnitudeDb: number;
  /** γ² lost to the delay: magnitudeFactor². */
  coherenceFactor: number;
  /** Phase error at `atHz`, degrees. */
  phaseDegAt: number;
}

/** Bias of a delay `delayS` for `window` blocks of `blockLength` samples at `sampleRateHz` (module doc). */
export function delayBias(window: WindowName, blockLength: number, sampleRateHz: number, delayS: number, atHz: number): DelayBias {
  const lag = Math.abs(delayS) * sampleRateHz;
  const w = windowSamples(window, blockLength);
  const whole = Math.floor(lag);
  const frac = lag - whole;
  const c0 = overlapCorrelation(w, whole);
  const factor = frac === 0 ? c0 : (1 - frac) * c0 + frac * overlapCorrelation(w, whole + 1);
  return {
    magnitudeFactor: factor,
    magnitudeDb: factor > 0 ? 20 * Math.log10(factor) : -Infinity,
    coherenceFactor: factor * factor,
    phaseDegAt: -360 * atHz * delayS,
  };
}
