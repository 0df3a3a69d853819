/**
 * A processing recipe: how a lab turns a two-channel record into an FRF (block length or
 * frequency resolution, window, overlap, averages, detrending, estimator, band, transient
 * windows) and the tolerances the result is judged against.
 *
 * `parseRecipe` validates a recipe on its own (unknown keys are errors, so a misspelt field is
 * not silently ignored); `resolveRecipe` checks it against a record (sample rate, length) and
 * turns a requested frequency resolution into a block length. Both throw EngineInputError
 * naming the field path and the value; adjustments are returned as warnings.
 */
import { z } from 'zod';
import type { WindowName } from './types';
import { EngineInputError } from './errors';
import { isPowerOfTwo } from './fft';
import { MAX_KAISER_BETA, WINDOW_NAMES } from './windows';
import { decisionRulesSchema } from './scores/decision-rules';

/** Largest block length a recipe may ask for (2^24 samples). */
export const MAX_BLOCK_LENGTH = 2 ** 24;

const positive = z.number().gt(0, { error: 'must be > 0' });
const fractionOpen = (rule: string) => z.number().gt(0, { error: rule }).lte(1, { error: rule });

export const recipeSchema = z.strictObject({
  name: z.string().trim().min(1, { error: 'must not be empty' }),
  description: z.string().optional(),
  blockLength: z
    .number()
    .refine((n) => isPowerOfTwo(n) && n >= 4 && n <= MAX_BLOCK_LENGTH, {
      error: `must be a power of two in [4, ${MAX_BLOCK_LENGTH}]`,
    })
    .optional(),
  frequencyResolutionHz: positive.optional(),
  window: z.enum(WINDOW_NAMES as unknown as [WindowName, ...WindowName[]], { error: `must be one of ${WINDOW_NAMES.join(', ')}` }),
  windowParams: z
    .strictObject({
      kaiserBeta: z
        .number()
        .min(0, { error: `must be in [0, ${MAX_KAISER_BETA}]` })
        .max(MAX_KAISER_BETA, { error: `must be in [0, ${MAX_KAISER_BETA}]` })
        .optional(),
    })
    .optional(),
  overlap: z.number().min(0, { error: 'must be in [0, 1)' }).lt(1, { error: 'must be in [0, 1)' }),
  averages: z
    .union([z.number().int().min(1), z.literal('all')], { error: 'must be an integer ≥ 1 or "all"' })
    .optional(),
  detrend: z.enum(['none', 'mean', 'linear'], { error: 'must be one of none, mean, linear' }),
  estimator: z.enum(['H1', 'H2', 'Hv'], { error: 'must be one of H1, H2, Hv' }),
  hvWeight: positive.optional(),
  band: z.strictObject({
    lowHz: z.number().min(0, { error: 'must be ≥ 0' }),
    highHz: positive,
  }),
  scaling: z.enum(['density', 'spectrum'], { error: 'must be one of density, spectrum' }),
  transient: z
    .strictObject({
      forceWindowFraction: fractionOpen('must be in (0, 1]'),
      exponentialDecayFraction: positive,
      triggerLevelFraction: fractionOpen('must be in (0, 1]'),
      pretriggerFraction: z.number().min(0, { error: 'must be in [0, 1)' }).lt(1, { error: 'must be in [0, 1)' }),
    })
    .optional(),
  tolerances: z.strictObject({
    magnitudeDb: positive.optional(),
    phaseDeg: positive.optional(),
    complexRelative: positive.optional(),
    resonanceFrequencyPercent: positive.optional(),
    dampingPercent: positive.optional(),
    coveragePercent: z.number().gt(0, { error: 'must be in (0, 100]' }).lte(100, { error: 'must be in (0, 100]' }).optional(),
    minCoherence: z.number().min(0, { error: 'must be in [0, 1]' }).max(1, { error: 'must be in [0, 1]' }).optional(),
  }),
  /** Decision rule per criterion id (scores/decision-rules.ts); simple acceptance where not given. */
  decisionRules: decisionRulesSchema.optional(),
});

export type Recipe = z.infer<typeof recipeSchema>;

