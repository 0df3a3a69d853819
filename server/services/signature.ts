/**
 * A signature as every reader sees it (standard, report JSON and PDF): the signer's name, e-mail
 * and how the account came to the lab, the meaning, the time, the hashes, and the independence
 * rule it was checked against.
 */
import type { Signature } from '@/shared/api/approval';
import type { DecisionRow } from '../db/approval';
import type { Db } from '../db/knex';
import { signerOf } from './account-origin';
import { independenceRule } from './independence';

/** The rule a decision was signed under (decisions before the cooling period was kept say so). */
export const ruleOf = (d: Pick<DecisionRow, 'admin_cooling_days'>) =>
  d.admin_cooling_days === null
    ? 'Signed before Plumbline kept the admin/approval separation rule with each signature; the submitter and the authors of the version could not decide it.'
    : independenceRule(Number(d.admin_cooling_days));

export async function signatureOf(db: Db, d: DecisionRow): Promise<Signature> {
  return {
    reviewer: { id: d.reviewer_id, displayName: d.reviewer_name },
    signer: await signerOf(db, d.lab_id, d.reviewer_id),
    rule: ruleOf(d),
    meaning: d.meaning ?? '',
    comment: d.comment,
    signedAt: Number(d.decided_at),
    engineVersion: d.engine_version,
    evidenceSha256: d.evidence_sha256,
    signatureSha256: d.signature_sha256,
  };
}
