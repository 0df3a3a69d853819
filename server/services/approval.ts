/**
 * Use cases of review: submit a recipe version with its evidence, the reviewer inbox, the evidence
 * view, and the decision (approve = electronic signature; return = with a reason). Lifecycle:
 * draft → in_review → approved | returned; returned → in_review (resubmitted as it is);
 * approved → superseded (a newer version of the recipe is approved) | retired (standards.ts).
 * An edit of any version appends a new draft version (versioned-resources.ts); no service writes
 * a version's body, and a trigger refuses it for approved versions.
 *
 * Every refused decision (wrong role, self-approval, author or editor of the version, a stale
 * version, a second decision, a wrong password) is answered with a clear message and recorded in
 * the audit trail in its own transaction, so the refusal is kept although nothing else changes.
 */
import { randomUUID } from 'node:crypto';
import type { z } from 'zod';
import { decideSchema, submitReviewSchema, type Evidence, type Submission } from '@/shared/api/approval';
import type { Role } from '@/shared/api/auth';
import { parseRecipe } from '@/shared/engine/recipe';
import { ENGINE_VERSION } from '@/shared/engine/version';
import { verifyPassword } from '../auth/password';
import * as store from '../db/approval';
import type { Db } from '../db/knex';
import { findMember } from '../db/members';
import { activeOlderStandards, endStandard, insertStandard } from '../db/standards';
import { findStudy, studyScenarios } from '../db/studies';
import { findUserById } from '../db/users';
import { findResource, findVersion } from '../db/versioned';
import { AppError, notFound } from '../errors';
import type { Mailer } from '../mail/mailer';
import { evidenceDocument, evidenceSha256, signatureSha256 } from './evidence';
import { recipeSettings } from '../reports/recipe-settings';
import { scopeCoverage } from './scope-coverage';
import { alreadyDecided, staleVersion, submissionView } from '../reports/submission-view';
import { signerOf } from './account-origin';
import { recordAudit } from './audit';
import { independenceFacts, independenceRefusals, independenceRule, type IndependencePolicy } from './independence';
import { reviewMail } from './review-reminders';
import { AttemptLimiter, MAX_FAILURES_PER_ACCOUNT } from './sign-in';
import { scenarioOf } from './scenario-definition';
import type { StoredStudySummary } from './study-results';

export interface ReviewDeps {
  db: Db;
  mailer: Mailer;
  publicUrl: string;
}
/** The signed-in user, and the clock and cooling period the independence rules are judged by. */
type Viewer = { id: string; role: Role; policy: IndependencePolicy };
const MIN_JUSTIFICATION = 20;
/** Wrong signature passwords per reviewer in 15 minutes before signing is paused (as for sign-in). */
const signatureAttempts = new AttemptLimiter();
const MONTH_MS = (365.2425 / 12) * 86_400_000;

async function studyList(db: Db, labId: string, ids: string[]): Promise<Submission['studies']> {
  const out: Submission['studies'] = [];
  for (const id of ids) {
    const s = await findStudy(db, labId, id);
    const summary = s?.summary ? (JSON.parse(s.summary) as StoredStudySummary) : null;
    out.push({ id, name: s?.name ?? '(missing study)', pass: summary?.pass ?? null });
  }
  return out;
}

/** One submission as the viewer sees it (with the reasons they may not decide it). */
export async function getSubmission(db: Db, labId: string, id: string, viewer: Viewer): Promise<Submission> {
  const row = await store.findSubmission(db, labId, id);
  if (!row) throw notFound(`Submission ${id}`);
  const decision = row.decision_id ? await store.findDecision(db, id) : undefined;
  const studies = await studyList(db, labId, await store.evidenceStudyIds(db, id));
  const me = await findUserById(db, viewer.id);
  return submissionView(row, studies, decision && { row: decision, signer: await signerOf(db, labId, decision.reviewer_id) }, {
    blockedForYou: await blockedMessages(db, row, decision, viewer),
    viewer: { id: viewer.id, displayName: me?.display_name ?? '', email: me?.email ?? '' },
    rule: independenceRule(viewer.policy.adminCoolingDays),
  });
}

/** The messages shown to a user who may not decide a submission (empty if they may). */
async function blockedMessages(db: Db, row: store.SubmissionRow, decision: store.DecisionRow | undefined, viewer: Viewer): Promise<string[]> {
  if (decision) return [alreadyDecided(decision).message];
  const out = independenceRefusals(await independenceFacts(db, row, viewer.id, viewer.role), viewer.id, viewer.policy).map((e) => e.message);
  if (row.recipe_version < row.latest_version) out.push(staleVersion(row.recipe_version, row.latest_version).message);
  return out;
}

