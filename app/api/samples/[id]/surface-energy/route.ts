import {
  angleTableToLiquids,
  getSurfaceEnergySubject,
  listAngleTable,
  listSurfaceEnergyResults,
  saveSurfaceEnergyResult,
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

async function evaluate(ctx: OrgContext, sampleId: string, options: SampleSurfaceEnergyOptions) {
  const organizationId = ctx.organization.id;
  const readAll = can(ctx.organization.role, 'results:read-all');
  const subject = await getSurfaceEnergySubject(organizationId, { sampleId });
  const angleTable = await listAngleTable(organizationId, { sampleId }, { readAll });
  const liquids = angleTableToLiquids(angleTable);
  return {
    subject,
    angleTable,
    readAll,
    availability: methodAvailability(liquids),
    outputs: computeSurfaceEnergy(liquids, options),
  };
}

/**
 * The sample's angle table (mean ± SD and n per probe liquid, from the latest analysis of each
 * drop; approved results only for viewers), the computed surface energy and the saved results.
 * Query: methods=owrk,wu, uncertaintyBasis=mean|single, envelopeAngleDeg.
 */
export const GET = route<Params>('organization:read', async (request, ctx, { params }) => {
  const { id } = await params;
  const options = parseSearchParams(
    sampleSurfaceEnergyQuerySchema,
    new URL(request.url).searchParams,
  );
  const evaluated = await evaluate(ctx, id, options);
  const saved = await listSurfaceEnergyResults(ctx.organization.id, { sampleId: id });
  return Response.json({ ...evaluated, options, saved });
});

/**
 * Computes the surface energy from the sample's drops and saves it with its inputs.
 * Body: { methods?, uncertaintyBasis?, envelopeAngleDeg? } → 201 { result }.
 */
export const POST = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const options = await parseJsonBody(request, sampleSurfaceEnergySchema);
    const { subject, angleTable, readAll, outputs } = await evaluate(ctx, id, options);
    if (angleTable.length === 0) {
      throw new HttpError(
        422,
        'no_angles',
        'This sample has no analysed drops yet, so there is nothing to compute. Measure at least two probe liquids on it first.',
      );
    }
    if (!outputs.results.some((r) => r.status === 'ok')) {
      throw new HttpError(
        422,
        'nothing_computed',
        'None of the chosen methods could be computed for this sample; see each method’s reason, choose another method or measure more liquids.',
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
      { sampleId: subject.id },
      { subject: { kind: 'sample', id: subject.id }, options, liquids: angleTable, readAll },
      outputs,
    );
    return Response.json({ result }, { status: 201 });
  },
  { what: 'save surface energy results' },
);
