import 'server-only';
import { lockApiToken, updateApiToken } from '@/db/queries/api-tokens';
import { auditAs } from '@/db/queries/audit';
import { inTransaction } from '@/db/queries/transaction';
import { notFound } from '@/lib/app-error';
import type { Actor } from '../actor';

/** Revokes a token: from now on /api/v1 answers 401 to it. Revoking twice changes nothing. */
export async function revokeApiToken(actor: Actor, tokenId: string): Promise<void> {
  await inTransaction(async (tx) => {
    const row = await lockApiToken(tx, actor.organizationId, tokenId);
    if (!row) throw notFound('That API token');
    if (row.revokedAt) return;
    await updateApiToken(tx, row.id, { revokedAt: new Date() });
    await auditAs(tx, actor)('api_token.revoke', 'api_token', row.id, {
      before: { name: row.name, scope: row.scope },
    });
  });
}
