/**
 * Repository of the review lifecycle: recipe version states, submissions with their evidence
 * studies, and decisions. Submissions, evidence and decisions are append-only (triggers refuse
 * UPDATE and DELETE); a submission's status is read from its decision. Every write takes the
 * transaction it runs in.
 */
import { randomUUID } from 'node:crypto';
import type { RecipeState } from '@/shared/api/approval';
import type { Db } from './knex';

export interface VersionStateRow {
  recipe_id: string;
  version: number;
  state: RecipeState;
  author_id: string;
  author_name: string;
  created_at: number;
  state_changed_at: number | null;
}

/** Every version of a recipe with its state, newest first. */
export function versionStates(db: Db, recipeId: string): Promise<VersionStateRow[]> {
  return db({ v: 'recipe_versions' })
    .join({ a: 'users' }, 'a.id', 'v.author_id')
    .where('v.recipe_id', recipeId)
    .orderBy('v.version', 'desc')
    .select('v.recipe_id', 'v.version', 'v.state', 'v.author_id', 'a.display_name as author_name', 'v.created_at', 'v.state_changed_at');
}

export async function versionState(db: Db, recipeId: string, version: number): Promise<RecipeState | undefined> {
  const row = await db('recipe_versions').where({ recipe_id: recipeId, version }).first('state');
  return row?.state;
}

/** Moves a version from one state to another; false when it was no longer in `from`. */
export async function moveVersionState(trx: Db, recipeId: string, version: number, from: RecipeState[], to: RecipeState, at: number): Promise<boolean> {
  const n = await trx('recipe_versions').where({ recipe_id: recipeId, version }).whereIn('state', from).update({ state: to, state_changed_at: at });
  return n === 1;
}

export interface SubmissionRow {
  id: string;
  lab_id: string;
  recipe_id: string;
  recipe_version: number;
  recipe_name: string;
  recipe_state: RecipeState;
  latest_version: number;
  scope_json: string;
  structure_type: string;
  purpose: string;
  justification: string | null;
  coverage_json: string;
  failing_json: string;
  submitted_by: string;
  submitted_by_name: string;
  submitted_at: number;
  decision_id: string | null;
  standard_id: string | null;
  standard_status: 'active' | 'retired' | 'superseded' | null;
  /** The next submission of the same recipe after this one, if any. */
  resubmitted_as: string | null;
}

export interface NewSubmission {
  labId: string;
  recipeId: string;
  recipeVersion: number;
  scope: unknown;
  structureType: string;
  purpose: string;
  justification: string | null;
  coverage: unknown;
  failing: unknown;
  studyIds: string[];
  submittedBy: string;
  at: number;
}

export async function insertSubmission(trx: Db, s: NewSubmission): Promise<string> {
  const id = randomUUID();
  await trx('review_submissions').insert({
    id,
    lab_id: s.labId,
    recipe_id: s.recipeId,
    recipe_version: s.recipeVersion,
    scope_json: JSON.stringify(s.scope),
    structure_type: s.structureType,
    purpose: s.purpose,
    justification: s.justification,
    coverage_json: JSON.stringify(s.coverage),
    failing_json: JSON.stringify(s.failing),
    submitted_by: s.submittedBy,
    submitted_at: s.at,
  });
  await trx('review_evidence').insert(s.studyIds.map((studyId, position) => ({ submission_id: id, position, study_id: studyId })));
  return id;
}

const SUBMISSION_COLUMNS = [
  's.*',
  'r.name as recipe_name',
  'r.latest_version',
  'v.state as recipe_state',
  'u.display_name as submitted_by_name',
  'd.id as decision_id',
  'st.id as standard_id',
  'st.status as standard_status',
];

/** The columns of a submission row, with the next submission of the same recipe. */
function submissionColumns(db: Db) {
  const next = db({ s2: 'review_submissions' })
    .whereRaw('s2.recipe_id = s.recipe_id')
    .andWhereRaw('(s2.submitted_at > s.submitted_at or (s2.submitted_at = s.submitted_at and s2.rowid > s.rowid))')
    .orderBy([{ column: 's2.submitted_at' }, { column: 's2.rowid' }])
    .limit(1)
    .select('s2.id');
  return [...SUBMISSION_COLUMNS, next.as('resubmitted_as')];
}

function submissions(db: Db) {
  return db({ s: 'review_submissions' })
    .join({ r: 'recipes' }, 'r.id', 's.recipe_id')
    .join({ v: 'recipe_versions' }, (j) => j.on('v.recipe_id', 's.recipe_id').andOn('v.version', 's.recipe_version'))
    .join({ u: 'users' }, 'u.id', 's.submitted_by')
    .leftJoin({ d: 'review_decisions' }, 'd.submission_id', 's.id')
    .leftJoin({ st: 'standards' }, 'st.decision_id', 'd.id');
}

export function findSubmission(db: Db, labId: string, id: string): Promise<SubmissionRow | undefined> {
  return submissions(db).where({ 's.lab_id': labId, 's.id': id }).first(submissionColumns(db));
}

