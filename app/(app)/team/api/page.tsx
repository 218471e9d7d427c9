import type { Metadata } from 'next';
import Link from 'next/link';
import { ApiTokenForm } from '@/components/api-access/token-form';
import { ApiTokenRow } from '@/components/api-access/token-row';
import { FormCard, ListCard } from '@/components/ui/cards';
import { PageHeader } from '@/components/ui/empty-state';
import { PlainTable } from '@/components/ui/plain-table';
import { requirePage } from '@/lib/auth/guard';
import { API_TOKEN_SCOPE_LABELS } from '@/lib/auth/permissions';
import { loadApiTokens } from '@/server/api-tokens/list';

export const metadata: Metadata = { title: 'API access' };

const day = (date: Date) => date.toISOString().slice(0, 10);
const moment = (date: Date) => `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;

export default async function ApiAccessPage() {
  const ctx = await requirePage('team:manage');
  const tokens = await loadApiTokens(ctx.organization.id);
  return (
    <>
      <PageHeader
        title="API access"
        lead="Tokens let instruments and LIMS use the versioned API (/api/v1) for this organization."
      />
      <FormCard
        title="Make a token"
        width="max-w-3xl"
        intro={
          <>
            A token reads, measures, or both; it never reviews or administers. It is shown once and
            kept only as a hash. See the <Link href="/api-reference">API reference</Link>.
          </>
        }
      >
        <ApiTokenForm />
      </FormCard>
      <ListCard title="Tokens" count={tokens.length} emptyText="No tokens yet.">
        <PlainTable
          head={[
            'Name',
            'Token',
            'Scope',
            'Made by',
            'Last used',
            'Valid',
            { label: 'Actions', hidden: true },
          ]}
        >
          {tokens.map((token) => (
            <ApiTokenRow
              key={token.id}
              id={token.id}
              name={token.name}
              scopeLabel={API_TOKEN_SCOPE_LABELS[token.scope]}
              prefix={token.prefix}
              createdBy={token.createdBy}
              expiresOn={day(token.expiresAt)}
              lastUsed={
                token.lastUsedAt
                  ? `${moment(token.lastUsedAt)} from ${token.lastUsedAddress ?? '?'}`
                  : 'Never'
              }
              status={token.status}
            />
          ))}
        </PlainTable>
      </ListCard>
    </>
  );
}
