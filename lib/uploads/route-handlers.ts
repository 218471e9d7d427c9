import 'server-only';

import { createRouteHandler } from 'uploadthing/next';
import type { FileRouter, RouteHandlerConfig } from 'uploadthing/types';

import { routeHandlerConfig } from './config';

type NextRouteHandlers = ReturnType<typeof createRouteHandler>;
type RouteRequest = Parameters<NextRouteHandlers['GET']>[0];

/**
 * GET and POST for app/api/uploadthing/route.ts, configured on the first request rather than
 * when the module loads: `next build` imports route modules, and the build has no upload service
 * configured (UPLOAD_FAKE_URL / UPLOADTHING_TOKEN are runtime settings).
 */
export function createUploadRouteHandlers(
  router: FileRouter,
  overrides: RouteHandlerConfig = {},
): NextRouteHandlers {
  let handlers: NextRouteHandlers | null = null;
  const current = () =>
    (handlers ??= createRouteHandler({
      router,
      config: routeHandlerConfig(process.env, overrides),
    }));
  return {
    GET: (request: RouteRequest) => current().GET(request),
    POST: (request: RouteRequest) => current().POST(request),
  };
}
