/**
 * The signatures under the audit trail's check: every decision of the lab (an approval's electronic
 * signature, or a return) is re-computed from what is stored — the evidence hash from the evidence
 * itself, the signature hash from the submission, decision, signer, meaning, comment, reason and
 * time — and matched with its decision entry in the trail, whose keyed hash covers the hashes,
 * the meaning and the recipe version as they were at signing. A decision row moved to another
 * submission, or with its meaning or time altered, fails one of these; so does a row whose hashes
 * were recomputed to fit, since the decision entry still holds the signed values.
 */
import type { AuditRow } from '../db/audit';
import { evidenceStudyIds, findSubmission, labDecisions, type DecisionRow } from '../db/approval';
import type { Db } from '../db/knex';
import { findUserById } from '../db/users';
import { evidenceDocument, evidenceSha256, signatureSha256 } from './evidence';

export interface SignatureProblem {
  /** The decision entry of the trail it concerns, when there is one. */
  id: number | null;
  detail: string;
}

const DECISION_ACTIONS: Record<DecisionRow['decision'], string> = { approved: 'reviews.approve', returned: 'reviews.return' };

interface DecisionEntry {
  recipe?: { id?: string; version?: number };
  meaning?: string | null;
  evidenceSha256?: string;
  signatureSha256?: string;
}

async function problemOf(db: Db, labId: string, d: DecisionRow, entry: AuditRow | undefined): Promise<SignatureProblem | null> {
  const what = `The ${d.decision === 'approved' ? 'signature' : 'return'} by ${d.reviewer_name} on submission ${d.submission_id}`;
  const sub = await findSubmission(db, labId, d.submission_id);
  if (!sub) return { id: entry ? Number(entry.id) : null, detail: `${what} points to a submission this lab does not have.` };
  let evidence: string;
  try {
    const doc = await evidenceDocument(db, labId, { id: sub.recipe_id, version: sub.recipe_version }, await evidenceStudyIds(db, sub.id), d.engine_version);
    evidence = evidenceSha256(doc);
  } catch (err) {
    return { id: entry ? Number(entry.id) : null, detail: `${what}: its evidence can no longer be read (${err instanceof Error ? err.message : String(err)}).` };
  }
  if (evidence !== d.evidence_sha256) {
    return { id: entry ? Number(entry.id) : null, detail: `${what}: the stored evidence no longer hashes to the value that was signed.` };
  }
  const signer = await findUserById(db, d.reviewer_id);
  const signature = signatureSha256({
    evidenceSha256: d.evidence_sha256, submissionId: d.submission_id, decision: d.decision,
    signer: { id: d.reviewer_id, displayName: signer?.display_name ?? '', email: signer?.email ?? '' },
    meaning: d.meaning, comment: d.comment, reason: d.reason, signedAt: Number(d.decided_at),
  });
  if (signature !== d.signature_sha256) {
    return { id: entry ? Number(entry.id) : null, detail: `${what}: its signature hash does not re-compute from the submission, decision, signer, meaning, comment and time stored with it.` };
  }
  if (!entry) return { id: null, detail: `${what} has no decision entry in the audit trail.` };
  const after = JSON.parse(entry.after_json ?? '{}') as DecisionEntry;
  const same =
    entry.action === DECISION_ACTIONS[d.decision] && entry.actor_user_id === d.reviewer_id &&
    after.signatureSha256 === d.signature_sha256 && after.evidenceSha256 === d.evidence_sha256 && (after.meaning ?? null) === d.meaning &&
    after.recipe?.id === sub.recipe_id && after.recipe?.version === sub.recipe_version;
  if (!same) return { id: Number(entry.id), detail: `${what} does not match its decision entry #${entry.id} in the trail (signer, hashes, meaning or recipe version differ).` };
  return null;
}

/** Re-computes every decision of the lab; the first problem found, and how many were checked. */
export async function checkSignatures(db: Db, labId: string, rows: AuditRow[]): Promise<{ checked: number; problem: SignatureProblem | null }> {
  const entries = rows.filter((r) => r.action === DECISION_ACTIONS.approved || r.action === DECISION_ACTIONS.returned);
  const decisions = await labDecisions(db, labId);
  let checked = 0;
  for (const d of decisions) {
    checked++;
    const problem = await problemOf(db, labId, d, entries.find((e) => e.target_id === d.submission_id));
    if (problem) return { checked, problem };
  }
  const decided = new Set(decisions.map((d) => d.submission_id));
  const orphan = entries.find((e) => !decided.has(e.target_id ?? ''));
  if (orphan) return { checked, problem: { id: Number(orphan.id), detail: `Decision entry #${orphan.id} records a decision on submission ${orphan.target_id}, which has no decision stored any more.` } };
  return { checked, problem: null };
}
