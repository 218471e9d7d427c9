import 'server-only';
import { listApiTokens } from '@/db/queries/api-tokens';
import type { ApiTokenSummary } from '@/lib/contracts/api-tokens';

/** The organization's API tokens for the admin's list (never the tokens themselves). */
export async function loadApiTokens(
  organizationId: string,
  now = new Date(),
): Promise<ApiTokenSummary[]> {
  const rows = await listApiTokens(organizationId);
  return rows.map((row) => ({
    ...row,
    status: row.revokedAt
      ? 'revoked'
      : row.expiresAt.getTime() <= now.getTime()
        ? 'expired'
        : 'active',
  }));
}
