/**
 * One-time tokens for e-mailed links (invitations, password resets): 32 random bytes, sent as
 * base64url, stored only as their SHA-256 so a database copy cannot be used to open the links.
 */
import { createHash, randomBytes } from 'node:crypto';

/** Invitation links stay valid for 72 hours. */
export const invitationLifetimeMs = 72 * 60 * 60 * 1000;
/** Password-reset links stay valid for 1 hour (common practice, no source). */
export const passwordResetLifetimeMs = 60 * 60 * 1000;

/** A fresh token (43 base64url characters) and the hash to store. */
export function createOneTimeToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

/** SHA-256 of the token, 64 hex characters. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
