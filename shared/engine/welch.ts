/**
 * Welch-averaged auto- and cross-spectra of a two-channel record (P. D. Welch, IEEE Trans. Audio
 * Electroacoust. AU-15(2), 1967).
 *
 * Block j starts at j·S, S = N − round(overlap·N). Each block is detrended, windowed and
 * transformed, `X[k] = Σ_n w[n]·x[n]·exp(−2πi k n / N)`, and the one-sided spectra are
 *   Gxx[k] = c_k · s · mean_j |X_j[k]|²,   Gyy likewise,   Gyx[k] = c_k · s · mean_j Y_j[k]·conj(X_j[k]),
 * with c_k = 2 for 0 < k < N/2 and 1 at k = 0 and N/2, and
 *   s = 1 / (fs · Σw²)  ('density', units²/Hz)   or   s = 1 / (Σw)²  ('spectrum', units²).
 * This is SciPy's `welch`/`csd` convention: scipy's csd(x, y) = mean conj(X)·Y = our Gyx.
 *
 * Both channels share one complex FFT per block (two-for-one packing, see fft.ts); all buffers are
 * allocated before the block loop.
 */
import type { ComplexArray, Detrend, SpectrumScaling, WindowName } from './types';
import { EngineInputError, requireFinite } from './errors';
import { PairedRealFft, accumulatePairedSpectra, isPowerOfTwo } from './fft';
import { fitTrend, DETREND_KINDS } from './detrend';
import { overlapCorrelation, windowSamples, type WindowParams } from './windows';

export interface WelchOptions {
  sampleRateHz: number;
  /** Block length N in samples, a power of two ≥ 4. */
  blockLength: number;
  window: WindowName;
  windowParams?: WindowParams;
  /** Overlap as a fraction of the block, in [0, 1). */
  overlap: number;
  /** Number of blocks to average; default all the record allows. */
  averages?: number;
  detrend: Detrend;
  scaling: SpectrumScaling;
}

export interface CrossSpectra {
  /** k·fs/N, k = 0..N/2. */
  frequenciesHz: Float64Array;
  gxx: Float64Array;
  gyy: Float64Array;
  /** mean Y·conj(X), scaled as gxx. */
  gyx: ComplexArray;
  /** Blocks averaged. */
  blocks: number;
  /** Welch's equivalent number of independent averages (≤ blocks when blocks overlap). */
  effectiveAverages: number;
  warnings: string[];
}

const SCALINGS: readonly SpectrumScaling[] = ['density', 'spectrum'];

/** Welch's auto- and cross-spectra of input x and output y (equal lengths). */
export function welchCrossSpectra(x: Float64Array, y: Float64Array, o: WelchOptions): CrossSpectra {
  const warnings: string[] = [];
  requireSameLength(x, y);
  requireFinite('sampleRateHz', o.sampleRateHz);
  if (o.sampleRateHz <= 0) throw new EngineInputError('sampleRateHz', o.sampleRateHz, 'must be > 0');
  const n = o.blockLength;
  if (!isPowerOfTwo(n) || n < 4) throw new EngineInputError('blockLength', n, 'must be a power of two ≥ 4');
  if (n > x.length) {
    throw new EngineInputError('blockLength', n, `must not exceed the record length ${x.length} samples`);
  }
  if (typeof o.overlap !== 'number' || !(o.overlap >= 0 && o.overlap < 1)) {
    throw new EngineInputError('overlap', o.overlap, 'must be in [0, 1)');
  }
  const overlapSamples = Math.round(o.overlap * n);
  if (overlapSamples >= n) {
    throw new EngineInputError('overlap', o.overlap, `leaves no step between blocks of ${n} samples`);
  }
  if (overlapSamples !== o.overlap * n) {
    warnings.push(
      `overlap=${o.overlap} of ${n} samples rounded to ${overlapSamples} samples (${((100 * overlapSamples) / n).toFixed(2)} %)`,
    );
  }
  const step = n - overlapSamples;
  const available = Math.floor((x.length - n) / step) + 1;
  let blocks = available;
  if (o.averages !== undefined) {
    if (!Number.isInteger(o.averages) || o.averages < 1) {
      throw new EngineInputError('averages', o.averages, 'must be an integer ≥ 1');
    }
    if (o.averages > available) {
      warnings.push(`averages=${o.averages} asked for, but the record holds only ${available} blocks; ${available} averaged`);
    } else {
      blocks = o.averages;
    }
  }
  const w = windowSamples(o.window, n, o.windowParams);
  const starts = new Float64Array(blocks);
  for (let j = 0; j < blocks; j++) starts[j] = j * step;
  const spectra = accumulateCrossSpectra(x, y, {
    sampleRateHz: o.sampleRateHz,
    blockStarts: starts,
    inputWindow: w,
    outputWindow: w,
    scaleWindow: w,
    detrend: o.detrend,
    scaling: o.scaling,
  });
  spectra.effectiveAverages = effectiveAverages(w, step, blocks);
  spectra.warnings.push(...warnings);
  return spectra;
}

