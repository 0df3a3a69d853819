/**
 * Studies end to end (simulate → process → score → aggregate → judge), against analytic truths:
 * - a periodic excitation whose period equals the block, analysed with a rectangular window and
 *   no overlap, is leakage-free, so H1 equals the exact FRF at every excited line (DFT of a
 *   periodic steady state; any DSP text);
 * - a delay τ on the response channel then shows as a phase error of exactly −360·f·τ degrees
 *   (time-shift theorem) with no magnitude error;
 * - an SDOF peak scales as 1/ζ (receptance peak 1/(2ζk), textbook), so an exponential window that
 *   adds ζ_add = 1/(ω_n τ) (common practice, quoted from memory) lowers the plain peak by
 *   20·log10(ζ/(ζ + ζ_add)) dB;
 * - determinism: two runs give the same bytes, and assembling the runs in any order gives the same
 *   study as running it in order.
 */
import { ENGINE_VERSION } from '@/shared/engine/version';
import { EngineInputError } from '@/shared/engine/errors';
import { assembleStudy, planStudy, runScenarioSeed, runStudy, studySeed, type RunResult } from '@/shared/engine/study';
import type { ScenarioInput } from '@/shared/engine/scenario';
import { runStudyChunk, splitTasks } from '@/shared/engine/worker-run';
import { hannRecipe, sdofRandomScenario, toBytes } from './study-helpers';

function periodicScenario(delayS?: number): ScenarioInput {
  return {
    name: 'Harbor Ridge bench SDOF, pseudo-random force',
    system: { kind: 'sdof', quantity: 'mobility', naturalFrequencyHz: 40, dampingRatio: 0.05, stiffnessNPerM: 2e5 },
    acquisition: { sampleRateHz: 512, durationS: 16 },
    excitation: { kind: 'pseudo-random', band: { lowHz: 1, highHz: 200 }, periodS: 2, level: { rmsN: 5 } },
    errors: delayS === undefined ? {} : { delayS },
  } as ScenarioInput;
}

const rectangular = hannRecipe({
  name: 'periodic, rectangular',
  window: 'rectangular',
  overlap: 0,
  band: { lowHz: 5, highHz: 150 },
  tolerances: { magnitudeDb: 0.01, phaseDeg: 0.01, complexRelative: 1e-6, resonanceFrequencyPercent: 1.5, dampingPercent: 10, minCoherence: 0.999 },
});

describe('runScenarioSeed on leakage-free periodic records', () => {
  it('H1 equals the exact FRF at every line of the band (|error| < 1e-9 dB, 1e-7 degrees)', () => {
    const r = runScenarioSeed(periodicScenario(), rectangular, 7);
    expect(r.reference).toBe('linear-frf');
    expect(r.plain).toBeUndefined();
    expect(r.engineVersion).toBe(ENGINE_VERSION);
    const s = r.judged.score.summary;
    expect(s.lines).toBe(291); // 5 … 150 Hz at 0.5 Hz
    expect(s.maxAbsMagnitudeDb).toBeLessThan(1e-9);
    expect(s.maxAbsPhaseDeg).toBeLessThan(1e-7);
    expect(s.maxComplexRelative).toBeLessThan(1e-10);
    expect(r.judged.modes[0].status).toBe('resolved');
    expect(r.judged.atResonances.map((p) => p.lineHz)).toEqual([40]);
    expect(Math.abs(r.judged.atResonances[0].magnitudeErrorDb)).toBeLessThan(1e-9);
    expect(r.judged.atAntiResonances).toEqual([]); // an SDOF has none
  });

  it('a 2 ms response delay gives a phase error of −360·f·τ and no magnitude error', () => {
    const tau = 0.002;
    const r = runScenarioSeed(periodicScenario(tau), rectangular, 7);
    const sc = r.judged.score;
    for (let i = 0; i < sc.frequenciesHz.length; i++) {
      expect(sc.phaseErrorDeg[i]).toBeCloseTo(-360 * sc.frequenciesHz[i] * tau, 6);
      expect(Math.abs(sc.magnitudeErrorDb[i])).toBeLessThan(1e-9);
    }
  });

  it('the criteria of an exact estimate pass, and fail when the delay is on', () => {
    const clean = runStudy({ recipe: rectangular, scenarios: [periodicScenario()], seeds: 2 });
    const c = clean.results[0].judged.criteria;
    expect(c.map((x) => x.id)).toEqual([
      'magnitude-bias', 'magnitude-p95', 'phase-p95', 'complex-relative-p95', 'resonance-frequency', 'damping', 'min-coherence',
    ]);
    expect(c.every((x) => x.pass)).toBe(true);
    expect(clean.pass).toBe(true);
    const delayed = runStudy({ recipe: rectangular, scenarios: [periodicScenario(0.002)], seeds: 2 });
    const phase = delayed.results[0].judged.criteria.find((x) => x.id === 'phase-p95')!;
    expect(phase.pass).toBe(false);
    expect(phase.worstLineHz).toBe(150); // |−360·150·0.002| = 108° is the largest in 5…150 Hz
    expect(phase.observed!).toBeCloseTo(108, 6);
    expect(delayed.pass).toBe(false);
  });
});

