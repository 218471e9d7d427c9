import { apiRequest } from '../support/request';
import { insertDrop, type Revision } from '../support/seed';

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

/**
 * A drop read by hand (no photo) with its analysis revisions 1…n, oldest first (invented angles).
 */
export const addDrop = (
  organizationId: string,
  sampleId: string,
  probeLiquidId: string,
  revisions: Revision[],
) => insertDrop(organizationId, sampleId, { probeLiquidId, revisions });
