import 'server-only';
import { AppError } from '@/lib/app-error';
import type { InvitationStatus } from '@/lib/contracts/team';

/** Where an invitation stands: accepted, revoked, expired (7 days) or still pending. */
export function invitationStatus(row: {
  acceptedAt: Date | null;
  revokedAt: Date | null;
  expiresAt: Date;
}): InvitationStatus {
  if (row.acceptedAt) return 'accepted';
  if (row.revokedAt) return 'revoked';
  if (row.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'pending';
}

/** Why an invitation link no longer works (or never did). */
export function invitationClosedError(
  status: Exclude<InvitationStatus, 'pending'> | 'unknown',
): AppError {
  switch (status) {
    case 'accepted':
      return new AppError(
        'invitation_used',
        'This invitation was already used. Sign in, or ask an admin of the lab for a new invitation.',
      );
    case 'revoked':
      return new AppError(
        'invitation_revoked',
        'This invitation was withdrawn by an admin of the lab. Ask them for a new one if you still need access.',
      );
    case 'expired':
      return new AppError(
        'invitation_expired',
        'This invitation has expired (links last 7 days). Ask an admin of the lab to invite you again.',
      );
    default:
      return new AppError(
        'invitation_not_found',
        'This invitation link is not valid. Check that you opened the whole link from the mail, or ask for a new invitation.',
      );
  }
}
