/**
 * Monte Carlo aggregation against hand-computed small arrays. Percentiles follow Hyndman & Fan
 * (1996) definition 7, the default of numpy.percentile; the figures below were worked by hand and
 * agree with numpy 2.4.6 (np.percentile, np.std(ddof=1)).
 */
import { EngineInputError } from '@/shared/engine/errors';
import { aggregateModes } from '@/shared/engine/scores/mode-aggregate';
import type { ModeError } from '@/shared/engine/scores/modes';
import { aggregateRuns, type SeedLineScores } from '@/shared/engine/scores/monte-carlo';
import { meanStd, percentiles } from '@/shared/engine/scores/statistics';

const dB = (r: number) => 20 * Math.log10(r);

/** Two lines, four seeds. Line 0: magnitude error 1, 2, 3, 4 dB. Line 1: ratios 0.9, 1.0, 1.1, 1.2. */
function seeds(): SeedLineScores[] {
  const ratios = [0.9, 1.0, 1.1, 1.2];
  const coh = [0.5, 0.9, 0.8, 0.95];
  const eps = [0.1, 0.1, 0.2, 0.2];
  const inside0 = [1, 1, 0, 1];
  return [0, 1, 2, 3].map((s) => ({
    magnitudeErrorDb: Float64Array.of(s + 1, dB(ratios[s])),
    phaseErrorDeg: Float64Array.of(-s, 10 * s),
    complexRelativeError: Float64Array.of(0.01 * (s + 1), 0.1),
    coherence: Float64Array.of(coh[s], 1),
    predictedMagnitudeError: Float64Array.of(eps[s], 0.1),
    insideMagnitudeBand: Uint8Array.of(inside0[s], 1),
    insidePhaseBand: Uint8Array.of(1, s === 0 ? 0 : 1),
  }));
}

describe('statistics', () => {
  it('mean, sample std and percentiles of 1, 2, 3, 4: 2.5, sqrt(5/3), P5 1.15, P50 2.5, P95 3.85', () => {
    const m = meanStd([1, 2, 3, 4]);
    expect(m.mean).toBe(2.5);
    expect(m.std).toBeCloseTo(Math.sqrt(5 / 3), 14);
    const [p5, p50, p95] = percentiles([4, 1, 3, 2], [5, 50, 95]);
    expect(p5).toBeCloseTo(1.15, 14);
    expect(p50).toBeCloseTo(2.5, 14);
    expect(p95).toBeCloseTo(3.85, 14);
  });

  it('is numerically careful: 1e9 + {4, 7, 13, 16} has sample variance exactly 30', () => {
    // The textbook example where the one-pass sum-of-squares formula loses every digit
    // (Chan, Golub & LeVeque 1983; the shifted data are 4, 7, 13, 16 with mean 10).
    const m = meanStd([1e9 + 4, 1e9 + 7, 1e9 + 13, 1e9 + 16]);
    expect(m.std * m.std).toBeCloseTo(30, 6);
  });

  it('skips non-finite values; a single value has no sample deviation', () => {
    expect(meanStd([NaN, 2, Infinity, 4]).mean).toBe(3);
    expect(Number.isNaN(meanStd([5]).std)).toBe(true);
    expect(Number.isNaN(percentiles([NaN], [50])[0])).toBe(true);
  });
});

