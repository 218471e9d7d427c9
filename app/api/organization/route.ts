import { organizationNameSchema } from '@/lib/contracts/team';
import { json, route } from '@/server/http/route';
import { renameOrganization } from '@/server/team/rename-organization';

/** Renames the active organization (admins). Body: { name } → { organization: { id, name } }. */
export const PATCH = route(
  { access: 'team:manage', what: 'rename the organization', body: organizationNameSchema },
  async ({ actor, body }) => json(await renameOrganization(actor, body.name)),
);
