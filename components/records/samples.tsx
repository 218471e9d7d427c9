'use client';

import Link from 'next/link';
import type { ColumnDef } from '@tanstack/react-table';
import { z } from 'zod';
import { DataTable, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { TextAreaField, TextField } from '@/components/ui/fields';
import {
  sampleCreateSchema,
  sampleReplies,
  sampleUpdateSchema,
  type BatchDrop,
  type Sample,
  type SampleWithResults,
} from '@/lib/contracts/samples';
import { fmtDateTime, fmtNumber, fmtSince, fromLocalInput, toLocalInput } from './format';
import { RecordEditor, RowActions } from './record-editor';
import { RecordForm } from './record-form';
import { useRecordForm } from './use-record-form';
import { dropHref } from '@/lib/measure/links';
import { analysisMethodName } from '@/lib/contracts/drops';

/** The samples of a batch with their drop counts and mean water angle; writers edit in place. */
export function SamplesPanel({
  batchId,
  canWrite,
  ...table
}: Omit<DataTableProps<SampleWithResults>, 'columns' | 'label' | 'rowId' | 'empty' | 'sortable'> & {
  batchId: string;
  canWrite: boolean;
}) {
  const columns = (edit: (id: string) => void): ColumnDef<SampleWithResults, unknown>[] => [
    { id: 'label', header: 'Label', accessorKey: 'label', enableHiding: false },
    { id: 'substrate', header: 'Substrate', accessorKey: 'substrate' },
    { id: 'position', header: 'Position', accessorKey: 'position' },
    {
      id: 'treatedAt',
      header: 'Treated at',
      cell: ({ row }) => fmtDateTime(row.original.treatedAt),
    },
    {
      id: 'sinceTreatment',
      header: 'Time since treatment',
      // Relative to now: the server's and the browser's now differ slightly.
      cell: ({ row }) => <span suppressHydrationWarning>{fmtSince(row.original.treatedAt)}</span>,
    },
    {
      id: 'drops',
      header: 'Drops',
      cell: ({ row }) => (
        <span data-testid={`drops-${row.original.label}`}>{row.original.dropCount}</span>
      ),
    },
    {
      id: 'meanWater',
      header: 'Mean water angle (°)',
      cell: ({ row }) => (
        <span data-testid={`mean-water-${row.original.label}`}>
          {fmtNumber(row.original.meanWaterDeg, 1)}
          {row.original.waterDropCount > 0 ? ` (n = ${row.original.waterDropCount})` : ''}
        </span>
      ),
    },
    {
      id: 'actions',
      header: 'Actions',
      enableHiding: false,
      cell: ({ row }) =>
        canWrite ? (
          <RowActions
            onEdit={() => edit(row.original.id)}
            archive={{
              url: `/api/samples/${row.original.id}`,
              version: row.original.version,
              what: 'sample',
            }}
          >
            <Link className="btn-quiet py-1" href={`/measure?sample=${row.original.id}`}>
              Measure on this sample
            </Link>
          </RowActions>
        ) : null,
    },
  ];
  return (
    <RecordEditor
      rows={table.rows}
      canEdit={canWrite}
      noun="sample"
      editTitle={(sample) => `Edit sample ${sample.label}`}
      addSummary="Add a sample"
      form={(sample) => <SampleForm batchId={batchId} sample={sample} />}
      table={(edit) => (
        <DataTable
          {...table}
          label="samples"
          columns={columns(edit)}
          sortable={['label', 'treatedAt', 'createdAt', 'updatedAt']}
          paramPrefix="s"
          rowId={(row) => row.id}
          empty={
            <EmptyState title="No samples yet">
              Add the panels or coupons cut from this batch; drops are measured on samples.
            </EmptyState>
          }
        />
      )}
    />
  );
}

const LABELS = {
  label: 'Label',
  substrate: 'Substrate',
  position: 'Position',
  treatedAt: 'Treated at',
  notes: 'Notes',
};

// The same schemas, after turning the browser's datetime-local value into ISO 8601 with offset.
const withLocalTime = (schema: z.ZodType) =>
  z.preprocess(
    (value) =>
      value && typeof value === 'object'
        ? {
            ...(value as Record<string, unknown>),
            treatedAt: fromLocalInput((value as Record<string, unknown>).treatedAt),
          }
        : value,
    schema,
  );
const SCHEMAS = {
  create: withLocalTime(sampleCreateSchema),
  update: withLocalTime(sampleUpdateSchema),
};

type SampleValues = Record<string, string | number | undefined>;

export function SampleForm({ batchId, sample }: { batchId: string; sample?: Sample }) {
  const { field, formProps } = useRecordForm<SampleValues, Sample>({
    noun: 'sample',
    collection: '/api/samples',
    replyKey: 'sample',
    reply: sampleReplies.one,
    record: sample,
    schemas: SCHEMAS,
    blank: { batchId, label: '', substrate: '', position: '', treatedAt: '', notes: '' },
    toValues: (saved) => ({
      batchId,
      label: saved.label,
      substrate: saved.substrate,
      position: saved.position,
      treatedAt: toLocalInput(saved.treatedAt),
      notes: saved.notes,
    }),
    labels: LABELS,
  });
  return (
    <RecordForm {...formProps}>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField label="Sample label" hint="Like P-01" {...field('label')} />
        <TextField
          label="Treated at"
          type="datetime-local"
          hint="Your local time; optional"
          {...field('treatedAt')}
        />
        <TextField label="Substrate" {...field('substrate')} />
        <TextField label="Position on the web or panel" {...field('position')} />
      </div>
      <TextAreaField label="Notes" rows={2} {...field('notes')} />
    </RecordForm>
  );
}

const dropColumns: ColumnDef<BatchDrop, unknown>[] = [
  {
    id: 'measuredAt',
    header: 'Measured at',
    cell: ({ row }) => (
      <Link href={dropHref(row.original.dropId)} className="text-lagoon-700 hover:underline">
        {fmtDateTime(row.original.measuredAt)}
      </Link>
    ),
  },
  { id: 'sample', header: 'Sample', accessorKey: 'sampleLabel' },
  { id: 'liquid', header: 'Probe liquid', accessorKey: 'probeLiquidName' },
  {
    id: 'source',
    header: 'Source',
    cell: ({ row }) => (row.original.source === 'import' ? 'imported' : 'photo'),
  },
  {
    id: 'method',
    header: 'Method',
    cell: ({ row }) => (row.original.method ? analysisMethodName(row.original.method) : '—'),
  },
  { id: 'left', header: 'Left (°)', cell: ({ row }) => fmtNumber(row.original.leftDeg, 1) },
  { id: 'right', header: 'Right (°)', cell: ({ row }) => fmtNumber(row.original.rightDeg, 1) },
  { id: 'mean', header: 'Mean (°)', cell: ({ row }) => fmtNumber(row.original.meanDeg, 1) },
];

export function BatchDropsTable({ drops }: { drops: BatchDrop[] }) {
  return (
    <DataTable
      label="drops"
      columns={dropColumns}
      rows={drops}
      total={drops.length}
      page={1}
      pageSize={Math.max(drops.length, 1)}
      sort="measuredAt"
      dir="desc"
      sortable={[]}
      paramPrefix="d"
      rowId={(row) => row.dropId}
      empty={
        <EmptyState title="No drops yet">
          Measure a sample, or import angles read by hand.
        </EmptyState>
      }
    />
  );
}
