import type { Metadata } from 'next';
import Link from 'next/link';
import { ActionButton } from '@/components/webhooks/action-button';
import { WebhookForm } from '@/components/webhooks/webhook-form';
import { FormCard, ListCard } from '@/components/ui/cards';
import { PageHeader } from '@/components/ui/empty-state';
import { PlainTable } from '@/components/ui/plain-table';
import { requirePage } from '@/lib/auth/guard';
import { loadWebhooks } from '@/server/webhooks/load';
import { removeWebhookAction } from './actions';

export const metadata: Metadata = { title: 'Webhooks' };

const day = (date: Date) => date.toISOString().slice(0, 10);

export default async function WebhooksPage() {
  const ctx = await requirePage('team:manage');
  const webhooks = await loadWebhooks(ctx.organization.id);
  return (
    <>
      <PageHeader
        title="Webhooks"
        lead="Beadline tells your systems when an analysis is saved, a review is decided or a batch verdict changes, with a signed JSON request to each address registered here."
      />
      <FormCard
        title="Register a webhook"
        width="max-w-3xl"
        intro={
          <>
            Each request is signed with HMAC-SHA256 over its timestamp and body; the receiver checks
            the signature with the secret shown once below (README: webhooks). Failed deliveries are
            retried for about a day. Also see <Link href="/team/api">API tokens</Link>.
          </>
        }
      >
        <WebhookForm />
      </FormCard>
      <ListCard title="Registered webhooks" count={webhooks.length} emptyText="No webhooks yet.">
        <PlainTable
          head={['Address', 'Events', 'Deliveries', 'Made', { label: 'Actions', hidden: true }]}
        >
          {webhooks.map((webhook) => (
            <tr key={webhook.id} className="border-b border-ink-100 last:border-0">
              <td className="py-2 pr-4">
                <Link href={`/team/webhooks/${webhook.id}`} className="font-mono text-xs">
                  {webhook.url}
                </Link>
                {webhook.description ? (
                  <span className="block text-xs text-ink-600">{webhook.description}</span>
                ) : null}
              </td>
              <td className="py-2 pr-4 font-mono text-xs">{webhook.events.join(', ')}</td>
              <td className="py-2 pr-4 text-ink-600">
                {webhook.delivered} delivered
                {webhook.failing > 0 ? `, ${webhook.failing} failing` : ''}
              </td>
              <td className="py-2 pr-4 text-ink-600">
                {day(webhook.createdAt)} by {webhook.createdBy ?? '—'}
              </td>
              <td className="py-2 text-right">
                <Link href={`/team/webhooks/${webhook.id}`} className="mr-3">
                  Delivery log
                </Link>
                <ActionButton
                  action={removeWebhookAction}
                  field="webhookId"
                  value={webhook.id}
                  label="Delete"
                  busyLabel="Deleting…"
                  ariaLabel={`Delete the webhook for ${webhook.url}`}
                />
              </td>
            </tr>
          ))}
        </PlainTable>
      </ListCard>
    </>
  );
}
