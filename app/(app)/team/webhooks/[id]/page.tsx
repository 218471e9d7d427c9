import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { ActionButton } from '@/components/webhooks/action-button';
import { ListCard } from '@/components/ui/cards';
import { PageHeader } from '@/components/ui/empty-state';
import { PlainTable } from '@/components/ui/plain-table';
import { requirePage } from '@/lib/auth/guard';
import type { WebhookDelivery } from '@/lib/contracts/webhooks';
import { loadWebhookLog } from '@/server/webhooks/load';
import { redeliverWebhookAction } from '../actions';

export const metadata: Metadata = { title: 'Webhook deliveries' };

const moment = (date: Date | null) =>
  date ? `${date.toISOString().slice(0, 19).replace('T', ' ')} UTC` : '—';

const STATUS_WORDS: Record<WebhookDelivery['status'], string> = {
  pending: 'Waiting to be sent',
  retrying: 'Failed, will retry',
  delivered: 'Delivered',
  failed: 'Failed, no more retries',
};

export default async function WebhookLogPage({ params }: { params: Promise<{ id: string }> }) {
  const ctx = await requirePage('team:manage');
  const { id } = await params;
  const log = await loadWebhookLog(ctx.organization.id, id);
  if (!log) notFound();
  const { webhook, deliveries } = log;
  return (
    <>
      <PageHeader
        title="Webhook deliveries"
        lead={`${webhook.url} — ${webhook.events.join(', ')}`}
      />
      <p className="mb-4 text-sm">
        <Link href="/team/webhooks">All webhooks</Link>
      </p>
      <ListCard
        title="Newest 100 deliveries"
        count={deliveries.length}
        emptyText="Nothing sent yet: events appear here as they happen."
      >
        <PlainTable
          head={[
            'Event',
            'Status',
            'Attempts',
            'Answer',
            'Last attempt',
            'Next retry',
            { label: 'Actions', hidden: true },
          ]}
        >
          {deliveries.map((delivery) => (
            <tr key={delivery.id} className="border-b border-ink-100 last:border-0">
              <td className="py-2 pr-4">
                <span className="font-mono text-xs">{delivery.eventType}</span>
                <span className="block font-mono text-xs text-ink-500">{delivery.eventId}</span>
              </td>
              <td className="py-2 pr-4">{STATUS_WORDS[delivery.status]}</td>
              <td className="py-2 pr-4">{delivery.attempts}</td>
              <td className="py-2 pr-4 text-ink-600">
                {delivery.lastStatusCode ?? '—'}
                {delivery.lastError ? (
                  <span className="block text-xs">{delivery.lastError}</span>
                ) : null}
              </td>
              <td className="py-2 pr-4 text-ink-600">{moment(delivery.lastAttemptAt)}</td>
              <td className="py-2 pr-4 text-ink-600">
                {delivery.status === 'retrying' ? moment(delivery.nextAttemptAt) : '—'}
              </td>
              <td className="py-2 text-right">
                <ActionButton
                  action={redeliverWebhookAction}
                  field="deliveryId"
                  value={delivery.id}
                  label="Send again"
                  busyLabel="Queuing…"
                  ariaLabel={`Send the ${delivery.eventType} event ${delivery.eventId} again`}
                />
              </td>
            </tr>
          ))}
        </PlainTable>
      </ListCard>
    </>
  );
}
