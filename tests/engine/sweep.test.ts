/**
 * Sweep studies: grid expansion and its refusals, measurement time, the cheapest passing point.
 *
 * Hand-computed references:
 * - measurement time of n blocks of N samples at overlap o and rate fs: (n − 1)(1 − o)N/fs + N/fs
 *   (Welch's segmentation, P. D. Welch, IEEE Trans. Audio Electroacoust. AU-15(2), 1967);
 * - resolution bias of a Hann-windowed H1 at a lightly damped resonance, second order:
 *   bias/H ≈ −(4/3)(Δf/B_r)² with B_r = 2ζf_n (the Hann power kernel's second moment is 1/3 bin²
 *   by Parseval; see tests/engine/scores-resolution-bias.test.ts), so on an SDOF with f_n = 50 Hz,
 *   ζ = 2 % (B_r = 2 Hz) at fs = 256 Hz: N = 512 (Δf = 0.5 Hz) reads 20·log10(1 − 1/12) = −0.76 dB
 *   and N = 1024 (Δf = 0.25 Hz) −0.18 dB. A 0.45 dB magnitude tolerance therefore fails N = 512 and
 *   passes N = 1024; with 64 averages at 50 % overlap the cheapest passing point is N = 1024 with
 *   63·0.5·1024/256 + 1024/256 = 130 s of record.
 */
import { EngineInputError } from '@/shared/engine/errors';
import { cheapestPassing, failedSweepPoint, runSweep } from '@/shared/engine/sweep-result';
import { expandSweep, measurementTimeS, type SweepAxis } from '@/shared/engine/sweep';
import { hannRecipe, sdofRandomScenario } from './study-helpers';

const db = (ratio: number) => 20 * Math.log10(ratio);

describe('measurementTimeS', () => {
  it.each([
    // [averages, N, overlap, fs, seconds by hand]
    [1, 1024, 0.5, 256, 4],
    [64, 1024, 0.5, 256, 130],
    [10, 2048, 0, 1000, 20.48],
    [5, 512, 0.75, 512, 2],
  ])('%i averages of %i samples at overlap %d, fs %d Hz → %d s', (n, block, overlap, fs, seconds) => {
    expect(measurementTimeS(n, block, overlap, fs)).toBeCloseTo(seconds, 12);
  });

  it('refuses counts and overlaps that have no meaning', () => {
    expect(() => measurementTimeS(0, 1024, 0.5, 256)).toThrow('averages=0 must be a whole number ≥ 1');
    expect(() => measurementTimeS(4, 1024, 1, 256)).toThrow('overlap=1 must be in [0, 1)');
  });
});

