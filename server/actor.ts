import 'server-only';

/** Who makes a change, in which organization: the organization scope and the audit row. */
export type Actor = { organizationId: string; userId: string };

export function actorOf(ctx: { organization: { id: string }; user: { id: string } }): Actor {
  return { organizationId: ctx.organization.id, userId: ctx.user.id };
}
