/**
 * Repository of controlled reports: one report (document_id) per lab, kind and target, kept as
 * append-only numbered revisions, each with its stored content, the sha256 of that content and
 * what changed from the revision before.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from './knex';

export type ReportKind = 'study' | 'standard';

export interface ReportRow {
  id: string;
  document_id: string;
  revision: number;
  lab_id: string;
  kind: ReportKind;
  target_id: string;
  sha256: string;
  content_json: string | null;
  changes_json: string;
  created_by: string | null;
  created_by_name: string | null;
  created_at: number;
}

function reports(db: Db) {
  return db({ r: 'reports' }).leftJoin({ u: 'users' }, 'u.id', 'r.created_by');
}
const COLUMNS = ['r.*', 'u.display_name as created_by_name'];

/** The newest revision of the report of a target. */
export function latestRevision(db: Db, labId: string, kind: ReportKind, targetId: string): Promise<ReportRow | undefined> {
  return reports(db).where({ 'r.lab_id': labId, 'r.kind': kind, 'r.target_id': targetId }).orderBy('r.revision', 'desc').first(COLUMNS);
}

/** Every revision of a report, oldest first. */
export function revisionsOf(db: Db, documentId: string): Promise<ReportRow[]> {
  return reports(db).where({ 'r.document_id': documentId }).orderBy('r.revision', 'asc').select(COLUMNS);
}

/** A report by its id (its newest revision), or one revision by the revision's own id. */
export async function findReport(db: Db, labId: string, id: string): Promise<ReportRow | undefined> {
  const byDocument = await reports(db).where({ 'r.lab_id': labId, 'r.document_id': id }).orderBy('r.revision', 'desc').first(COLUMNS);
  return byDocument ?? reports(db).where({ 'r.lab_id': labId, 'r.id': id }).first(COLUMNS);
}

export async function insertRevision(
  trx: Db,
  r: { documentId: string | null; revision: number; labId: string; kind: ReportKind; targetId: string; sha256: string; content: string; changes: string[]; createdBy: string | null; at: number },
): Promise<{ id: string; documentId: string }> {
  const id = randomUUID();
  const documentId = r.documentId ?? randomUUID();
  await trx('reports').insert({
    id,
    document_id: documentId,
    revision: r.revision,
    lab_id: r.labId,
    kind: r.kind,
    target_id: r.targetId,
    sha256: r.sha256,
    content_json: r.content,
    changes_json: JSON.stringify(r.changes),
    created_by: r.createdBy,
    created_at: r.at,
  });
  return { id, documentId };
}