describe('transient processing with an exponential window', () => {
  const zeta = 0.005;
  const fn = 40;
  const impact = {
    name: 'Harbor Ridge drone arm stand-in, impact',
    system: { kind: 'sdof', quantity: 'accelerance', naturalFrequencyHz: fn, dampingRatio: zeta, stiffnessNPerM: 1e5 },
    acquisition: { sampleRateHz: 1024, durationS: 16 },
    excitation: { kind: 'impact', pulseDurationS: 0.002, periodS: 8, level: { peakN: 100 } },
  } as ScenarioInput;
  const recipe = hannRecipe({
    name: 'impact, force + exponential',
    blockLength: 4096,
    window: 'rectangular',
    overlap: 0,
    band: { lowHz: 5, highHz: 200 },
    transient: { forceWindowFraction: 0.05, exponentialDecayFraction: 0.25, triggerLevelFraction: 0.1, pretriggerFraction: 0.01 },
    tolerances: { magnitudeDb: 0.5 },
  });

  it('is judged against the windowed FRF, with the plain comparison and damping correction beside it', () => {
    const r = runScenarioSeed(impact, recipe, 3);
    expect(r.reference).toBe('exponential-window');
    expect(r.exponentialTauS).toBeCloseTo(1, 12); // 0.25 × 4096 / 1024 s
    const judgedPeak = r.judged.modes[0];
    const plainPeak = r.plain!.modes[0];
    expect(Math.abs(judgedPeak.peakValueErrorDb!)).toBeLessThan(0.05);
    const added = 1 / (2 * Math.PI * fn * r.exponentialTauS!);
    expect(plainPeak.peakValueErrorDb!).toBeCloseTo(20 * Math.log10(zeta / (zeta + added)), 1);
    // Corrected damping ζ̂ − ζ_add against the true ζ, within what 3 lines of half-power allow.
    expect(Math.abs(plainPeak.dampingErrorPercent!)).toBeLessThan(10);
    expect(r.judged.score.summary.rmsMagnitudeDb).toBeLessThan(r.plain!.score.summary.rmsMagnitudeDb);
  });
});

describe('seeds, progress and determinism', () => {
  it('derives seeds by the documented rule', () => {
    expect(studySeed(1, 0, 0)).toBe(1);
    expect(studySeed(1, 2, 17)).toBe(2_000_018);
    expect(planStudy({ scenarios: [{}, {}] as ScenarioInput[], seeds: 2, baseSeed: 10 }).map((t) => t.seed)).toEqual([
      10, 11, 1_000_010, 1_000_011,
    ]);
    expect(() => planStudy({ scenarios: [], seeds: 2 })).toThrow(EngineInputError);
    expect(() => planStudy({ scenarios: [{}] as ScenarioInput[], seeds: 0 })).toThrow(/seeds/);
    expect(() => planStudy({ scenarios: [{}] as ScenarioInput[], seeds: 1, baseSeed: -1 })).toThrow(/baseSeed/);
  });

  const scenarios = [sdofRandomScenario({ snrDb: 20, durationS: 32 }), sdofRandomScenario({ name: 'second', zeta: 0.05, durationS: 32 })];
  const recipe = hannRecipe();

  it('reports progress once per run, in order', () => {
    const seen: number[] = [];
    const study = runStudy({ recipe, scenarios, seeds: 3, onProgress: (p) => seen.push(p.completed * 100 + p.total) });
    expect(seen).toEqual([106, 206, 306, 406, 506, 606]);
    expect(study.results.map((r) => r.seeds)).toEqual([[1, 2, 3], [1_000_001, 1_000_002, 1_000_003]]);
    expect(study.seedRule.rule).toMatch(/baseSeed \+ scenarioIndex·1000000 \+ run/);
    expect(study.recipe).toEqual(recipe);
    expect(study.scenarios).toEqual(scenarios);
    expect(study.results[0].judged.aggregate.meanMagnitudeDb).toBeInstanceOf(Float64Array);
  });

  it('two runs give identical bytes; assembling shuffled runs gives the same study', () => {
    const a = runStudy({ recipe, scenarios, seeds: 3 });
    const b = runStudy({ recipe, scenarios, seeds: 3 });
    expect(toBytes(a)).toBe(toBytes(b));
    const runs: RunResult[] = planStudy({ scenarios, seeds: 3 }).map((t) => runScenarioSeed(scenarios[t.scenarioIndex], recipe, t.seed));
    const shuffled = [runs[4], runs[1], runs[5], runs[0], runs[3], runs[2]].map((r) => structuredClone(r));
    expect(toBytes(assembleStudy({ recipe, scenarios, seeds: 3 }, shuffled))).toBe(toBytes(a));
    // A different base seed gives different numbers.
    const c = runStudy({ recipe, scenarios, seeds: 3, baseSeed: 5 });
    expect(toBytes(c)).not.toBe(toBytes(a));
  });

  it('a missing run is an error naming the seed', () => {
    const runs = [runScenarioSeed(scenarios[0], recipe, 1)];
    expect(() => assembleStudy({ recipe, scenarios: [scenarios[0]], seeds: 2 }, runs)).toThrow(/runs=2/);
  });
});

