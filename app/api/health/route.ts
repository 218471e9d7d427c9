import { json, route } from '@/server/http/route';
import { computeLoad, databaseAnswers } from '@/server/health/check';

export const dynamic = 'force-dynamic';

/**
 * Liveness and database reachability, for the start script and monitoring, with the number of
 * calculations running or waiting in the compute pool (`compute.inFlight`).
 */
export const GET = route({ access: 'public' }, async () =>
  (await databaseAnswers())
    ? json({ status: 'ok', compute: computeLoad() })
    : json(
        {
          status: 'degraded',
          error: { code: 'database_unreachable', message: 'The database does not answer.' },
        },
        503,
      ),
);
