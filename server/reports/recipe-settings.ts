/**
 * The settings summary of a stored recipe version, with the line spacing stated at the sample
 * rate of every scenario its evidence studies ran (shared/api/settings-summary.ts).
 */
import { settingsSummary, type SettingsSummary } from '@/shared/api/settings-summary';
import { parseRecipe } from '@/shared/engine/recipe';
import type { Db } from '../db/knex';
import { studyScenarios } from '../db/studies';
import { findVersion } from '../db/versioned';
import { scenarioOf } from '../services/scenario-definition';

/** The sample rates (Hz) of the scenarios of the given studies, distinct and ascending. */
export async function studySampleRates(db: Db, studyIds: readonly string[]): Promise<number[]> {
  const rates = new Set<number>();
  for (const id of studyIds) {
    for (const sc of await studyScenarios(db, id)) rates.add(scenarioOf(JSON.parse(sc.body)).acquisition.sampleRateHz);
  }
  return [...rates].sort((a, b) => a - b);
}

/** The summary of version `version` of recipe `recipeId`; null when the version is missing. */
export async function recipeSettings(db: Db, recipeId: string, version: number, studyIds: readonly string[]): Promise<SettingsSummary | null> {
  const row = await findVersion(db, 'recipes', recipeId, version);
  if (!row) return null;
  return settingsSummary({ id: recipeId, version, name: row.name }, parseRecipe(JSON.parse(row.body)), await studySampleRates(db, studyIds));
}
