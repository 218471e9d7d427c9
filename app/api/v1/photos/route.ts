import { V1_ENDPOINTS } from '@/lib/contracts/api-v1-endpoints';
import { postDropPhoto } from '@/server/api-v1/post-photo';
import { apiV1Route } from '@/server/http/api-v1';

/** Posts a drop photo (multipart): checked, stored, analysed; the saved result comes back. */
export const POST = apiV1Route(V1_ENDPOINTS.postPhoto, async ({ caller, body, files }) =>
  postDropPhoto(caller, body, files.photo),
);