describe('Monte Carlo: coverage and Bendat & Piersol random error of |H1|', () => {
  // Random force, white output noise at 10 dB band SNR, Hann 1024 at 256 Hz (Δf = 0.25 Hz) on a
  // 5 %-damped 50 Hz SDOF (B_r = 5 Hz = 20·Δf): the resolution bias (< 0.4 %) is far below the
  // random error (≈ 1–9 %), so the estimator is "ideal" in the sense the 95 % band assumes.
  const S = 120;
  let study: ReturnType<typeof runStudy>;
  beforeAll(() => {
    study = runStudy({ recipe: hannRecipe(), scenarios: [sdofRandomScenario({ zeta: 0.05, snrDb: 10, durationS: 64 })], seeds: S });
  });

  it('coverage of the 95 % magnitude band is 95 % within the sampling tolerance of the seed count', () => {
    const a = study.results[0].judged.aggregate;
    // Each line's coverage over S seeds is Binomial(S, 0.95)/S, σ = sqrt(0.95·0.05/S) = 0.020 for
    // S = 120. The band average is no less precise than one line whatever the correlation between
    // lines, so 3σ bounds it without assuming independent lines.
    const tol = 3 * Math.sqrt((0.95 * 0.05) / S);
    expect(Math.abs(a.overallCoverage - 0.95)).toBeLessThan(tol);
    expect(Math.abs(a.overallPhaseCoverage! - 0.95)).toBeLessThan(tol);
    // Line by line: at 3σ a line falls outside with probability ≈ 0.3 % (normal approximation),
    // so at least 95 % of the lines must lie inside.
    let inside = 0;
    for (const c of a.coverage) if (Math.abs(c - 0.95) <= tol) inside++;
    expect(inside / a.lines).toBeGreaterThanOrEqual(0.95);
  });

  it('observed scatter of |H1| matches ε = sqrt(1−γ²)/(|γ|·sqrt(2 n_d)) within the seed-count tolerance', () => {
    const a = study.results[0].judged.aggregate;
    // The sample standard deviation of S Gaussian values has relative standard error
    // 1/sqrt(2(S − 1)) = 0.065 for S = 120; 3 of them bound the median ratio and each line.
    const tol = 3 / Math.sqrt(2 * (S - 1));
    expect(Math.abs(a.medianRandomErrorRatio - 1)).toBeLessThan(tol);
    let inside = 0;
    for (const r of a.randomErrorRatio) if (Math.abs(r - 1) <= tol) inside++;
    expect(inside / a.lines).toBeGreaterThanOrEqual(0.95);
    // The noise makes the errors real: the predicted error is a few per cent, not zero.
    expect(a.predictedRandomError[0]).toBeGreaterThan(0.01);
  });
});

describe('worker-run chunks', () => {
  const scenarios = [sdofRandomScenario({ snrDb: 20, durationS: 32 }), sdofRandomScenario({ name: 'second', zeta: 0.05, durationS: 32 })];
  const recipe = hannRecipe();

  it('split into chunks, cloned as a thread would receive them, they assemble to the same bytes', () => {
    const tasks = planStudy({ scenarios, seeds: 3 });
    const chunks = splitTasks(tasks, 4);
    expect(chunks.map((c) => c.length)).toEqual([2, 2, 1, 1]);
    const outputs = chunks.reverse().map((c) => structuredClone(runStudyChunk(structuredClone({ recipe, scenarios, tasks: c }))));
    const runs = outputs.flatMap((o) => o.runs);
    expect(outputs.every((o) => o.failures.length === 0 && o.engineVersion === ENGINE_VERSION)).toBe(true);
    expect(toBytes(assembleStudy({ recipe, scenarios, seeds: 3 }, runs))).toBe(toBytes(runStudy({ recipe, scenarios, seeds: 3 })));
  });

  it('a failing run is reported by seed with the engine message; the others still run', () => {
    const out = runStudyChunk({ recipe, scenarios, tasks: [{ scenarioIndex: 0, run: 0, seed: -1 }, { scenarioIndex: 0, run: 1, seed: 2 }] });
    expect(out.runs.map((r) => r.seed)).toEqual([2]);
    expect(out.failures).toEqual([{ scenarioIndex: 0, seed: -1, error: expect.stringMatching(/^seed=-1/) }]);
    expect(splitTasks([], 3)).toEqual([[]]);
  });
});
