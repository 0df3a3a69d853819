/**
 * The scenario editor's form: the create body of the API (the definition carries its own name),
 * a starting scenario from the Harbor Ridge fan frame, and the starting fields of each excitation
 * kind and error source, in the units of the engine's scenario schema.
 */
import type { z } from 'zod';
import { scenarioCreateSchema } from '@/shared/api/work';
import type { ScenarioInput } from '@/shared/engine/scenario';
import type { ExcitationSpec } from '@/shared/engine/synthesis/excitation-schema';

export const scenarioFormSchema = scenarioCreateSchema;
export type ScenarioFormValues = z.input<typeof scenarioFormSchema>;
export type ExcitationKind = ExcitationSpec['kind'];
type ExcitationInput = ScenarioInput['excitation'];

export const excitationOptions = [
  { value: 'random', label: 'Random' },
  { value: 'burst-random', label: 'Burst random' },
  { value: 'periodic-random', label: 'Periodic random' },
  { value: 'pseudo-random', label: 'Pseudo-random' },
  { value: 'chirp', label: 'Chirp' },
  { value: 'impact', label: 'Impact' },
] as const;

export function startingScenario(): ScenarioInput {
  return {
    name: '',
    description: '',
    system: {
      kind: 'modal',
      quantity: 'receptance',
      modes: [
        { naturalFrequencyHz: 36, dampingRatio: 0.012, modalConstant: 0.03 },
        { naturalFrequencyHz: 46, dampingRatio: 0.0055, modalConstant: 0.02 },
        { naturalFrequencyHz: 53, dampingRatio: 0.009, modalConstant: 0.015 },
      ],
    },
    acquisition: { sampleRateHz: 512, durationS: 64 },
    excitation: { kind: 'random', band: { lowHz: 10, highHz: 150 }, level: { rmsN: 20 } },
    errors: { outputNoise: { snrDb: 20 } },
  };
}

/** The fields of an excitation kind, keeping the band and level already chosen. */
export function excitationAs(kind: ExcitationKind, previous: ExcitationInput, fs: number): ExcitationInput {
  const band = 'band' in previous && previous.band ? previous.band : { lowHz: 0, highHz: Math.floor(0.3 * fs) };
  const level = previous.level ?? { rmsN: 10 };
  // Periods: a power-of-two number of samples near one second.
  const period = 2 ** Math.round(Math.log2(Math.max(64, fs))) / fs;
  switch (kind) {
    case 'random':
      return { kind, band, level };
    case 'burst-random':
      return { kind, band, level, blockLengthS: period, burstFraction: 0.5 };
    case 'periodic-random':
      return { kind, band, level, periodS: period, periodsPerRealisation: 3 };
    case 'pseudo-random':
      return { kind, band, level, periodS: period };
    case 'chirp':
      return { kind, band, level, periodS: period, sweep: 'linear' };
    case 'impact':
      return { kind, level: 'peakN' in level ? level : { peakN: 200 }, pulseDurationS: Math.max(2 / fs, 0.002), periodS: period };
  }
}

/** Starting values when an error source is switched on. */
export const errorStart = {
  inputNoise: { snrDb: 30 },
  outputNoise: { snrDb: 20 },
  delayS: 0.0005,
  gainMismatch: 1.02,
  phaseMismatchDeg: 2,
  quantisation: { bits: 12, inputFullScale: 'auto', outputFullScale: 'auto' },
  cubicStiffness: { k3NPerM3: 1e10, springIndex: 0, oversampling: 16 },
  clipping: { inputLimitN: 50 },
} as const;
export type ErrorSource = keyof typeof errorStart;
