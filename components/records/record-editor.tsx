'use client';

import { Fragment, useState, type ReactNode } from 'react';
import { ArchiveButton } from './archive-button';

/**
 * A table of records that writers edit in place: "Edit" on a row opens that record's form under
 * the table, and "Add a …" opens an empty one.
 */
export function RecordEditor<T extends { id: string }>({
  rows,
  canEdit,
  isEditable = () => true,
  noun,
  editTitle,
  addSummary,
  form,
  table,
}: {
  rows: T[];
  canEdit: boolean;
  isEditable?: (row: T) => boolean;
  /** "sample" → the edit section is labelled "Edit sample". */
  noun: string;
  editTitle: (row: T) => string;
  addSummary: string;
  /** The form for one record (edit) or for a new one (no record). */
  form: (record?: T) => ReactNode;
  /** The table, given what opens a row's form. */
  table: (edit: (id: string) => void) => ReactNode;
}) {
  const [editing, setEditing] = useState<string | null>(null);
  const current = rows.find((row) => row.id === editing && isEditable(row));
  return (
    <div className="space-y-4">
      {table(setEditing)}
      {canEdit && current ? (
        <section className="card" aria-label={`Edit ${noun}`}>
          <div className="mb-3 flex items-center justify-between">
            <h3 className="font-semibold">{editTitle(current)}</h3>
            <button type="button" className="btn-quiet py-1" onClick={() => setEditing(null)}>
              Close
            </button>
          </div>
          {/* A fresh form per record. */}
          <Fragment key={current.id}>{form(current)}</Fragment>
        </section>
      ) : null}
      {canEdit ? (
        <details className="card">
          <summary className="cursor-pointer font-semibold">{addSummary}</summary>
          <div className="mt-3">{form()}</div>
        </details>
      ) : null}
    </div>
  );
}

/** A row's actions: anything extra, Edit, and archive-or-delete. */
export function RowActions({
  onEdit,
  archive,
  children,
}: {
  onEdit: () => void;
  archive: { url: string; version: number; what: string };
  children?: ReactNode;
}) {
  return (
    <span className="flex flex-wrap gap-2">
      {children}
      <button type="button" className="btn-quiet py-1" onClick={onEdit}>
        Edit
      </button>
      <ArchiveButton url={archive.url} version={archive.version} what={archive.what} />
    </span>
  );
}
