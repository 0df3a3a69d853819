/**
 * Monte Carlo standard errors: how far a figure computed over n seeds may sit from the value an
 * unlimited number of seeds would give. Each is a standard uncertainty (k = 1) of the figure.
 *
 * - proportion p over n seeds (coverage): sqrt(p(1 − p)/n), the binomial standard deviation of
 *   a proportion;
 * - mean of n values with sample deviation s: s/sqrt(n);
 * - sample standard deviation s: from the exact variance of the unbiased sample variance,
 *   var(s²) = (m4 − s⁴·(n − 3)/(n − 1))/n with m4 the fourth central moment (a standard result,
 *   e.g. A. M. Mood, F. A. Graybill & D. C. Boes, Introduction to the Theory of Statistics, 3rd
 *   ed., 1974, ch. VI; quoted from memory), carried to s by the delta method: u(s) = sqrt(var(s²))/(2s).
 *   No normal assumption: for normal data it reduces to s/sqrt(2(n − 1)).
 * - percentile p: distribution-free, from order statistics. The ranks l < u for which
 *   P(l ≤ B < u) ≥ 95 %, B ~ Binomial(n, p), bound a 95 % confidence interval [x₍l₎, x₍u₎] of the
 *   p-quantile whatever the distribution (W. J. Conover, Practical Nonparametric Statistics, 3rd
 *   ed., Wiley 1999, §3.2; also JCGM 101:2008 §7.7 for coverage intervals from ordered values);
 *   the standard error is its width ÷ (2 × 1.95996). Where the interval would run past the sample
 *   (too few seeds for the percentile), the result is NaN: the figure has no usable uncertainty.
 * Non-finite inputs give NaN, shown as "not available".
 */
import { NORMAL_95 } from '../random-errors';

/** sqrt(p(1 − p)/n) for a proportion p in [0, 1] over n trials. */
export function proportionStandardError(p: number, n: number): number {
  if (!(n > 0) || !Number.isFinite(p)) return NaN;
  return Math.sqrt(Math.max(0, p * (1 - p)) / n);
}

/** s/sqrt(n): standard error of a mean of n values whose sample deviation is s. */
export function meanStandardError(s: number, n: number): number {
  if (!(n > 1) || !Number.isFinite(s)) return NaN;
  return s / Math.sqrt(n);
}

/**
 * Standard error of the sample standard deviation of `values` (finite ones), distribution-free by
 * the fourth-moment formula of the module doc. NaN for fewer than four finite values or s = 0.
 */
export function stdStandardError(values: ArrayLike<number>): number {
  let n = 0;
  let sum = 0;
  for (let i = 0; i < values.length; i++) {
    if (Number.isFinite(values[i])) {
      n++;
      sum += values[i];
    }
  }
  if (n < 4) return NaN;
  const mean = sum / n;
  let m2 = 0;
  let m4 = 0;
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i])) continue;
    const d2 = (values[i] - mean) ** 2;
    m2 += d2;
    m4 += d2 * d2;
  }
  const s2 = m2 / (n - 1);
  m4 /= n;
  if (!(s2 > 0)) return NaN;
  const varS2 = Math.max(0, (m4 - (s2 * s2 * (n - 3)) / (n - 1)) / n);
  return Math.sqrt(varS2) / (2 * Math.sqrt(s2));
}

/** Binomial(n, p) cumulative probabilities P(B ≤ k), k = 0 … n (log-space pmf, so large n is safe). */
function binomialCdf(n: number, p: number): Float64Array {
  const cdf = new Float64Array(n + 1);
  if (p <= 0) return cdf.fill(1);
  if (p >= 1) {
    cdf[n] = 1;
    return cdf;
  }
  const lp = Math.log(p);
  const lq = Math.log1p(-p);
  let logC = 0; // log C(n, k)
  let acc = 0;
  for (let k = 0; k <= n; k++) {
    if (k > 0) logC += Math.log((n - k + 1) / k);
    acc += Math.exp(logC + k * lp + (n - k) * lq);
    cdf[k] = Math.min(1, acc);
  }
  return cdf;
}

/** 1-based ranks (l, u) of the distribution-free 95 % interval of the p-quantile, or null. */
export interface OrderStatisticRanks {
  lower: number;
  upper: number;
  /** P(l ≤ B < u) actually achieved (≥ 0.95). */
  confidence: number;
}

/**
 * The ranks of the module doc for the p-quantile (p in (0, 1)) of n values: l the largest with
 * P(B ≤ l − 1) ≤ 2.5 %, u the smallest with P(B ≤ u − 1) ≥ 97.5 %. Null when l < 1 or u > n.
 */
export function percentileRanks(n: number, p: number): OrderStatisticRanks | null {
  if (!Number.isInteger(n) || n < 2 || !(p > 0 && p < 1)) return null;
  const cdf = binomialCdf(n, p);
  let lower = 0;
  for (let l = 1; l <= n; l++) if (cdf[l - 1] <= 0.025) lower = l;
  let upper = n + 1;
  for (let u = n; u >= 1; u--) if (cdf[u - 1] >= 0.975) upper = u;
  if (lower < 1 || upper > n || upper <= lower) return null;
  return { lower, upper, confidence: cdf[upper - 1] - cdf[lower - 1] };
}

/** Standard error of a percentile from ascending sorted values and precomputed ranks (module doc). */
export function percentileStandardError(sorted: ArrayLike<number>, ranks: OrderStatisticRanks | null): number {
  if (!ranks || ranks.upper > sorted.length) return NaN;
  return (sorted[ranks.upper - 1] - sorted[ranks.lower - 1]) / (2 * NORMAL_95);
}
