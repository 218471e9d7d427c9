'use server';

import { revalidatePath } from 'next/cache';
import { actorOf } from '@/server/actor';
import { apiTokenCreateSchema, apiTokenIdSchema } from '@/lib/contracts/api-tokens';
import { createApiToken } from '@/server/api-tokens/create';
import { revokeApiToken } from '@/server/api-tokens/revoke';
import { formAction } from '@/server/http/action';

/** Makes an API token; the form shows the token this once. */
export const createApiTokenAction = formAction({
  access: 'team:manage',
  what: 'make API tokens',
  input: apiTokenCreateSchema,
  keep: ['name', 'scope', 'expiresInDays'],
  async run(input, { ctx }) {
    const { token, expiresAt } = await createApiToken(actorOf(ctx), input);
    revalidatePath('/team/api');
    return {
      notice: `Token “${input.name}” made; it works until ${expiresAt.toISOString().slice(0, 10)}. Copy it now: it is not shown again.`,
      values: { token },
    };
  },
});

export const revokeApiTokenAction = formAction({
  access: 'team:manage',
  what: 'revoke API tokens',
  input: apiTokenIdSchema,
  async run({ tokenId }, { ctx }) {
    await revokeApiToken(actorOf(ctx), tokenId);
    revalidatePath('/team/api');
    return { notice: 'Token revoked.' };
  },
});
