/** Password hashing with bcryptjs. */
import bcrypt from 'bcryptjs';

/** Cost 10: tens of milliseconds per hash on a small server (common practice for bcrypt). */
export const DEFAULT_BCRYPT_COST = 10;

export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}

export function checkPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}

const dummyHashes = new Map<number, Promise<string>>();

/**
 * Compared against when the e-mail is unknown, so a miss costs as much as a wrong password.
 * Made once per cost, asynchronously, so the first miss does not block the event loop.
 */
export function dummyHash(cost: number): Promise<string> {
  let hash = dummyHashes.get(cost);
  if (!hash) {
    hash = bcrypt.hash('not-a-real-password', cost);
    dummyHashes.set(cost, hash);
  }
  return hash;
}