describe('expandSweep', () => {
  const recipe = hannRecipe({ averages: 8 });
  const scenario = sdofRandomScenario({ durationS: 64, snrDb: 30 });

  it('crosses two settings, first slowest, with each point resolved through the recipe resolver', () => {
    const plan = expandSweep(recipe, scenario, [
      { setting: 'frequencyResolutionHz', values: [0.5, 0.25] },
      { setting: 'window', values: ['hann', 'rectangular'] },
    ]);
    expect(plan.points.map((p) => p.settings)).toEqual([
      { frequencyResolutionHz: 0.5, window: 'hann' },
      { frequencyResolutionHz: 0.5, window: 'rectangular' },
      { frequencyResolutionHz: 0.25, window: 'hann' },
      { frequencyResolutionHz: 0.25, window: 'rectangular' },
    ]);
    // fs/Δf = 256/0.5 = 512 and 256/0.25 = 1024 samples; the base recipe's block length is dropped.
    expect(plan.points.map((p) => p.blockLength)).toEqual([512, 512, 1024, 1024]);
    expect(plan.points[2].recipe.blockLength).toBeUndefined();
    // 8 averages at 50 %: 3.5·N/fs + N/fs = 4.5·N/256.
    expect(plan.points.map((p) => p.measurementTimeS)).toEqual([9, 9, 18, 18]);
  });

  it('uses every block of the record for averages "all", and the record length for recordLengthS', () => {
    const plan = expandSweep(hannRecipe({ averages: 'all' }), scenario, [{ setting: 'recordLengthS', values: [16, 32] }]);
    // 16 s at 256 Hz = 4096 samples: (4096 − 1024)/512 + 1 = 7 blocks → 6·512 + 1024 samples = 16 s.
    expect(plan.points.map((p) => p.averages)).toEqual([7, 15]);
    expect(plan.points.map((p) => p.measurementTimeS)).toEqual([16, 32]);
    expect(plan.points[1].scenario.acquisition.durationS).toBe(32);
  });

  it('sets the SNR of a channel and the delay in the scenario only', () => {
    const plan = expandSweep(recipe, scenario, [{ setting: 'outputSnrDb', values: [10, 40] }]);
    expect(plan.points.map((p) => p.scenario.errors?.outputNoise)).toEqual([{ snrDb: 10 }, { snrDb: 40 }]);
    expect(plan.points[0].recipe).toEqual(plan.points[1].recipe);
    expect(plan.points[0].choiceKey).toBe(plan.points[1].choiceKey);
  });

  it.each<[string, SweepAxis[], string]>([
    ['no setting', [], 'vary=0 must name one or two settings'],
    ['an unknown setting', [{ setting: 'colour' as never, values: [1] }], 'vary="colour" is not a setting a sweep can vary'],
    ['a setting twice', [{ setting: 'overlap', values: [0] }, { setting: 'overlap', values: [0.5] }], 'vary="overlap" is named twice'],
    ['two conditions', [{ setting: 'delayS', values: [0] }, { setting: 'outputSnrDb', values: [20] }], 'may hold at most one test condition'],
    ['block and resolution together', [{ setting: 'blockLength', values: [512] }, { setting: 'frequencyResolutionHz', values: [1] }], 'are the same setting'],
    ['a word for a number', [{ setting: 'overlap', values: ['half'] }], 'vary.overlap="half" must be a number'],
    ['an unknown window', [{ setting: 'window', values: ['triangle'] }], 'vary.window="triangle" must be one of rectangular'],
    ['a fractional average count', [{ setting: 'averages', values: [2.5] }], 'vary.averages=2.5 must be a whole number ≥ 1 or "all"'],
    ['a repeated value', [{ setting: 'blockLength', values: [512, 512] }], 'lists a value twice'],
    ['a block that is not a power of two', [{ setting: 'blockLength', values: [1000] }], 'grid point blockLength=1000 cannot be processed: blockLength=1000 must be a power of two'],
    ['a block longer than the record', [{ setting: 'blockLength', values: [32768] }], "more than the record's 16384"],
    ['an overlap of 1', [{ setting: 'overlap', values: [1] }], 'overlap=1 must be in [0, 1)'],
  ])('refuses %s in plain words', (_what, axes, message) => {
    expect(() => expandSweep(recipe, scenario, axes)).toThrow(EngineInputError);
    expect(() => expandSweep(recipe, scenario, axes)).toThrow(message);
  });

  it('refuses an SNR on a channel whose noise is a PSD level, and more than 48 points', () => {
    const psd = { ...scenario, errors: { inputNoise: { psd: 1e-6 } } };
    expect(() => expandSweep(recipe, psd, [{ setting: 'inputSnrDb', values: [20] }])).toThrow('sizes its force noise by a PSD level');
    const many = Array.from({ length: 7 }, (_, i) => i + 2);
    expect(() => expandSweep(recipe, scenario, [{ setting: 'averages', values: many }, { setting: 'outputSnrDb', values: many }])).toThrow(
      'vary="49 points" must give at most 48 grid points',
    );
  });
});

