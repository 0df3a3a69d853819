/**
 * Data windows, DFT-even ("periodic"): a window of length N is the symmetric window of length
 * N + 1 with its last sample dropped, as spectrum analysers and SciPy's
 * `get_window(..., fftbins=True)` build them (F. J. Harris, Proc. IEEE 66(1), 1978).
 *
 * Cosine-sum windows `w[n] = Σ_k a_k cos(k·φ_n)`, φ_n = −π + 2π n / N (n = 0..N−1), with
 *   hann            a = [0.5, 0.5]
 *   hamming         a = [0.54, 0.46]
 *   flattop         a = [0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368]
 *                   (the 5-term coefficients of SciPy's 'flattop')
 *   blackman-harris a = [0.35875, 0.48829, 0.14128, 0.01168]
 *                   (4-term, −92 dB; SciPy's 'blackmanharris', Harris 1978)
 * kaiser: `w[n] = I0(β·sqrt(1 − ((n − N/2)/(N/2))²)) / I0(β)` (J. F. Kaiser, 1974), I0 by its
 * power series. rectangular: all ones.
 */
import type { WindowName } from './types';
import { EngineInputError, requireFinite } from './errors';
import { realFft } from './fft';

export interface WindowParams {
  kaiserBeta?: number;
}

/** Cosine-sum coefficients of the windows that have them. */
export const COSINE_SUM_COEFFICIENTS: Readonly<Partial<Record<WindowName, readonly number[]>>> = {
  hann: [0.5, 0.5],
  hamming: [0.54, 0.46],
  flattop: [0.21557895, 0.41663158, 0.277263158, 0.083578947, 0.006947368],
  'blackman-harris': [0.35875, 0.48829, 0.14128, 0.01168],
};

export const WINDOW_NAMES: readonly WindowName[] = [
  'rectangular',
  'hann',
  'hamming',
  'flattop',
  'blackman-harris',
  'kaiser',
];

/** Largest Kaiser β accepted (I0(100) ≈ 1e42; far beyond any practical side-lobe level). */
export const MAX_KAISER_BETA = 100;

/** The DFT-even window `name` of length `n` (n ≥ 1). */
export function windowSamples(name: WindowName, n: number, params?: WindowParams): Float64Array {
  if (!Number.isInteger(n) || n < 1) throw new EngineInputError('n', n, 'must be an integer ≥ 1');
  if (!WINDOW_NAMES.includes(name)) {
    throw new EngineInputError('window', name, `must be one of ${WINDOW_NAMES.join(', ')}`);
  }
  const beta = name === 'kaiser' ? kaiserBeta(params) : 0;
  const w = new Float64Array(n);
  if (n === 1 || name === 'rectangular') return w.fill(1);
  if (name === 'kaiser') {
    const half = n / 2; // (M − 1)/2 with M = n + 1
    const i0Beta = besselI0(beta);
    for (let i = 0; i < n; i++) {
      const r = (i - half) / half;
      w[i] = besselI0(beta * Math.sqrt(1 - r * r)) / i0Beta;
    }
    return w;
  }
  const a = COSINE_SUM_COEFFICIENTS[name] as readonly number[];
  const step = (2 * Math.PI) / n;
  for (let i = 0; i < n; i++) {
    const phi = i * step - Math.PI;
    let s = 0;
    for (let k = 0; k < a.length; k++) s += a[k] * Math.cos(k * phi);
    w[i] = s;
  }
  return w;
}

function kaiserBeta(params?: WindowParams): number {
  const beta = params?.kaiserBeta;
  if (beta === undefined) {
    throw new EngineInputError('windowParams.kaiserBeta', beta, 'is required for the kaiser window');
  }
  requireFinite('windowParams.kaiserBeta', beta);
  if (beta < 0 || beta > MAX_KAISER_BETA) {
    throw new EngineInputError('windowParams.kaiserBeta', beta, `must be in [0, ${MAX_KAISER_BETA}]`);
  }
  return beta;
}

