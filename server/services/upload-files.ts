/**
 * Where uploaded files live: DATA_DIR/uploads/<generated name>. Multer writes each incoming file
 * to DATA_DIR/uploads/incoming/ first; a file is moved to its final name only inside the database
 * transaction that stores its row, so a rejected or failed upload leaves neither a row nor a file.
 */
import { createHash, randomBytes } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

export const uploadsDir = (dataDir: string) => path.join(dataDir, 'uploads');
export const incomingDir = (dataDir: string) => path.join(uploadsDir(dataDir), 'incoming');

/** A fresh, unguessable file name for an incoming or stored upload. */
export function generatedName(ext = '.csv'): string {
  return `${Date.now().toString(36)}-${randomBytes(12).toString('hex')}${ext}`;
}

export function sha256Hex(bytes: Buffer): string {
  return createHash('sha256').update(bytes).digest('hex');
}

/** Removes a temporary file, ignoring one already gone. */
export function discard(file: string | undefined): void {
  if (!file) return;
  try {
    fs.unlinkSync(file);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
  }
}

/**
 * Moves an incoming file to its stored name (same file system, so rename is atomic). Called inside
 * the transaction of the row: if it throws, the transaction rolls back.
 */
export function moveIntoPlace(incoming: string, dataDir: string, storedName: string): string {
  const target = path.join(uploadsDir(dataDir), storedName);
  fs.mkdirSync(path.dirname(target), { recursive: true });
  fs.renameSync(incoming, target);
  return target;
}

/** Incoming files older than an hour (from a process that stopped mid-upload) are removed. */
export function sweepIncoming(dataDir: string, olderThanMs = 3600_000, now = Date.now()): number {
  const dir = incomingDir(dataDir);
  if (!fs.existsSync(dir)) return 0;
  let removed = 0;
  for (const name of fs.readdirSync(dir)) {
    const file = path.join(dir, name);
    if (now - fs.statSync(file).mtimeMs > olderThanMs) {
      discard(file);
      removed++;
    }
  }
  return removed;
}
