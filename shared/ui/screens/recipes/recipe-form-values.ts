/**
 * The recipe editor's form: the create body of the API (the definition carries its name), the
 * Harbor Ridge frame survey as a start, and the choices of the engine's recipe schema.
 */
import type { z } from 'zod';
import { recipeCreateSchema } from '@/shared/api/work';
import type { Recipe } from '@/shared/engine/recipe';

export const recipeFormSchema = recipeCreateSchema;
export type RecipeFormValues = z.input<typeof recipeFormSchema>;

export const windowOptions = [
  { value: 'rectangular', label: 'Rectangular' },
  { value: 'hann', label: 'Hann' },
  { value: 'hamming', label: 'Hamming' },
  { value: 'flattop', label: 'Flat-top' },
  { value: 'blackman-harris', label: 'Blackman-Harris' },
  { value: 'kaiser', label: 'Kaiser' },
] as const;

export const estimatorOptions = [
  { value: 'H1', label: 'H1 = Gyx/Gxx' },
  { value: 'H2', label: 'H2 = Gyy/Gxy' },
  { value: 'Hv', label: 'Hv (total least squares)' },
] as const;

export const detrendOptions = [
  { value: 'none', label: 'None' },
  { value: 'mean', label: 'Mean' },
  { value: 'linear', label: 'Linear' },
] as const;

export const scalingOptions = [
  { value: 'density', label: 'Density (unit²/Hz)' },
  { value: 'spectrum', label: 'Spectrum (unit²)' },
] as const;

export function startingRecipe(): Recipe {
  return {
    name: '',
    description: '',
    blockLength: 4096,
    window: 'hann',
    overlap: 0.5,
    averages: 'all',
    detrend: 'mean',
    estimator: 'H1',
    band: { lowHz: 20, highHz: 120 },
    scaling: 'density',
    tolerances: { magnitudeDb: 1, phaseDeg: 6, resonanceFrequencyPercent: 0.5, dampingPercent: 25, minCoherence: 0.8 },
  };
}

/** Transient processing fields when switched on (impact testing): common practice starting values. */
export const transientStart = { forceWindowFraction: 0.05, exponentialDecayFraction: 0.25, triggerLevelFraction: 0.1, pretriggerFraction: 0.01 };

export const toleranceFields = [
  { key: 'magnitudeDb', label: 'Magnitude error within ±', unit: 'dB' },
  { key: 'phaseDeg', label: 'Phase error within ±', unit: '°' },
  { key: 'complexRelative', label: 'Complex relative error below', unit: '' },
  { key: 'resonanceFrequencyPercent', label: 'Resonance frequency error within ±', unit: '%' },
  { key: 'dampingPercent', label: 'Damping error within ±', unit: '%' },
  { key: 'coveragePercent', label: 'Confidence-band coverage at least', unit: '%' },
  { key: 'minCoherence', label: 'Coherence at least', unit: '' },
] as const;
