/**
 * Schemas of the pre-flight check of a recipe against a study's scenarios: the findings the engine
 * gives (shared/engine/preflight), each named by its scenario. Refusals stop a study from starting
 * (422, nothing stored); warnings are stored with the study and shown with its results.
 */
import { z } from 'zod';
import { PREFLIGHT_REFUSAL_CODES, PREFLIGHT_WARNING_CODES } from '@/shared/engine/preflight/findings';

const id = z.string().min(1).max(100);

export const preflightFindingSchema = z.object({
  scenario: z.object({ id: z.string(), version: z.number().int(), name: z.string() }),
  code: z.enum([...PREFLIGHT_REFUSAL_CODES, ...PREFLIGHT_WARNING_CODES]),
  severity: z.enum(['refusal', 'warning']),
  /** Stable key of the setting concerned (a recipe field, or scenario.* for the scenario). */
  setting: z.string(),
  settingLabel: z.string(),
  message: z.string(),
  fix: z.string(),
});
export type PreflightFinding = z.infer<typeof preflightFindingSchema>;

/** The pair to check: a recipe and the scenarios of a study (latest versions if not given). */
export const studyPreflightRequestSchema = z.object({
  recipe: z.object({ id, version: z.number().int().min(1).optional() }),
  scenarios: z.array(z.object({ id, version: z.number().int().min(1).optional() })).min(1).max(50),
});
export type StudyPreflightRequest = z.input<typeof studyPreflightRequestSchema>;

export const studyPreflightSchema = z.object({
  refusals: z.array(preflightFindingSchema),
  warnings: z.array(preflightFindingSchema),
});
export type StudyPreflight = z.infer<typeof studyPreflightSchema>;
