import 'server-only';
import type { z } from 'zod';
import type { Action } from '@/lib/auth/permissions';
import { route } from '@/lib/auth/guard';
import {
  archiveOrDeleteQuerySchema,
  parseJsonBody,
  parseSearchParams,
} from '@/lib/validation/records';
import type { ArchiveOrDeleteQuery } from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };
type Actor = { organizationId: string; userId: string };

/**
 * GET, PATCH and DELETE of one lab record (`/api/<records>/[id]`), the same for every entity:
 * read with `readAction`, change with optimistic concurrency and archive-or-delete with
 * `writeAction`; the body key names the record (e.g. `{ batch }`).
 */
export function recordRoutes<Schema extends z.ZodType, Record>(config: {
  key: string;
  /** Plural, for "Your role … does not allow you to change batches." */
  plural: string;
  writeAction: Action;
  updateSchema: Schema;
  get(organizationId: string, id: string): Promise<Record>;
  update(actor: Actor, id: string, input: z.output<Schema>): Promise<Record>;
  archiveOrDelete(
    actor: Actor,
    id: string,
    options: ArchiveOrDeleteQuery,
  ): Promise<{ outcome: 'archived' | 'deleted'; record: Record }>;
}) {
  const actorOf = (ctx: { organization: { id: string }; user: { id: string } }): Actor => ({
    organizationId: ctx.organization.id,
    userId: ctx.user.id,
  });
  return {
    GET: route<Params>('organization:read', async (_request, ctx, { params }) => {
      const { id } = await params;
      return Response.json({ [config.key]: await config.get(ctx.organization.id, id) });
    }),
    PATCH: route<Params>(
      config.writeAction,
      async (request, ctx, { params }) => {
        const { id } = await params;
        const input = await parseJsonBody(request, config.updateSchema);
        return Response.json({ [config.key]: await config.update(actorOf(ctx), id, input) });
      },
      { what: `change ${config.plural}` },
    ),
    DELETE: route<Params>(
      config.writeAction,
      async (request, ctx, { params }) => {
        const { id } = await params;
        const options = parseSearchParams(
          archiveOrDeleteQuerySchema,
          new URL(request.url).searchParams,
        );
        const { outcome, record } = await config.archiveOrDelete(actorOf(ctx), id, options);
        return Response.json({ outcome, [config.key]: record });
      },
      { what: `archive or delete ${config.plural}` },
    ),
  };
}
