/**
 * The JSON description of an excitation (zod 4). Forces in N, times in s, frequencies in Hz.
 * Kinds used in the trade: random, burst random, periodic random, pseudo-random, chirp, impact.
 * Cross-field rules that need the sample rate (band below Nyquist, whole numbers of samples,
 * powers of two) are checked in scenario.ts.
 */
import { z } from 'zod';

const positive = (what: string) => z.number().positive().describe(what);

export const bandSchema = z
  .object({
    lowHz: z.number().min(0).describe('lower band edge, Hz (≥ 0)'),
    highHz: positive('upper band edge, Hz (below fs/2)'),
  })
  .strict()
  .refine((b) => b.lowHz < b.highHz, { message: 'lowHz must be below highHz', path: ['lowHz'] })
  .describe('frequency band, Hz');

export const levelSchema = z
  .union([
    z.object({ rmsN: positive('RMS force over the record, N') }).strict(),
    z.object({ peakN: positive('largest absolute force sample over the record, N') }).strict(),
  ])
  .describe('excitation level: { rmsN } or { peakN }');

const randomSchema = z
  .object({
    kind: z.literal('random'),
    band: bandSchema,
    level: levelSchema,
  })
  .strict()
  .describe('stationary Gaussian random force, flat spectrum over the band (built in the frequency domain)');

const burstRandomSchema = z
  .object({
    kind: z.literal('burst-random'),
    band: bandSchema,
    blockLengthS: positive('length of each burst block, s (a whole number of samples)'),
    burstFraction: z.number().gt(0).max(1).describe('fraction of each block the burst is on, (0, 1]'),
    offsetS: z.number().min(0).default(0).describe('start of the burst within its block, s (default 0)'),
    level: levelSchema,
  })
  .strict()
  .describe('band-limited random force switched on for a fraction of each block');

const periodicRandomSchema = z
  .object({
    kind: z.literal('periodic-random'),
    band: bandSchema,
    periodS: positive('period, s (a power-of-two number of samples)'),
    periodsPerRealisation: z
      .number()
      .int()
      .min(1)
      .max(1000)
      .default(3)
      .describe('periods each random realisation is repeated before the next one (default 3)'),
    level: levelSchema,
  })
  .strict()
  .describe('random multisine (Gaussian line amplitudes and phases) on the lines k/period, repeated, then renewed');

const pseudoRandomSchema = z
  .object({
    kind: z.literal('pseudo-random'),
    band: bandSchema,
    periodS: positive('period, s (a power-of-two number of samples)'),
    level: levelSchema,
  })
  .strict()
  .describe('one period of a flat-magnitude, random-phase multisine repeated over the whole record');

const chirpSchema = z
  .object({
    kind: z.literal('chirp'),
    band: bandSchema,
    periodS: positive('sweep period, s (a whole number of samples)'),
    sweep: z.enum(['linear', 'log']).default('linear').describe("frequency law of the sweep (default 'linear')"),
    level: levelSchema,
  })
  .strict()
  .describe('sine sweep from band.lowHz to band.highHz over each period, repeated');

const impactSchema = z
  .object({
    kind: z.literal('impact'),
    pulseDurationS: positive('half-sine pulse duration, s (at least 2 samples)'),
    periodS: positive('time between impacts, s (a whole number of samples)'),
    offsetS: z
      .number()
      .min(0)
      .optional()
      .describe('time of the first hit within each period, s (default 5 % of the period)'),
    doubleHit: z
      .object({
        delayS: positive('delay of the second hit after the first, s'),
        amplitudeRatio: z.number().gt(0).max(1).describe('second-hit amplitude ÷ first, (0, 1]'),
      })
      .strict()
      .optional()
      .describe('an optional second hit (hammer bounce)'),
    level: levelSchema,
  })
  .strict()
  .describe('half-sine force pulses (a hammer hit), repeated every period');

export const excitationSchema = z
  .discriminatedUnion('kind', [
    randomSchema,
    burstRandomSchema,
    periodicRandomSchema,
    pseudoRandomSchema,
    chirpSchema,
    impactSchema,
  ])
  .describe('the force applied at the input point');

export type Band = z.infer<typeof bandSchema>;
export type Level = z.infer<typeof levelSchema>;
export type ExcitationSpec = z.infer<typeof excitationSchema>;
export type ExcitationKind = ExcitationSpec['kind'];
