import { createHash, randomBytes } from 'node:crypto';

/** A new respondent token: 128 random bits, base64url (22 characters). */
export function newAttemptToken(): string {
  return randomBytes(16).toString('base64url');
}

/** What the database stores instead of the token: SHA-256, hex. */
export function hashAttemptToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** True when a string has the shape of a token (so malformed ones are never looked up). */
export function looksLikeAttemptToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{22}$/.test(token);
}
