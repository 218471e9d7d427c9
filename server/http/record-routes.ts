import 'server-only';
import { archiveOrDeleteQuerySchema, idParamsSchema } from '@/lib/contracts/common';
import { archiveOrDeleteRecord } from '../records/archive-or-delete';
import { createRecord } from '../records/create';
import { getRecord } from '../records/get';
import type { AnyRecordKind } from '../records/kind';
import { listRecords } from '../records/list';
import { updateRecord } from '../records/update';
import { json, route } from './route';

/*
 * The route handlers of a kind of lab record, the same for every kind (server/records/kinds.ts).
 * Reading is open to every member; writing needs the kind's `writeAction`.
 */

/**
 * `/api/<records>`: GET lists (filters, sort and page in the query string) → { items, total,
 * page, pageSize }; POST creates → 201 { <key> }.
 */
export function recordCollectionRoutes(kind: AnyRecordKind) {
  return {
    GET: route({ access: 'organization:read', query: kind.schemas.list }, async ({ ctx, query }) =>
      json(await listRecords(kind, ctx.organization.id, query)),
    ),
    POST: route(
      { access: kind.writeAction, what: `add ${kind.plural}`, body: kind.schemas.create },
      async ({ actor, body }) => json({ [kind.key]: await createRecord(kind, actor, body) }, 201),
    ),
  };
}

/**
 * `/api/<records>/[id]`: GET → { <key> }; PATCH with { version, …fields } → { <key> } (409
 * stale_version with `current` when it moved on); DELETE archives the record when results
 * depend on it (or with ?mode=archive), else deletes it → { outcome, <key> }.
 */
export function recordItemRoutes(kind: AnyRecordKind) {
  return {
    GET: route({ access: 'organization:read', params: idParamsSchema }, async ({ ctx, params }) =>
      json({ [kind.key]: await getRecord(kind, ctx.organization.id, params.id) }),
    ),
    PATCH: route(
      {
        access: kind.writeAction,
        what: `change ${kind.plural}`,
        params: idParamsSchema,
        body: kind.schemas.update,
      },
      async ({ actor, params, body }) =>
        json({ [kind.key]: await updateRecord(kind, actor, params.id, body) }),
    ),
    DELETE: route(
      {
        access: kind.writeAction,
        what: `archive or delete ${kind.plural}`,
        params: idParamsSchema,
        query: archiveOrDeleteQuerySchema,
      },
      async ({ actor, params, query }) => {
        const { outcome, record } = await archiveOrDeleteRecord(kind, actor, params.id, query);
        return json({ outcome, [kind.key]: record });
      },
    ),
  };
}

/**
 * `/api/<records>/export.csv`: every record matching the list's filters and sort (all pages) as
 * UTF-8 CSV, streamed page by page; the same query as the list.
 */
export function recordExportRoute(kind: AnyRecordKind) {
  return route(
    { access: 'results:export', what: 'export tables', query: kind.schemas.list },
    async ({ ctx, query }) => kind.exportCsv(ctx.organization.id, query),
  );
}
