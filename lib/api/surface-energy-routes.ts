import {
  angleTableToLiquids,
  getSurfaceEnergySubject,
  listAngleTable,
  listSurfaceEnergyResults,
  saveSurfaceEnergyResult,
  type SurfaceEnergySubject,
} from '@/db/queries/surface-energy';
import { HttpError } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { parseJsonBody, parseSearchParams } from '@/lib/validation/records';
import {
  computeSurfaceEnergy,
  methodAvailability,
  sampleSurfaceEnergyQuerySchema,
  sampleSurfaceEnergySchema,
  type SampleSurfaceEnergyOptions,
} from '@/lib/validation/surface-energy';

type Params = { params: Promise<{ id: string }> };
type Kind = 'sample' | 'batch';

const subjectOf = (kind: Kind, id: string): SurfaceEnergySubject =>
  kind === 'sample' ? { sampleId: id } : { batchId: id };

async function evaluate(ctx: OrgContext, subject: SurfaceEnergySubject, options: SampleSurfaceEnergyOptions) {
  const organizationId = ctx.organization.id;
  const readAll = can(ctx.organization.role, 'results:read-all');
  const summary = await getSurfaceEnergySubject(organizationId, subject);
  const angleTable = await listAngleTable(organizationId, subject, { readAll });
  const liquids = angleTableToLiquids(angleTable);
  return {
    subject: summary,
    angleTable,
    readAll,
    availability: methodAvailability(liquids),
    outputs: computeSurfaceEnergy(liquids, options),
  };
}

/**
 * GET and POST of /api/samples/[id]/surface-energy and /api/batches/[id]/surface-energy. A batch
 * pools the drops of all its live samples: per probe liquid, the mean ± SD over every drop.
 *
 * GET: the angle table (latest analysis of each drop; approved results only for viewers), the
 * computed surface energy and the saved results. Query: methods=owrk,wu,
 * uncertaintyBasis=mean|single, envelopeAngleDeg.
 * POST: computes and saves with its inputs. Body: { methods?, uncertaintyBasis?,
 * envelopeAngleDeg? } → 201 { result }.
 */
export function surfaceEnergyRoutes(kind: Kind) {
  const GET = route<Params>('organization:read', async (request, ctx, { params }) => {
    const { id } = await params;
    const options = parseSearchParams(sampleSurfaceEnergyQuerySchema, new URL(request.url).searchParams);
    const evaluated = await evaluate(ctx, subjectOf(kind, id), options);
    const saved = await listSurfaceEnergyResults(ctx.organization.id, subjectOf(kind, evaluated.subject.id));
    return Response.json({ ...evaluated, options, saved });
  });

  const POST = route<Params>(
    'records:write',
    async (request, ctx, { params }) => {
      const { id } = await params;
      const options = await parseJsonBody(request, sampleSurfaceEnergySchema);
      const { subject, angleTable, readAll, outputs } = await evaluate(ctx, subjectOf(kind, id), options);
      if (angleTable.length === 0) {
        throw new HttpError(
          422,
          'no_angles',
          `This ${kind} has no analysed drops yet, so there is nothing to compute. Measure at least two probe liquids on ${kind === 'sample' ? 'it' : 'its samples'} first.`,
        );
      }
      if (!outputs.results.some((r) => r.status === 'ok')) {
        throw new HttpError(
          422,
          'nothing_computed',
          `None of the chosen methods could be computed for this ${kind}; see each method’s reason, choose another method or measure more liquids.`,
          {
            methods: outputs.results
              .map((r) => r.reason)
              .filter(Boolean)
              .join(' '),
          },
        );
      }
      const result = await saveSurfaceEnergyResult(
        { organizationId: ctx.organization.id, userId: ctx.user.id },
        subjectOf(kind, subject.id),
        { subject: { kind, id: subject.id }, options, liquids: angleTable, readAll },
        outputs,
      );
      return Response.json({ result }, { status: 201 });
    },
    { what: 'save surface energy results' },
  );

  return { GET, POST };
}
