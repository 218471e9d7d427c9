import { renameOrganization } from '@/db/queries/organizations';
import { route } from '@/lib/auth/guard';
import { organizationNameSchema } from '@/lib/validation/auth';

/** Renames the active organization (admins). Body: { name }. */
export const PATCH = route(
  'team:manage',
  async (request, ctx) => {
    const body: unknown = await request.json().catch(() => null);
    const { name } = organizationNameSchema.parse(body ?? {});
    await renameOrganization({ organizationId: ctx.organization.id, name, actorUserId: ctx.user.id });
    return Response.json({ organization: { id: ctx.organization.id, name } });
  },
  { what: 'rename the organization' },
);