export async function listSubmissions(db: Db, labId: string, query: { limit: number; offset: number } & store.SubmissionFilter, viewer: Viewer) {
  const { rows, total } = await store.listSubmissions(db, labId, query, query);
  const items: Submission[] = [];
  for (const r of rows) items.push(await getSubmission(db, labId, r.id, viewer));
  return { items, total, limit: query.limit, offset: query.offset };
}

/** Submits a version with its evidence (module doc); mails the lab's reviewers. */
export async function submitForReview(deps: ReviewDeps, labId: string, viewer: Viewer, input: z.input<typeof submitReviewSchema>): Promise<Submission> {
  const body = submitReviewSchema.parse(input);
  const { db } = deps;
  const head = await findResource(db, 'recipes', labId, body.recipe.id);
  if (!head) throw notFound(`Recipe ${body.recipe.id}`);
  const version = await findVersion(db, 'recipes', body.recipe.id, body.recipe.version);
  if (!version) throw notFound(`Version ${body.recipe.version} of recipe ${body.recipe.id}`);
  const state = await store.versionState(db, body.recipe.id, body.recipe.version);
  if (state !== 'draft' && state !== 'returned') {
    const hint = state === 'in_review' ? 'it is already in review' : `it is ${state}; edit the recipe to start a new draft version`;
    throw new AppError(409, 'not_a_draft', `Version ${body.recipe.version} cannot be submitted: ${hint}.`, { state });
  }
  if (body.recipe.version !== head.latest_version) throw staleVersion(body.recipe.version, head.latest_version);

  const scenarios: { name: string; scenario: ReturnType<typeof scenarioOf> }[] = [];
  const failing: Submission['failingCriteria'] = [];
  for (const studyId of body.studyIds) {
    const s = await findStudy(db, labId, studyId);
    if (!s) throw notFound(`Study ${studyId}`);
    if (s.status !== 'finished') throw new AppError(409, 'study_not_finished', `Study "${s.name}" is ${s.status}: only finished studies count as evidence.`);
    if (s.recipe_id !== body.recipe.id || s.recipe_version !== body.recipe.version) {
      throw new AppError(409, 'study_other_version', `Study "${s.name}" ran recipe version ${s.recipe_version}${s.recipe_id === body.recipe.id ? '' : ' of another recipe'}; evidence must be of exactly version ${body.recipe.version}.`);
    }
    for (const sc of await studyScenarios(db, studyId)) scenarios.push({ name: sc.name, scenario: scenarioOf(JSON.parse(sc.body)) });
    const summary = JSON.parse(s.summary ?? '{"scenarios":[]}') as StoredStudySummary;
    for (const r of summary.scenarios) {
      for (const c of r.judged?.criteria ?? []) {
        if (!c.pass) failing.push({ studyId, scenario: r.name, label: c.label, limit: c.limit, observed: c.observed, unit: c.unit });
      }
    }
  }
  const coverage = scopeCoverage(body.scope, parseRecipe(JSON.parse(version.body)), scenarios);
  if (!coverage.covered) {
    const gaps = coverage.checks.filter((c) => !c.ok).map((c) => c.detail);
    throw new AppError(422, 'scope_not_covered', `The evidence does not cover the declared scope: ${gaps.join('; ')}.`, { coverage });
  }
  const justification = body.justification?.length ? body.justification : null;
  if (failing.length && (justification ?? '').length < MIN_JUSTIFICATION) {
    const list = failing.map((f) => `${f.scenario}: ${f.label}`).join('; ');
    throw new AppError(422, 'justification_required', `${failing.length} criterion(s) failed (${list}); give a written justification of at least ${MIN_JUSTIFICATION} characters.`, { failing });
  }

  const id = await db.transaction(async (trx) => {
    const at = Date.now();
    if (!(await store.moveVersionState(trx, body.recipe.id, body.recipe.version, ['draft', 'returned'], 'in_review', at))) {
      throw new AppError(409, 'not_a_draft', `Version ${body.recipe.version} changed state meanwhile; reload it.`);
    }
    const submissionId = await store.insertSubmission(trx, {
      labId, recipeId: body.recipe.id, recipeVersion: body.recipe.version, scope: body.scope, structureType: body.scope.structureType,
      purpose: body.purpose, justification, coverage, failing, studyIds: body.studyIds, submittedBy: viewer.id, at,
    });
    await recordAudit(trx, {
      labId, actorUserId: viewer.id, action: 'reviews.submit', targetType: 'review', targetId: submissionId,
      before: { state }, after: { recipe: body.recipe, state: 'in_review', studyIds: body.studyIds, scope: body.scope, failingCriteria: failing.length, justification },
    });
    return submissionId;
  });
  const submitter = await findUserById(db, viewer.id);
  for (const r of await store.membersWithRoles(db, labId, ['reviewer'])) {
    await deps.mailer.send(reviewMail.requested(deps.publicUrl, labId, r, { recipe: head.name, version: body.recipe.version, by: submitter?.display_name ?? '', scope: body.scope.structureType, failing: failing.length }));
  }
  return getSubmission(db, labId, id, viewer);
}

