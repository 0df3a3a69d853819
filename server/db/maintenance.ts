/**
 * Whole-database statements of the backup command: SQLite's integrity check and an online copy
 * (sqlite.org/pragma.html#pragma_integrity_check, sqlite.org/lang_vacuum.html#vacuuminto).
 */
import type { Db } from './knex';

/** 'ok', or SQLite's list of problems joined by '; '. */
export async function integrityCheck(db: Db): Promise<string> {
  const rows: { integrity_check: string }[] = await db.raw('PRAGMA integrity_check');
  return rows.map((r) => r.integrity_check).join('; ');
}

/** Writes a consistent copy of the database to `file` (one read transaction). */
export async function vacuumInto(db: Db, file: string): Promise<void> {
  await db.raw('VACUUM INTO ?', [file]);
}
