'use client';

import type { ColumnDef } from '@tanstack/react-table';
import type { Coating } from '@/lib/contracts/coatings';
import { DataTable, TableLink, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { InputField, TextAreaField } from '@/components/ui/form-field';
import { coatingCreateSchema, coatingUpdateSchema } from '@/lib/contracts/coatings';
import { fmtDate } from './format';
import { FormMessages, useRecordForm } from './use-record-form';

const columns: ColumnDef<Coating, unknown>[] = [
  {
    id: 'code',
    header: 'Code',
    cell: ({ row }) => (
      <TableLink href={`/coatings/${row.original.id}`}>{row.original.code}</TableLink>
    ),
    enableHiding: false,
  },
  { id: 'name', header: 'Name', accessorKey: 'name' },
  { id: 'description', header: 'Description', accessorKey: 'description' },
  { id: 'createdAt', header: 'Created', cell: ({ row }) => fmtDate(row.original.createdAt) },
  { id: 'updatedAt', header: 'Updated', cell: ({ row }) => fmtDate(row.original.updatedAt) },
  {
    id: 'status',
    header: 'Status',
    cell: ({ row }) => (row.original.archivedAt ? 'Archived' : 'Current'),
  },
];

export function CoatingsTable(
  props: Omit<DataTableProps<Coating>, 'columns' | 'label' | 'rowId' | 'empty' | 'sortable'>,
) {
  return (
    <DataTable
      {...props}
      label="coatings"
      columns={columns}
      sortable={['code', 'name', 'createdAt', 'updatedAt']}
      rowId={(row) => row.id}
      empty={
        <EmptyState title="No coatings match">
          Clear the filters, or ask an admin to add the coatings your lab tests.
        </EmptyState>
      }
    />
  );
}

const LABELS = { code: 'Code', name: 'Name', description: 'Description' };
const FIELDS = ['code', 'name', 'description'] as const;

type CoatingValues = { code: string; name: string; description: string; version?: number };

/** New coating (POST) or edit (PATCH with version). */
export function CoatingForm({
  coating,
  onSaved,
}: {
  coating?: Coating;
  onSaved?: (id: string) => void;
}) {
  const editing = Boolean(coating);
  const formId = editing ? `coating-${coating!.id}` : 'coating-new';
  const { form, onSubmit, notice, conflict, reapply } = useRecordForm<CoatingValues>({
    schema: editing ? coatingUpdateSchema : coatingCreateSchema,
    defaultValues: coating
      ? {
          code: coating.code,
          name: coating.name,
          description: coating.description,
          version: coating.version,
        }
      : { code: '', name: '', description: '' },
    fields: FIELDS,
    url: editing ? `/api/coatings/${coating!.id}` : '/api/coatings',
    method: editing ? 'PATCH' : 'POST',
    onSaved: (body) => {
      const saved = body.coating as Coating;
      if (!editing) form.reset({ code: '', name: '', description: '' });
      else
        form.reset({
          code: saved.code,
          name: saved.name,
          description: saved.description,
          version: saved.version,
        });
      onSaved?.(saved.id);
    },
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={editing ? 'Edit coating' : 'New coating'}
    >
      <FormMessages notice={notice} conflict={conflict} labels={LABELS} onReapply={reapply} />
      <div className="grid gap-3 sm:grid-cols-2">
        <InputField form={form} formId={formId} name="code" label="Code" hint="Like HT-200" />
        <InputField form={form} formId={formId} name="name" label="Name" />
      </div>
      <TextAreaField form={form} formId={formId} name="description" label="Description" />
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {editing ? 'Save coating' : 'Add coating'}
      </button>
    </form>
  );
}
