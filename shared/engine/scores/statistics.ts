/**
 * Small, numerically careful sample statistics used by the Monte Carlo aggregation.
 * - mean and standard deviation by the corrected two-pass algorithm (T. F. Chan, G. H. Golub,
 *   R. J. LeVeque, "Algorithms for computing the sample variance", Am. Stat. 37(3), 1983, eq. 1.7):
 *   s² = [Σ(x − x̄)² − (Σ(x − x̄))²/n] / (n − 1);
 * - percentiles by linear interpolation between order statistics, definition 7 of R. J. Hyndman &
 *   Y. Fan, "Sample quantiles in statistical packages", Am. Stat. 50(4), 1996 (also the default of
 *   numpy.percentile): h = (n − 1)·p, Q = x₍⌊h⌋₎ + (h − ⌊h⌋)(x₍⌊h⌋+1₎ − x₍⌊h⌋₎).
 * Non-finite values are skipped; with no finite value the results are NaN.
 */

export interface MeanStd {
  mean: number;
  /** Sample standard deviation (n − 1 in the denominator); NaN for fewer than two values. */
  std: number;
  count: number;
}

/** Mean and sample standard deviation of the finite values, corrected two-pass. */
export function meanStd(values: ArrayLike<number>): MeanStd {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (Number.isFinite(v)) {
      sum += v;
      count++;
    }
  }
  if (count === 0) return { mean: NaN, std: NaN, count: 0 };
  const mean = sum / count;
  let ss = 0;
  let comp = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    const d = v - mean;
    ss += d * d;
    comp += d;
  }
  const std = count > 1 ? Math.sqrt(Math.max(0, (ss - (comp * comp) / count) / (count - 1))) : NaN;
  return { mean, std, count };
}

/** Percentiles (p in [0, 100]) of the finite values, Hyndman & Fan definition 7. */
export function percentiles(values: ArrayLike<number>, ps: readonly number[]): number[] {
  const sorted = finiteSorted(values);
  return ps.map((p) => percentileOfSorted(sorted, p));
}

/** The finite values in ascending order, as a new Float64Array. */
export function finiteSorted(values: ArrayLike<number>): Float64Array {
  let count = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) count++;
  const out = new Float64Array(count);
  let j = 0;
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i])) out[j++] = values[i];
  return out.sort();
}

/** Percentile p (0..100) of ascending sorted finite values, Hyndman & Fan definition 7. */
export function percentileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * (p / 100);
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}
