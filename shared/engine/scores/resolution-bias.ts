/**
 * Resolution (smoothing) bias of an averaged FRF estimate at a lightly damped resonance.
 *
 * For jointly stationary signals the expected windowed cross-periodogram is the true cross
 * spectrum smoothed by the window's power kernel: E[Ĝyx(f)] = ∫ Gyx(ν)·K(f − ν) dν with
 * K(δ) = |W(δ)|² / ∫|W|² (P. D. Welch, IEEE Trans. Audio Electroacoust. AU-15(2), 1967). With a
 * flat input spectrum over the kernel's width, E[Ĥ1](f) ≈ ∫ H(ν)·K(f − ν) dν; this module
 * evaluates that sum numerically on a grid of offsets (the "kernel" prediction).
 *
 * Two closed forms beside it, for a resonance with half-power bandwidth B_r:
 * - the second-order expansion of the smoothing: bias/H ≈ ½·H''/H·μ₂ = −4·μ₂/B_r², where μ₂ is the
 *   kernel's second moment (Hz²); for Hann μ₂ = Δf²/3 exactly (Parseval: μ₂ = ∫|w'|²/(4π²∫w²));
 * - Bendat & Piersol's rule ε_b ≈ −(1/3)·(B_e/B_r)² (Random Data, 4th ed., ch. 8, quoted from
 *   memory), which assumes an ideal rectangular spectral window of width B_e (μ₂ = B_e²/12). With
 *   B_e = the window's noise bandwidth it is the same formula with a different μ₂: for Hann
 *   (B_e = 1.5·Δf) it gives −0.75·(Δf/B_r)² against −1.33·(Δf/B_r)² from the true kernel.
 * Windows that do not taper to zero (rectangular, Hamming) have a kernel whose second moment grows
 * with the truncation width; their quadratic figure is not meaningful and is reported as NaN.
 */
import type { ComplexArray, WindowName } from '../types';
import { EngineInputError } from '../errors';
import { fft } from '../fft';
import { windowSamples, windowFigures, type WindowParams } from '../windows';

export interface PowerKernel {
  /** Offsets from the analysed line, in bins (multiples of Δf). */
  offsetsBins: Float64Array;
  /** K at each offset, normalised to sum 1. */
  weights: Float64Array;
  /** Second moment Σ K·δ², bins²; NaN for a window that does not taper to zero. */
  secondMomentBins2: number;
  /** Noise bandwidth of the window, bins (Harris). */
  enbwBins: number;
}

/**
 * The window's power kernel K(δ) = |Σ_n w[n]·exp(−2πi δ n/N)|², sampled every 1/oversample bin
 * over ±halfWidthBins (zero-padded FFT of length oversample·N), normalised to sum 1.
 */
export function powerKernel(
  window: WindowName,
  blockLength: number,
  o: { windowParams?: WindowParams; oversample?: number; halfWidthBins?: number } = {},
): PowerKernel {
  const R = o.oversample ?? 16;
  const J = o.halfWidthBins ?? 32;
  if (!Number.isInteger(R) || R < 1 || (R & (R - 1)) !== 0) {
    throw new EngineInputError('oversample', R, 'must be a power of two ≥ 1');
  }
  if (!Number.isInteger(J) || J < 1 || 2 * J > blockLength) {
    throw new EngineInputError('halfWidthBins', J, `must be an integer in [1, ${blockLength / 2}]`);
  }
  const w = windowSamples(window, blockLength, o.windowParams);
  const size = R * blockLength;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  re.set(w);
  const W = fft(re, im);
  const m = 2 * J * R + 1;
  const offsetsBins = new Float64Array(m);
  const weights = new Float64Array(m);
  let total = 0;
  for (let j = -J * R; j <= J * R; j++) {
    const k = (j + size) % size;
    const p = W.re[k] * W.re[k] + W.im[k] * W.im[k];
    offsetsBins[j + J * R] = j / R;
    weights[j + J * R] = p;
    total += p;
  }
  let moment = 0;
  for (let i = 0; i < m; i++) {
    weights[i] /= total;
    moment += weights[i] * offsetsBins[i] * offsetsBins[i];
  }
  let peak = 0;
  for (const v of w) peak = Math.max(peak, Math.abs(v));
  const tapered = Math.abs(w[0]) <= 1e-3 * peak;
  return {
    offsetsBins,
    weights,
    secondMomentBins2: tapered ? moment : NaN,
    enbwBins: windowFigures(window, blockLength, o.windowParams).enbwBins,
  };
}