describe('aggregateRuns', () => {
  const agg = aggregateRuns(Float64Array.of(10, 20), seeds());

  it('bias, scatter and percentiles of the magnitude error per line', () => {
    expect(agg.seeds).toBe(4);
    expect(agg.lines).toBe(2);
    expect(agg.meanMagnitudeDb[0]).toBeCloseTo(2.5, 14);
    expect(agg.stdMagnitudeDb[0]).toBeCloseTo(1.2909944487358056, 14);
    expect(agg.p5MagnitudeDb[0]).toBeCloseTo(1.15, 14);
    expect(agg.p50MagnitudeDb[0]).toBeCloseTo(2.5, 14);
    expect(agg.p95MagnitudeDb[0]).toBeCloseTo(3.85, 14);
    expect(agg.p95AbsMagnitudeDb[0]).toBeCloseTo(3.85, 14);
    // Line 1: 20·log10 of 0.9, 1.0, 1.1, 1.2 (numpy: P5 −0.77787734, P50 0.41392685, P95 1.47025924,
    // P95 of |error| 1.48335365).
    expect(agg.p5MagnitudeDb[1]).toBeCloseTo(-0.77787734, 7);
    expect(agg.p50MagnitudeDb[1]).toBeCloseTo(0.41392685, 7);
    expect(agg.p95MagnitudeDb[1]).toBeCloseTo(1.47025924, 7);
    expect(agg.p95AbsMagnitudeDb[1]).toBeCloseTo(1.48335365, 7);
  });

  it('observed random error is the sample std of |Ĥ|/|H|; predicted is the RMS of ε over seeds', () => {
    // std of 0.9, 1.0, 1.1, 1.2 = sqrt(0.05/3) = 0.129099...
    expect(agg.observedRandomError[1]).toBeCloseTo(Math.sqrt(0.05 / 3), 12);
    expect(agg.predictedRandomError[1]).toBeCloseTo(0.1, 14);
    expect(agg.randomErrorRatio[1]).toBeCloseTo(Math.sqrt(0.05 / 3) / 0.1, 12);
    // Line 0: ε = 0.1, 0.1, 0.2, 0.2 → RMS sqrt(0.025).
    expect(agg.predictedRandomError[0]).toBeCloseTo(Math.sqrt(0.025), 14);
  });

  it('phase, complex relative error and coherence figures', () => {
    expect(agg.meanPhaseDeg[0]).toBeCloseTo(-1.5, 14);
    expect(agg.stdPhaseDeg[1]).toBeCloseTo(10 * Math.sqrt(5 / 3), 12);
    expect(agg.p95AbsPhaseDeg[0]).toBeCloseTo(2.85, 14);
    expect(agg.meanComplexRelative[0]).toBeCloseTo(0.025, 14);
    expect(agg.p95ComplexRelative[0]).toBeCloseTo(0.0385, 14);
    expect(agg.meanCoherence[0]).toBeCloseTo(0.7875, 14);
    expect(agg.p5Coherence[0]).toBeCloseTo(0.545, 14);
  });

  it('coverage per line and over all (line, seed) pairs', () => {
    expect(Array.from(agg.coverage)).toEqual([0.75, 1]);
    expect(agg.overallCoverage).toBe(7 / 8);
    expect(Array.from(agg.phaseCoverage!)).toEqual([1, 0.75]);
    expect(agg.overallPhaseCoverage).toBe(7 / 8);
  });

  it('is independent of the order of the seeds', () => {
    const rev = aggregateRuns(Float64Array.of(10, 20), seeds().reverse());
    expect(rev.p95MagnitudeDb[1]).toBe(agg.p95MagnitudeDb[1]);
    expect(rev.overallCoverage).toBe(agg.overallCoverage);
  });

  it('rejects an empty seed list and mismatched lengths, naming the field', () => {
    expect(() => aggregateRuns(Float64Array.of(1), [])).toThrow(EngineInputError);
    const bad = seeds();
    bad[2] = { ...bad[2], coherence: Float64Array.of(1) };
    expect(() => aggregateRuns(Float64Array.of(10, 20), bad)).toThrow(/seeds\[2\]\.coherence/);
  });

  it('without phase bands on every seed, phase coverage is null', () => {
    const s = seeds().map(({ insidePhaseBand: _omit, ...rest }) => rest);
    const a = aggregateRuns(Float64Array.of(10, 20), s);
    expect(a.phaseCoverage).toBeNull();
    expect(a.overallPhaseCoverage).toBeNull();
  });
});

describe('aggregateModes', () => {
  function err(status: ModeError['status'], freq: number | null, damp: number | null): ModeError {
    return {
      modeIndex: 0,
      naturalFrequencyHz: 40,
      dampingRatio: 0.01,
      status,
      reason: status === 'resolved' ? undefined : 'too coarse',
      linesAboveHalfPower: 5,
      estimatedPeakHz: null,
      estimatedPeakMagnitude: null,
      lowerHalfPowerHz: null,
      upperHalfPowerHz: null,
      estimatedDampingRatio: null,
      exactPeakMagnitude: null,
      resonanceFrequencyErrorPercent: freq,
      dampingErrorPercent: damp,
      peakValueErrorDb: freq === null ? null : 0,
    };
  }

  it('counts resolved seeds and spreads the errors of the resolved ones', () => {
    const per = [[err('resolved', 1, -2)], [err('resolved', -3, 4)], [err('not-resolvable', null, null)]];
    const [m] = aggregateModes(per);
    expect(m.resolvedSeeds).toBe(2);
    expect(m.notResolvableSeeds).toBe(1);
    expect(m.reason).toBe('too coarse');
    expect(m.resonanceFrequencyErrorPercent.mean).toBe(-1);
    // |errors| 1 and 3: P95 = 1 + 0.95·2 = 2.9
    expect(m.resonanceFrequencyErrorPercent.p95Abs).toBeCloseTo(2.9, 14);
    expect(m.dampingErrorPercent.std).toBeCloseTo(Math.sqrt(18), 14);
  });

  it('rejects rows with different mode counts', () => {
    expect(() => aggregateModes([[err('resolved', 1, 1)], []])).toThrow(EngineInputError);
    expect(aggregateModes([])).toEqual([]);
  });
});
