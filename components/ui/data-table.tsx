'use client';

import { useMemo } from 'react';
import Link from 'next/link';
import { usePathname, useRouter, useSearchParams } from 'next/navigation';
import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
  type VisibilityState,
} from '@tanstack/react-table';

export type DataTableProps<Row> = {
  /** Names the table for the column chooser and tests. */
  label: string;
  columns: ColumnDef<Row, unknown>[];
  rows: Row[];
  total: number;
  page: number;
  pageSize: number;
  sort: string;
  dir: 'asc' | 'desc';
  /** Column ids the server can sort by (the list query's `sort` values). */
  sortable: readonly string[];
  /** Search-param prefix when a page shows several tables (e.g. 'b' → bsort, bpage). */
  paramPrefix?: string;
  exportHref?: string | null;
  empty: React.ReactNode;
  rowId: (row: Row) => string;
};

/**
 * A server-paged table (@tanstack/react-table in manual mode): sorting, the page and the hidden
 * columns live in the URL search params, so a filtered, sorted view can be shared as a link.
 */
export function DataTable<Row>({
  label,
  columns,
  rows,
  total,
  page,
  pageSize,
  sort,
  dir,
  sortable,
  paramPrefix = '',
  exportHref,
  empty,
  rowId,
}: DataTableProps<Row>) {
  const router = useRouter();
  const pathname = usePathname();
  const searchParams = useSearchParams();
  const key = (name: string) =>
    paramPrefix ? `${paramPrefix}${name[0].toUpperCase()}${name.slice(1)}` : name;

  const hidden = useMemo(
    () => new Set((searchParams.get(key('hide')) ?? '').split(',').filter(Boolean)),
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [searchParams, paramPrefix],
  );
  const columnVisibility: VisibilityState = Object.fromEntries(
    [...hidden].map((id) => [id, false]),
  );
  const sorting: SortingState = [{ id: sort, desc: dir === 'desc' }];

  const navigate = (changes: Record<string, string | null>) => {
    const params = new URLSearchParams(searchParams.toString());
    for (const [name, value] of Object.entries(changes)) {
      if (value === null || value === '') params.delete(key(name));
      else params.set(key(name), value);
    }
    const query = params.toString();
    router.push(query ? `${pathname}?${query}` : pathname, { scroll: false });
  };

  // TanStack Table returns fresh functions each render; nothing here memoizes them.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data: rows,
    columns,
    getRowId: rowId,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    rowCount: total,
    state: { sorting, columnVisibility, pagination: { pageIndex: page - 1, pageSize } },
    enableSortingRemoval: false,
  });

  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const toggleSort = (id: string) => {
    const nextDir = sort === id ? (dir === 'asc' ? 'desc' : 'asc') : 'asc';
    navigate({ sort: id, dir: nextDir, page: null });
  };
  const toggleColumn = (id: string, visible: boolean) => {
    const next = new Set(hidden);
    if (visible) next.delete(id);
    else next.add(id);
    navigate({ hide: [...next].join(',') || null });
  };

  return (
    <div className="space-y-2" data-testid={`table-${label}`}>
      <div className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-600">
        <p aria-live="polite">
          {total === 0
            ? 'No records'
            : `${(page - 1) * pageSize + 1}–${Math.min(page * pageSize, total)} of ${total}`}
        </p>
        <div className="flex items-center gap-2">
          <details className="relative">
            <summary className="btn-quiet cursor-pointer list-none py-1">Columns</summary>
            <fieldset className="absolute right-0 z-10 mt-1 w-56 space-y-1 rounded-md border border-ink-200 bg-white p-3 shadow-md">
              <legend className="sr-only">Columns shown in {label}</legend>
              {table.getAllLeafColumns().map((column) => (
                <label key={column.id} className="flex items-center gap-2">
                  <input
                    type="checkbox"
                    checked={column.getIsVisible()}
                    disabled={!column.getCanHide()}
                    onChange={(event) => toggleColumn(column.id, event.target.checked)}
                  />
                  {typeof column.columnDef.header === 'string'
                    ? column.columnDef.header
                    : column.id}
                </label>
              ))}
            </fieldset>
          </details>
          {exportHref ? (
            <a className="btn-quiet py-1" href={exportHref} download>
              Export CSV
            </a>
          ) : null}
        </div>
      </div>
      {rows.length === 0 ? (
        empty
      ) : (
        <div className="overflow-x-auto rounded-lg border border-ink-200 bg-white">
          <table className="min-w-full text-sm">
            <thead className="bg-ink-50 text-left text-ink-700">
              {table.getHeaderGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const id = header.column.id;
                    const canSort = sortable.includes(id);
                    const active = sort === id;
                    return (
                      <th
                        key={header.id}
                        scope="col"
                        className="whitespace-nowrap px-3 py-2 font-medium"
                        aria-sort={
                          active ? (dir === 'asc' ? 'ascending' : 'descending') : undefined
                        }
                      >
                        {canSort ? (
                          <button
                            type="button"
                            className="inline-flex items-center gap-1 hover:text-ink-950"
                            onClick={() => toggleSort(id)}
                          >
                            {flexRender(header.column.columnDef.header, header.getContext())}
                            <span aria-hidden="true">
                              {active ? (dir === 'asc' ? '▲' : '▼') : '↕'}
                            </span>
                          </button>
                        ) : (
                          flexRender(header.column.columnDef.header, header.getContext())
                        )}
                      </th>
                    );
                  })}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.id} className="border-t border-ink-100 align-top">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {pageCount > 1 ? (
        <nav aria-label={`Pages of ${label}`} className="flex items-center gap-2 text-sm">
          <button
            type="button"
            className="btn-quiet py-1"
            disabled={page <= 1}
            onClick={() => navigate({ page: String(page - 1) })}
          >
            Previous
          </button>
          <span>
            Page {page} of {pageCount}
          </span>
          <button
            type="button"
            className="btn-quiet py-1"
            disabled={page >= pageCount}
            onClick={() => navigate({ page: String(page + 1) })}
          >
            Next
          </button>
        </nav>
      ) : null}
    </div>
  );
}

export function TableLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <Link href={href} className="font-medium text-lagoon-700 hover:underline">
      {children}
    </Link>
  );
}
