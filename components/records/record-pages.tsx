import Link from 'next/link';
import type { ReactNode } from 'react';
import { PageHeader } from '@/components/ui/empty-state';
import { ListFilters, type FilterField } from '@/components/ui/list-filters';

/** A list of records: title, filters in the URL, the table, and the form that adds one. */
export function RecordListPage({
  title,
  lead,
  filters,
  add,
  children,
}: {
  title: string;
  lead: string;
  filters: { label: string; fields: FilterField[] };
  /** Shown to those who may add: a closed section with the form. */
  add?: { summary: string; id?: string; open?: boolean; form: ReactNode } | null;
  children: ReactNode;
}) {
  return (
    <>
      <PageHeader title={title} lead={lead} />
      <ListFilters label={filters.label} fields={filters.fields} />
      {children}
      {add ? (
        <details className="card mt-6" id={add.id} open={add.open || undefined}>
          <summary className="cursor-pointer font-semibold">{add.summary}</summary>
          <div className="mt-3">{add.form}</div>
        </details>
      ) : null}
    </>
  );
}

/** The top of one record's page: the way back to its list, its title, and whether it is archived. */
export function RecordPageHeader({
  back,
  title,
  lead,
  archived,
  what,
  actions,
}: {
  back: { href: string; label: string };
  title: string;
  lead?: string;
  /** Links or buttons under the title. */
  actions?: ReactNode;
  archived?: boolean;
  /** "batch", for the archived notice. */
  what?: string;
}) {
  return (
    <>
      <p className="mb-2 text-sm">
        <Link href={back.href} className="text-lagoon-700 hover:underline">
          ← {back.label}
        </Link>
      </p>
      <PageHeader title={title} lead={lead} />
      {actions}
      {archived ? (
        <p className="mb-4 rounded-md border border-amber-500 bg-amber-50 px-3 py-2 text-sm text-amber-900">
          This {what} is archived: its records are kept, but it can no longer be changed.
        </p>
      ) : null}
    </>
  );
}

/** A titled section of a record's page, with an optional action beside the title. */
export function RecordSection({
  id,
  title,
  action,
  card = false,
  children,
}: {
  id: string;
  title: string;
  action?: ReactNode;
  card?: boolean;
  children: ReactNode;
}) {
  return (
    <section className={card ? 'card' : 'mb-8'} aria-labelledby={`${id}-heading`}>
      <div className={`${card ? 'mb-3' : 'mb-2'} flex items-center justify-between`}>
        <h2 id={`${id}-heading`}>{title}</h2>
        {action}
      </div>
      {children}
    </section>
  );
}
