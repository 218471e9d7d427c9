import 'server-only';
import { eq } from 'drizzle-orm';
import { organizationDataVersions } from '../schema';
import { database, type Executor } from './transaction';

/**
 * The organization's data version (migration 0017 gives it a new value whenever its lab data
 * changes); 0n when nothing has changed since the versions were introduced.
 */
export async function organizationDataVersion(
  organizationId: string,
  db: Executor = database(),
): Promise<bigint> {
  const [row] = await db
    .select({ version: organizationDataVersions.version })
    .from(organizationDataVersions)
    .where(eq(organizationDataVersions.organizationId, organizationId));
  return row?.version ?? 0n;
}