describe('cheapestPassing', () => {
  const plan = expandSweep(hannRecipe({ averages: 4 }), sdofRandomScenario({ durationS: 64, snrDb: 30 }), [
    { setting: 'blockLength', values: [1024, 512] },
    { setting: 'window', values: ['hann', 'rectangular'] },
  ]);
  const outcome = (passes: boolean[]) => passes.map((pass, index) => ({ index, ran: true, pass }));

  it('is null when no point passes', () => {
    expect(cheapestPassing(plan, outcome([false, false, false, false]))).toBeNull();
  });

  it('takes the shortest record, and the first in grid order on a tie', () => {
    // 4 averages at 50 %: 2.5·N/256 s → 10 s at N = 1024, 5 s at N = 512 (both windows).
    expect(cheapestPassing(plan, outcome([true, true, false, true]))).toEqual({ index: 3, points: [3], settings: { blockLength: 512, window: 'rectangular' }, measurementTimeS: 5 });
    expect(cheapestPassing(plan, outcome([true, true, true, true]))?.index).toBe(2);
  });

  it('passes a choice only when it passes at every condition value', () => {
    const withSnr = expandSweep(hannRecipe({ averages: 4 }), sdofRandomScenario({ durationS: 64, snrDb: 30 }), [
      { setting: 'blockLength', values: [512, 1024] },
      { setting: 'outputSnrDb', values: [10, 30] },
    ]);
    const cheapest = cheapestPassing(withSnr, outcome([false, true, true, true]));
    expect(cheapest).toEqual({ index: 2, points: [2, 3], settings: { blockLength: 1024 }, measurementTimeS: 10 });
  });
});

describe('runSweep on a noise-free SDOF (resolution bias, module doc)', () => {
  const result = runSweep({
    recipe: hannRecipe({ averages: 64, band: { lowHz: 30, highHz: 70 }, tolerances: { magnitudeDb: 0.45 } }),
    scenario: sdofRandomScenario({ durationS: 320 }),
    vary: [{ setting: 'blockLength', values: [512, 1024, 2048] }],
    seeds: 4,
    baseSeed: 7,
  });

  it('names N = 1024 with 130 s of record as the cheapest passing point', () => {
    expect(result.points.map((p) => p.measurementTimeS)).toEqual([65, 130, 260]);
    expect(result.points.map((p) => p.pass)).toEqual([false, true, true]);
    expect(result.cheapestPassing).toEqual({ index: 1, points: [1], settings: { blockLength: 1024 }, measurementTimeS: 130 });
    expect(result.statement).toBe(
      'The cheapest passing point is block length 1024 samples: 130 s of record (64 averages of 1024 samples) passes every criterion.',
    );
  });

  it('reads the resolution bias the second-order formula predicts, within the Monte Carlo scatter', () => {
    const bias = (i: number) => result.points[i].criteria.find((c) => c.id === 'magnitude-bias')!;
    expect(bias(0).observed).toBeGreaterThan(0.5 * -db(1 - 1 / 12));
    expect(bias(0).observed).toBeLessThan(1.5 * -db(1 - 1 / 12));
    expect(bias(1).observed).toBeGreaterThan(0.5 * -db(1 - 1 / 48));
    expect(bias(1).observed).toBeLessThan(1.5 * -db(1 - 1 / 48));
    // Decided at the resonance line.
    expect(Math.abs(bias(0).worstLineHz! - 50)).toBeLessThanOrEqual(0.5);
  });

  it('uses the same seeds at every point and gives one figure per seed per criterion', () => {
    expect(result.seeds).toEqual([7, 8, 9, 10]);
    for (const p of result.points) {
      expect(Object.keys(p.perSeed)).toEqual(['magnitude-bias', 'magnitude-p95']);
      expect(p.perSeed['magnitude-p95']).toHaveLength(4);
      // The 95th percentile over seeds lies inside the per-seed values' range.
      const seeds = p.perSeed['magnitude-p95'] as number[];
      const judged = p.criteria.find((c) => c.id === 'magnitude-p95')!.observed!;
      expect(judged).toBeLessThanOrEqual(Math.max(...seeds) + 1e-12);
    }
  });

  it('a point that could not run keeps its choice from passing', () => {
    const plan = expandSweep(hannRecipe({ averages: 4 }), sdofRandomScenario({ durationS: 64, snrDb: 30 }), [{ setting: 'blockLength', values: [512, 1024] }]);
    const failed = failedSweepPoint(plan.points[0], 'errors.cubicStiffness.k3NPerM3=1e12 makes the response diverge at this level');
    expect(failed).toMatchObject({ ran: false, pass: false, criteria: [], measurementTimeS: 5 });
    expect(cheapestPassing(plan, [{ ...failed, pass: true }, { index: 1, ran: true, pass: true }])?.index).toBe(1);
  });
});
