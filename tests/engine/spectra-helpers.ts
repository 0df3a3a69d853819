/**
 * Helpers for the spectral-estimation tests: SciPy fixtures, seeded Gaussian noise and
 * comparison with an explicit relative tolerance.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import seedrandom from 'seedrandom';
import { welchCrossSpectra } from '@/shared/engine/welch';
import type { Detrend, SpectrumScaling, WindowName } from '@/shared/engine/types';

const FIXTURES = join(__dirname, '..', 'fixtures', 'scipy');

export function loadScipyFixture<T = Record<string, unknown>>(name: string): T {
  return JSON.parse(readFileSync(join(FIXTURES, name), 'utf8')) as T;
}

/** The SciPy fixtures' signals, with the trended variant built as (v + offset) + slope·n. */
export function scipySignals(): { x: Float64Array; y: Float64Array; xTrended: Float64Array; yTrended: Float64Array; sampleRateHz: number } {
  const s = loadScipyFixture<{
    x: string[];
    y: string[];
    sampleRateHz: number;
    trend: Record<'x' | 'y', { offset: number; slope: number }>;
  }>('signals.json');
  const x = Float64Array.from(s.x, Number);
  const y = Float64Array.from(s.y, Number);
  const trended = (v: Float64Array, t: { offset: number; slope: number }) =>
    v.map((value, n) => value + t.offset + t.slope * n);
  return { x, y, xTrended: trended(x, s.trend.x), yTrended: trended(y, s.trend.y), sampleRateHz: s.sampleRateHz };
}

/**
 * Largest relative difference |a − e| / max(|e|, floor), floor = floorFraction · max|e|. The floor
 * only matters for lines that are zero up to rounding (e.g. the DC line after detrending).
 */
export function maxRelativeDifference(actual: ArrayLike<number>, expected: ArrayLike<number>, floorFraction = 1e-12): number {
  if (actual.length !== expected.length) throw new Error(`length ${actual.length} != ${expected.length}`);
  let peak = 0;
  for (let i = 0; i < expected.length; i++) peak = Math.max(peak, Math.abs(expected[i]));
  const floor = floorFraction * peak;
  let worst = 0;
  for (let i = 0; i < expected.length; i++) {
    const d = Math.abs(actual[i] - expected[i]) / Math.max(Math.abs(expected[i]), floor);
    if (!(d <= worst)) worst = d; // NaN propagates as a failure
  }
  return worst;
}

/** Largest |a − e| / max(|e|, floor) for complex arrays given as (re, im) pairs. */
export function maxComplexRelativeDifference(
  aRe: ArrayLike<number>,
  aIm: ArrayLike<number>,
  eRe: ArrayLike<number>,
  eIm: ArrayLike<number>,
  floorFraction = 1e-12,
): number {
  let peak = 0;
  for (let i = 0; i < eRe.length; i++) peak = Math.max(peak, Math.hypot(eRe[i], eIm[i]));
  const floor = floorFraction * peak;
  let worst = 0;
  for (let i = 0; i < eRe.length; i++) {
    const d = Math.hypot(aRe[i] - eRe[i], aIm[i] - eIm[i]) / Math.max(Math.hypot(eRe[i], eIm[i]), floor);
    if (!(d <= worst)) worst = d;
  }
  return worst;
}

/** Seeded standard-normal generator (Alea PRNG from seedrandom, Marsaglia polar method). */
export function gaussianSource(seed: string): () => number {
  const uniform = seedrandom.alea(seed);
  let spare = 0;
  let hasSpare = false;
  return () => {
    if (hasSpare) {
      hasSpare = false;
      return spare;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * uniform() - 1;
      v = 2 * uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const f = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * f;
    hasSpare = true;
    return u * f;
  };
}

/** n samples of Gaussian noise with standard deviation sigma. */
export function gaussianNoise(seed: string, n: number, sigma = 1): Float64Array {
  const g = gaussianSource(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = sigma * g();
  return out;
}

/** Mean and unbiased variance of a list of numbers. */
export function meanAndVariance(values: ArrayLike<number>): { mean: number; variance: number } {
  let mean = 0;
  for (let i = 0; i < values.length; i++) mean += values[i];
  mean /= values.length;
  let ss = 0;
  for (let i = 0; i < values.length; i++) ss += (values[i] - mean) ** 2;
  return { mean, variance: ss / (values.length - 1) };
}

export interface ScipyCase {
  options: {
    window: WindowName;
    windowParams?: { kaiserBeta: number };
    blockLength: number;
    overlap: number;
    detrend: Detrend;
    scaling: SpectrumScaling;
    signals: 'plain' | 'trended';
  };
  blocks: number;
  frequenciesHz: number[];
  gxx: number[];
  gyy: number[];
  gyxRe: number[];
  gyxIm: number[];
  coherence: number[];
  h1Re: number[];
  h1Im: number[];
  h2Re: number[];
  h2Im: number[];
}
export interface ScipyFile {
  scipy: string;
  seed: number;
  cases: ScipyCase[];
}

export const SCIPY_FILES = ['welch-windows.json', 'welch-overlaps.json', 'welch-detrend.json', 'welch-spectrum-scaling.json'];

const label = (c: ScipyCase) =>
  `${c.options.window}${c.options.windowParams ? ` β=${c.options.windowParams.kaiserBeta}` : ''} N=${c.options.blockLength} ` +
  `overlap=${c.options.overlap} detrend=${c.options.detrend} ${c.options.scaling} (${c.options.signals})`;

export function scipyCases(): [string, ScipyCase][] {
  return SCIPY_FILES.flatMap((f) => loadScipyFixture<ScipyFile>(f).cases.map((c) => [`${f}: ${label(c)}`, c] as [string, ScipyCase]));
}

export function spectraForCase(c: ScipyCase) {
  const s = scipySignals();
  const [x, y] = c.options.signals === 'plain' ? [s.x, s.y] : [s.xTrended, s.yTrended];
  return welchCrossSpectra(x, y, { sampleRateHz: s.sampleRateHz, ...c.options });
}

