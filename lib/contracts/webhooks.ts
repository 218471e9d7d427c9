import { z } from 'zod';
import { recordId, requiredText, text } from './common';

/** The events an admin can subscribe a webhook to (the `type` of each delivery). */
export const WEBHOOK_EVENT_TYPES = [
  'analysis.saved',
  'review.decided',
  'batch.verdict_changed',
] as const;
export type WebhookEventType = (typeof WEBHOOK_EVENT_TYPES)[number];

export const WEBHOOK_EVENT_LABELS: Record<WebhookEventType, string> = {
  'analysis.saved': 'Analysis saved (a new revision of a drop’s result)',
  'review.decided': 'Review decided (approved or rejected)',
  'batch.verdict_changed': 'Batch verdict changed (pass, marginal, fail against its spec)',
};

const EVENT_FIELD_PREFIX = 'event:';
/** The form's checkbox for an event (a form sends each checkbox under its own name). */
export const webhookEventField = (type: WebhookEventType) => `${EVENT_FIELD_PREFIX}${type}`;

const webhookUrl = requiredText(2000, 'Enter the address that should receive the events.').pipe(
  z.url({
    protocol: /^https?$/,
    error:
      'Enter a full http:// or https:// address, e.g. https://lims.example.com/hooks/beadline.',
  }),
);

/**
 * The admin's form: the receiving address, what it is for, and at least one event. The events
 * come as a list, or as the form's checkboxes (`event:<type>`).
 */
export const webhookCreateSchema = z.preprocess(
  (input) => {
    if (typeof input !== 'object' || input === null || 'events' in input) return input;
    const fields = input as Record<string, unknown>;
    return {
      ...fields,
      events: WEBHOOK_EVENT_TYPES.filter((type) => fields[webhookEventField(type)] !== undefined),
    };
  },
  z.object({
    url: webhookUrl,
    description: text(200).default(''),
    events: z
      .array(
        z.enum(WEBHOOK_EVENT_TYPES, {
          message: `Choose events among: ${WEBHOOK_EVENT_TYPES.join(', ')}.`,
        }),
      )
      .min(1, 'Choose at least one event to send.'),
  }),
);
export type WebhookCreate = z.output<typeof webhookCreateSchema>;

export const webhookIdSchema = z.object({ webhookId: recordId('Choose a webhook.') });
export const webhookDeliveryIdSchema = z.object({ deliveryId: recordId('Choose a delivery.') });

export const WEBHOOK_DELIVERY_STATUSES = ['pending', 'retrying', 'delivered', 'failed'] as const;
export type WebhookDeliveryStatus = (typeof WEBHOOK_DELIVERY_STATUSES)[number];

export const webhookSummarySchema = z.object({
  id: z.string(),
  url: z.string(),
  description: z.string(),
  events: z.array(z.enum(WEBHOOK_EVENT_TYPES)),
  createdBy: z.string().nullable(),
  createdAt: z.coerce.date(),
  delivered: z.number().int(),
  failing: z.number().int(),
});
export type WebhookSummary = z.output<typeof webhookSummarySchema>;

export const webhookDeliverySchema = z.object({
  id: z.string(),
  eventId: z.string(),
  eventType: z.enum(WEBHOOK_EVENT_TYPES),
  status: z.enum(WEBHOOK_DELIVERY_STATUSES),
  attempts: z.number().int(),
  lastStatusCode: z.number().int().nullable(),
  lastError: z.string().nullable(),
  lastAttemptAt: z.coerce.date().nullable(),
  nextAttemptAt: z.coerce.date().nullable(),
  deliveredAt: z.coerce.date().nullable(),
  createdAt: z.coerce.date(),
});
export type WebhookDelivery = z.output<typeof webhookDeliverySchema>;

/**
 * What every delivery's body is: the event's id (the same for every subscription and every
 * redelivery, so a receiver can drop repeats), its type, when it happened and its data.
 */
export const webhookEventSchema = z.object({
  id: z.string(),
  type: z.enum(WEBHOOK_EVENT_TYPES),
  time: z.iso.datetime(),
  organizationId: z.string(),
  data: z.record(z.string(), z.unknown()),
});
export type WebhookEvent = z.output<typeof webhookEventSchema>;
