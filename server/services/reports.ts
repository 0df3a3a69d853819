/**
 * Use cases of validation reports: the content of a study's or a standard's report (JSON, for the
 * printable page), its PDF, and the controlled register of reports. Each study and each standard
 * has one report whose id stays; a new revision (numbered, with what changed) is recorded only
 * when the content changes. The sha256 is taken over the canonical JSON of the content, which
 * depends on nothing but stored data and the engine version, so making the report again keeps its
 * id, revision and hash. A new revision is recorded in the audit trail, and so is every PDF
 * download (an export).
 */
import type { Report, ReportContent, ReportRecord, ReportTrail } from '@/shared/api/approval';
import type { Db } from '../db/knex';
import { findReport, insertRevision, latestRevision, revisionsOf, type ReportKind, type ReportRow } from '../db/reports';
import { notFound } from '../errors';
import { sha256Hex } from './evidence';
import { standardReportContent, studyReportContent } from '../reports/report-content';
import { reportChanges } from '../reports/report-changes';
import { renderReportPdf } from '../reports/report-pdf';
import { auditTrailOf, canonicalJson, recordAudit } from './audit';

export type { ReportKind };

const personOf = (r: ReportRow) => (r.created_by ? { id: r.created_by, displayName: r.created_by_name ?? '' } : null);
const changesOf = (r: ReportRow) => JSON.parse(r.changes_json) as string[];

async function recordOf(db: Db, r: ReportRow): Promise<ReportRecord> {
  const revisions = await revisionsOf(db, r.document_id);
  return {
    id: r.document_id,
    labId: r.lab_id,
    kind: r.kind,
    targetId: r.target_id,
    sha256: r.sha256,
    createdAt: Number(r.created_at),
    createdBy: personOf(r),
    revision: r.revision,
    revisionId: r.id,
    changes: changesOf(r),
    revisions: revisions.map((x) => ({ revision: x.revision, revisionId: x.id, sha256: x.sha256, createdAt: Number(x.created_at), createdBy: personOf(x), changes: changesOf(x) })),
  };
}

/** The report's newest revision if it holds this content, else a new revision of it. */
async function registered(db: Db, labId: string, userId: string, kind: ReportKind, targetId: string, content: ReportContent): Promise<ReportRecord> {
  const text = canonicalJson(content);
  const sha256 = sha256Hex(text);
  const latest = await latestRevision(db, labId, kind, targetId);
  if (latest?.sha256 === sha256) return recordOf(db, latest);
  const row = await db.transaction(async (trx) => {
    const last = await latestRevision(trx, labId, kind, targetId);
    if (last?.sha256 === sha256) return last;
    const revision = (last?.revision ?? 0) + 1;
    const changes = last ? reportChanges(last.content_json ? (JSON.parse(last.content_json) as ReportContent) : null, content) : [];
    const made = await insertRevision(trx, { documentId: last?.document_id ?? null, revision, labId, kind, targetId, sha256, content: text, changes, createdBy: userId, at: Date.now() });
    await recordAudit(trx, {
      labId, actorUserId: userId, action: revision === 1 ? 'reports.create' : 'reports.revise', targetType: 'report', targetId: made.documentId,
      before: last ? { revision: last.revision, sha256: last.sha256 } : null, after: { kind, targetId, revision, sha256, changes },
    });
    return (await findReport(trx, labId, made.id))!;
  });
  return recordOf(db, row);
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
    after: { kind, targetId, format: 'pdf', revision: report.revision, sha256: report.sha256, bytes: pdf.length },
  });
  return { report, pdf };
}

/** A report by its id (its newest revision) or by a revision's id: an assessor checks a filed copy here. */
export async function getReportRecord(db: Db, labId: string, id: string): Promise<ReportRecord> {
  const row = await findReport(db, labId, id);
  if (!row) throw notFound(`Report ${id}`);
  return recordOf(db, row);
}
