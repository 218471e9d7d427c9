import type { Metadata } from 'next';
import Link from 'next/link';
import { EmptyState, PageHeader } from '@/components/ui/empty-state';
import { SelectField, TextField } from '@/components/ui/fields';
import { PlainTable } from '@/components/ui/plain-table';
import { requirePage } from '@/lib/auth/guard';
import { loadAuditLog, type AuditFilters } from '@/server/audit/list';

export const metadata: Metadata = { title: 'Audit log' };

type Search = {
  action?: string;
  entity?: string;
  actor?: string;
  from?: string;
  to?: string;
  page?: string;
};

const DATE = /^\d{4}-\d{2}-\d{2}$/;

function parseDay(value: string | undefined): Date | null | undefined {
  if (!value) return undefined;
  if (!DATE.test(value)) return null;
  const date = new Date(`${value}T00:00:00Z`);
  return Number.isNaN(date.getTime()) ? null : date;
}

/** Reads the filters from the URL; bad dates are reported, not silently dropped. */
function readFilters(search: Search): { filters: AuditFilters; errors: string[] } {
  const errors: string[] = [];
  const from = parseDay(search.from);
  const to = parseDay(search.to);
  if (from === null)
    errors.push(`“From” must be a date like 2026-12-01; “${search.from}” was ignored.`);
  if (to === null) errors.push(`“To” must be a date like 2026-12-01; “${search.to}” was ignored.`);
  const filters: AuditFilters = {
    action: search.action || undefined,
    entityType: search.entity || undefined,
    actorUserId: search.actor || undefined,
    from: from ?? undefined,
    // "To" includes the whole day.
    to: to ? new Date(to.getTime() + 24 * 60 * 60 * 1000) : undefined,
  };
  if (filters.from && filters.to && filters.from >= filters.to) {
    errors.push('“From” is after “To”; swap them to see events in that range.');
  }
  return { filters, errors };
}

/** "maxDeg" → "max deg", "probe_liquid_id" → "probe liquid id". */
function words(key: string): string {
  return key
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase();
}

/** An audit row's before/after in words: "name: HT-200; limits: min 100, max none". */
function describe(value: unknown, depth = 0): string {
  if (value === null || value === undefined || value === '') return 'none';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) {
    if (value.length === 0) return 'none';
    const items = value.map((v) => describe(v, depth + 1));
    return items.length > 5
      ? `${items.slice(0, 5).join(', ')} and ${items.length - 5} more`
      : items.join(', ');
  }
  if (typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>);
    if (entries.length === 0) return 'none';
    const text = entries.map(([key, v]) => `${words(key)}: ${describe(v, depth + 1)}`);
    return depth === 0 ? text.join('; ') : `(${text.join(', ')})`;
  }
  const text = String(value);
  return /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(text)
    ? `${text.slice(0, 16).replace('T', ' ')} UTC`
    : text;
}

function timestamp(date: Date): string {
  return date.toISOString().slice(0, 19).replace('T', ' ') + ' UTC';
}

