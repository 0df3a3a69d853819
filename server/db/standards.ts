/**
 * Repository of the lab's register of approved standards. Scope, signature and dates are
 * immutable (trigger standards_signed_frozen); a standard only ends (retired or superseded) and
 * remembers the reminder it last sent. Damping is stored in percent of critical.
 */
import { randomUUID } from 'node:crypto';
import type { StandardListQuery } from '@/shared/api/approval';
import type { Db } from './knex';
import { likeEscaped } from './members';

export interface StandardRow {
  id: string;
  lab_id: string;
  recipe_id: string;
  recipe_version: number;
  recipe_name: string;
  submission_id: string;
  decision_id: string;
  structure_type: string;
  band_low_hz: number;
  band_high_hz: number;
  damping_min_percent: number;
  damping_max_percent: number;
  excitations: string;
  effective_at: number;
  review_due_at: number;
  status: 'active' | 'retired' | 'superseded';
  supersedes_id: string | null;
  superseded_by_id: string | null;
  ended_at: number | null;
  ended_by: string | null;
  ended_by_name: string | null;
  end_reason: string | null;
  reminded_for_due_at: number | null;
}

const COLUMNS = ['st.*', 'rv.name as recipe_name', 'eu.display_name as ended_by_name'];

function standards(db: Db) {
  return db({ st: 'standards' })
    .join({ rv: 'recipe_versions' }, (j) => j.on('rv.recipe_id', 'st.recipe_id').andOn('rv.version', 'st.recipe_version'))
    .leftJoin({ eu: 'users' }, 'eu.id', 'st.ended_by');
}

export const excitationsColumn = (kinds: readonly string[]) => `,${kinds.join(',')},`;
export const excitationsOf = (column: string) => column.split(',').filter(Boolean);

export interface NewStandard {
  labId: string;
  recipeId: string;
  recipeVersion: number;
  submissionId: string;
  decisionId: string;
  scope: { structureType: string; band: { lowHz: number; highHz: number }; dampingPercent: { min: number; max: number }; excitations: readonly string[] };
  effectiveAt: number;
  reviewDueAt: number;
  supersedesId: string | null;
}

export async function insertStandard(trx: Db, s: NewStandard): Promise<string> {
  const id = randomUUID();
  await trx('standards').insert({
    id,
    lab_id: s.labId,
    recipe_id: s.recipeId,
    recipe_version: s.recipeVersion,
    submission_id: s.submissionId,
    decision_id: s.decisionId,
    structure_type: s.scope.structureType,
    band_low_hz: s.scope.band.lowHz,
    band_high_hz: s.scope.band.highHz,
    damping_min_percent: s.scope.dampingPercent.min,
    damping_max_percent: s.scope.dampingPercent.max,
    excitations: excitationsColumn(s.scope.excitations),
    effective_at: s.effectiveAt,
    review_due_at: s.reviewDueAt,
    status: 'active',
    supersedes_id: s.supersedesId,
  });
  return id;
}

export function findStandard(db: Db, labId: string, id: string): Promise<StandardRow | undefined> {
  return standards(db).where({ 'st.lab_id': labId, 'st.id': id }).first(COLUMNS);
}

/** Active standards of a recipe at versions below `version` (the ones a newer approval supersedes). */
export function activeOlderStandards(db: Db, recipeId: string, version: number): Promise<StandardRow[]> {
  return standards(db).where({ 'st.recipe_id': recipeId, 'st.status': 'active' }).andWhere('st.recipe_version', '<', version).select(COLUMNS);
}

export async function endStandard(
  trx: Db,
  id: string,
  end: { status: 'retired' | 'superseded'; at: number; by: string | null; reason: string; supersededById?: string },
): Promise<boolean> {
  const n = await trx('standards')
    .where({ id, status: 'active' })
    .update({ status: end.status, ended_at: end.at, ended_by: end.by, end_reason: end.reason, superseded_by_id: end.supersededById ?? null });
  return n === 1;
}

function filtered(db: Db, labId: string, q: StandardListQuery) {
  const base = standards(db).where('st.lab_id', labId);
  if (q.status !== 'all') base.where('st.status', q.status);
  if (q.structureType) base.whereRaw("lower(st.structure_type) like ? escape '\\'", [likeEscaped(q.structureType.toLowerCase())]);
  if (q.lowHz !== undefined) base.where('st.band_low_hz', '<=', q.lowHz);
  if (q.highHz !== undefined) base.where('st.band_high_hz', '>=', q.highHz);
  if (q.dampingPercent !== undefined) base.where('st.damping_min_percent', '<=', q.dampingPercent).andWhere('st.damping_max_percent', '>=', q.dampingPercent);
  if (q.excitation) base.where('st.excitations', 'like', `%,${q.excitation},%`);
  if (q.dueBefore !== undefined) base.where('st.review_due_at', '<', q.dueBefore);
  return base;
}

/** A page of the register, newest effective first. */
export async function listStandards(db: Db, labId: string, q: StandardListQuery): Promise<{ rows: StandardRow[]; total: number }> {
  const count = await filtered(db, labId, q).count({ n: '*' }).first();
  const rows = await filtered(db, labId, q)
    .orderBy([{ column: 'st.effective_at', order: 'desc' }, { column: 'st.id' }])
    .limit(q.limit)
    .offset(q.offset)
    .select(COLUMNS);
  return { rows, total: Number(count?.n ?? 0) };
}

export function standardByVersion(db: Db, recipeId: string, version: number): Promise<{ id: string; recipe_version: number } | undefined> {
  return db('standards').where({ recipe_id: recipeId, recipe_version: version }).first('id', 'recipe_version');
}

export function standardById(db: Db, id: string): Promise<{ id: string; recipe_version: number } | undefined> {
  return db('standards').where({ id }).first('id', 'recipe_version');
}

/** Active standards of every lab whose review falls due before `until` and that have not been reminded for that due date. */
export function standardsDueForReminder(db: Db, until: number): Promise<StandardRow[]> {
  return standards(db)
    .where('st.status', 'active')
    .andWhere('st.review_due_at', '<=', until)
    .andWhere((w) => w.whereNull('st.reminded_for_due_at').orWhereRaw('st.reminded_for_due_at <> st.review_due_at'))
    .orderBy('st.review_due_at')
    .select(COLUMNS);
}

export async function markReminded(trx: Db, id: string, dueAt: number): Promise<void> {
  await trx('standards').where({ id }).update({ reminded_for_due_at: dueAt });
}
