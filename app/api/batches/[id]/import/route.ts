import { importManualAngles, invalidImport } from '@/db/queries/import';
import { refreshBatchVerdictQuietly } from '@/lib/alerts/out-of-spec';
import { route } from '@/lib/auth/guard';
import { parseImportCsv } from '@/lib/csv/import';
import { importRequestSchema } from '@/lib/validation/import';
import { parseJsonBody } from '@/lib/validation/records';

type Params = { params: Promise<{ id: string }> };

/**
 * Imports hand-read contact angles into a batch (legacy data). Body: { csv } with the columns
 * Sample label, Probe liquid, Left angle (°), Right angle (°), Measured at, Operator, Note.
 * All or nothing: → 201 { imported, dropIds }, or 400 invalid_rows with `issues`
 * [{ row, column, message }] naming every problem.
 */
export const POST = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const { csv } = await parseJsonBody(request, importRequestSchema);
    const parsed = parseImportCsv(csv);
    if (!parsed.ok) throw invalidImport(parsed.issues);
    const outcome = await importManualAngles(
      { organizationId: ctx.organization.id, userId: ctx.user.id },
      id,
      parsed.rows,
    );
    await refreshBatchVerdictQuietly(ctx.organization.id, id);
    return Response.json(outcome, { status: 201 });
  },
  { what: 'import results' },
);
