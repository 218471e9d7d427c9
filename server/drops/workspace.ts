import 'server-only';
import {
  getSessionConditions,
  listProbeLiquidChoices,
  listSampleChoices,
  listSavedStateOfPhotos,
} from '@/db/queries/drops';
import { listPhotosByIds, listUnsavedPhotos } from '@/db/queries/photos';
import type { OrgContext } from '@/lib/auth/context';
import type { WorkspacePhotoSeed, WorkspaceSessionSeed } from '@/lib/contracts/photos';

/**
 * The measurement workspace: the samples and probe liquids to save to, and the photos of the
 * table: those asked for in the URL (saved or not, e.g. a drop reopened from its page) first,
 * then the user's photos not saved to a sample yet, oldest first, each with what is saved of it;
 * and the conditions of the first reopened drop's session, which a re-save keeps.
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
  const listed = [...reopened, ...unsaved.reverse().filter((p) => !requested.includes(p.id))];
  const saved = new Map(
    (
      await listSavedStateOfPhotos(
        organizationId,
        reopened.map((p) => p.id),
      )
    ).map((s) => [s.photoId, s]),
  );
  const photos: WorkspacePhotoSeed[] = listed.map((p) => {
    const state = saved.get(p.id);
    return {
      id: p.id,
      name: p.originalName,
      width: p.width,
      height: p.height,
      saved: state
        ? {
            dropId: state.dropId,
            sampleId: state.sampleId,
            probeLiquidId: state.probeLiquidId,
            sessionId: state.sessionId,
            revision: state.revision,
            method: state.method,
            baseline: state.baseline,
          }
        : null,
    };
  });
  const sessionId = photos.find((p) => p.saved?.sessionId)?.saved?.sessionId;
  const session: WorkspaceSessionSeed | null = sessionId
    ? await getSessionConditions(organizationId, sessionId)
    : null;
  return { samples, liquids, photos, session };
}