/**
 * Welch's equivalent number of independent averages of K blocks stepped by S samples,
 * `n_eff = K / [1 + 2 Σ_{j=1}^{K−1} (1 − j/K)·c(j·S)²]`, c = the window's overlap correlation
 * (P. D. Welch 1967, variance of the averaged periodogram of a Gaussian process).
 */
export function effectiveAverages(w: Float64Array, step: number, blocks: number): number {
  let sum = 0;
  for (let j = 1; j < blocks && j * step < w.length; j++) {
    const c = overlapCorrelation(w, j * step);
    sum += (1 - j / blocks) * c * c;
  }
  return blocks / (1 + 2 * sum);
}

export interface BlockAverageOptions {
  sampleRateHz: number;
  /** Start sample of each block (integers). */
  blockStarts: ArrayLike<number>;
  /** Weights applied to the input and output blocks (length N = block length). */
  inputWindow: Float64Array;
  outputWindow: Float64Array;
  /** The window whose Σw² (density) or (Σw)² (spectrum) sets the scale. */
  scaleWindow: Float64Array;
  detrend: Detrend;
  scaling: SpectrumScaling;
}

/**
 * Averages Gxx, Gyy and Gyx over the given blocks (module doc for the formulas). The input and
 * output channels may carry different weights (transient processing); the scale comes from
 * `scaleWindow` so that both channels are scaled alike and H1 = Gyx/Gxx stays unbiased by it.
 * `effectiveAverages` is returned equal to the block count (non-overlapping blocks).
 */
