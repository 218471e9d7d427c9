import 'server-only';
import { findWebhook, listDeliveries, listWebhooks } from '@/db/queries/webhooks';
import { notFound } from '@/lib/app-error';
import type { WebhookDelivery, WebhookSummary } from '@/lib/contracts/webhooks';

/** The organization's webhooks for the admin's list (never their secrets). */
export async function loadWebhooks(organizationId: string): Promise<WebhookSummary[]> {
  return listWebhooks(organizationId);
}

/** One webhook and its newest deliveries; another organization's webhook is not found. */
export async function loadWebhookLog(
  organizationId: string,
  webhookId: string,
): Promise<{ webhook: Omit<WebhookSummary, 'delivered' | 'failing' | 'createdBy'>; deliveries: WebhookDelivery[] }> {
  const webhook = await findWebhook(organizationId, webhookId);
  if (!webhook) throw notFound('That webhook');
  const deliveries = await listDeliveries(organizationId, webhookId);
  const { secret: _secret, organizationId: _org, createdByUserId: _by, ...shown } = webhook;
  return { webhook: shown, deliveries };
}
