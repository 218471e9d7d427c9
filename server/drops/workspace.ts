import 'server-only';
import { listProbeLiquidChoices, listSampleChoices } from '@/db/queries/drops';
import { listPhotosByIds, listUnsavedPhotos } from '@/db/queries/photos';
import type { OrgContext } from '@/lib/auth/context';

/**
 * The measurement workspace: the samples and probe liquids to save to, and the photos of the
 * strip: those asked for in the URL (saved or not, e.g. after a reload) first, then the user's
 * photos not saved to a sample yet.
 */
export async function loadMeasureWorkspace(ctx: OrgContext, requestedPhotoIds: string[]) {
  const organizationId = ctx.organization.id;
  const requested = requestedPhotoIds.slice(0, 50);
  const [samples, liquids, unsaved, reopened] = await Promise.all([
    listSampleChoices(organizationId),
    listProbeLiquidChoices(organizationId),
    listUnsavedPhotos(organizationId, ctx.user.id),
    listPhotosByIds(organizationId, requested),
  ]);
  const photos = [...reopened, ...unsaved.filter((p) => !requested.includes(p.id))];
  return { samples, liquids, photos };
}
