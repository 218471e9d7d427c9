import { isWatching, setWatching } from '@/db/queries/alerts';
import { route } from '@/lib/auth/guard';

type Params = { params: Promise<{ id: string }> };

/** Whether the signed-in user gets an e-mail when a batch of this coating turns out of spec. */
export const GET = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json({ watching: await isWatching(ctx.user.id, id) });
});

/** Start watching the coating. */
export const PUT = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json(
    await setWatching({
      organizationId: ctx.organization.id,
      userId: ctx.user.id,
      coatingId: id,
      watching: true,
    }),
  );
});

/** Stop watching the coating. */
export const DELETE = route<Params>('results:read-all', async (_request, ctx, { params }) => {
  const { id } = await params;
  return Response.json(
    await setWatching({
      organizationId: ctx.organization.id,
      userId: ctx.user.id,
      coatingId: id,
      watching: false,
    }),
  );
});