export function accumulateCrossSpectra(x: Float64Array, y: Float64Array, o: BlockAverageOptions): CrossSpectra {
  if (!DETREND_KINDS.includes(o.detrend)) {
    throw new EngineInputError('detrend', o.detrend, `must be one of ${DETREND_KINDS.join(', ')}`);
  }
  if (!SCALINGS.includes(o.scaling)) {
    throw new EngineInputError('scaling', o.scaling, `must be one of ${SCALINGS.join(', ')}`);
  }
  requireSameLength(x, y);
  const blocks = o.blockStarts.length;
  if (blocks < 1) throw new EngineInputError('blocks', blocks, 'must be ≥ 1');
  const n = o.inputWindow.length;
  for (const [field, w] of [['outputWindow', o.outputWindow], ['scaleWindow', o.scaleWindow]] as const) {
    if (w.length !== n) throw new EngineInputError(`${field}.length`, w.length, `must equal inputWindow.length=${n}`);
  }
  // Two-for-one packing adds rounding error of order ε·|larger channel| to both spectra, so a
  // channel 1e-6 times the other (metres against newtons) would lose six digits. Scaling each
  // channel by a power of two (exact in binary floating point) to a peak near 1 avoids that; the
  // scales are folded into the window copies and divided out exactly at the end.
  const gx = powerOfTwoScale('x', x);
  const gy = powerOfTwoScale('y', y);
  const wx = o.inputWindow.map((v) => v * gx);
  const wy = o.outputWindow.map((v) => v * gy);
  const paired = new PairedRealFft(n);
  const lines = paired.lines;
  const { input } = paired;
  const sxx = new Float64Array(lines);
  const syy = new Float64Array(lines);
  const syxRe = new Float64Array(lines);
  const syxIm = new Float64Array(lines);
  const cx = new Float64Array(2);
  const cy = new Float64Array(2);
  const centre = (n - 1) / 2;
  for (let j = 0; j < blocks; j++) {
    const off = o.blockStarts[j];
    if (!(off >= 0 && off + n <= x.length) || !Number.isInteger(off)) {
      throw new EngineInputError(`blockStarts[${j}]`, off, `must be an integer in [0, ${x.length - n}]`);
    }
    if (o.detrend === 'none') {
      for (let i = 0; i < n; i++) {
        input[2 * i] = wx[i] * x[off + i];
        input[2 * i + 1] = wy[i] * y[off + i];
      }
    } else {
      fitTrend(o.detrend, x, off, n, cx);
      fitTrend(o.detrend, y, off, n, cy);
      for (let i = 0; i < n; i++) {
        const t = i - centre;
        input[2 * i] = wx[i] * (x[off + i] - cx[0] - cx[1] * t);
        input[2 * i + 1] = wy[i] * (y[off + i] - cy[0] - cy[1] * t);
      }
    }
    accumulatePairedSpectra(paired, sxx, syy, syxRe, syxIm); // sums of 4·|X|² etc.
  }
  const sw = o.scaleWindow;
  let sum = 0;
  let sumSq = 0;
  for (let i = 0; i < sw.length; i++) {
    sum += sw[i];
    sumSq += sw[i] * sw[i];
  }
  const scale = (o.scaling === 'density' ? 0.25 / (o.sampleRateHz * sumSq) : 0.25 / (sum * sum)) / blocks;
  const frequenciesHz = new Float64Array(lines);
  for (let k = 0; k < lines; k++) {
    const s = k === 0 || k === lines - 1 ? scale : 2 * scale;
    sxx[k] *= s / (gx * gx);
    syy[k] *= s / (gy * gy);
    syxRe[k] *= s / (gx * gy);
    syxIm[k] *= s / (gx * gy);
    frequenciesHz[k] = (k * o.sampleRateHz) / n;
  }
  return {
    frequenciesHz,
    gxx: sxx,
    gyy: syy,
    gyx: { re: syxRe, im: syxIm },
    blocks,
    effectiveAverages: blocks,
    warnings: [],
  };
}

/**
 * 2^−e with 2^e the power of two nearest the peak |v| (1 for an all-zero channel). Throws naming
 * the first sample that is not finite, e.g. `x[17]=NaN` (one pass does both).
 */
function powerOfTwoScale(field: string, v: Float64Array): number {
  let peak = 0;
  for (let i = 0; i < v.length; i++) {
    const a = v[i] < 0 ? -v[i] : v[i];
    if (a > peak) {
      if (a === Infinity) throw new EngineInputError(`${field}[${i}]`, v[i], 'must be finite');
      peak = a;
    } else if (a !== a) {
      throw new EngineInputError(`${field}[${i}]`, v[i], 'must be finite');
    }
  }
  if (peak === 0) return 1;
  return 2 ** -Math.round(Math.log2(peak));
}

function requireSameLength(x: Float64Array, y: Float64Array): void {
  if (!(x instanceof Float64Array)) throw new EngineInputError('x', typeof x, 'must be a Float64Array');
  if (!(y instanceof Float64Array)) throw new EngineInputError('y', typeof y, 'must be a Float64Array');
  if (y.length !== x.length) throw new EngineInputError('y.length', y.length, `must equal x.length=${x.length}`);
  // Finite samples are checked where the block loop scans each channel (powerOfTwoScale).
}

/** Throws naming the first sample of `data` that is NaN or infinite, e.g. `x[17]=NaN`. */
export function requireFiniteSamples(field: string, data: Float64Array): void {
  for (let i = 0; i < data.length; i++) {
    const v = data[i];
    if (v - v !== 0) throw new EngineInputError(`${field}[${i}]`, v, 'must be finite');
  }
}
