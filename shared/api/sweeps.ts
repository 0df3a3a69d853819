/**
 * Schemas of sweep studies: start one (a recipe and a scenario of the lab, one or two settings
 * with their values, seeds), read it with its progress, and read its judged grid points with the
 * cheapest passing point. The engine (shared/engine/sweep.ts) checks the grid itself and answers
 * with words naming the setting and value.
 */
import { z } from 'zod';
import { MAX_SWEEP_POINTS, MAX_SWEEP_VALUES, SWEEP_SETTING_NAMES } from '@/shared/engine/sweep';
import { criterionSchema, MAX_STUDY_RUNS, studyProgressSchema, studyStatusSchema } from './work';

const id = z.string().min(1).max(100);
const value = z.union([z.number(), z.string().max(40)]);

export const sweepAxisSchema = z.object({
  setting: z.enum(SWEEP_SETTING_NAMES as [string, ...string[]]),
  values: z.array(value).min(1).max(MAX_SWEEP_VALUES),
});

export const startSweepSchema = z
  .object({
    name: z.string().trim().min(1).max(200),
    recipe: z.object({ id, version: z.number().int().min(1).optional() }),
    scenario: z.object({ id, version: z.number().int().min(1).optional() }),
    /** One or two settings; the first varies slowest in the grid. */
    vary: z.array(sweepAxisSchema).min(1).max(2),
    /** Monte Carlo seeds at every grid point (the same seeds at each). */
    seeds: z.number().int().min(1).max(1000),
    baseSeed: z.number().int().min(0).max(2 ** 40).default(1),
  })
  .refine((s) => s.vary.reduce((n, a) => n * a.values.length, 1) <= MAX_SWEEP_POINTS, {
    path: ['vary'],
    message: `A sweep may hold at most ${MAX_SWEEP_POINTS} grid points`,
  })
  .refine((s) => s.vary.reduce((n, a) => n * a.values.length, 1) * s.seeds <= MAX_STUDY_RUNS, {
    path: ['seeds'],
    message: `A sweep may hold at most ${MAX_STUDY_RUNS} runs (grid points × seeds), as a study`,
  });
export type StartSweepRequest = z.input<typeof startSweepSchema>;

const ref = z.object({ id: z.string(), version: z.number().int(), name: z.string() });

export const sweepSchema = z.object({
  id: z.string(),
  labId: z.string(),
  name: z.string(),
  status: studyStatusSchema,
  recipe: ref,
  scenario: ref,
  vary: z.array(sweepAxisSchema),
  points: z.number().int(),
  seeds: z.number().int(),
  baseSeed: z.number().int(),
  progress: studyProgressSchema,
  engineVersion: z.string(),
  error: z.string().nullable(),
  createdAt: z.number().int(),
  finishedAt: z.number().int().nullable(),
});
export type Sweep = z.infer<typeof sweepSchema>;
export const sweepListSchema = z.object({ items: z.array(sweepSchema) });

const settings = z.record(z.string(), value);

export const sweepPointSchema = z.object({
  index: z.number().int(),
  settings,
  blockLength: z.number().int(),
  frequencyResolutionHz: z.number(),
  averages: z.number().int(),
  measurementTimeS: z.number(),
  /** False when a run of the point failed in the engine; `error` says why. */
  ran: z.boolean(),
  error: z.string().nullable(),
  pass: z.boolean(),
  criteria: z.array(criterionSchema),
  /** Criterion id → its figure on each seed, in seed order. */
  perSeed: z.record(z.string(), z.array(z.number().nullable())),
  warnings: z.array(z.object({ message: z.string(), runs: z.number().int() })),
  /** The point's recipe, ready to be saved as a recipe of the lab. */
  recipe: z.record(z.string(), z.unknown()),
});
export type SweepPoint = z.infer<typeof sweepPointSchema>;

export const sweepResultsSchema = z.object({
  sweepId: z.string(),
  status: studyStatusSchema,
  vary: z.array(sweepAxisSchema),
  seeds: z.array(z.number().int()),
  points: z.array(sweepPointSchema),
  cheapestPassing: z
    .object({ index: z.number().int(), points: z.array(z.number().int()), settings, measurementTimeS: z.number() })
    .nullable(),
  statement: z.string(),
});
export type SweepResults = z.infer<typeof sweepResultsSchema>;