/** Validates `json` as a Recipe; throws EngineInputError naming the first bad field. */
export function parseRecipe(json: unknown): Recipe {
  const result = recipeSchema.safeParse(json);
  if (!result.success) {
    const issue = result.error.issues[0];
    const path = issue.path.map(String);
    if (issue.code === 'unrecognized_keys') {
      const key = [...path, issue.keys[0]].join('.');
      throw new EngineInputError(key, valueAt(json, [...path, issue.keys[0]]), 'is not a recipe field');
    }
    const value = valueAt(json, path);
    const rule = value === undefined && path.length > 0 ? 'is required' : ruleOf(issue.message);
    throw new EngineInputError(path.join('.') || 'recipe', value, rule);
  }
  const r = result.data;
  if (r.blockLength === undefined && r.frequencyResolutionHz === undefined) {
    throw new EngineInputError('blockLength', undefined, 'or frequencyResolutionHz must be given');
  }
  if (r.blockLength !== undefined && r.frequencyResolutionHz !== undefined) {
    throw new EngineInputError(
      'frequencyResolutionHz',
      r.frequencyResolutionHz,
      `cannot be given together with blockLength=${r.blockLength}`,
    );
  }
  if (r.window === 'kaiser' && r.windowParams?.kaiserBeta === undefined) {
    throw new EngineInputError('windowParams.kaiserBeta', undefined, 'is required for the kaiser window');
  }
  if (r.transient && r.transient.forceWindowFraction <= r.transient.pretriggerFraction) {
    // The force window is unity from the block start; ending at or before the trigger it would cut
    // the impact itself.
    throw new EngineInputError(
      'transient.forceWindowFraction',
      r.transient.forceWindowFraction,
      `must exceed transient.pretriggerFraction=${r.transient.pretriggerFraction}`,
    );
  }
  if (r.band.lowHz >= r.band.highHz) {
    throw new EngineInputError('band.lowHz', r.band.lowHz, `must be below band.highHz=${r.band.highHz}`);
  }
  return r;
}

function ruleOf(message: string): string {
  return message.replace(/^Invalid (input|option): /, '');
}

function valueAt(json: unknown, path: string[]): unknown {
  let v: unknown = json;
  for (const key of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[key];
  }
  return v;
}

/** A recipe checked against a record's sample rate and length. */
export interface ResolvedRecipe {
  blockLength: number;
  frequencyResolutionHz: number;
  /** Blocks to average, or undefined for all the record allows. */
  averages?: number;
  /** Line range inside the band, inclusive–exclusive. */
  bandIndices: { start: number; end: number };
  /** Pretrigger in samples (transient processing only). */
  pretriggerSamples: number;
  warnings: string[];
}

/**
 * The block length N a recipe asks for at `sampleRateHz`: its blockLength, or the shortest
 * power-of-two block whose line spacing fs/N is no coarser than its frequencyResolutionHz.
 * Not checked against a record or MAX_BLOCK_LENGTH here (resolveRecipe does that).
 */
export function recipeBlockLength(recipe: Pick<Recipe, 'blockLength' | 'frequencyResolutionHz'>, sampleRateHz: number): number {
  if (recipe.frequencyResolutionHz !== undefined) {
    return 2 ** Math.max(2, Math.ceil(Math.log2(sampleRateHz / recipe.frequencyResolutionHz) - 1e-12));
  }
  return recipe.blockLength ?? 0;
}

/**
 * Resolves `recipe` for a record of `samples` samples at `sampleRateHz`. A frequency resolution
 * becomes the shortest power-of-two block whose line spacing fs/N is no coarser than asked.
 */
export function resolveRecipe(recipe: Recipe, record: { sampleRateHz: number; samples: number }): ResolvedRecipe {
  const fs = record.sampleRateHz;
  const warnings: string[] = [];
  const blockLength = recipeBlockLength(recipe, fs);
  if (recipe.frequencyResolutionHz !== undefined) {
    const df = recipe.frequencyResolutionHz;
    if (blockLength > MAX_BLOCK_LENGTH) {
      throw new EngineInputError('frequencyResolutionHz', df, `needs a block of ${blockLength} samples, above ${MAX_BLOCK_LENGTH}`);
    }
    const actual = fs / blockLength;
    if (Math.abs(actual - df) > 1e-9 * df) {
      warnings.push(
        `frequencyResolutionHz=${df} resolved to blockLength=${blockLength} (resolution ${formatHz(actual)} Hz)`,
      );
    }
  }
  if (blockLength > record.samples) {
    const field = recipe.blockLength !== undefined ? 'blockLength' : 'frequencyResolutionHz';
    const value = recipe.blockLength ?? recipe.frequencyResolutionHz;
    throw new EngineInputError(
      field,
      value,
      `needs ${blockLength} samples per block, more than the record's ${record.samples}`,
    );
  }
  const nyquist = fs / 2;
  if (recipe.band.highHz > nyquist) {
    throw new EngineInputError('band.highHz', recipe.band.highHz, `must not exceed the Nyquist frequency ${nyquist} Hz`);
  }
  const df = fs / blockLength;
  const start = Math.ceil(recipe.band.lowHz / df - 1e-9);
  const end = Math.min(blockLength / 2, Math.floor(recipe.band.highHz / df + 1e-9)) + 1;
  if (end <= start) {
    throw new EngineInputError(
      'band',
      recipe.band,
      `holds no frequency line at a resolution of ${formatHz(df)} Hz`,
    );
  }
  const averages = recipe.averages === undefined || recipe.averages === 'all' ? undefined : recipe.averages;
  const pretriggerSamples = recipe.transient ? Math.round(recipe.transient.pretriggerFraction * blockLength) : 0;
  if (recipe.transient && recipe.overlap > 0) {
    warnings.push(`overlap=${recipe.overlap} is not used: transient blocks are triggered and do not overlap`);
  }
  return { blockLength, frequencyResolutionHz: df, averages, bandIndices: { start, end }, pretriggerSamples, warnings };
}

function formatHz(hz: number): string {
  return Number(hz.toPrecision(6)).toString();
}
