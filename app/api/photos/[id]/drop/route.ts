import { idParamsSchema } from '@/lib/contracts/common';
import { saveDropAnalysisSchema } from '@/lib/contracts/drops';
import { loadDropOfPhoto } from '@/server/drops/drop-of-photo';
import { saveDropAnalysis } from '@/server/drops/save-analysis';
import { json, route } from '@/server/http/route';

/** The drop saved from this photo and all its analysis revisions (newest first), or null. */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) => json({ drop: await loadDropOfPhoto(ctx.organization.id, params.id) }),
);

/**
 * Saves the photo's analysis to a sample: the server analyses the stored photo with the chosen
 * method and baseline → 201 { dropId, analysisId, revision, result }. Every save is a new revision.
 */
export const POST = route(
  {
    access: 'records:write',
    what: 'save measurements',
    params: idParamsSchema,
    body: saveDropAnalysisSchema,
  },
  async ({ actor, params, body }) => json(await saveDropAnalysis(actor, params.id, body), 201),
);