/** The evidence a reviewer reads: the submission, the recipe definition, each study's criteria. */
export async function getEvidence(db: Db, labId: string, id: string, viewer: Viewer): Promise<Evidence> {
  const submission = await getSubmission(db, labId, id, viewer);
  const version = await findVersion(db, 'recipes', submission.recipe.id, submission.recipe.version);
  const studies: Evidence['studies'] = [];
  for (const s of submission.studies) {
    const row = await findStudy(db, labId, s.id);
    if (!row) continue;
    const summary = JSON.parse(row.summary ?? '{"pass":null,"scenarios":[]}') as StoredStudySummary;
    studies.push({
      id: row.id, name: row.name, engineVersion: row.engine_version, seeds: row.seeds, baseSeed: row.base_seed, pass: summary.pass,
      reportPath: `/api/v1/labs/${labId}/reports/study/${row.id}`,
      scenarios: summary.scenarios.map((r) => ({
        id: r.scenarioId, version: r.scenarioVersion, name: r.name, pass: r.judged?.pass ?? false, warnings: r.warnings,
        criteria: (r.judged?.criteria ?? []).map((c) => ({ id: c.id, label: c.label, limit: c.limit, observed: c.observed, unit: c.unit, pass: c.pass, worstLineHz: c.worstLineHz })),
      })),
    });
  }
  const settings = await recipeSettings(db, submission.recipe.id, submission.recipe.version, submission.studies.map((s) => s.id));
  return { submission, recipeDefinition: JSON.parse(version!.body), settings, studies };
}

/** Records a refused decision in its own transaction and throws the refusal. */
async function refuse(db: Db, labId: string, userId: string, submissionId: string, decision: string, err: AppError, action = 'reviews.decide-refused'): Promise<never> {
  await recordAudit(db, { labId, actorUserId: userId, action, targetType: 'review', targetId: submissionId, after: { refused: err.code, decision, message: err.message } });
  throw err;
}

/** For the route's error handler: a decision refused by the permission table is logged too. */
export async function recordRoleRefusal(db: Db, labId: string, userId: string, submissionId: string): Promise<AppError | null> {
  const member = await findMember(db, labId, userId);
  if (!member) return null;
  const none = { role: member.role, submittedBy: '', recipeVersion: 0, versionsWritten: [], studiesStarted: [], leftAdminAt: null };
  const err = independenceRefusals(none, userId, { adminCoolingDays: 0, now: 0 })[0];
  if (!err) return null;
  await recordAudit(db, { labId, actorUserId: userId, action: 'reviews.decide-refused', targetType: 'review', targetId: submissionId, after: { refused: 'role', role: member.role, message: err.message } });
  return err;
}

