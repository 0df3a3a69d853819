/**
 * Use cases of the lab's register of approved standards: list and filter by scope ("which
 * approved recipe covers a structure like this?": a structure type, the band it needs, its
 * damping, the excitation), read one with its signature, retire it, and the lifecycle view of a
 * recipe's versions.
 */
import type { RecipeLifecycle, Scope, Standard, StandardListQuery } from '@/shared/api/approval';
import { evidenceStudyIds, findDecision, latestSubmissionByVersion, moveVersionState, submissionPurpose, versionStates } from '../db/approval';
import type { Db } from '../db/knex';
import { endStandard, excitationsOf, findStandard, listStandards, standardById, standardByVersion, type StandardRow } from '../db/standards';
import { findResource } from '../db/versioned';
import { AppError, notFound } from '../errors';
import { recipeSettings } from '../reports/recipe-settings';
import { recordAudit } from './audit';
import { signatureOf } from './signature';

export function scopeOf(s: StandardRow): Scope {
  return {
    structureType: s.structure_type,
    band: { lowHz: Number(s.band_low_hz), highHz: Number(s.band_high_hz) },
    dampingPercent: { min: Number(s.damping_min_percent), max: Number(s.damping_max_percent) },
    excitations: excitationsOf(s.excitations) as Scope['excitations'],
  };
}

async function standardView(db: Db, s: StandardRow): Promise<Standard> {
  const d = await findDecision(db, s.submission_id);
  if (!d) throw new Error(`standard ${s.id} has no decision`);
  const studyIds = await evidenceStudyIds(db, s.submission_id);
  const link = async (id: string | null) => {
    const row = id ? await standardById(db, id) : undefined;
    return row ? { id: row.id, recipeVersion: row.recipe_version } : null;
  };
  return {
    id: s.id,
    labId: s.lab_id,
    recipe: { id: s.recipe_id, version: s.recipe_version, name: s.recipe_name },
    scope: scopeOf(s),
    purpose: await submissionPurpose(db, s.submission_id),
    effectiveAt: Number(s.effective_at),
    reviewDueAt: Number(s.review_due_at),
    status: s.status,
    supersedes: await link(s.supersedes_id),
    supersededBy: await link(s.superseded_by_id),
    ended: s.ended_at === null ? null : { at: Number(s.ended_at), by: s.ended_by ? { id: s.ended_by, displayName: s.ended_by_name ?? '' } : null, reason: s.end_reason ?? '' },
    signature: await signatureOf(db, d),
    submissionId: s.submission_id,
    evidenceStudyIds: studyIds,
    settings: await recipeSettings(db, s.recipe_id, s.recipe_version, studyIds),
  };
}

export async function getStandard(db: Db, labId: string, id: string): Promise<Standard> {
  const row = await findStandard(db, labId, id);
  if (!row) throw notFound(`Standard ${id}`);
  return standardView(db, row);
}

export async function listLabStandards(db: Db, labId: string, query: StandardListQuery) {
  if (query.lowHz !== undefined && query.highHz !== undefined && query.lowHz >= query.highHz) {
    throw new AppError(400, 'invalid_request', `lowHz=${query.lowHz} must be below highHz=${query.highHz}`, { fields: [{ path: 'lowHz', message: 'must be below highHz' }] });
  }
  const { rows, total } = await listStandards(db, labId, query);
  const items: Standard[] = [];
  for (const r of rows) items.push(await standardView(db, r));
  return { items, total, limit: query.limit, offset: query.offset };
}

/** Retires an active standard: it leaves the register's active list; its record stays. */
export async function retireStandard(db: Db, labId: string, userId: string, id: string, reason: string): Promise<Standard> {
  await db.transaction(async (trx) => {
    const row = await findStandard(trx, labId, id);
    if (!row) throw notFound(`Standard ${id}`);
    if (row.status !== 'active') throw new AppError(409, 'standard_ended', `This standard is already ${row.status}.`);
    const at = Date.now();
    await endStandard(trx, id, { status: 'retired', at, by: userId, reason });
    await moveVersionState(trx, row.recipe_id, row.recipe_version, ['approved'], 'retired', at);
    await recordAudit(trx, {
      labId, actorUserId: userId, action: 'standards.retire', targetType: 'standard', targetId: id,
      before: { status: 'active' }, after: { status: 'retired', reason, recipe: { id: row.recipe_id, version: row.recipe_version } },
    });
  });
  return getStandard(db, labId, id);
}

/** Every version of a recipe with its lifecycle state, newest submission and standard. */
export async function recipeLifecycle(db: Db, labId: string, recipeId: string): Promise<RecipeLifecycle> {
  const head = await findResource(db, 'recipes', labId, recipeId);
  if (!head) throw notFound(`Recipe ${recipeId}`);
  const submissions = await latestSubmissionByVersion(db, recipeId);
  const versions: RecipeLifecycle['versions'] = [];
  for (const v of await versionStates(db, recipeId)) {
    versions.push({
      version: v.version,
      state: v.state,
      author: { id: v.author_id, displayName: v.author_name },
      createdAt: Number(v.created_at),
      stateChangedAt: v.state_changed_at === null ? null : Number(v.state_changed_at),
      submissionId: submissions.get(v.version) ?? null,
      standardId: (await standardByVersion(db, recipeId, v.version))?.id ?? null,
    });
  }
  return { recipeId, name: head.name, latestVersion: head.latest_version, versions };
}
