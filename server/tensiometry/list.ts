import 'server-only';
import { listTensiometryResults } from '@/db/queries/tensiometry';
import type { TensiometryKind, TensiometryResult } from '@/lib/contracts/tensiometry';

/** Saved tensiometry results of the organization, newest first, of the given kinds (or all). */
export async function listSavedTensiometry(
  organizationId: string,
  options: { kinds?: readonly TensiometryKind[]; limit?: number },
): Promise<{ items: TensiometryResult[] }> {
  return { items: await listTensiometryResults(organizationId, options) };
}
