/**
 * Per-block detrending before windowing, as in Welch's method (P. D. Welch 1967; SciPy's
 * `detrend='constant' | 'linear'`):
 *   none   — the block as it is;
 *   mean   — subtract the block mean;
 *   linear — subtract the least-squares straight line a + b·t, t = n − (N − 1)/2 (centred, so
 *            a is the mean and b = Σ t·x / Σ t²).
 */
import type { Detrend } from './types';
import { EngineInputError } from './errors';

export const DETREND_KINDS: readonly Detrend[] = ['none', 'mean', 'linear'];

/**
 * Fits the trend of `src[offset .. offset+n)` and writes it to `coef`: coef[0] = level at the
 * block centre, coef[1] = slope per sample. The trend at sample i of the block is
 * `coef[0] + coef[1]·(i − (n − 1)/2)`. Allocates nothing.
 */
export function fitTrend(kind: Detrend, src: Float64Array, offset: number, n: number, coef: Float64Array): void {
  coef[0] = 0;
  coef[1] = 0;
  if (kind === 'none') return;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += src[offset + i];
  const mean = sum / n;
  coef[0] = mean;
  if (kind === 'mean' || n < 2) return;
  const centre = (n - 1) / 2;
  let stx = 0;
  for (let i = 0; i < n; i++) stx += (i - centre) * src[offset + i];
  // Σ t² for t = i − (n−1)/2, i = 0..n−1, is n(n² − 1)/12.
  coef[1] = stx / ((n * (n * n - 1)) / 12);
}

/** A detrended copy of the whole of `x` (one block). */
export function detrend(x: Float64Array, kind: Detrend): Float64Array {
  if (!DETREND_KINDS.includes(kind)) {
    throw new EngineInputError('detrend', kind, `must be one of ${DETREND_KINDS.join(', ')}`);
  }
  const coef = new Float64Array(2);
  fitTrend(kind, x, 0, x.length, coef);
  const centre = (x.length - 1) / 2;
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = x[i] - coef[0] - coef[1] * (i - centre);
  return out;
}
