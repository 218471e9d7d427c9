import { idParamsSchema } from '@/lib/contracts/common';
import { isWatching, setWatching } from '@/server/alerts/watch';
import { json, route } from '@/server/http/route';

const watchRoute = (watching: boolean) =>
  route({ access: 'results:read-all', params: idParamsSchema }, async ({ actor, params }) =>
    json(await setWatching(actor, params.id, watching)),
  );

/** Whether the signed-in user gets an e-mail when a batch of this coating turns out of spec. */
export const GET = route(
  { access: 'results:read-all', params: idParamsSchema },
  async ({ ctx, params }) => json(await isWatching(ctx.user.id, params.id)),
);

/** Start watching the coating → { watching: true }. */
export const PUT = watchRoute(true);

/** Stop watching the coating → { watching: false }. */
export const DELETE = watchRoute(false);
