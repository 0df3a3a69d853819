/**
 * Display names are unique within a lab, ignoring case, spaces and look-alike forms (Unicode
 * NFKC), so no account can sign under a name a reader takes for another member's.
 */
import type { Db } from '../db/knex';
import { labDisplayNames } from '../db/members';
import { AppError } from '../errors';

/** The form two names are compared in: NFKC, lower case, without whitespace or invisible characters. */
export const nameKey = (name: string) => name.normalize('NFKC').toLowerCase().replace(/[\s\u00AD\u200B-\u200F\u2060\uFEFF]+/gu, '');

/** The refusal when a member of the lab (other than `userId`) already goes by this name, else null. */
export async function displayNameClash(db: Db, labId: string, name: string, userId: string | null): Promise<AppError | null> {
  const key = nameKey(name);
  const clash = (await labDisplayNames(db, labId)).find((m) => m.user_id !== userId && nameKey(m.display_name) === key);
  if (!clash) return null;
  return new AppError(
    409,
    'display_name_taken',
    `A member of this lab is already called "${clash.display_name}". Names must tell people apart: use another form of your name, for example with a middle initial.`,
    { fields: [{ path: 'displayName', message: 'Another member of this lab has this name' }] },
  );
}
