import 'server-only';
import { and, desc, eq, inArray } from 'drizzle-orm';
import type { TensiometryKind, TensiometryResult } from '@/lib/contracts/tensiometry';
import { tensiometryResults, users } from '../schema';
import { database, type Executor } from './transaction';

export async function insertTensiometryResult(
  db: Executor,
  row: typeof tensiometryResults.$inferInsert,
): Promise<TensiometryResult> {
  const [saved] = await db.insert(tensiometryResults).values(row).returning();
  const { organizationId: _organizationId, ...result } = saved;
  return { ...result, createdByName: null };
}

/** Saved tensiometry results of the organization, newest first; optionally of some kinds. */
export async function listTensiometryResults(
  organizationId: string,
  options: { kinds?: readonly TensiometryKind[]; limit?: number } = {},
): Promise<TensiometryResult[]> {
  const rows = await database()
    .select({ result: tensiometryResults, createdByName: users.name })
    .from(tensiometryResults)
    .leftJoin(users, eq(users.id, tensiometryResults.createdByUserId))
    .where(
      and(
        eq(tensiometryResults.organizationId, organizationId),
        options.kinds?.length ? inArray(tensiometryResults.kind, [...options.kinds]) : undefined,
      ),
    )
    .orderBy(desc(tensiometryResults.createdAt), desc(tensiometryResults.id))
    .limit(options.limit ?? 50);
  return rows.map(({ result: { organizationId: _organizationId, ...result }, createdByName }) => ({
    ...result,
    createdByName,
  }));
}
