/**
 * Monte Carlo standard errors against analytic results and against the scatter they predict.
 * Sources: binomial standard deviation sqrt(p(1−p)/n); standard error of a mean s/sqrt(n); for
 * normal data var(s²) = 2σ⁴/(n − 1) (the chi-square distribution of (n−1)s²/σ²), so
 * u(s) ≈ σ/sqrt(2(n − 1)); distribution-free percentile intervals from binomial ranks
 * (W. J. Conover, Practical Nonparametric Statistics, 3rd ed., 1999, §3.2; the ranks for the
 * median of n = 20, 95 %, are 6 and 15 as in Conover's Table A3 — quoted from memory).
 */
import { createRandom } from '@/shared/engine/random';
import {
  meanStandardError,
  percentileRanks,
  percentileStandardError,
  proportionStandardError,
  stdStandardError,
} from '@/shared/engine/scores/monte-carlo-error';
import { aggregateRuns, type SeedLineScores } from '@/shared/engine/scores/monte-carlo';
import { finiteSorted, meanStd, percentileOfSorted } from '@/shared/engine/scores/statistics';

describe('Monte Carlo standard errors', () => {
  it('proportion and mean: sqrt(0.95·0.05/100) = 0.02179, 2/sqrt(16) = 0.5', () => {
    expect(proportionStandardError(0.95, 100)).toBeCloseTo(0.0217945, 6);
    expect(meanStandardError(2, 16)).toBe(0.5);
    expect(Number.isNaN(meanStandardError(2, 1))).toBe(true);
  });

  it('median of 20 values: ranks 6 and 15 with confidence 95.86 %', () => {
    const r = percentileRanks(20, 0.5)!;
    expect([r.lower, r.upper]).toEqual([6, 15]);
    // P(6 ≤ B ≤ 14), B ~ Bin(20, ½) = 1 − 2·P(B ≤ 5) = 1 − 2·0.020695 = 0.958611.
    expect(r.confidence).toBeCloseTo(0.958611, 5);
    expect(percentileRanks(5, 0.95)).toBeNull();
  });

  it('the predicted standard errors match the scatter of the figures over repeated experiments', () => {
    // 300 experiments of n = 200 normal values: the sd of the 300 means, stds and 95th percentiles
    // is compared with the mean predicted standard error (within 20 %: the scatter of an sd from
    // 300 values is about 4 %, the order-statistic interval is a coarser estimate). Fewer than
    // about 75 values cannot bound a 95th percentile distribution-free at 95 %.
    const rnd = createRandom(7, 'mc-error-test');
    const n = 200;
    const means: number[] = [];
    const stds: number[] = [];
    const p95s: number[] = [];
    const seMean: number[] = [];
    const seStd: number[] = [];
    const seP95: number[] = [];
    const ranks = percentileRanks(n, 0.95);
    for (let e = 0; e < 300; e++) {
      const x = new Float64Array(n).map(() => rnd.gaussian());
      const m = meanStd(x);
      const sorted = finiteSorted(x);
      means.push(m.mean);
      stds.push(m.std);
      p95s.push(percentileOfSorted(sorted, 95));
      seMean.push(meanStandardError(m.std, n));
      seStd.push(stdStandardError(x));
      seP95.push(percentileStandardError(sorted, ranks));
    }
    const avg = (a: number[]) => meanStd(a).mean;
    expect(meanStd(means).std / avg(seMean)).toBeGreaterThan(0.85);
    expect(meanStd(means).std / avg(seMean)).toBeLessThan(1.15);
    expect(meanStd(stds).std / avg(seStd)).toBeGreaterThan(0.8);
    expect(meanStd(stds).std / avg(seStd)).toBeLessThan(1.2);
    // Normal theory: u(s) ≈ 1/sqrt(2·199) = 0.0501.
    expect(avg(seStd) / (1 / Math.sqrt(2 * (n - 1)))).toBeCloseTo(1, 1);
    expect(meanStd(p95s).std / avg(seP95)).toBeGreaterThan(0.6);
    expect(meanStd(p95s).std / avg(seP95)).toBeLessThan(1.4);
  });

  it('aggregateRuns gives each line figure its standard error (coverage 3 of 4: sqrt(3/16/4))', () => {
    const seeds: SeedLineScores[] = [0, 1, 2, 3].map((s) => ({
      magnitudeErrorDb: Float64Array.of(s + 1),
      phaseErrorDeg: Float64Array.of(-s),
      complexRelativeError: Float64Array.of(0.01 * (s + 1)),
      coherence: Float64Array.of(0.9),
      predictedMagnitudeError: Float64Array.of(0.1),
      insideMagnitudeBand: Uint8Array.of(s === 2 ? 0 : 1),
    }));
    const a = aggregateRuns(Float64Array.of(10), seeds);
    expect(a.coverageSe[0]).toBeCloseTo(Math.sqrt((0.75 * 0.25) / 4), 14);
    expect(a.meanMagnitudeDbSe[0]).toBeCloseTo(Math.sqrt(5 / 3) / 2, 14);
    // Four values cannot bound a 95th percentile distribution-free.
    expect(Number.isNaN(a.p95AbsMagnitudeDbSe[0])).toBe(true);
    // Per-seed clusters: fractions 1, 1, 0, 1 → sd 0.5, SE 0.25.
    expect(a.band.overallCoverageSe).toBeCloseTo(0.25, 14);
    expect(a.exactRegionCoverage).toBeNull();
  });
});
