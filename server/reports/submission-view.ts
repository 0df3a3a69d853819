/**
 * API views of review submissions and decisions, and the independence rules a decision must pass
 * (who may not decide a submission, and why), as plain functions over stored rows.
 */
import type { Coverage, Scope, Submission } from '@/shared/api/approval';
import type { Role } from '@/shared/api/auth';
import type { DecisionRow, SubmissionRow } from '../db/approval';
import { AppError } from '../errors';

/** Why `userId` (with `role` in the lab) may not decide this submission, most basic first. */
export function independenceRefusals(
  sub: Pick<SubmissionRow, 'submitted_by' | 'recipe_version'>,
  authors: { author_id: string; version: number }[],
  userId: string,
  role: Role,
): AppError[] {
  const out: AppError[] = [];
  if (role !== 'reviewer') {
    out.push(new AppError(403, 'forbidden', `Only a reviewer may approve or return a submission; your role in this lab is ${role}.`));
  }
  if (sub.submitted_by === userId) {
    out.push(new AppError(403, 'self_approval', 'You submitted this recipe version for review: an independent reviewer must decide it.'));
  }
  const own = authors.filter((a) => a.author_id === userId);
  if (own.some((a) => a.version === sub.recipe_version)) {
    out.push(new AppError(403, 'author_cannot_decide', `You wrote version ${sub.recipe_version} of this recipe: a reviewer who is not its author must decide it.`));
  } else if (own.length) {
    out.push(
      new AppError(
        403,
        'editor_cannot_decide',
        `You edited this recipe (version ${own.map((a) => a.version).join(', ')}), and version ${sub.recipe_version} builds on that edit: a reviewer who did not edit it must decide it.`,
      ),
    );
  }
  return out;
}

export const alreadyDecided = (d: Pick<DecisionRow, 'decision' | 'reviewer_name' | 'decided_at'>) =>
  new AppError(
    409,
    'already_decided',
    `This submission was already ${d.decision} by ${d.reviewer_name} on ${new Date(Number(d.decided_at)).toISOString().slice(0, 10)}; a decision is final. Submit again for a new review.`,
  );

export const staleVersion = (version: number, latest: number) =>
  new AppError(
    409,
    'stale_version',
    `Version ${version} is no longer the recipe's latest (version ${latest} exists), so it cannot be approved. Return it, and let the analyst submit version ${latest}.`,
    { version, latestVersion: latest },
  );

export function decisionView(d: DecisionRow): NonNullable<Submission['decision']> {
  return {
    id: d.id,
    decision: d.decision,
    reviewer: { id: d.reviewer_id, displayName: d.reviewer_name },
    meaning: d.meaning,
    comment: d.comment,
    reason: d.reason,
    decidedAt: Number(d.decided_at),
    engineVersion: d.engine_version,
    evidenceSha256: d.evidence_sha256,
    signatureSha256: d.signature_sha256,
  };
}

export function submissionView(
  row: SubmissionRow,
  studies: Submission['studies'],
  decision: DecisionRow | undefined,
  blockedForYou: string[],
): Submission {
  return {
    id: row.id,
    labId: row.lab_id,
    recipe: { id: row.recipe_id, version: row.recipe_version, name: row.recipe_name, state: row.recipe_state, latestVersion: row.latest_version },
    stale: row.recipe_version < row.latest_version,
    scope: JSON.parse(row.scope_json) as Scope,
    purpose: row.purpose,
    justification: row.justification,
    studies,
    coverage: JSON.parse(row.coverage_json) as Coverage,
    failingCriteria: JSON.parse(row.failing_json) as Submission['failingCriteria'],
    submittedBy: { id: row.submitted_by, displayName: row.submitted_by_name },
    submittedAt: Number(row.submitted_at),
    status: decision ? decision.decision : 'pending',
    decision: decision ? decisionView(decision) : null,
    standardId: row.standard_id,
    standardStatus: row.standard_status ?? null,
    resubmittedAs: row.resubmitted_as ?? null,
    blockedForYou,
  };
}

/** The messages shown to a user who may not decide a pending submission (empty if they may). */
export function blockedMessages(
  row: SubmissionRow,
  decision: DecisionRow | undefined,
  authors: { author_id: string; version: number }[],
  userId: string,
  role: Role,
): string[] {
  if (decision) return [alreadyDecided(decision).message];
  const out = independenceRefusals(row, authors, userId, role).map((e) => e.message);
  if (row.recipe_version < row.latest_version) out.push(staleVersion(row.recipe_version, row.latest_version).message);
  return out;
}
