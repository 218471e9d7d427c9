import { getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { analyses, drops } from '@/db/schema';
import { apiRequest } from '../support/request';

type Handler<P> = (request: Request, context: P) => Promise<Response>;

/** Calls a route handler in-process as Next would, and reads its JSON body. */
export async function call<P = unknown>(
  handler: Handler<P>,
  path: string,
  options: { method?: string; sessionId: string; body?: unknown; params?: P },
) {
  const response = await handler(
    apiRequest(path, {
      method: options.method ?? 'GET',
      sessionId: options.sessionId,
      body: options.body,
    }),
    (options.params ?? {}) as P,
  );
  return { status: response.status, body: await response.json() };
}

export const idParams = (id: string) => ({ params: Promise.resolve({ id }) });

type Revision = { meanDeg: number; reviewStatus?: 'draft' | 'submitted' | 'approved' | 'rejected' };

/**
 * A drop read by hand (no photo) with its analysis revisions 1…n, oldest first (invented angles).
 */
export async function addDrop(
  organizationId: string,
  sampleId: string,
  probeLiquidId: string,
  revisions: Revision[],
): Promise<string> {
  const db = getDb();
  const dropId = newId();
  await db
    .insert(drops)
    .values({ id: dropId, organizationId, sampleId, probeLiquidId, source: 'import' });
  for (const [i, r] of revisions.entries()) {
    await db.insert(analyses).values({
      id: newId(),
      organizationId,
      dropId,
      revision: i + 1,
      method: 'manual',
      result: {},
      leftDeg: r.meanDeg,
      rightDeg: r.meanDeg,
      meanDeg: r.meanDeg,
      softwareVersion: 'test',
      reviewStatus: r.reviewStatus ?? 'draft',
    });
  }
  return dropId;
}
