import { createHash, randomBytes } from 'node:crypto';

/** SHA-256 of a token, hex; the only form in which e-mailed tokens are stored. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A single-use token for a link in an e-mail: 32 random bytes, base64url, and its hash. */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;
export const PASSWORD_RESET_LIFETIME_MS = 60 * 60 * 1000;
export const EMAIL_VERIFICATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;
export const SIGN_UP_LIFETIME_MS = 24 * 60 * 60 * 1000;
