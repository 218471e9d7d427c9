'use client';

import type { ColumnDef } from '@tanstack/react-table';
import { DataTable, TableLink, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { TextAreaField, TextField } from '@/components/ui/fields';
import {
  coatingCreateSchema,
  coatingReplies,
  coatingUpdateSchema,
  type Coating,
} from '@/lib/contracts/coatings';
import { fmtDate } from './format';
import { RecordForm } from './record-form';
import { useRecordForm } from './use-record-form';

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
const SCHEMAS = { create: coatingCreateSchema, update: coatingUpdateSchema };

type CoatingValues = { code: string; name: string; description: string; version?: number };

/** New coating (POST) or edit (PATCH with version). */
export function CoatingForm({ coating }: { coating?: Coating }) {
  const { field, formProps } = useRecordForm<CoatingValues, Coating>({
    noun: 'coating',
    collection: '/api/coatings',
    replyKey: 'coating',
    reply: coatingReplies.one,
    record: coating,
    schemas: SCHEMAS,
    blank: { code: '', name: '', description: '' },
    toValues: (saved) => ({ code: saved.code, name: saved.name, description: saved.description }),
    labels: LABELS,
  });
  return (
    <RecordForm {...formProps}>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Code" hint="Like HT-200" {...field('code')} />
        <TextField label="Name" {...field('name')} />
      </div>
      <TextAreaField label="Description" {...field('description')} />
    </RecordForm>
  );
}
