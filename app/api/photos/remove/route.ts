import { removePhotosSchema } from '@/lib/contracts/photos';
import { removeUnsavedPhotos } from '@/server/photos/remove';
import { json, route } from '@/server/http/route';

/** Takes the signed-in user's unsaved photos out of the workspace → 200 { removed }. */
export const POST = route(
  { access: 'records:write', what: 'remove photos', body: removePhotosSchema },
  async ({ actor, body }) => json(await removeUnsavedPhotos(actor, body)),
);
