/**
 * Opens a database's audit trail at start: loads (or makes) the audit key, opens the checkpoint
 * file, binds both to the database, and seals chains written before the key existed.
 *
 * Sealing, once per chain: events stored before the key carry a plain sha256, which anyone who
 * can edit the database can recompute. Their hashes are not rewritten (the triggers forbid it, and
 * a rewrite would look exactly like tampering); instead, when the whole old chain still verifies,
 * one keyed `audit.seal` event is appended after it, recording how many events it seals and the
 * head hash. From then on an edit of any old event breaks the link to the seal event, which only
 * the key can make. A chain that no longer verifies is not sealed (that would hide the damage):
 * the server logs it and the integrity check reports it.
 */
import fs from 'node:fs';
import path from 'node:path';
import { chainHead, chainLabs, chainRows } from '../db/audit';
import type { Db } from '../db/knex';
import { bindAuditTrail, legacyAuditHash, recordAudit, sealAuditRow, type AuditTrail } from './audit';
import { CheckpointLog } from './audit-checkpoints';
import { loadAuditKey, type AuditKeySettings } from './audit-key';

export interface AuditTrailSettings extends AuditKeySettings {
  checkpointFile: string;
}

export interface TrailLog {
  info(message: string): void;
  warn(message: string): void;
}

export const SEAL_ACTION = 'audit.seal';

/** True when some chain's newest event was not made with the plain sha256 of the old scheme. */
async function keyedChainsExist(db: Db): Promise<boolean> {
  for (const lab of await chainLabs(db)) {
    const head = await chainHead(db, lab);
    if (head && legacyAuditHash(head) !== head.hash) return true;
  }
  return false;
}

/** The id of the first event of an old (plain sha256) chain that does not verify, or null. */
function firstLegacyBreak(rows: Awaited<ReturnType<typeof chainRows>>): number | null {
  let prev: string | null = null;
  for (const row of rows) {
    if ((row.prev_hash ?? null) !== prev || legacyAuditHash(row) !== row.hash) return Number(row.id);
    prev = row.hash;
  }
  return null;
}

async function sealOldChains(db: Db, trail: AuditTrail, log: TrailLog): Promise<void> {
  for (const lab of await chainLabs(db)) {
    const head = await chainHead(db, lab);
    if (!head || sealAuditRow(trail.key, head) === head.hash) continue;
    const name = lab === null ? 'the lab-less chain' : `the chain of lab ${lab}`;
    const rows = legacyAuditHash(head) === head.hash ? await chainRows(db, lab) : [];
    if (rows.length === 0 || rows.some((r) => r.action === SEAL_ACTION)) {
      log.warn(`Audit trail: ${name} ends in an event the audit key did not seal; the integrity check will report it.`);
      continue;
    }
    const broken = firstLegacyBreak(rows);
    if (broken !== null) {
      log.warn(`Audit trail: ${name} was written before the audit key and is broken at event ${broken}; it was not sealed.`);
      continue;
    }
    await recordAudit(db, {
      labId: lab, actorUserId: null, action: SEAL_ACTION, targetType: 'audit-trail', targetId: lab,
      after: { sealedEvents: rows.length, legacyHead: head.hash, note: 'events written before the audit key, sealed under it' },
    });
    log.info(`Audit trail: sealed the ${rows.length} events of ${name} written before the audit key.`);
  }
}

export async function openAuditTrail(db: Db, settings: AuditTrailSettings, log: TrailLog): Promise<AuditTrail> {
  for (const file of [settings.keyFile, settings.checkpointFile]) fs.mkdirSync(path.dirname(file), { recursive: true });
  const hasCheckpoints = fs.existsSync(settings.checkpointFile) && fs.statSync(settings.checkpointFile).size > 0;
  const keyed = await keyedChainsExist(db);
  const loaded = loadAuditKey(settings, () => {
    if (hasCheckpoints) return `the checkpoint file ${settings.checkpointFile} shows a trail sealed with an earlier key. Put that key file back (or set AUDIT_KEY_FILE to it) and start again; Plumbline does not make a new key over a sealed trail.`;
    if (keyed) return 'the database holds audit events sealed with a key. Put that key file back (or set AUDIT_KEY_FILE to it) and start again; Plumbline does not make a new key over a sealed trail.';
    return null;
  });
  if (loaded.created) log.info(`Audit trail: made a new audit key in ${loaded.origin} (mode 600). Keep a copy of it somewhere safe, away from the database backups.`);
  const checkpoints = new CheckpointLog(settings.checkpointFile, loaded.key, (message, err) => log.warn(`${message}: ${err instanceof Error ? err.message : String(err)}`));
  const trail: AuditTrail = { key: loaded.key, checkpoints };
  bindAuditTrail(db, trail);
  await sealOldChains(db, trail, log);
  return trail;
}
