/** The audit trail of a lab: list (filtered, paged), chain verification and CSV export. */
import { Router } from 'express';
import { auditListQuerySchema, auditListSchema, auditVerifySchema, type AuditEvent } from '@/shared/api/people';
import type { AppDeps } from '../deps';
import { labRoute } from '../auth/permissions';
import { chainRowsWithPeople, listAudit, type AuditRow } from '../db/audit';
import { verifyAuditTrail } from '../services/audit-verify';
import { parseBody } from './parse';

const DAY = /^\d{4}-\d{2}-\d{2}$/;
/** `from` is inclusive; `to` is exclusive, and a bare day (UTC) includes that whole day. */
const bound = (s: string | undefined, end: boolean) =>
  s === undefined ? undefined : Date.parse(s) + (end && DAY.test(s) ? 86_400_000 : 0);

const parseJson = (s: string | null) => (s === null ? null : JSON.parse(s));

function toEvent(r: AuditRow & { actor_display_name?: string | null; actor_email?: string | null }): AuditEvent {
  return {
    id: Number(r.id), labId: r.lab_id,
    actor: r.actor_user_id ? { userId: r.actor_user_id, displayName: r.actor_display_name ?? null, email: r.actor_email ?? null } : null,
    action: r.action, targetType: r.target_type, targetId: r.target_id,
    before: parseJson(r.before_json), after: parseJson(r.after_json), at: Number(r.at), prevHash: r.prev_hash, hash: r.hash,
  };
}

/** A CSV cell: quoted when needed; text starting with = + - @ (or tab/CR) is prefixed with ' so a
 * spreadsheet shows it as text instead of running it as a formula (OWASP "CSV Injection"). */
export function csvCell(v: string | number | null): string {
  if (v === null) return '';
  if (typeof v === 'number') return String(v);
  const safe = /^[=+\-@\t\r]/.test(v) ? `'${v}` : v;
  return /[",\n\r]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

export function auditRoutes(deps: AppDeps): Router {
  const r = Router();
  const { db } = deps;
  labRoute(r, db, {
    method: 'get', path: '/labs/:labId/audit', action: 'audit.read',
    summary: "The lab's audit trail, newest first; filter by action, actor and time",
    query: auditListQuerySchema, response: auditListSchema,
  }, async (req, res) => {
    const q = parseBody(auditListQuerySchema, req.query);
    const { rows, total } = await listAudit(
      db,
      { labId: req.lab.id, action: q.action, actorUserId: q.actor, from: bound(q.from, false), to: bound(q.to, true) },
      q,
    );
    res.json({ items: rows.map(toEvent), total, limit: q.limit, offset: q.offset });
  });
  labRoute(r, db, {
    method: 'get', path: '/labs/:labId/audit/verify', action: 'audit.read',
    summary: "Check the lab's trail (keyed chain, checkpoints outside the database, every signature) and report the first problem", response: auditVerifySchema,
  }, async (req, res) => {
    res.json(await verifyAuditTrail(db, req.lab.id));
  });
  labRoute(r, db, {
    method: 'get', path: '/labs/:labId/audit/export', action: 'audit.export',
    summary: "The lab's whole audit trail as CSV, oldest first, with names and e-mails of the people and the hashes", produces: 'text/csv',
  }, async (req, res) => {
    const rows = await chainRowsWithPeople(db, req.lab.id);
    const head = ['id', 'at_iso', 'actor_user_id', 'actor_name', 'actor_email', 'action', 'target_type', 'target_id', 'target_name', 'target_email', 'before_json', 'after_json', 'prev_hash', 'hash'];
    const lines = rows.map((e) =>
      [
        Number(e.id), new Date(Number(e.at)).toISOString(), e.actor_user_id, e.actor_name, e.actor_email, e.action, e.target_type, e.target_id,
        e.target_name, e.target_email, e.before_json, e.after_json, e.prev_hash, e.hash,
      ]
        .map(csvCell)
        .join(','),
    );
    res.type('text/csv').attachment(`audit-${req.lab.id}.csv`).send([head.join(','), ...lines].join('\r\n') + '\r\n');
  });
  return r;
}
