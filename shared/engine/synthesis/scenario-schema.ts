/**
 * The JSON description of a scenario (zod 4): a known-answer system, how it is acquired, how it
 * is excited and which error sources are on. Units are in each field's description and in
 * docs/scenario-schema.md. Cross-field rules (sample counts, Nyquist, powers of two) are checked
 * by `resolveScenario` in plan.ts.
 */
import { z } from 'zod';
import { systemSpecSchema } from '../systems/schema';
import { excitationSchema } from './excitation-schema';
import { noiseSchema } from './noise';

const fullScale = z
  .union([z.number().positive(), z.literal('auto')])
  .default('auto')
  .describe("converter range ±V in the channel's unit, or 'auto' = 1.25 × the channel's largest sample");

export const quantisationSchema = z
  .object({
    bits: z.number().int().min(2).max(32).describe('converter resolution, bits (2…32)'),
    inputFullScale: fullScale,
    outputFullScale: fullScale,
  })
  .strict()
  .describe('ADC quantisation and overload on both channels (mid-tread)');

export const cubicStiffnessSchema = z
  .object({
    k3NPerM3: z.number().describe('cubic stiffness k₃ of the element, N/m³ (force k₃·δ³; 0 = linear, negative = softening)'),
    springIndex: z
      .number()
      .int()
      .min(0)
      .default(0)
      .describe('which spring of a physical system carries it (index into springs; 0 for an SDOF)'),
    oversampling: z
      .number()
      .int()
      .min(4)
      .max(64)
      .default(16)
      .describe('Runge–Kutta sub-steps per sample (4…64, default 16)'),
  })
  .strict()
  .describe('a cubic (Duffing) spring added to one linear spring; needs an sdof or physical system');

export const clippingSchema = z
  .object({
    inputLimitN: z.number().positive().optional().describe('force channel clips at ±limit, N'),
    outputLimit: z.number().positive().optional().describe("response channel clips at ±limit, in the output's unit"),
  })
  .strict()
  .refine((c) => c.inputLimitN !== undefined || c.outputLimit !== undefined, {
    message: 'give inputLimitN and/or outputLimit',
  })
  .describe('hard clipping of the conditioned signals before noise and ADC');

export const errorsSchema = z
  .object({
    inputNoise: noiseSchema.optional().describe('uncorrelated noise on the force channel'),
    outputNoise: noiseSchema.optional().describe('uncorrelated noise on the response channel'),
    delayS: z.number().optional().describe('delay of the response channel against the force channel, s'),
    gainMismatch: z.number().positive().optional().describe('response channel gain error as a ratio (1 = none)'),
    phaseMismatchDeg: z
      .number()
      .min(-180)
      .max(180)
      .optional()
      .describe('response channel phase error, degrees, on every line above DC'),
    quantisation: quantisationSchema.optional(),
    cubicStiffness: cubicStiffnessSchema.optional(),
    clipping: clippingSchema.optional(),
  })
  .strict()
  .describe('error sources, each off unless given');

export const acquisitionSchema = z
  .object({
    sampleRateHz: z.number().positive().max(1e7).describe('sample rate fs, Hz (≤ 1e7)'),
    durationS: z.number().positive().describe('record duration, s (64 to 2^23 samples)'),
    start: z
      .enum(['steady-state', 'from-rest'])
      .optional()
      .describe("'steady-state' (default for random, periodic and chirp) or 'from-rest' (default for burst random and impact)"),
  })
  .strict();

export const scenarioSchema = z
  .object({
    name: z.string().min(1).max(200).describe('scenario name'),
    description: z.string().max(4000).optional().describe('what the scenario represents'),
    expectation: z.string().max(4000).optional().describe('what a good recipe should show on it'),
    system: systemSpecSchema,
    acquisition: acquisitionSchema,
    excitation: excitationSchema,
    errors: errorsSchema.default({}),
  })
  .strict();

/** A validated scenario with its defaults filled in. */
export type Scenario = z.infer<typeof scenarioSchema>;
/** A scenario as written (defaults optional). */
export type ScenarioInput = z.input<typeof scenarioSchema>;
export type ScenarioErrors = z.infer<typeof errorsSchema>;
