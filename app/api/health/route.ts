import { json, route } from '@/server/http/route';
import { databaseAnswers } from '@/server/health/check';

export const dynamic = 'force-dynamic';

/** Liveness and database reachability, for the start script and monitoring. */
export const GET = route({ access: 'public' }, async () =>
  (await databaseAnswers())
    ? json({ status: 'ok' })
    : json(
        {
          status: 'degraded',
          error: { code: 'database_unreachable', message: 'The database does not answer.' },
        },
        503,
      ),
);
