/**
 * Criteria branches: each tolerance judged on the figure the module documents, pass and fail,
 * with the deciding line named. Aggregates are built from hand-sized seed arrays.
 */
import { allPass, judgeCriteria } from '@/shared/engine/scores/criteria';
import type { ModeAggregate } from '@/shared/engine/scores/mode-aggregate';
import { aggregateRuns, type SeedLineScores } from '@/shared/engine/scores/monte-carlo';

const f = Float64Array.of(10, 20, 30);

/** Three lines, two seeds; line 20 Hz carries the largest errors and the lowest coherence. */
function aggregate(scale = 1) {
  const seed = (s: number): SeedLineScores => ({
    magnitudeErrorDb: Float64Array.of(0.1, (s === 0 ? 0.4 : 0.6) * scale, -0.2),
    phaseErrorDeg: Float64Array.of(1, -4 * scale, 2),
    complexRelativeError: Float64Array.of(0.01, 0.05 * scale, 0.02),
    coherence: Float64Array.of(0.99, s === 0 ? 0.9 : 0.95, 0.98),
    predictedMagnitudeError: Float64Array.of(0.01, 0.01, 0.01),
    insideMagnitudeBand: Uint8Array.of(1, s === 0 ? 0 : 1, 1),
  });
  return aggregateRuns(f, [seed(0), seed(1)]);
}

function mode(over: Partial<ModeAggregate> = {}): ModeAggregate {
  const spread = (p95Abs: number) => ({ mean: 0, std: 0, p95Abs });
  return {
    modeIndex: 0,
    naturalFrequencyHz: 20.5,
    dampingRatio: 0.01,
    seeds: 2,
    resolvedSeeds: 2,
    notResolvableSeeds: 0,
    outsideBand: false,
    reason: null,
    resonanceFrequencyErrorPercent: spread(0.3),
    dampingErrorPercent: spread(8),
    peakValueErrorDb: spread(0.5),
    ...over,
  };
}

const byId = (list: ReturnType<typeof judgeCriteria>, id: string) => {
  const c = list.find((x) => x.id === id);
  if (!c) throw new Error(`criterion ${id} missing`);
  return c;
};

describe('judgeCriteria', () => {
  it('judges only the tolerances given', () => {
    expect(judgeCriteria({}, aggregate())).toEqual([]);
    expect(judgeCriteria({ phaseDeg: 5 }, aggregate()).map((c) => c.id)).toEqual(['phase-p95']);
    expect(allPass([])).toBe(false);
  });

  it('magnitude: bias on the mean (0.5 dB at 20 Hz) and the 95th percentile of |error| (0.59 dB)', () => {
    const pass = judgeCriteria({ magnitudeDb: 0.6 }, aggregate());
    const bias = byId(pass, 'magnitude-bias');
    const p95 = byId(pass, 'magnitude-p95');
    expect(bias.observed).toBeCloseTo(0.5, 12);
    expect(p95.observed).toBeCloseTo(0.4 + 0.95 * 0.2, 12);
    expect(bias.worstLineHz).toBe(20);
    expect(p95.worstLineHz).toBe(20);
    expect(bias.unit).toBe('dB');
    expect(allPass(pass)).toBe(true);
    // 0.55 dB: the mean passes, the 95th percentile does not.
    const split = judgeCriteria({ magnitudeDb: 0.55 }, aggregate());
    expect(byId(split, 'magnitude-bias').pass).toBe(true);
    expect(byId(split, 'magnitude-p95').pass).toBe(false);
    expect(allPass(split)).toBe(false);
  });

  it('phase and complex relative error on the 95th percentile, pass and fail', () => {
    const ok = judgeCriteria({ phaseDeg: 4, complexRelative: 0.05 }, aggregate());
    expect(ok.every((c) => c.pass)).toBe(true);
    expect(byId(ok, 'phase-p95').observed).toBeCloseTo(4, 12);
    expect(byId(ok, 'phase-p95').worstLineHz).toBe(20);
    const bad = judgeCriteria({ phaseDeg: 4, complexRelative: 0.05 }, aggregate(1.1));
    expect(bad.every((c) => !c.pass)).toBe(true);
  });

  it('coverage is judged on all (line, seed) pairs, as a percentage at least the limit', () => {
    const c = byId(judgeCriteria({ coveragePercent: 80 }, aggregate()), 'coverage');
    expect(c.observed).toBeCloseTo((5 / 6) * 100, 12);
    expect(c.pass).toBe(true);
    expect(c.worstLineHz).toBe(20);
    expect(byId(judgeCriteria({ coveragePercent: 90 }, aggregate()), 'coverage').pass).toBe(false);
  });

  it('minimum coherence on the 5th percentile over seeds of the lowest line', () => {
    const c = byId(judgeCriteria({ minCoherence: 0.9 }, aggregate()), 'min-coherence');
    expect(c.observed).toBeCloseTo(0.9 + 0.05 * 0.05, 12);
    expect(c.pass).toBe(true);
    expect(c.worstLineHz).toBe(20);
    expect(byId(judgeCriteria({ minCoherence: 0.95 }, aggregate()), 'min-coherence').pass).toBe(false);
  });

  it('resonance frequency and damping: the worst mode decides, named by its natural frequency', () => {
    const modes = [mode(), mode({ modeIndex: 1, naturalFrequencyHz: 29, dampingErrorPercent: { mean: 0, std: 0, p95Abs: 12 } })];
    const list = judgeCriteria({ resonanceFrequencyPercent: 0.5, dampingPercent: 10 }, aggregate(), modes);
    expect(byId(list, 'resonance-frequency').pass).toBe(true);
    const d = byId(list, 'damping');
    expect(d.pass).toBe(false);
    expect(d.observed).toBe(12);
    expect(d.worstLineHz).toBe(29);
  });

  it('a mode some seed could not resolve fails, with the reason and no number', () => {
    const modes = [mode({ resolvedSeeds: 1, notResolvableSeeds: 1, reason: 'resolution too coarse' })];
    const d = byId(judgeCriteria({ dampingPercent: 50 }, aggregate(), modes), 'damping');
    expect(d.pass).toBe(false);
    expect(d.observed).toBeNull();
    expect(d.note).toMatch(/not resolvable in 1 of 2 seeds: resolution too coarse/);
  });

  it('modes outside the band are not judged; none left → fail with a note', () => {
    const d = byId(judgeCriteria({ dampingPercent: 50 }, aggregate(), [mode({ outsideBand: true })]), 'damping');
    expect(d.pass).toBe(false);
    expect(d.note).toBe('no mode inside the band');
    const none = byId(judgeCriteria({ resonanceFrequencyPercent: 1 }, aggregate()), 'resonance-frequency');
    expect(none.pass).toBe(false);
  });

  it('a band with no finite value fails with observed null', () => {
    const s: SeedLineScores = {
      magnitudeErrorDb: Float64Array.of(NaN),
      phaseErrorDeg: Float64Array.of(NaN),
      complexRelativeError: Float64Array.of(NaN),
      coherence: Float64Array.of(NaN),
      predictedMagnitudeError: Float64Array.of(NaN),
      insideMagnitudeBand: Uint8Array.of(0),
    };
    const c = byId(judgeCriteria({ magnitudeDb: 1 }, aggregateRuns(Float64Array.of(5), [s])), 'magnitude-p95');
    expect(c.observed).toBeNull();
    expect(c.pass).toBe(false);
  });
});
