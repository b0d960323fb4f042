/** Invitation link tokens: 32 random bytes mailed in the link; only their SHA-256 is stored. */
import { createHash, randomBytes } from 'node:crypto';

export function newInvitationToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
