/** Repository of uploaded files (the file itself lives under DATA_DIR/uploads, named by its row). */
import type { Db } from './knex';
import { pageOf, type ListQuery } from './list-query';

export interface UploadRow {
  id: string;
  lab_id: string;
  kind: 'time-data' | 'frf';
  original_name: string;
  stored_name: string;
  size_bytes: number;
  sha256: string;
  recipe_id: string | null;
  recipe_version: number | null;
  scenario_id: string | null;
  scenario_version: number | null;
  summary: string;
  status: string;
  created_by: string;
  created_by_name: string;
  created_at: number;
}

const COLUMNS = ['up.*', 'u.display_name as created_by_name'];
const uploads = (db: Db) => db({ up: 'uploads' }).join({ u: 'users' }, 'u.id', 'up.created_by');

export const UPLOAD_SORT_COLUMNS = { createdAt: 'up.created_at', name: 'up.original_name collate nocase' } as const;

export function listUploads(db: Db, labId: string, query: ListQuery & { kind?: string }) {
  const base = uploads(db).where('up.lab_id', labId);
  if (query.kind) base.where('up.kind', query.kind);
  return pageOf<UploadRow>(base, query, { sortColumns: UPLOAD_SORT_COLUMNS, nameColumn: 'up.original_name', idColumn: 'up.id', select: COLUMNS });
}

export function findUpload(db: Db, labId: string, id: string): Promise<UploadRow | undefined> {
  return uploads(db).where({ 'up.lab_id': labId, 'up.id': id }).first(COLUMNS);
}

export async function insertUpload(trx: Db, row: Omit<UploadRow, 'created_by_name'>): Promise<void> {
  await trx('uploads').insert(row);
}