/** Approves (signs) or returns a submission (module doc); mails the authors and the lab admins. */
export async function decide(deps: ReviewDeps, labId: string, viewer: Viewer, submissionId: string, input: z.input<typeof decideSchema>): Promise<Submission> {
  const body = decideSchema.parse(input);
  const { db } = deps;
  const sub = await store.findSubmission(db, labId, submissionId);
  if (!sub) throw notFound(`Submission ${submissionId}`);
  const no = (err: AppError, action?: string) => refuse(db, labId, viewer.id, submissionId, body.decision, err, action);
  const prior = await store.findDecision(db, submissionId);
  if (prior) return no(alreadyDecided(prior));
  const authors = await store.recipeAuthors(db, sub.recipe_id);
  const [refusal] = independenceRefusals(await independenceFacts(db, sub, viewer.id, viewer.role), viewer.id, viewer.policy);
  if (refusal) return no(refusal);
  if (body.decision === 'approved' && sub.recipe_version < sub.latest_version) return no(staleVersion(sub.recipe_version, sub.latest_version));
  if (sub.recipe_state !== 'in_review') return no(new AppError(409, 'not_in_review', `Version ${sub.recipe_version} is ${sub.recipe_state}, not in review.`));
  const reviewer = await findUserById(db, viewer.id);
  if (!reviewer) throw notFound('Your account');
  if (body.decision === 'approved') {
    const key = `signature:${reviewer.id}`;
    if (signatureAttempts.blocked(key)) {
      return no(new AppError(429, 'too_many_attempts', `${MAX_FAILURES_PER_ACCOUNT} wrong passwords in 15 minutes: signing is paused; try again later.`), 'reviews.signature-refused');
    }
    if (!(reviewer.password_hash && (await verifyPassword(reviewer.password_hash, body.password)))) {
      signatureAttempts.fail(key);
      return no(new AppError(403, 'signature_refused', 'The password is not correct: the approval was not signed.'), 'reviews.signature-refused');
    }
    signatureAttempts.clear(key);
  }

  const studyIds = await store.evidenceStudyIds(db, submissionId);
  const evidence = evidenceSha256(await evidenceDocument(db, labId, { id: sub.recipe_id, version: sub.recipe_version }, studyIds, ENGINE_VERSION));
  const signedAt = Date.now();
  const meaning = body.decision === 'approved' ? body.meaning : null;
  const reason = body.decision === 'returned' ? body.reason : null;
  const signature = signatureSha256({
    evidenceSha256: evidence, submissionId, decision: body.decision, signer: { id: reviewer.id, displayName: reviewer.display_name, email: reviewer.email },
    meaning, comment: body.comment, reason, signedAt,
  });
  const decisionId = randomUUID();
  const raced = await db.transaction(async (trx) => {
    const again = await store.findDecision(trx, submissionId);
    if (again) return alreadyDecided(again);
    const head = await findResource(trx, 'recipes', labId, sub.recipe_id);
    if (body.decision === 'approved' && head && head.latest_version > sub.recipe_version) return staleVersion(sub.recipe_version, head.latest_version);
    await store.insertDecision(trx, {
      id: decisionId, submission_id: submissionId, lab_id: labId, reviewer_id: viewer.id, decision: body.decision, meaning, comment: body.comment,
      reason, decided_at: signedAt, engine_version: ENGINE_VERSION, evidence_sha256: evidence, signature_sha256: signature,
      admin_cooling_days: viewer.policy.adminCoolingDays,
    });
    await store.moveVersionState(trx, sub.recipe_id, sub.recipe_version, ['in_review'], body.decision, signedAt);
    const recipe = { id: sub.recipe_id, version: sub.recipe_version };
    await recordAudit(trx, {
      labId, actorUserId: viewer.id, action: body.decision === 'approved' ? 'reviews.approve' : 'reviews.return', targetType: 'review', targetId: submissionId,
      before: { state: 'in_review' }, after: { recipe, state: body.decision, meaning, reason, comment: body.comment, evidenceSha256: evidence, signatureSha256: signature },
    });
    if (body.decision === 'approved') await openStandard(trx, labId, viewer.id, sub, decisionId, signedAt, body.reviewMonths);
    return null;
  });
  if (raced) return no(raced);

  const recipients = new Map<string, { email: string; display_name: string }>();
  for (const a of authors) {
    const u = await findUserById(db, a.author_id);
    if (u && a.version === sub.recipe_version) recipients.set(u.id, u);
  }
  const submitter = await findUserById(db, sub.submitted_by);
  if (submitter) recipients.set(submitter.id, submitter);
  for (const admin of await store.membersWithRoles(db, labId, ['admin'])) recipients.set(admin.user_id, admin);
  for (const to of recipients.values()) {
    await deps.mailer.send(reviewMail.decided(deps.publicUrl, labId, to, { recipe: sub.recipe_name, version: sub.recipe_version, decision: body.decision, by: reviewer.display_name, meaning, reason, comment: body.comment }));
  }
  return getSubmission(db, labId, submissionId, viewer);
}

/** The standard an approval opens, superseding the recipe's older active standards. */
async function openStandard(trx: Db, labId: string, userId: string, sub: store.SubmissionRow, decisionId: string, at: number, months: number) {
  const older = (await activeOlderStandards(trx, sub.recipe_id, sub.recipe_version)).sort((a, b) => b.recipe_version - a.recipe_version);
  const scope = JSON.parse(sub.scope_json);
  const standardId = await insertStandard(trx, {
    labId, recipeId: sub.recipe_id, recipeVersion: sub.recipe_version, submissionId: sub.id, decisionId, scope,
    effectiveAt: at, reviewDueAt: Math.round(at + months * MONTH_MS), supersedesId: older[0]?.id ?? null,
  });
  await recordAudit(trx, {
    labId, actorUserId: userId, action: 'standards.create', targetType: 'standard', targetId: standardId,
    after: { recipe: { id: sub.recipe_id, version: sub.recipe_version }, scope, reviewMonths: months, supersedes: older.map((o) => o.id) },
  });
  for (const o of older) {
    await endStandard(trx, o.id, { status: 'superseded', at, by: userId, reason: `superseded by version ${sub.recipe_version}`, supersededById: standardId });
    await store.moveVersionState(trx, o.recipe_id, o.recipe_version, ['approved'], 'superseded', at);
    await recordAudit(trx, {
      labId, actorUserId: userId, action: 'standards.supersede', targetType: 'standard', targetId: o.id,
      before: { status: 'active', recipeVersion: o.recipe_version }, after: { status: 'superseded', supersededBy: standardId, recipeVersion: sub.recipe_version },
    });
  }
}
