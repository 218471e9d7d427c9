import { getSql } from '@/db/client';

export const dynamic = 'force-dynamic';

/** Liveness and database reachability, for the start script and monitoring. */
export async function GET() {
  try {
    await getSql()`select 1`;
    return Response.json({ status: 'ok' });
  } catch {
    return Response.json(
      { status: 'degraded', error: { code: 'database_unreachable', message: 'The database does not answer.' } },
      { status: 503 },
    );
  }
}
