/**
 * H1's exact confidence region (N. R. Goodman, AFFDL-TR-65-56, 1965; J. S. Bendat & A. G. Piersol,
 * Random Data, 4th ed., 2010, ch. 9): its radius from the F quantile, and its coverage over seeds on
 * a noise-on-output scenario with negligible bias (heavily damped SDOF, fine resolution, no overlap,
 * so blocks are independent as the theory asks): within 3 Monte Carlo standard errors of 95 %.
 */
import { h1ExactRegionRadius } from '@/shared/engine/exact-frf-region';
import { runStudy } from '@/shared/engine/study';
import { hannRecipe, sdofRandomScenario } from './study-helpers';

describe('exact region of H1', () => {
  it('radius² = (2/(n−2))·F(2, n−2; 0.95)·(1−γ²)/γ²·|Ĥ|², n = 2·n_d; F(2, 20; 0.95) = 3.49 (F table)', () => {
    // n_d = 11 → n − 2 = 20; γ² = 0.5, |Ĥ| = 2: radius² = (2/20)·3.4928·1·4.
    const r = h1ExactRegionRadius({ re: Float64Array.of(2), im: Float64Array.of(0) }, Float64Array.of(0.5), 11);
    expect(r[0] ** 2).toBeCloseTo(0.1 * 3.4928 * 4, 3);
    const none = h1ExactRegionRadius({ re: Float64Array.of(2), im: Float64Array.of(0) }, Float64Array.of(0.5), 1);
    expect(none[0]).toBe(Infinity);
    expect(() => h1ExactRegionRadius({ re: Float64Array.of(1), im: Float64Array.of(0) }, Float64Array.of(1), 4, 1.5)).toThrow(/alpha/);
  });

  it('covers the exact H in 95 % of (line, seed) pairs within 3 Monte Carlo standard errors', () => {
    const study = runStudy({
      recipe: hannRecipe({ overlap: 0, blockLength: 512, tolerances: { coveragePercent: 50 } }),
      scenarios: [sdofRandomScenario({ zeta: 0.05, snrDb: 6, durationS: 64 })],
      seeds: 40,
    });
    const a = study.results[0].judged.aggregate;
    const p = a.band.overallExactRegionCoverage!;
    const se = a.band.overallExactRegionCoverageSe!;
    expect(se).toBeGreaterThan(0);
    expect(Math.abs(p - 0.95)).toBeLessThanOrEqual(3 * se);
    // The first-order magnitude band is reported beside it with its own standard error.
    expect(a.band.overallCoverageSe).toBeGreaterThan(0);
  });
});
