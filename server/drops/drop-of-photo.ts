import 'server-only';
import { getDropOfPhoto } from '@/db/queries/drops';
import { getPhoto } from '@/db/queries/photos';
import { notFound } from '@/lib/app-error';
import type { DropOfPhoto } from '@/lib/contracts/drops';

/** The drop saved from a photo (null when none yet) with all its revisions, newest first. */
export async function loadDropOfPhoto(
  organizationId: string,
  photoId: string,
): Promise<DropOfPhoto> {
  if (!(await getPhoto(organizationId, photoId))) throw notFound('That photo');
  return getDropOfPhoto(organizationId, photoId);
}
