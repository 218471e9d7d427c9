import { getDropOfPhoto, saveDropAnalysis } from '@/db/queries/drops';
import { getPhoto } from '@/db/queries/photos';
import { refreshVerdictOfSampleQuietly } from '@/lib/alerts/out-of-spec';
import { analyseDrop } from '@/lib/analysis';
import { AnalysisError, type FitMethod } from '@/lib/analysis/types';
import { HttpError, notFound } from '@/lib/api/errors';
import { route } from '@/lib/auth/guard';
import { loadPhotoGray } from '@/lib/measure/photo-pixels';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { saveDropAnalysisSchema } from '@/lib/validation/measure';

type Params = { params: Promise<{ id: string }> };

/** The drop saved from this photo and all its analysis revisions (newest first), or null. */
export const GET = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  if (!(await getPhoto(ctx.organization.id, id))) throw notFound('That photo');
  return Response.json({ drop: await getDropOfPhoto(ctx.organization.id, id) });
});

/**
 * Saves the photo's analysis to a sample. The server runs lib/analysis itself on the stored
 * photo with the method and baseline the user chose, so what is kept is what the engine computes,
 * never numbers sent by a browser. Every save is a new revision.
 */
export const POST = route<Params>(
  'records:write',
  async (request, ctx, { params }) => {
    const { id } = await params;
    const body = saveDropAnalysisSchema.parse(await request.json().catch(() => ({})));
    if (!(await getPhoto(ctx.organization.id, id))) throw notFound('That photo');
    const image = await loadPhotoGray(ctx.organization.id, id);
    const options = {
      method: body.method as FitMethod,
      ...(body.baseline ? { baseline: body.baseline } : {}),
      ...(body.scalePxPerMm ? { scalePxPerMm: body.scalePxPerMm } : {}),
      ...(body.settings ? { settings: body.settings } : {}),
    };
    let result;
    try {
      result = await analyseDrop(image, options);
    } catch (error) {
      if (error instanceof AnalysisError) {
        throw new HttpError(422, error.code, `${error.message} Adjust the baseline or choose another photo, then save again.`);
      }
      throw error;
    }
    const { edgePoints: _edgePoints, profile: _profile, ...kept } = result;
    const saved = await saveDropAnalysis({
      organizationId: ctx.organization.id,
      userId: ctx.user.id,
      photoId: id,
      sampleId: body.sampleId,
      probeLiquidId: body.probeLiquidId,
      sessionId: body.sessionId ?? null,
      analysis: {
        method: body.method,
        baseline: body.baseline,
        options: {
          scalePxPerMm: body.scalePxPerMm ?? null,
          baselineSource: result.baselineSource,
          settings: result.settings,
        },
        result: { ...kept, edgePointCount: result.edgePointCount },
        softwareVersion: SOFTWARE_VERSION,
      },
    });
    await refreshVerdictOfSampleQuietly(ctx.organization.id, body.sampleId);
    return Response.json({ ...saved, result: kept }, { status: 201 });
  },
  { what: 'save measurements' },
);
