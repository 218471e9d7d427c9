import 'server-only';
import { findWebhook, listDeliveries, listWebhooks } from '@/db/queries/webhooks';
import type { WebhookDelivery, WebhookSummary } from '@/lib/contracts/webhooks';

/** The organization's webhooks for the admin's list (never their secrets). */
export async function loadWebhooks(organizationId: string): Promise<WebhookSummary[]> {
  return listWebhooks(organizationId);
}

type WebhookLog = {
  webhook: Omit<WebhookSummary, 'delivered' | 'failing' | 'createdBy'>;
  deliveries: WebhookDelivery[];
};

/** One webhook and its newest deliveries; null for another organization's (or none). */
export async function loadWebhookLog(
  organizationId: string,
  webhookId: string,
): Promise<WebhookLog | null> {
  const webhook = await findWebhook(organizationId, webhookId);
  if (!webhook) return null;
  const deliveries = await listDeliveries(organizationId, webhookId);
  const { secret: _secret, organizationId: _org, createdByUserId: _by, ...shown } = webhook;
  return { webhook: shown, deliveries };
}
