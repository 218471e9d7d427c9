import 'server-only';
import { AppError } from '@/lib/app-error';

export type TokenStatus = 'valid' | 'used' | 'expired' | 'unknown';

export function tokenStatus(row: { usedAt: Date | null; expiresAt: Date } | null): TokenStatus {
  if (!row) return 'unknown';
  if (row.usedAt) return 'used';
  if (row.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'valid';
}

/** Why a password-reset link does not work. */
export function resetTokenError(status: Exclude<TokenStatus, 'valid'>): AppError {
  const again = 'Ask for a new link with “Forgot password?” on the sign-in page.';
  if (status === 'used') {
    return new AppError('token_used', `This link was already used to set a password. ${again}`);
  }
  if (status === 'expired') {
    return new AppError('token_expired', `This link has expired (links last one hour). ${again}`);
  }
  return new AppError(
    'token_not_found',
    `This link is not valid; check that you opened the whole link from the mail. ${again}`,
  );
}

/** Why an address-confirmation link does not work. */
export function verificationTokenError(status: Exclude<TokenStatus, 'valid'> | 'stale'): AppError {
  const again = 'Sign in and use “Send the mail again” on the dashboard for a new link.';
  switch (status) {
    case 'used':
      return new AppError('token_used', 'This link was already used; your address is confirmed.');
    case 'expired':
      return new AppError('token_expired', `This link has expired (links last 7 days). ${again}`);
    case 'stale':
      return new AppError(
        'token_stale',
        `This link was sent to an address the account no longer uses. ${again}`,
      );
    default:
      return new AppError(
        'token_not_found',
        `This link is not valid; check that you opened the whole link from the mail. ${again}`,
      );
  }
}
