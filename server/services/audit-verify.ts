/**
 * The integrity check of a lab's audit trail, in this order, stopping at the first problem:
 *  1. the chain: each entry points to the one before and matches its keyed hash (entries from
 *     before the audit key: their plain sha256, up to the keyed event that sealed them);
 *  2. the checkpoint file: every line sealed with the key and linked to the line before;
 *  3. the chain against the lab's checkpoints: the entry at each recorded count is the recorded
 *     head, and the database holds at least as many entries as the checkpoints recorded (a cut at
 *     the end, a lab's whole chain removed, or an older backup restored all show here);
 *  4. every signature re-computed and matched with its decision entry (audit-signatures.ts).
 */
import type { AuditBreakReason, AuditVerify } from '@/shared/api/people';
import { chainRows, type AuditRow } from '../db/audit';
import type { Db } from '../db/knex';
import { auditTrailOf, legacyAuditHash, sealAuditRow } from './audit';
import type { Checkpoint } from './audit-checkpoints';
import { checkSignatures } from './audit-signatures';
import { SEAL_ACTION } from './audit-trail';

type Problem = { id: number | null; reason: AuditBreakReason; detail: string; checked?: number; missing?: number };

const when = (at: number) => `${new Date(at).toISOString().slice(0, 19).replace('T', ' ')} UTC`;

/** Step 1: the first entry whose link or hash does not hold. */
export function chainProblem(rows: AuditRow[], key: Buffer): Problem | null {
  const sealAt = rows.findIndex((r) => r.action === SEAL_ACTION);
  const beforeKey = Math.max(sealAt, 0);
  let prev: string | null = null;
  for (let i = 0; i < rows.length; i++) {
    const row = rows[i]!;
    const id = Number(row.id);
    const at = { id, checked: i + 1 };
    if ((row.prev_hash ?? null) !== prev) {
      return { ...at, reason: 'link_mismatch', detail: `Entry #${id} does not point to the entry before it: an entry was removed or put in between here.` };
    }
    if (i < beforeKey) {
      if (legacyAuditHash(row) !== row.hash) return { ...at, reason: 'hash_mismatch', detail: `Entry #${id}, written before the audit key, no longer matches its stored hash: it was changed.` };
    } else if (sealAuditRow(key, row) !== row.hash) {
      return { ...at, reason: 'hash_mismatch', detail: `Entry #${id} does not match its keyed hash: it was changed after it was written, or its hash was made without the audit key.` };
    }
    if (i === sealAt && (JSON.parse(row.after_json ?? '{}') as { sealedEvents?: number }).sealedEvents !== sealAt) {
      return { ...at, reason: 'seal_mismatch', detail: `Entry #${id} sealed a different number of earlier entries than the ${sealAt} before it.` };
    }
    prev = row.hash;
  }
  return null;
}

/** Step 3: the chain against the lab's checkpoints (in file order). */
export function checkpointProblem(rows: AuditRow[], mine: Checkpoint[], file: string): Problem | null {
  if (mine.length === 0) {
    return rows.length === 0 ? null : { id: null, reason: 'no_checkpoint', detail: `No checkpoint in ${file} records this lab's ${rows.length} entries: the checkpoint file was replaced or cut.` };
  }
  // The lowest place where a checkpoint and the chain disagree, and the last agreement below it.
  let firstDiverging: Checkpoint | null = null;
  let most = mine[0]!;
  for (const c of mine) {
    if (c.events > most.events) most = c;
    if (c.events <= rows.length && rows[c.events - 1]!.hash !== c.head && (!firstDiverging || c.events < firstDiverging.events)) firstDiverging = c;
  }
  const limit = firstDiverging?.events ?? Infinity;
  let lastGood: Checkpoint | null = null;
  for (const c of mine) {
    if (c.events < limit && c.events <= rows.length && rows[c.events - 1]!.hash === c.head && (!lastGood || c.events > lastGood.events)) lastGood = c;
  }
  const matched = lastGood?.events ?? 0;
  const after = lastGood ? ` after entry #${rows[matched - 1]!.id}` : ' from its first entry';
  if (firstDiverging) {
    const row = rows[firstDiverging.events - 1]!;
    return {
      id: Number(row.id), reason: 'checkpoint_mismatch', missing: Math.max(0, most.events - matched),
      detail: `Entry #${row.id} is not the entry the checkpoint of ${when(firstDiverging.at)} recorded as number ${firstDiverging.events} of this lab's trail: the trail was rewritten${after}, or an older backup was restored and written to since.`,
    };
  }
  if (most.events > rows.length) {
    const missing = most.events - rows.length;
    return {
      id: null, reason: 'missing_events', missing,
      detail: `The checkpoint of ${when(most.at)} recorded ${most.events} entries, but the database holds ${rows.length}: the last ${missing} are missing (removed, or an older backup was restored).`,
    };
  }
  return null;
}

/** The whole check of a lab's trail (module doc). */
export async function verifyAuditTrail(db: Db, labId: string | null): Promise<AuditVerify> {
  const trail = auditTrailOf(db);
  const rows = await chainRows(db, labId);
  const reading = trail.checkpoints.read();
  const mine = reading.lines.filter((c) => c.lab === labId);
  const latest = mine.at(-1);
  const base = { checked: rows.length, missing: 0, checkpoint: latest ? { events: latest.events, head: latest.head, at: latest.at } : null, signatures: 0 };
  const fail = (p: Problem, signatures = 0): AuditVerify => ({
    ...base, ok: false, checked: p.checked ?? rows.length, missing: p.missing ?? 0, signatures,
    firstBroken: { id: p.id, reason: p.reason, detail: p.detail },
  });
  const chain = chainProblem(rows, trail.key);
  if (chain) return fail(chain);
  if (reading.problem) return fail({ id: null, reason: 'checkpoint_file', detail: `The checkpoint file cannot be trusted: ${reading.problem.detail}.` });
  const cut = checkpointProblem(rows, mine, trail.checkpoints.file);
  if (cut) return fail(cut);
  const signatures = labId === null ? { checked: 0, problem: null } : await checkSignatures(db, labId, rows);
  if (signatures.problem) return fail({ ...signatures.problem, reason: 'signature_mismatch' }, signatures.checked);
  return { ...base, ok: true, firstBroken: null, signatures: signatures.checked };
}