/**
 * Expected H1 at each frequency of `fHz` under the kernel smoothing (module doc): Σ K_j·H(f − δ_j·Δf).
 * `frf` gives the exact FRF; `resolutionHz` is Δf = fs/N.
 */
export function smoothedFrf(
  frf: (fHz: Float64Array) => ComplexArray,
  fHz: Float64Array,
  kernel: PowerKernel,
  resolutionHz: number,
): ComplexArray {
  const m = kernel.offsetsBins.length;
  const re = new Float64Array(fHz.length);
  const im = new Float64Array(fHz.length);
  const grid = new Float64Array(m);
  for (let i = 0; i < fHz.length; i++) {
    for (let j = 0; j < m; j++) grid[j] = Math.abs(fHz[i] - kernel.offsetsBins[j] * resolutionHz);
    const h = frf(grid);
    let sr = 0;
    let si = 0;
    for (let j = 0; j < m; j++) {
      // H(−f) = conj H(f) for a real system; |f| with the sign of the imaginary part flipped.
      const sign = fHz[i] - kernel.offsetsBins[j] * resolutionHz < 0 ? -1 : 1;
      sr += kernel.weights[j] * h.re[j];
      si += kernel.weights[j] * sign * h.im[j];
    }
    re[i] = sr;
    im[i] = si;
  }
  return { re, im };
}

/**
 * Coherence lost to leakage alone, per line: |E[Ĝyx]|² / (E[Ĝxx]·E[Ĝyy]) with the kernel sums
 * E[Ĝyx] ∝ Σ K·H and E[Ĝyy] ∝ Σ K·|H|² (flat input spectrum; the Cauchy–Schwarz inequality keeps
 * it in [0, 1]). It multiplies the noise coherence of scores/expected-coherence.ts.
 */
export function leakageCoherence(
  frf: (fHz: Float64Array) => ComplexArray,
  fHz: Float64Array,
  kernel: PowerKernel,
  resolutionHz: number,
): Float64Array {
  const h = smoothedFrf(frf, fHz, kernel, resolutionHz);
  const m = kernel.offsetsBins.length;
  const grid = new Float64Array(m);
  const out = new Float64Array(fHz.length);
  for (let i = 0; i < fHz.length; i++) {
    for (let j = 0; j < m; j++) grid[j] = Math.abs(fHz[i] - kernel.offsetsBins[j] * resolutionHz);
    const g = frf(grid);
    let power = 0;
    for (let j = 0; j < m; j++) power += kernel.weights[j] * (g.re[j] * g.re[j] + g.im[j] * g.im[j]);
    out[i] = power > 0 ? Math.min(1, (h.re[i] * h.re[i] + h.im[i] * h.im[i]) / power) : 1;
  }
  return out;
}

export interface ResolutionBias {
  /** |E[Ĥ1]|/|H| − 1 at the resonance from the kernel sum (fraction; negative = low). */
  kernel: number;
  /** −4·μ₂/B_r² from the kernel's second moment (fraction); NaN for untapered windows. */
  secondOrder: number;
  /** Bendat & Piersol's −(1/3)(B_e/B_r)², B_e = ENBW·Δf (fraction; quoted from memory). */
  bendatPiersol: number;
  resolutionHz: number;
  effectiveBandwidthHz: number;
}

/**
 * Predicted resolution bias of |Ĥ1| at frequency `atHz` (normally a natural frequency) for a
 * resonance of half-power bandwidth `halfPowerBandwidthHz`, by the three routes of the module doc.
 */
export function resolutionBias(
  frf: (fHz: Float64Array) => ComplexArray,
  atHz: number,
  halfPowerBandwidthHz: number,
  kernel: PowerKernel,
  resolutionHz: number,
): ResolutionBias {
  const at = Float64Array.of(atHz);
  const h = frf(at);
  const s = smoothedFrf(frf, at, kernel, resolutionHz);
  const ratio = Math.hypot(s.re[0], s.im[0]) / Math.hypot(h.re[0], h.im[0]);
  const be = kernel.enbwBins * resolutionHz;
  const br = halfPowerBandwidthHz;
  return {
    kernel: ratio - 1,
    secondOrder: (-4 * kernel.secondMomentBins2 * resolutionHz * resolutionHz) / (br * br),
    bendatPiersol: -(1 / 3) * (be / br) ** 2,
    resolutionHz,
    effectiveBandwidthHz: be,
  };
}
