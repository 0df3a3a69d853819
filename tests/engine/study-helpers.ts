/**
 * Shared inputs for the study, advice and bench tests: small invented scenarios and recipes in
 * the style of the Harbor Ridge Test Lab demo (names only; the systems are plain textbook SDOFs).
 */
import type { Recipe } from '@/shared/engine/recipe';
import type { ScenarioInput } from '@/shared/engine/scenario';

export function sdofRandomScenario(over: { name?: string; fn?: number; zeta?: number; snrDb?: number; durationS?: number; fs?: number; delayS?: number } = {}): ScenarioInput {
  const errors: Record<string, unknown> = {};
  if (over.snrDb !== undefined) errors.outputNoise = { snrDb: over.snrDb };
  if (over.delayS !== undefined) errors.delayS = over.delayS;
  return {
    name: over.name ?? 'Harbor Ridge bench SDOF, random force',
    system: {
      kind: 'sdof',
      quantity: 'receptance',
      naturalFrequencyHz: over.fn ?? 50,
      dampingRatio: over.zeta ?? 0.02,
      stiffnessNPerM: 1e5,
    },
    acquisition: { sampleRateHz: over.fs ?? 256, durationS: over.durationS ?? 128 },
    excitation: { kind: 'random', band: { lowHz: 0, highHz: 120 }, level: { rmsN: 10 } },
    errors,
  } as ScenarioInput;
}

export function hannRecipe(over: Partial<Recipe> = {}): Recipe {
  return {
    name: 'Harbor Ridge draft: Hann, 50 % overlap, H1',
    blockLength: 1024,
    window: 'hann',
    overlap: 0.5,
    detrend: 'none',
    estimator: 'H1',
    band: { lowHz: 30, highHz: 70 },
    scaling: 'density',
    tolerances: { magnitudeDb: 1, phaseDeg: 5, coveragePercent: 90 },
    ...over,
  } as Recipe;
}

/** Serialises a value with typed arrays as their raw bytes, so equal strings mean equal bits. */
export function toBytes(value: unknown): string {
  return JSON.stringify(value, (_key, v) => {
    if (v instanceof Float64Array || v instanceof Uint8Array) {
      return { typed: v.constructor.name, bytes: Buffer.from(v.buffer, v.byteOffset, v.byteLength).toString('base64') };
    }
    if (typeof v === 'number' && (!Number.isFinite(v) || Object.is(v, -0))) return `number:${Object.is(v, -0) ? '-0' : v}`;
    return v;
  });
}
