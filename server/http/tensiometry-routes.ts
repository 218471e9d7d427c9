import 'server-only';
import type { z } from 'zod';
import type { OrgContext } from '@/lib/auth/context';
import {
  tensiometryListQuerySchema,
  type TensiometryKind,
  type TensiometryResult,
} from '@/lib/contracts/tensiometry';
import { listSavedTensiometry } from '../tensiometry/list';
import { json, route } from './route';

/**
 * POST and GET of one tensiometry calculation (`/api/tensiometry/<kind>`): POST computes for
 * every member and, with `save: true`, stores the result for 'records:write' → { result, saved? }
 * (201 when saved); GET lists the saved results of its kinds, newest first (query: limit, and
 * kind where a route has several).
 */
export function tensiometryRoutes<Body extends z.ZodType>(config: {
  body: Body;
  maxBodyBytes?: number;
  /** The kinds GET lists; a `kind` in the query narrows them to one. */
  kinds: readonly TensiometryKind[];
  compute: (ctx: OrgContext, body: z.output<Body>) => Promise<{ saved?: TensiometryResult }>;
}) {
  return {
    POST: route(
      { access: 'organization:read', body: config.body, maxBodyBytes: config.maxBodyBytes },
      async ({ ctx, body }) => {
        const reply = await config.compute(ctx, body as z.output<Body>);
        return json(reply, reply.saved ? 201 : 200);
      },
    ),
    GET: route(
      { access: 'organization:read', query: tensiometryListQuerySchema },
      async ({ ctx, query }) => {
        const asked = query.kind && config.kinds.includes(query.kind) ? [query.kind] : config.kinds;
        return json(
          await listSavedTensiometry(ctx.organization.id, { kinds: asked, limit: query.limit }),
        );
      },
    ),
  };
}
