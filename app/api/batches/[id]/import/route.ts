import { idParamsSchema } from '@/lib/contracts/common';
import { importRequestSchema } from '@/lib/contracts/import';
import { importManualAngles } from '@/server/drops/import-angles';
import { json, route } from '@/server/http/route';

/**
 * Imports hand-read contact angles into a batch (legacy data). Body: { csv } with the columns
 * Sample label, Probe liquid, Left angle (°), Right angle (°), Measured at, Operator, Note.
 * All or nothing: → 201 { imported, dropIds }, or 400 invalid_rows with `issues`
 * [{ row, column, message }] naming every problem.
 */
export const POST = route(
  {
    access: 'records:write',
    what: 'import results',
    params: idParamsSchema,
    body: importRequestSchema,
    // Up to MAX_IMPORT_CHARS characters of CSV, several bytes each in UTF-8 and JSON.
    maxBodyBytes: 6 * 1024 * 1024,
  },
  async ({ actor, params, body }) =>
    json(await importManualAngles(actor, params.id, body.csv), 201),
);
