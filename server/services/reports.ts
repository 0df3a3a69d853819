/**
 * Use cases of validation reports: the content of a study's or a standard's report (JSON, for the
 * printable page), its PDF, and the registry that gives each distinct content an id. The sha256 is
 * taken over the canonical JSON of the content; the same stored data give the same content, so a
 * report made again keeps its id. A new content is recorded in the audit trail, and so is every
 * PDF download (an export).
 */
import type { Report, ReportContent, ReportRecord, ReportTrail } from '@/shared/api/approval';
import type { Db } from '../db/knex';
import { findReport, findReportByContent, insertReport, type ReportRow } from '../db/reports';
import { notFound } from '../errors';
import { sha256Hex } from './evidence';
import { standardReportContent, studyReportContent } from '../reports/report-content';
import { renderReportPdf } from '../reports/report-pdf';
import { auditTrailOf, canonicalJson, recordAudit } from './audit';

export type ReportKind = 'study' | 'standard';

const recordOf = (r: ReportRow): ReportRecord => ({
  id: r.id,
  labId: r.lab_id,
  kind: r.kind,
  targetId: r.target_id,
  sha256: r.sha256,
  createdAt: Number(r.created_at),
  createdBy: r.created_by ? { id: r.created_by, displayName: r.created_by_name ?? '' } : null,
});

async function registered(db: Db, labId: string, userId: string, kind: ReportKind, targetId: string, content: ReportContent): Promise<ReportRecord> {
  const sha256 = sha256Hex(canonicalJson(content));
  const known = await findReportByContent(db, labId, kind, targetId, sha256);
  if (known) return recordOf(known);
  const id = await db.transaction(async (trx) => {
    const again = await findReportByContent(trx, labId, kind, targetId, sha256);
    if (again) return again.id;
    const newId = await insertReport(trx, { labId, kind, targetId, sha256, createdBy: userId, at: Date.now() });
    await recordAudit(trx, { labId, actorUserId: userId, action: 'reports.create', targetType: 'report', targetId: newId, after: { kind, targetId, sha256 } });
    return newId;
  });
  return recordOf((await findReport(db, labId, id))!);
}

/** The lab's newest audit checkpoint (the report prints it; see reportTrailSchema). */
function trailOf(db: Db, labId: string): ReportTrail | null {
  const c = auditTrailOf(db).checkpoints.latest(labId);
  return c ? { events: c.events, head: c.head, checkpointAt: c.at } : null;
}

/** The report of a study or a standard, registered, with the trail as it stands after that. */
export async function makeReport(db: Db, labId: string, userId: string, kind: ReportKind, targetId: string): Promise<Report> {
  const content = kind === 'study' ? await studyReportContent(db, labId, targetId) : await standardReportContent(db, labId, targetId);
  const report = await registered(db, labId, userId, kind, targetId, content);
  return { report, content, trail: trailOf(db, labId) };
}

/** The report as a PDF; the download is an export in the audit trail. */
export async function makeReportPdf(db: Db, labId: string, userId: string, kind: ReportKind, targetId: string): Promise<{ report: ReportRecord; pdf: Buffer }> {
  const { report, content, trail } = await makeReport(db, labId, userId, kind, targetId);
  const pdf = await renderReportPdf(report, content, trail);
  await recordAudit(db, {
    labId, actorUserId: userId, action: 'reports.export', targetType: 'report', targetId: report.id,
    after: { kind, targetId, format: 'pdf', sha256: report.sha256, bytes: pdf.length },
  });
  return { report, pdf };
}

/** A registered report by id (an assessor checks a filed report's id and sha256 here). */
export async function getReportRecord(db: Db, labId: string, id: string): Promise<ReportRecord> {
  const row = await findReport(db, labId, id);
  if (!row) throw notFound(`Report ${id}`);
  return recordOf(row);
}
