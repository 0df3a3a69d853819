/**
 * The audit key: the secret the trail's hashes and checkpoints are sealed with (HMAC-SHA-256). It
 * lives outside the database, so someone who can edit the database file alone cannot make edited
 * entries verify. Given as text (AUDIT_KEY) or as a file (AUDIT_KEY_FILE, by default
 * DATA_DIR/audit-key), which is made at first start with 32 random bytes and mode 0600. A key file
 * that other users may read, that cannot be read, or that is too short stops the server.
 */
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';

export const MIN_KEY_LENGTH = 32;

export interface AuditKeySettings {
  /** The key as text, or null to use the file. */
  key: string | null;
  keyFile: string;
}

export interface AuditKey {
  key: Buffer;
  /** Where the key came from, for the start-up log ("AUDIT_KEY" or the file's path). */
  origin: string;
  created: boolean;
}

export class AuditKeyError extends Error {}

const fromText = (text: string, where: string): Buffer => {
  const trimmed = text.trim();
  if (trimmed.length < MIN_KEY_LENGTH) {
    throw new AuditKeyError(`The audit key in ${where} is ${trimmed.length} characters long; it must have at least ${MIN_KEY_LENGTH}.`);
  }
  return Buffer.from(trimmed, 'utf8');
};

/** Reads an existing key file, refusing one that other users can read or write. */
function readKeyFile(file: string): Buffer {
  let stat: fs.Stats;
  try {
    stat = fs.statSync(file);
  } catch (err) {
    throw new AuditKeyError(`The audit key file ${file} cannot be read (${(err as NodeJS.ErrnoException).code ?? String(err)}).`);
  }
  if (!stat.isFile()) throw new AuditKeyError(`The audit key file ${file} is not a regular file.`);
  const loose = stat.mode & 0o077;
  if (loose !== 0 && process.platform !== 'win32') {
    const mode = (stat.mode & 0o777).toString(8).padStart(3, '0');
    throw new AuditKeyError(
      `The audit key file ${file} can be read or changed by other users (mode ${mode}). Make it private with "chmod 600 ${file}" and start again.`,
    );
  }
  let text: string;
  try {
    text = fs.readFileSync(file, 'utf8');
  } catch (err) {
    throw new AuditKeyError(
      `The audit key file ${file} cannot be read (${(err as NodeJS.ErrnoException).code ?? String(err)}). It must belong to the user the server runs as, with mode 600.`,
    );
  }
  return fromText(text, file);
}

/**
 * The key from the settings; makes the key file when it does not exist yet and `mayCreate` allows
 * it (the caller refuses to make a new key over a trail that an earlier key sealed).
 */
export function loadAuditKey(settings: AuditKeySettings, mayCreate: () => string | null): AuditKey {
  if (settings.key !== null) return { key: fromText(settings.key, 'AUDIT_KEY'), origin: 'AUDIT_KEY', created: false };
  const file = settings.keyFile;
  if (fs.existsSync(file)) return { key: readKeyFile(file), origin: file, created: false };
  const refusal = mayCreate();
  if (refusal) throw new AuditKeyError(`There is no audit key file at ${file}, and ${refusal}`);
  const text = `${randomBytes(32).toString('hex')}\n`;
  try {
    fs.writeFileSync(file, text, { mode: 0o600, flag: 'wx' });
  } catch (err) {
    throw new AuditKeyError(`The audit key file ${file} could not be made (${(err as NodeJS.ErrnoException).code ?? String(err)}).`);
  }
  return { key: readKeyFile(file), origin: file, created: true };
}
