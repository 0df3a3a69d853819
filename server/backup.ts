/**
 * `npm run backup`: a consistent online copy of the SQLite database, taken while the server runs,
 * into DATA_DIR/backups/<timestamp>.sqlite (printed). `VACUUM INTO` reads the whole database in
 * one read transaction of a separate connection, so the copy is one committed state even while a
 * study writes (WAL readers do not block the writer; sqlite.org/lang_vacuum.html#vacuuminto).
 * Stored upload files are copied beside it (DATA_DIR/backups/<timestamp>-uploads/) after the
 * snapshot: they are written once under unique names, so every row in the copy has its file.
 *
 * `npm run restore -- FILE`, with the server stopped: checks the backup (integrity_check, its
 * migrations), then puts it in place of the database file (temp file + rename, the old -wal/-shm
 * removed) and its uploads folder back into DATA_DIR/uploads. The audit key and checkpoint file are
 * not part of a backup; after a restore the integrity check names the entries lost (docs/approval.md).
 */
import fs from 'node:fs';
import path from 'node:path';
import { loadConfig, type Config } from './config';
import { createDb } from './db/knex';
import { integrityCheck, vacuumInto } from './db/maintenance';

export interface BackupResult {
  file: string;
  uploadsDir: string | null;
  bytes: number;
}

const stamp = (d = new Date()) => d.toISOString().replace(/[:.]/g, '-');

async function integrityOf(file: string): Promise<string> {
  const db = createDb(file);
  try {
    return await integrityCheck(db);
  } finally {
    await db.destroy();
  }
}

/** Takes the backup through a connection of its own; the running server is not disturbed. */
export async function backupDatabase(config: Pick<Config, 'dataDir' | 'databaseFile'>, now = new Date()): Promise<BackupResult> {
  if (config.databaseFile === ':memory:') throw new Error('DATABASE_FILE is :memory:; there is nothing on disk to back up.');
  if (!fs.existsSync(config.databaseFile)) throw new Error(`No database at ${config.databaseFile}.`);
  const dir = path.join(config.dataDir, 'backups');
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${stamp(now)}.sqlite`);
  const db = createDb(config.databaseFile);
  try {
    await vacuumInto(db, file);
  } finally {
    await db.destroy();
  }
  const check = await integrityOf(file);
  if (check !== 'ok') throw new Error(`The backup ${file} failed its integrity check: ${check}`);
  const uploads = path.join(config.dataDir, 'uploads');
  let uploadsDir: string | null = null;
  if (fs.existsSync(uploads)) {
    uploadsDir = path.join(dir, `${stamp(now)}-uploads`);
    fs.cpSync(uploads, uploadsDir, { recursive: true, filter: (src) => path.basename(src) !== 'incoming' });
  }
  return { file, uploadsDir, bytes: fs.statSync(file).size };
}

/** Puts a backup in place of the database (server stopped). Returns the file restored to. */
export async function restoreDatabase(config: Pick<Config, 'dataDir' | 'databaseFile'>, backupFile: string): Promise<string> {
  const source = path.resolve(backupFile);
  if (!fs.existsSync(source)) throw new Error(`No backup at ${source}.`);
  const check = await integrityOf(source);
  if (check !== 'ok') throw new Error(`The backup ${source} failed its integrity check: ${check}; nothing was restored.`);
  const target = config.databaseFile;
  fs.mkdirSync(path.dirname(target), { recursive: true });
  const temp = `${target}.restoring`;
  fs.copyFileSync(source, temp);
  for (const suffix of ['-wal', '-shm']) fs.rmSync(`${target}${suffix}`, { force: true });
  fs.renameSync(temp, target);
  const uploads = source.replace(/\.sqlite$/, '-uploads');
  if (uploads !== source && fs.existsSync(uploads)) fs.cpSync(uploads, path.join(config.dataDir, 'uploads'), { recursive: true });
  return target;
}

async function main(argv: string[]) {
  const config = loadConfig();
  const i = argv.indexOf('--restore');
  if (i >= 0) {
    const file = argv[i + 1];
    if (!file) throw new Error('Usage: npm run restore -- FILE   (stop the server first)');
    const target = await restoreDatabase(config, file);
    console.log(`Restored ${path.resolve(file)} to ${target}. Start the server with the same DATA_DIR.`);
    // The key and the checkpoints stay outside the backup (docs/approval.md, "Backups and restores").
    if (fs.existsSync(config.audit.checkpointFile)) {
      console.log(`The audit checkpoints in ${config.audit.checkpointFile} remember any entries written after this backup: the integrity check will report those as missing.`);
    }
    return;
  }
  const r = await backupDatabase(config);
  console.log(r.file);
  console.error(`Backup of ${config.databaseFile}: ${r.bytes} bytes, integrity ok${r.uploadsDir ? `; uploads copied to ${r.uploadsDir}` : ''}.`);
}

if (require.main === module) {
  main(process.argv.slice(2)).catch((err) => {
    console.error(err instanceof Error ? err.message : err);
    process.exit(1);
  });
}
