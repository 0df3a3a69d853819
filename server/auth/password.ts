/** Password hashing with argon2id (@node-rs/argon2, OWASP's suggested minimum parameters). */
import { hash, verify } from '@node-rs/argon2';

const params = { memoryCost: 19456, timeCost: 2, parallelism: 1, outputLen: 32 } as const;

export function hashPassword(password: string): Promise<string> {
  return hash(password, { ...params, algorithm: 2 /* Argon2id */ });
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash of nothing in particular, verified against when the user does not exist, so that an
 * unknown e-mail takes as long to refuse as a wrong password. */
let decoy: Promise<string> | null = null;
export function decoyHash(): Promise<string> {
  decoy ??= hashPassword('decoy-password-that-matches-nobody');
  return decoy;
}
