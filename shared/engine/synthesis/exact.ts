/**
 * Exact synthesis of a linear system's response (docs/engine.md, "Known-answer signals").
 *
 * Over one synthesis record of L = 2^p samples at fs:
 *   X = FFT(x) with the Nyquist line removed (X[L/2] = 0; the input record becomes IFFT(X)),
 *   Y[k] = H(f_k)·G(f_k)·X[k],  f_k = k·fs/L,  k = 0…L/2 − 1,  Y[L/2] = 0,
 *   y = IFFT(Y).
 * y is then exactly the sampled steady-state response of the continuous system to the
 * band-limited L-periodic input whose samples are x. G is the output channel's error:
 *   G(f) = g · exp(jφ) · exp(−2πi·f·τ)   (φ applied for f > 0 only: a real channel cannot shift
 *   the phase of a constant), so a delay τ and a gain/phase mismatch are exact too.
 * A record that must start from rest is zero-padded after the excitation (the padding precedes
 * the next period) by at least the 1e-6 decay time ln(1e6)/(ζω_n) of the slowest mode plus |τ|.
 */
import type { ComplexArray } from '../types';
import { EngineInputError } from '../errors';
import { isPowerOfTwo } from '../fft';
import { oneSidedSpectrum, realFromSpectrum, transformsFor, type RealTransforms } from './spectrum';

export interface OutputChannelErrors {
  /** Delay of the output channel against the input channel, s (may be negative). */
  delayS?: number;
  /** Output channel gain as a ratio (1 = none). */
  gain?: number;
  /** Output channel phase shift, degrees (applied for f > 0). */
  phaseDeg?: number;
}

export interface ExactSynthesisOptions {
  sampleRateHz: number;
  /** Transforms of the synthesis length to reuse (optional). */
  transforms?: RealTransforms;
  /** The exact FRF of the chosen quantity at frequencies in Hz. */
  frf: (fHz: Float64Array) => ComplexArray;
  channel?: OutputChannelErrors;
}

export interface SynthesisedPair {
  /** The input record actually used (x without its Nyquist line), length L. */
  input: Float64Array;
  /** The exact response, length L. */
  output: Float64Array;
}

function requirePowerOfTwo(field: string, n: number): void {
  if (!(isPowerOfTwo(n) && n >= 4)) {
    throw new EngineInputError(field, n, 'must be a power of two ≥ 4');
  }
}

/** One-sided spectrum of x with the Nyquist line removed (length L/2 + 1). */
export function excitationSpectrum(x: Float64Array, t?: RealTransforms): ComplexArray {
  requirePowerOfTwo('synthesis.length', x.length);
  const s = oneSidedSpectrum(x, t ?? transformsFor(x.length));
  s.re[x.length / 2] = 0;
  s.im[x.length / 2] = 0;
  return s;
}

/** G(f) = g·exp(jφ)·exp(−2πifτ) of the output channel at frequency f (Hz), as [re, im]. */
export function outputChannelFactor(fHz: number, channel: OutputChannelErrors = {}): [number, number] {
  const gain = channel.gain ?? 1;
  const phase = fHz > 0 ? ((channel.phaseDeg ?? 0) * Math.PI) / 180 : 0;
  const angle = phase - 2 * Math.PI * fHz * (channel.delayS ?? 0);
  return [gain * Math.cos(angle), gain * Math.sin(angle)];
}

/**
 * Exact response y = IFFT(H·G·X) to the input spectrum X (one-sided, length L/2 + 1, Nyquist
 * line zero); H is evaluated only at lines where X is non-zero. Returns y, length L.
 */
export function exactResponse(x: ComplexArray, o: ExactSynthesisOptions): Float64Array {
  const half = x.re.length - 1;
  const length = 2 * half;
  requirePowerOfTwo('synthesis.length', length);
  const active: number[] = [];
  for (let k = 0; k < half; k++) if (x.re[k] !== 0 || x.im[k] !== 0) active.push(k);
  const f = Float64Array.from(active, (k) => (k * o.sampleRateHz) / length);
  const h = o.frf(f);
  const y = { re: new Float64Array(half + 1), im: new Float64Array(half + 1) };
  active.forEach((k, i) => {
    const [gr, gi] = outputChannelFactor(f[i], o.channel);
    const hr = h.re[i] * gr - h.im[i] * gi;
    const hi = h.re[i] * gi + h.im[i] * gr;
    y.re[k] = hr * x.re[k] - hi * x.im[k];
    y.im[k] = hr * x.im[k] + hi * x.re[k];
  });
  // DC must stay real (it is, for a real H(0) and real gain); drop any rounding residue.
  y.im[0] = 0;
  return realFromSpectrum(y, length, o.transforms ?? transformsFor(length));
}

/** Input record IFFT(X) and exact response IFFT(H·G·X), both of length L. */
export function synthesiseFromSpectrum(x: ComplexArray, o: ExactSynthesisOptions): SynthesisedPair {
  const length = 2 * (x.re.length - 1);
  const t = o.transforms ?? transformsFor(length);
  return { input: realFromSpectrum(x, length, t), output: exactResponse(x, { ...o, transforms: t }) };
}

/** Exact synthesis from time samples x of length L = 2^p (see the module doc). */
export function synthesiseExact(x: Float64Array, o: ExactSynthesisOptions): SynthesisedPair {
  return synthesiseFromSpectrum(excitationSpectrum(x), o);
}

/** Samples of padding needed after the excitation for a record that starts from rest. */
export function restPaddingSamples(slowestDecayRatePerS: number, sampleRateHz: number, delayS = 0): number {
  const decayS = Math.log(1e6) / slowestDecayRatePerS;
  return Math.ceil((decayS + Math.abs(delayS)) * sampleRateHz) + 2;
}
