/**
 * Adaptive number of seeds after JCGM 101:2008 (GUM Supplement 1) §7.9: the numerical tolerance
 * δ = ½·10^ℓ of §7.9.2 (values worked by hand from that definition: 0.0028 = 28 × 10⁻⁴ with
 * n_dig = 2 → δ = 0.00005), the stopping test 2·s_y < δ over batch figures (§7.9.4), and the
 * reproducibility of a stopped study (it equals the fixed-seed study of the seeds it used).
 */
import { numericalTolerance } from '@/shared/engine/adaptive-stopping';
import { runAdaptiveStudy } from '@/shared/engine/adaptive-study';
import { runStudy } from '@/shared/engine/study';
import { hannRecipe, sdofRandomScenario, toBytes } from './study-helpers';

describe('adaptive seeds', () => {
  it('δ from significant digits: 0.0028 with 2 digits → 0.00005; 1 dB with 1 digit → 0.5 dB; 2.5 with 3 → 0.005', () => {
    expect(numericalTolerance(0.0028, 2)).toBeCloseTo(0.00005, 15);
    expect(numericalTolerance(1, 1)).toBeCloseTo(0.5, 15);
    expect(numericalTolerance(2.5, 3)).toBeCloseTo(0.005, 15);
    expect(Number.isNaN(numericalTolerance(0, 2))).toBe(true);
  });

  const recipe = hannRecipe({ band: { lowHz: 40, highHz: 60 }, tolerances: { magnitudeDb: 1, coveragePercent: 80 } });
  const scenario = sdofRandomScenario({ snrDb: 20, durationS: 32 });

  it('a loose tolerance stops as stable after the second batch; the result equals the fixed-seed study', () => {
    const [s] = runAdaptiveStudy({ recipe, scenarios: [scenario], seeds: 40, adaptive: { batchSize: 4, significantDigits: 1 } });
    expect(s.state.stop).toBe('stable');
    expect(s.state.seeds % 4).toBe(0);
    for (const c of s.state.criteria) expect(2 * c.batchMeanSd!).toBeLessThan(c.tolerance!);
    const fixed = runStudy({ recipe, scenarios: [scenario], seeds: s.state.seeds }).results[0];
    expect(toBytes(s.result)).toBe(toBytes(fixed));
  });

  it('a tolerance tighter than the scatter allows runs to the maximum and says so', () => {
    const [s] = runAdaptiveStudy({ recipe, scenarios: [scenario], seeds: 12, adaptive: { batchSize: 4, significantDigits: 4 } });
    expect(s.state.stop).toBe('max-seeds');
    expect(s.state.seeds).toBe(12);
    expect(s.state.criteria.some((c) => !c.stable)).toBe(true);
  });
});
