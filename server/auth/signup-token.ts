/**
 * The sign-up confirmation token: the pending account (e-mail, name, team name, expiry) sealed
 * with AES-256-GCM under a key derived from the session secret, so nothing is stored until the
 * owner of the address opens the link (and chooses the password there), and the link reveals
 * nothing to whoever sees it. It is single-use in effect: confirming creates the account, and a
 * second confirm finds the address taken.
 */
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from 'node:crypto';
import { z } from 'zod';

export const SIGNUP_TOKEN_TTL_MS = 24 * 60 * 60 * 1000;

const pendingSchema = z.object({
  email: z.string(),
  name: z.string(),
  teamName: z.string(),
  expires: z.number(),
});
type PendingSignup = z.infer<typeof pendingSchema>;

/** The sealing key of the last secret seen (one per server: derived once, not per link). */
let cachedKey: { secret: string; key: Buffer } | null = null;
function keyOf(secret: string): Buffer {
  if (cachedKey?.secret !== secret) cachedKey = { secret, key: Buffer.from(hkdfSync('sha256', secret, 'runnel', 'sign-up confirmation token', 32)) };
  return cachedKey.key;
}

export function sealSignup(secret: string, pending: Omit<PendingSignup, 'expires'>, now = Date.now()): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', keyOf(secret), iv);
  const body = Buffer.concat([cipher.update(JSON.stringify({ ...pending, expires: now + SIGNUP_TOKEN_TTL_MS }), 'utf8'), cipher.final()]);
  return Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64url');
}

/** The pending sign-up, 'expired', or null when the token is not one of ours (forged, cut, garbled). */
export function openSignup(secret: string, token: string, now = Date.now()): PendingSignup | 'expired' | null {
  try {
    const raw = Buffer.from(token, 'base64url');
    if (raw.length < 29) return null;
    const decipher = createDecipheriv('aes-256-gcm', keyOf(secret), raw.subarray(0, 12));
    decipher.setAuthTag(raw.subarray(12, 28));
    const text = Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8');
    const pending = pendingSchema.parse(JSON.parse(text));
    return pending.expires <= now ? 'expired' : pending;
  } catch {
    return null;
  }
}
