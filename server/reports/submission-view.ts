/**
 * API views of review submissions and decisions, and the refusals that are not about independence
 * (a decided submission, a stale version), as plain functions over stored rows. Who may not decide
 * a submission, and why, lives in services/independence.ts.
 */
import type { Coverage, Scope, Signer, Submission } from '@/shared/api/approval';
import type { DecisionRow, SubmissionRow } from '../db/approval';
import { AppError } from '../errors';

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

export function decisionView(d: DecisionRow, signer: Signer): NonNullable<Submission['decision']> {
  return {
    id: d.id,
    decision: d.decision,
    reviewer: { id: d.reviewer_id, displayName: d.reviewer_name },
    signer,
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
  decision: { row: DecisionRow; signer: Signer } | undefined,
  you: Pick<Submission, 'blockedForYou' | 'viewer' | 'rule'>,
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
    status: decision ? decision.row.decision : 'pending',
    decision: decision ? decisionView(decision.row, decision.signer) : null,
    standardId: row.standard_id,
    standardStatus: row.standard_status ?? null,
    resubmittedAs: row.resubmitted_as ?? null,
    ...you,
  };
}