/**
 * Modified Bessel function of the first kind, order 0: `I0(x) = Σ_k ((x/2)^k / k!)²`
 * (M. Abramowitz & I. A. Stegun, Handbook of Mathematical Functions, 9.6.12). All terms are
 * positive, so summing until a term is below 1e-17 of the sum is accurate to rounding.
 */
export function besselI0(x: number): number {
  const q = (x * x) / 4;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 1000; k++) {
    term *= q / (k * k);
    sum += term;
    if (term < 1e-17 * sum) break;
  }
  return sum;
}

/** Figures of merit of a window, after Harris (1978), computed on the DFT-even samples. */
export interface WindowFigures {
  /** Σw / N (fraction). */
  coherentGain: number;
  /** Equivalent noise bandwidth in bins, N·Σw² / (Σw)². */
  enbwBins: number;
  /** Loss of a tone half-way between bins, −20·log10(|W(½ bin)| / |W(0)|), dB (positive). */
  scallopingLossDb: number;
  /** Highest side lobe relative to the main-lobe peak, dB (negative), from a zero-padded FFT. */
  highestSidelobeDb: number;
  /** Correlation of the window with itself shifted by (1 − r)·N, r = 0.5 and 0.75 (fraction). */
  overlapCorrelation: { at50: number; at75: number };
}

/** Harris's window figures of `name` at length `n` (n ≥ 8). */
export function windowFigures(name: WindowName, n: number, params?: WindowParams): WindowFigures {
  if (!Number.isInteger(n) || n < 8) throw new EngineInputError('n', n, 'must be an integer ≥ 8');
  const w = windowSamples(name, n, params);
  let sum = 0;
  let sumSq = 0;
  let halfRe = 0;
  let halfIm = 0;
  for (let i = 0; i < n; i++) {
    sum += w[i];
    sumSq += w[i] * w[i];
    const phase = (-Math.PI * i) / n; // half a bin: exp(−2πi·(1/2)·i/N)
    halfRe += w[i] * Math.cos(phase);
    halfIm += w[i] * Math.sin(phase);
  }
  return {
    coherentGain: sum / n,
    enbwBins: (n * sumSq) / (sum * sum),
    scallopingLossDb: -20 * Math.log10(Math.hypot(halfRe, halfIm) / Math.abs(sum)),
    highestSidelobeDb: highestSidelobeDb(w),
    overlapCorrelation: {
      at50: overlapCorrelation(w, n - Math.round(0.5 * n)),
      at75: overlapCorrelation(w, n - Math.round(0.75 * n)),
    },
  };
}

/**
 * Normalised correlation of window `w` with itself shifted by `shift` samples,
 * `c = Σ_n w[n]·w[n + shift] / Σ_n w[n]²` (Harris 1978; P. D. Welch 1967). 0 for shift ≥ N.
 */
export function overlapCorrelation(w: Float64Array, shift: number): number {
  const n = w.length;
  if (shift >= n) return 0;
  let num = 0;
  let den = 0;
  for (let i = 0; i < n; i++) {
    den += w[i] * w[i];
    if (i + shift < n) num += w[i] * w[i + shift];
  }
  return num / den;
}

/**
 * Highest side lobe in dB below the main-lobe peak, measured on the window's transform zero-padded
 * to at least 64 times its length. The main lobe ends at the first local minimum of |W| after |W|
 * has fallen below half power (so the ripple of a flat-top window's top is not taken for an edge).
 */
function highestSidelobeDb(w: Float64Array): number {
  const n = w.length;
  let padded = 1;
  while (padded < 64 * n) padded *= 2;
  const x = new Float64Array(padded);
  x.set(w);
  const spec = realFft(x);
  const mag = new Float64Array(spec.re.length);
  for (let k = 0; k < mag.length; k++) mag[k] = Math.hypot(spec.re[k], spec.im[k]);
  const peak = mag[0];
  let k = 1;
  while (k < mag.length && mag[k] > peak / Math.SQRT2) k++;
  while (k + 1 < mag.length && mag[k + 1] <= mag[k]) k++;
  let side = 0;
  for (let j = k; j < mag.length; j++) if (mag[j] > side) side = mag[j];
  return 20 * Math.log10(side / peak);
}
