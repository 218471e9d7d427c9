'use server';

import { revalidatePath } from 'next/cache';
import {
  WEBHOOK_EVENT_TYPES,
  webhookCreateSchema,
  webhookDeliveryIdSchema,
  webhookEventField,
  webhookIdSchema,
} from '@/lib/contracts/webhooks';
import { actorOf } from '@/server/actor';
import { formAction } from '@/server/http/action';
import { createWebhook } from '@/server/webhooks/create';
import { redeliverWebhook } from '@/server/webhooks/redeliver';
import { removeWebhook } from '@/server/webhooks/remove';

/** Registers a webhook; the form shows its signing secret this once. */
export const createWebhookAction = formAction({
  access: 'team:manage',
  what: 'manage webhooks',
  input: webhookCreateSchema,
  keep: ['url', 'description', ...WEBHOOK_EVENT_TYPES.map(webhookEventField)],
  async run(input, { ctx }) {
    const { secret, url } = await createWebhook(actorOf(ctx), input);
    revalidatePath('/team/webhooks');
    return {
      notice: `Webhook for ${url} registered. Copy its signing secret now: it is not shown again.`,
      values: { secret },
    };
  },
});

export const removeWebhookAction = formAction({
  access: 'team:manage',
  what: 'manage webhooks',
  input: webhookIdSchema,
  async run({ webhookId }, { ctx }) {
    await removeWebhook(actorOf(ctx), webhookId);
    revalidatePath('/team/webhooks');
    return { notice: 'Webhook deleted.' };
  },
});

export const redeliverWebhookAction = formAction({
  access: 'team:manage',
  what: 'manage webhooks',
  input: webhookDeliveryIdSchema,
  async run({ deliveryId }, { ctx }) {
    const { webhookId } = await redeliverWebhook(actorOf(ctx), deliveryId);
    revalidatePath(`/team/webhooks/${webhookId}`);
    return { notice: 'Queued to be sent again now.' };
  },
});