export interface SubmissionFilter {
  status?: 'pending' | 'approved' | 'returned';
  recipeId?: string;
}

function filtered(db: Db, labId: string, f: SubmissionFilter) {
  const q = submissions(db).where('s.lab_id', labId);
  if (f.status === 'pending') q.whereNull('d.id');
  else if (f.status) q.where('d.decision', f.status);
  if (f.recipeId) q.where('s.recipe_id', f.recipeId);
  return q;
}

/** A page of a lab's submissions: pending ones oldest first (an inbox), others newest first. */
export async function listSubmissions(db: Db, labId: string, f: SubmissionFilter, page: { limit: number; offset: number }) {
  const count = await filtered(db, labId, f).count({ n: '*' }).first();
  const rows: SubmissionRow[] = await filtered(db, labId, f)
    .orderBy([{ column: 's.submitted_at', order: f.status === 'pending' ? 'asc' : 'desc' }, { column: 's.id' }])
    .limit(page.limit)
    .offset(page.offset)
    .select(submissionColumns(db));
  return { rows, total: Number(count?.n ?? 0) };
}

/** The newest submission of each version of a recipe. */
export async function latestSubmissionByVersion(db: Db, recipeId: string): Promise<Map<number, string>> {
  const rows = await db('review_submissions').where({ recipe_id: recipeId }).orderBy('submitted_at', 'asc').select('id', 'recipe_version');
  return new Map(rows.map((r: { id: string; recipe_version: number }) => [r.recipe_version, r.id]));
}

export async function evidenceStudyIds(db: Db, submissionId: string): Promise<string[]> {
  const rows = await db('review_evidence').where({ submission_id: submissionId }).orderBy('position').select('study_id');
  return rows.map((r: { study_id: string }) => r.study_id);
}

export interface DecisionRow {
  id: string;
  submission_id: string;
  lab_id: string;
  reviewer_id: string;
  reviewer_name: string;
  decision: 'approved' | 'returned';
  meaning: string | null;
  comment: string;
  reason: string | null;
  decided_at: number;
  engine_version: string;
  evidence_sha256: string;
  signature_sha256: string;
  /** The admin cooling period (days) the decision was checked against; null before it was kept. */
  admin_cooling_days: number | null;
}

export function findDecision(db: Db, submissionId: string): Promise<DecisionRow | undefined> {
  return db({ d: 'review_decisions' })
    .join({ u: 'users' }, 'u.id', 'd.reviewer_id')
    .where('d.submission_id', submissionId)
    .first('d.*', 'u.display_name as reviewer_name');
}

/** Every decision of a lab, oldest first (the audit trail's check re-computes each signature). */
export function labDecisions(db: Db, labId: string): Promise<DecisionRow[]> {
  return db({ d: 'review_decisions' })
    .join({ u: 'users' }, 'u.id', 'd.reviewer_id')
    .where('d.lab_id', labId)
    .orderBy(['d.decided_at', 'd.id'])
    .select('d.*', 'u.display_name as reviewer_name');
}

export async function insertDecision(trx: Db, d: Omit<DecisionRow, 'reviewer_name'>): Promise<void> {
  await trx('review_decisions').insert(d);
}

/** Members of a lab holding one of the roles (the recipients of review mail). */
export function membersWithRoles(db: Db, labId: string, roles: string[]): Promise<{ user_id: string; email: string; display_name: string; role: string }[]> {
  return db({ m: 'memberships' })
    .join({ u: 'users' }, 'u.id', 'm.user_id')
    .where('m.lab_id', labId)
    .whereIn('m.role', roles)
    .whereNull('u.disabled_at')
    .orderBy('u.email')
    .select('u.id as user_id', 'u.email', 'u.display_name', 'm.role');
}

export async function submissionPurpose(db: Db, id: string): Promise<string> {
  const row = await db('review_submissions').where({ id }).first('purpose');
  return row?.purpose ?? '';
}

/** The submission that used a study as evidence, preferring an approved one, newest first. */
export function submissionWithStudy(db: Db, labId: string, studyId: string): Promise<SubmissionRow | undefined> {
  return submissions(db)
    .join({ e: 'review_evidence' }, 'e.submission_id', 's.id')
    .where({ 's.lab_id': labId, 'e.study_id': studyId })
    .orderByRaw("case when d.decision = 'approved' then 0 else 1 end, s.submitted_at desc")
    .first(submissionColumns(db));
}

/** Who wrote each version of a recipe, every version (earlier and later ones alike). */
export function recipeAuthors(db: Db, recipeId: string): Promise<{ author_id: string; version: number }[]> {
  return db('recipe_versions').where('recipe_id', recipeId).orderBy('version').select('author_id', 'version');
}

/** The evidence studies of a submission a user started (name and start time). */
export function evidenceStudiesStartedBy(db: Db, submissionId: string, userId: string): Promise<{ id: string; name: string }[]> {
  return db({ e: 'review_evidence' })
    .join({ s: 'studies' }, 's.id', 'e.study_id')
    .where({ 'e.submission_id': submissionId, 's.created_by': userId })
    .orderBy('e.position')
    .select('s.id', 's.name');
}
