/**
 * Analogue-to-digital conversion of one channel: a mid-tread uniform quantiser of `bits` bits
 * over the input range ±V. Step q = 2V/2^bits; code = round(x/q) (halves upward), clamped to the
 * 2^bits codes −2^(bits−1) … 2^(bits−1) − 1, value = q·code. A sample whose code falls outside
 * that range is an overload: it is clipped to the end code and counted. Within range the error is
 * at most q/2 (uniform quantisation; B. Widrow and I. Kollár, Quantization Noise, 2008, for the
 * q²/12 noise model).
 */
import { EngineInputError } from '../errors';

export interface QuantiserSettings {
  bits: number;
  /** Full-scale range V: the converter spans ±V, in the channel's unit. */
  fullScale: number;
}

export interface QuantisedChannel {
  values: Float64Array;
  /** Samples that overloaded the range. */
  clipped: number;
  /** Quantisation step q, channel unit. */
  step: number;
}

/** Quantises x; overloaded samples are counted and marked in `mask` (if given). */
export function quantise(x: Float64Array, s: QuantiserSettings, mask?: Uint8Array): QuantisedChannel {
  if (!(Number.isInteger(s.bits) && s.bits >= 2 && s.bits <= 32)) {
    throw new EngineInputError('errors.quantisation.bits', s.bits, 'must be a whole number 2…32');
  }
  if (!(s.fullScale > 0 && Number.isFinite(s.fullScale))) {
    throw new EngineInputError('errors.quantisation.fullScale', s.fullScale, 'must be a finite number > 0');
  }
  const step = (2 * s.fullScale) / Math.pow(2, s.bits);
  const lowest = -Math.pow(2, s.bits - 1);
  const highest = Math.pow(2, s.bits - 1) - 1;
  const values = new Float64Array(x.length);
  let clipped = 0;
  for (let i = 0; i < x.length; i++) {
    let code = Math.round(x[i] / step);
    if (code > highest || code < lowest) {
      code = code > highest ? highest : lowest;
      clipped++;
      if (mask) mask[i] = 1;
    }
    values[i] = code * step;
  }
  return { values, clipped, step };
}

/** Clips x to ±limit in place and marks clipped samples in `mask` (if given); returns the count. */
export function clipInPlace(x: Float64Array, limit: number, mask?: Uint8Array): number {
  let count = 0;
  for (let i = 0; i < x.length; i++) {
    if (x[i] > limit) x[i] = limit;
    else if (x[i] < -limit) x[i] = -limit;
    else continue;
    count++;
    if (mask) mask[i] = 1;
  }
  return count;
}

/** Largest absolute sample. */
export function peakAbs(x: Float64Array): number {
  let p = 0;
  for (let i = 0; i < x.length; i++) p = Math.max(p, Math.abs(x[i]));
  return p;
}
