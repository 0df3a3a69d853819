/**
 * Decision rules (ILAC G8:09/2019 §4.2; JCGM 106:2012 §8–9): simple acceptance, a binary guard band
 * w = r·U and the non-binary rule with a conditional zone, and the false-accept probability taken
 * from the Monte Carlo replicates themselves. Hand-made replicates with a known spread: the worked
 * numbers follow from the definitions (U = 2u, acceptance limit = limit − w for "at most").
 */
import type { Criterion } from '@/shared/engine/scores/criteria';
import { decide } from '@/shared/engine/scores/decision-rules';
import { decisionFigureOf } from '@/shared/engine/scores/decision-figures';
import { aggregateRuns, type SeedLineScores } from '@/shared/engine/scores/monte-carlo';
import { judgeCriteria } from '@/shared/engine/scores/criteria';
import { parseRecipe } from '@/shared/engine/recipe';
import { meanStd } from '@/shared/engine/scores/statistics';

const crit = (observed: number, id = 'magnitude-p95', limit = 1): Criterion => ({ id, label: id, limit, observed, unit: 'dB', pass: observed <= limit, worstLineHz: 10 });
/** 100 replicates spread evenly over centre ± half. */
const spread = (centre: number, half: number) => Float64Array.from({ length: 100 }, (_, k) => centre + (half * (k - 49.5)) / 49.5);

describe('decision rules', () => {
  it('simple acceptance keeps the plain judgement and reports the false-accept probability from the replicates', () => {
    const reps = spread(0.9, 0.2); // 0.7 … 1.1: replicates above 1.0 are outside the limit
    const d = decide(crit(0.9), reps);
    expect(d.decision).toBe('pass');
    expect(d.pass).toBe(true);
    expect(d.guardBand).toBe(0);
    const outside = Array.from(reps).filter((v) => v > 1).length / 100;
    expect(d.falseAcceptProbability).toBe(outside);
    expect(outside).toBeGreaterThan(0.2);
    expect(d.uncertainty).toBeCloseTo(meanStd(reps).std, 14);
    expect(d.expandedUncertainty).toBeCloseTo(2 * meanStd(reps).std, 14);
  });

  it('a guard band w = U turns the same figure into a fail; w = 0.5·U with a smaller spread passes', () => {
    const reps = spread(0.9, 0.2);
    const u = meanStd(reps).std; // ≈ 0.117, U ≈ 0.234: acceptance limit ≈ 0.766 < 0.9
    const d = decide(crit(0.9), reps, { kind: 'guard-band' });
    expect(d.acceptanceLimit).toBeCloseTo(1 - 2 * u, 12);
    expect(d.decision).toBe('fail');
    expect(d.falseAcceptProbability).toBeNull();
    expect(d.falseRejectProbability).toBeGreaterThan(0.5);
    const tight = decide(crit(0.9), spread(0.9, 0.05), { kind: 'guard-band', factor: 0.5 });
    expect(tight.decision).toBe('pass');
  });

  it('the non-binary rule gives conditional within w of the limit on either side, fail beyond', () => {
    const reps = spread(0, 0.2); // u ≈ 0.117, U ≈ 0.234
    expect(decide(crit(0.95), reps, { kind: 'guard-band-conditional' }).decision).toBe('conditional');
    expect(decide(crit(1.1), reps, { kind: 'guard-band-conditional' }).decision).toBe('conditional');
    expect(decide(crit(1.3), reps, { kind: 'guard-band-conditional' }).decision).toBe('fail');
    expect(decide(crit(0.7), reps, { kind: 'guard-band-conditional' }).decision).toBe('pass');
    // Only this rule may answer conditional.
    expect(decide(crit(0.95), reps, { kind: 'guard-band' }).decision).toBe('fail');
  });

  it('a figure limited from below (coverage) moves its acceptance limit up', () => {
    const d = decide(crit(93, 'coverage', 90), spread(93, 1), { kind: 'guard-band' });
    expect(d.acceptanceLimit!).toBeGreaterThan(90);
    expect(d.decision).toBe('pass');
  });

  it('one seed has no uncertainty: a guard band cannot be placed and the criterion fails with a note', () => {
    const d = decide(crit(0.5), new Float64Array(0), { kind: 'guard-band' });
    expect(d.decision).toBe('fail');
    expect(d.note).toMatch(/one seed/);
    expect(decide(crit(0.5), new Float64Array(0)).decision).toBe('pass');
  });

  it('the recipe carries a rule per criterion and refuses an unknown criterion or kind', () => {
    const base = { name: 'r', blockLength: 256, window: 'hann', overlap: 0.5, detrend: 'none', estimator: 'H1', band: { lowHz: 1, highHz: 10 }, scaling: 'density', tolerances: { magnitudeDb: 1 } };
    expect(parseRecipe({ ...base, decisionRules: { 'magnitude-p95': { kind: 'guard-band', factor: 1 } } }).decisionRules).toEqual({ 'magnitude-p95': { kind: 'guard-band', factor: 1 } });
    expect(() => parseRecipe({ ...base, decisionRules: { 'magnitude-p99': { kind: 'simple' } } })).toThrow(/magnitude-p99/);
    expect(() => parseRecipe({ ...base, decisionRules: { coverage: { kind: 'lenient' } } })).toThrow(/decisionRules\.coverage\.kind/);
  });

  it('on every seed and line the decision figure is exactly judgeCriteria\'s figure', () => {
    const seeds: SeedLineScores[] = [0, 1, 2, 3, 4].map((s) => ({
      magnitudeErrorDb: Float64Array.of(0.1 * s, -0.3 + 0.05 * s, 0.2),
      phaseErrorDeg: Float64Array.of(s, -2 * s, 0.5),
      complexRelativeError: Float64Array.of(0.01 * s, 0.02, 0.03 * s),
      coherence: Float64Array.of(0.9, 0.8 + 0.01 * s, 0.95),
      predictedMagnitudeError: Float64Array.of(0.1, 0.1, 0.1),
      insideMagnitudeBand: Uint8Array.of(1, s % 2, 1),
    }));
    const agg = aggregateRuns(Float64Array.of(1, 2, 3), seeds);
    const judged = judgeCriteria({ magnitudeDb: 1, phaseDeg: 5, complexRelative: 0.1, coveragePercent: 80, minCoherence: 0.5 }, agg);
    const evidence = seeds.map((lines) => ({ lines, modes: [] }));
    for (const c of judged) expect(decisionFigureOf(c.id, evidence)([0, 1, 2, 3, 4], null)).toBe(c.observed);
  });
});
