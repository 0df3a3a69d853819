/**
 * Repository of the validation-report registry: one append-only row per distinct content of a
 * report (lab, kind, target, sha256 of the content). The same content always finds the same row,
 * so a report regenerated from unchanged data keeps its id.
 */
import { randomUUID } from 'node:crypto';
import type { Db } from './knex';

export interface ReportRow {
  id: string;
  lab_id: string;
  kind: 'study' | 'standard';
  target_id: string;
  sha256: string;
  created_by: string | null;
  created_by_name: string | null;
  created_at: number;
}

function reports(db: Db) {
  return db({ r: 'reports' }).leftJoin({ u: 'users' }, 'u.id', 'r.created_by');
}
const COLUMNS = ['r.*', 'u.display_name as created_by_name'];

export function findReport(db: Db, labId: string, id: string): Promise<ReportRow | undefined> {
  return reports(db).where({ 'r.lab_id': labId, 'r.id': id }).first(COLUMNS);
}

export function findReportByContent(db: Db, labId: string, kind: string, targetId: string, sha256: string): Promise<ReportRow | undefined> {
  return reports(db).where({ 'r.lab_id': labId, 'r.kind': kind, 'r.target_id': targetId, 'r.sha256': sha256 }).first(COLUMNS);
}

export async function insertReport(
  trx: Db,
  r: { labId: string; kind: 'study' | 'standard'; targetId: string; sha256: string; createdBy: string | null; at: number },
): Promise<string> {
  const id = randomUUID();
  await trx('reports').insert({ id, lab_id: r.labId, kind: r.kind, target_id: r.targetId, sha256: r.sha256, created_by: r.createdBy, created_at: r.at });
  return id;
}
