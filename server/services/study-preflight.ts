/**
 * The pre-flight check of a study: the recipe against each scenario (shared/engine/preflight),
 * run before anything is stored. A refusal answers 422 naming the scenario, the setting and the
 * fix in plain words; warnings go back to the form and are stored with the study.
 */
import type { PreflightFinding, StudyPreflight, StudyPreflightRequest } from '@/shared/api/preflight';
import { studyPreflightRequestSchema } from '@/shared/api/preflight';
import { findingText, preflight } from '@/shared/engine/preflight/check';
import type { Recipe } from '@/shared/engine/recipe';
import type { Db } from '../db/knex';
import { findResource, findVersion, type VersionedKind } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { checkedByEngine } from './engine-input';

/** The version asked for, or the latest; 404 when the resource or the version is not in the lab. */
export async function versionOf(db: Db, kind: VersionedKind, noun: string, labId: string, ref: { id: string; version?: number }) {
  const head = await findResource(db, kind, labId, ref.id);
  if (!head) throw notFound(`${noun} ${ref.id}`);
  const version = ref.version ?? head.latest_version;
  const row = await findVersion(db, kind, ref.id, version);
  if (!row) throw notFound(`Version ${version} of ${noun.toLowerCase()} ${ref.id}`);
  return row;
}

export interface CheckedPair extends StudyPreflight {
  recipe: { id: string; version: number; name: string };
  scenarios: { id: string; version: number; name: string }[];
}

/** Refusals and warnings of the recipe on every scenario, each finding named by its scenario. */
export async function checkStudyPair(db: Db, labId: string, input: StudyPreflightRequest): Promise<CheckedPair> {
  const body = studyPreflightRequestSchema.parse(input);
  const recipeRow = await versionOf(db, 'recipes', 'Recipe', labId, body.recipe);
  const recipe = JSON.parse(recipeRow.body) as Recipe;
  const refusals: PreflightFinding[] = [];
  const warnings: PreflightFinding[] = [];
  const scenarios: CheckedPair['scenarios'] = [];
  for (const ref of body.scenarios) {
    const row = await versionOf(db, 'scenarios', 'Scenario', labId, ref);
    const scenario = { id: ref.id, version: row.version, name: row.name };
    scenarios.push(scenario);
    const result = checkedByEngine(`scenario ${row.name}`, () => preflight(recipe, JSON.parse(row.body)));
    refusals.push(...result.refusals.map((f) => ({ scenario, ...f })));
    warnings.push(...result.warnings.map((f) => ({ scenario, ...f })));
  }
  return { recipe: { id: body.recipe.id, version: recipeRow.version, name: recipeRow.name }, scenarios, refusals, warnings };
}

/** 422 when any scenario refuses the recipe: the first refusal in words, all of them in details. */
export function refuseIfCannotRun(pair: CheckedPair): void {
  if (pair.refusals.length === 0) return;
  const first = pair.refusals[0];
  const more = pair.refusals.length > 1 ? ` There ${pair.refusals.length === 2 ? 'is 1 more problem' : `are ${pair.refusals.length - 1} more problems`} to fix first.` : '';
  throw new AppError(
    422,
    'study_cannot_run',
    `The recipe "${pair.recipe.name}" cannot run on the scenario "${first.scenario.name}": ${findingText(first)}${more}`,
    { refusals: pair.refusals },
  );
}
