/** Recipe schema and resolver: a valid recipe, every validation branch, adjustments as warnings. */
import { parseRecipe, resolveRecipe, type Recipe } from '@/shared/engine/recipe';
import { EngineInputError } from '@/shared/engine/errors';

export const BASE_RECIPE = {
  name: 'Harbor Ridge frame, random excitation',
  blockLength: 1024,
  window: 'hann',
  overlap: 0.5,
  averages: 'all',
  detrend: 'none',
  estimator: 'H1',
  band: { lowHz: 10, highHz: 200 },
  scaling: 'density',
  tolerances: { magnitudeDb: 0.5, phaseDeg: 5 },
} as const;

function fieldOf(call: () => unknown): { field: string; message: string } {
  try {
    call();
  } catch (e) {
    expect(e).toBeInstanceOf(EngineInputError);
    return { field: (e as EngineInputError).field, message: (e as Error).message };
  }
  throw new Error('expected an EngineInputError');
}

describe('parseRecipe', () => {
  it('accepts a complete recipe and returns it typed', () => {
    const r = parseRecipe({
      ...BASE_RECIPE,
      description: 'frame survey',
      window: 'kaiser',
      windowParams: { kaiserBeta: 6 },
      estimator: 'Hv',
      hvWeight: 2,
      transient: { forceWindowFraction: 0.05, exponentialDecayFraction: 0.25, triggerLevelFraction: 0.1, pretriggerFraction: 0.02 },
      tolerances: { magnitudeDb: 0.5, phaseDeg: 5, complexRelative: 0.1, resonanceFrequencyPercent: 1, dampingPercent: 10, coveragePercent: 90, minCoherence: 0.9 },
    });
    expect(r.window).toBe('kaiser');
    expect(r.transient?.pretriggerFraction).toBe(0.02);
  });
  it('accepts a frequency resolution in place of a block length', () => {
    const { blockLength: _omit, ...rest } = BASE_RECIPE;
    expect(parseRecipe({ ...rest, frequencyResolutionHz: 0.5 }).frequencyResolutionHz).toBe(0.5);
  });

  const { blockLength: _b, ...noBlock } = BASE_RECIPE;
  it.each<[string, unknown, RegExp | null]>([
    ['recipe', null, null],
    ['recipe', 'hann', null],
    ['name', { ...BASE_RECIPE, name: '  ' }, /must not be empty/],
    ['name', { ...BASE_RECIPE, name: 3 }, null],
    ['description', { ...BASE_RECIPE, description: 7 }, null],
    ['blockLength', { ...BASE_RECIPE, blockLength: 1000 }, /power of two/],
    ['blockLength', { ...BASE_RECIPE, blockLength: 2 }, null],
    ['blockLength', { ...BASE_RECIPE, blockLength: 2 ** 25 }, null],
    ['blockLength', { ...BASE_RECIPE, blockLength: '1024' }, null],
    ['blockLength', noBlock, /or frequencyResolutionHz must be given/],
    ['frequencyResolutionHz', { ...BASE_RECIPE, frequencyResolutionHz: 1 }, /cannot be given together/],
    ['frequencyResolutionHz', { ...noBlock, frequencyResolutionHz: 0 }, null],
    ['window', { ...BASE_RECIPE, window: 'triangle' }, /must be one of/],
    ['windowParams.kaiserBeta', { ...BASE_RECIPE, window: 'kaiser' }, /required/],
    ['windowParams.kaiserBeta', { ...BASE_RECIPE, window: 'kaiser', windowParams: { kaiserBeta: -2 } }, null],
    ['windowParams.beta', { ...BASE_RECIPE, windowParams: { beta: 2 } }, /not a recipe field/],
    ['overlap', { ...BASE_RECIPE, overlap: 1 }, /must be in \[0, 1\)/],
    ['overlap', { ...BASE_RECIPE, overlap: 1.2 }, /^overlap=1.2 must be in \[0, 1\)$/],
    ['overlap', { ...BASE_RECIPE, overlap: -0.5 }, null],
    ['overlap', { ...BASE_RECIPE, overlap: Number.NaN }, null],
    ['averages', { ...BASE_RECIPE, averages: 0 }, null],
    ['averages', { ...BASE_RECIPE, averages: 2.5 }, null],
    ['averages', { ...BASE_RECIPE, averages: 'many' }, null],
    ['detrend', { ...BASE_RECIPE, detrend: 'constant' }, null],
    ['estimator', { ...BASE_RECIPE, estimator: 'H3' }, null],
    ['hvWeight', { ...BASE_RECIPE, hvWeight: 0 }, null],
    ['band', { ...BASE_RECIPE, band: undefined }, /^band=undefined is required$/],
    ['band.lowHz', { ...BASE_RECIPE, band: { lowHz: -1, highHz: 10 } }, null],
    ['band.highHz', { ...BASE_RECIPE, band: { lowHz: 0, highHz: 0 } }, null],
    ['band.lowHz', { ...BASE_RECIPE, band: { lowHz: 300, highHz: 200 } }, /must be below band.highHz=200/],
    ['scaling', { ...BASE_RECIPE, scaling: 'psd' }, null],
    ['transient.forceWindowFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0, exponentialDecayFraction: 1, triggerLevelFraction: 0.1, pretriggerFraction: 0 } }, null],
    ['transient.exponentialDecayFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: -1, triggerLevelFraction: 0.1, pretriggerFraction: 0 } }, null],
    ['transient.triggerLevelFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: 1, triggerLevelFraction: 1.5, pretriggerFraction: 0 } }, null],
    ['transient.pretriggerFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: 1, triggerLevelFraction: 0.1, pretriggerFraction: 1 } }, null],
    ['transient.pretriggerFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: 1, triggerLevelFraction: 0.1 } }, null],
    ['transient.forceWindowFraction', { ...BASE_RECIPE, transient: { forceWindowFraction: 0.05, exponentialDecayFraction: 1, triggerLevelFraction: 0.1, pretriggerFraction: 0.05 } }, /must exceed transient.pretriggerFraction=0.05/],
    ['tolerances', { ...BASE_RECIPE, tolerances: undefined }, null],
    ['tolerances.magnitudeDb', { ...BASE_RECIPE, tolerances: { magnitudeDb: 0 } }, null],
    ['tolerances.phaseDeg', { ...BASE_RECIPE, tolerances: { phaseDeg: -1 } }, null],
    ['tolerances.complexRelative', { ...BASE_RECIPE, tolerances: { complexRelative: 0 } }, null],
    ['tolerances.resonanceFrequencyPercent', { ...BASE_RECIPE, tolerances: { resonanceFrequencyPercent: 0 } }, null],
    ['tolerances.dampingPercent', { ...BASE_RECIPE, tolerances: { dampingPercent: 0 } }, null],
    ['tolerances.coveragePercent', { ...BASE_RECIPE, tolerances: { coveragePercent: 101 } }, /\(0, 100\]/],
    ['tolerances.minCoherence', { ...BASE_RECIPE, tolerances: { minCoherence: 1.1 } }, /\[0, 1\]/],
    ['overlapPercent', { ...BASE_RECIPE, overlapPercent: 50 }, /not a recipe field/],
  ])('rejects bad %s', (field, json, message) => {
    const e = fieldOf(() => parseRecipe(json));
    expect(e.field).toBe(field);
    expect(e.message.startsWith(`${field}=`)).toBe(true);
    if (message) expect(e.message).toMatch(message);
  });
});

describe('resolveRecipe', () => {
  const recipe = parseRecipe(BASE_RECIPE);
  it('band lines: ceil(low/Δf) .. floor(high/Δf), inclusive–exclusive', () => {
    const r = resolveRecipe(recipe, { sampleRateHz: 1024, samples: 8192 }); // Δf = 1 Hz
    expect(r.blockLength).toBe(1024);
    expect(r.bandIndices).toEqual({ start: 10, end: 201 });
    expect(r.averages).toBeUndefined();
    expect(r.warnings).toEqual([]);
  });
  it('frequencyResolutionHz → the shortest power-of-two block at least that fine, with a warning', () => {
    const { blockLength: _b, ...rest } = BASE_RECIPE;
    const r = resolveRecipe(parseRecipe({ ...rest, frequencyResolutionHz: 0.3 }), { sampleRateHz: 1000, samples: 1 << 14 });
    expect(r.blockLength).toBe(4096); // 1000/0.3 = 3333 → 4096, Δf = 0.244 Hz
    expect(r.frequencyResolutionHz).toBeCloseTo(1000 / 4096, 15);
    expect(r.warnings.join()).toMatch(/resolved to blockLength=4096 \(resolution 0.244141 Hz\)/);
  });
  it('an exact frequency resolution resolves without a warning', () => {
    const { blockLength: _b, ...rest } = BASE_RECIPE;
    const r = resolveRecipe(parseRecipe({ ...rest, frequencyResolutionHz: 0.5 }), { sampleRateHz: 1024, samples: 4096 });
    expect(r.blockLength).toBe(2048);
    expect(r.warnings).toEqual([]);
  });
  it('numeric averages pass through; overlap with transient processing is reported unused', () => {
    const r = resolveRecipe(
      parseRecipe({ ...BASE_RECIPE, averages: 12, transient: { forceWindowFraction: 0.1, exponentialDecayFraction: 0.3, triggerLevelFraction: 0.2, pretriggerFraction: 0.01 } }),
      { sampleRateHz: 1024, samples: 1 << 15 },
    );
    expect(r.averages).toBe(12);
    expect(r.pretriggerSamples).toBe(10);
    expect(r.warnings.join()).toMatch(/overlap=0.5 is not used/);
  });
  it.each<[string, Recipe, { sampleRateHz: number; samples: number }, RegExp]>([
    ['blockLength', recipe, { sampleRateHz: 1024, samples: 1000 }, /more than the record's 1000/],
    ['band.highHz', recipe, { sampleRateHz: 300, samples: 8192 }, /Nyquist frequency 150 Hz/],
    ['band', parseRecipe({ ...BASE_RECIPE, band: { lowHz: 10.2, highHz: 10.8 } }), { sampleRateHz: 1024, samples: 8192 }, /holds no frequency line/],
    ['frequencyResolutionHz', parseRecipe({ ...noBlockRecipe(), frequencyResolutionHz: 0.001 }), { sampleRateHz: 1e5, samples: 1e6 }, /above 16777216/],
    ['frequencyResolutionHz', parseRecipe({ ...noBlockRecipe(), frequencyResolutionHz: 0.01 }), { sampleRateHz: 1024, samples: 8192 }, /more than the record's/],
  ])('throws naming %s', (field, r, record, message) => {
    const e = fieldOf(() => resolveRecipe(r, record));
    expect(e.field).toBe(field);
    expect(e.message).toMatch(message);
  });
});

function noBlockRecipe() {
  const { blockLength: _b, ...rest } = BASE_RECIPE;
  return rest;
}