export default async function AuditPage({ searchParams }: { searchParams: Promise<Search> }) {
  const ctx = await requirePage('audit:read');
  const search = await searchParams;
  const { filters, errors } = readFilters(search);
  const page = Math.max(1, Math.floor(Number(search.page) || 1));
  const { rows, total, pages, options } = await loadAuditLog(ctx.organization.id, filters, page);
  const pageHref = (n: number) => {
    const params = new URLSearchParams();
    for (const key of ['action', 'entity', 'actor', 'from', 'to'] as const) {
      const value = search[key];
      if (value) params.set(key, value);
    }
    if (n > 1) params.set('page', String(n));
    const query = params.toString();
    return query ? `/audit?${query}` : '/audit';
  };
  return (
    <>
      <PageHeader
        title="Audit log"
        lead="Who changed what in this organization, newest first. Entries are never changed or deleted."
      />
      <form
        method="get"
        action="/audit"
        className="card mb-6 grid gap-3 sm:grid-cols-2 lg:grid-cols-3 lg:items-end 2xl:grid-cols-6"
      >
        {[
          { name: 'action', label: 'Action', any: 'Any', values: options.actions },
          { name: 'entity', label: 'Record type', any: 'Any', values: options.entityTypes },
        ].map((filter) => (
          <SelectField
            key={filter.name}
            id={`audit-${filter.name}`}
            name={filter.name}
            label={filter.label}
            defaultValue={search[filter.name as 'action' | 'entity'] ?? ''}
            placeholder={filter.any}
            options={filter.values.map((v) => ({ value: v, label: v }))}
          />
        ))}
        <SelectField
          id="audit-actor"
          name="actor"
          label="Who"
          defaultValue={search.actor ?? ''}
          placeholder="Anyone"
          options={options.actors.map((a) => ({ value: a.id, label: `${a.name} (${a.email})` }))}
        />
        {(['from', 'to'] as const).map((name) => (
          <TextField
            key={name}
            id={`audit-${name}`}
            name={name}
            label={name === 'from' ? 'From' : 'To'}
            type="date"
            defaultValue={search[name] ?? ''}
          />
        ))}
        <div className="flex gap-2">
          <button type="submit" className="btn-primary">
            Filter
          </button>
          <Link href="/audit" className="btn-quiet">
            Clear
          </Link>
        </div>
        {errors.length ? (
          <div role="alert" className="field-error sm:col-span-2 lg:col-span-3 2xl:col-span-6">
            {errors.map((e) => (
              <p key={e}>{e}</p>
            ))}
          </div>
        ) : null}
      </form>
      {rows.length === 0 ? (
        <EmptyState title="No audit entries">
          No entries match these filters. Clear them to see the whole log.
        </EmptyState>
      ) : (
        <section className="card">
          <p className="mb-3 text-sm text-ink-600">
            {total} {total === 1 ? 'entry' : 'entries'} · page {page} of {pages}
          </p>
          <PlainTable head={['When', 'Who', 'Action', 'Record', 'Details']}>
            {rows.map((row) => (
              <tr key={row.id} className="border-b border-ink-100 align-top last:border-0">
                <td className="whitespace-nowrap py-2 pr-4 font-mono text-xs text-ink-700">
                  {timestamp(row.createdAt)}
                </td>
                <td className="py-2 pr-4">
                  {row.actorName ? (
                    <>
                      <span className="text-ink-900">{row.actorName}</span>
                      <span className="block text-xs text-ink-500">{row.actorEmail}</span>
                    </>
                  ) : (
                    <span className="text-ink-500">
                      {row.actorUserId ? 'deleted account' : 'system'}
                    </span>
                  )}
                </td>
                <td className="py-2 pr-4 font-mono text-xs text-ink-900">{row.action}</td>
                <td className="py-2 pr-4 text-ink-700">
                  {row.entityType}
                  {row.entityId ? (
                    <span className="block font-mono text-xs text-ink-500">{row.entityId}</span>
                  ) : null}
                </td>
                <td className="max-w-md py-2 text-xs text-ink-700 [overflow-wrap:anywhere]">
                  {(['before', 'after'] as const).map((when) =>
                    row[when] ? (
                      <p key={when}>
                        <span className="text-ink-500">{when}</span> {describe(row[when])}
                      </p>
                    ) : null,
                  )}
                </td>
              </tr>
            ))}
          </PlainTable>
          <nav
            aria-label="Audit log pages"
            className="mt-4 flex items-center justify-between text-sm"
          >
            {page > 1 ? (
              <Link href={pageHref(page - 1)} className="btn-quiet">
                Newer
              </Link>
            ) : (
              <span />
            )}
            {page < pages ? (
              <Link href={pageHref(page + 1)} className="btn-quiet">
                Older
              </Link>
            ) : (
              <span />
            )}
          </nav>
        </section>
      )}
    </>
  );
}
