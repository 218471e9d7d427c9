'use client';

import { useState } from 'react';
import Link from 'next/link';
import type { ColumnDef } from '@tanstack/react-table';
import { z } from 'zod';
import type { BatchDrop, SampleWithResults } from '@/lib/contracts/samples';
import type { Sample } from '@/lib/contracts/samples';
import { DataTable, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { InputField, TextAreaField } from '@/components/ui/form-field';
import { sampleCreateSchema, sampleUpdateSchema } from '@/lib/contracts/samples';
import { ArchiveButton } from './archive-button';
import { fmtDateTime, fmtNumber, fmtSince, fromLocalInput, toLocalInput } from './format';
import { FormMessages, useRecordForm } from './use-record-form';

/** The samples of a batch with their drop counts and mean water angle; writers edit in place. */
export function SamplesPanel({
  batchId,
  canWrite,
  ...table
}: Omit<DataTableProps<SampleWithResults>, 'columns' | 'label' | 'rowId' | 'empty' | 'sortable'> & {
  batchId: string;
  canWrite: boolean;
}) {
  const [editing, setEditing] = useState<string | null>(null);
  const columns: ColumnDef<SampleWithResults, unknown>[] = [
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
      cell: ({ row }) => (
        <span className="flex flex-wrap gap-2">
          {canWrite ? (
            <>
              <Link className="btn-quiet py-1" href={`/measure?sample=${row.original.id}`}>
                Measure on this sample
              </Link>
              <button
                type="button"
                className="btn-quiet py-1"
                onClick={() => setEditing(row.original.id)}
              >
                Edit
              </button>
              <ArchiveButton
                url={`/api/samples/${row.original.id}`}
                version={row.original.version}
                what="sample"
              />
            </>
          ) : null}
        </span>
      ),
    },
  ];
  const current = table.rows.find((row) => row.id === editing);
  return (
    <div className="space-y-4">
      <DataTable
        {...table}
        label="samples"
        columns={columns}
        sortable={['label', 'treatedAt', 'createdAt', 'updatedAt']}
        paramPrefix="s"
        rowId={(row) => row.id}
        empty={
          <EmptyState title="No samples yet">
            Add the panels or coupons cut from this batch; drops are measured on samples.
          </EmptyState>
        }
      />
      {canWrite && current ? (
        <section className="card" aria-label="Edit sample">
          <div className="mb-3 flex items-center justify-between">
            <h3 className="font-semibold">Edit sample {current.label}</h3>
            <button type="button" className="btn-quiet py-1" onClick={() => setEditing(null)}>
              Close
            </button>
          </div>
          <SampleForm key={current.id} batchId={batchId} sample={current} />
        </section>
      ) : null}
      {canWrite ? (
        <details className="card">
          <summary className="cursor-pointer font-semibold">Add a sample</summary>
          <div className="mt-3">
            <SampleForm batchId={batchId} />
          </div>
        </details>
      ) : null}
    </div>
  );
}

const LABELS = {
  label: 'Label',
  substrate: 'Substrate',
  position: 'Position',
  treatedAt: 'Treated at',
  notes: 'Notes',
};
const FIELDS = ['batchId', ...Object.keys(LABELS)];

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
const createSchema = withLocalTime(sampleCreateSchema);
const updateSchema = withLocalTime(sampleUpdateSchema);

type SampleValues = Record<string, string | number | undefined>;

export function SampleForm({ batchId, sample }: { batchId: string; sample?: Sample }) {
  const formId = sample ? `sample-${sample.id}` : 'sample-new';
  const blank: SampleValues = {
    batchId,
    label: '',
    substrate: '',
    position: '',
    treatedAt: '',
    notes: '',
  };
  const { form, onSubmit, notice, conflict, reapply } = useRecordForm<SampleValues>({
    schema: sample ? updateSchema : createSchema,
    defaultValues: sample
      ? {
          batchId,
          label: sample.label,
          substrate: sample.substrate,
          position: sample.position,
          treatedAt: toLocalInput(sample.treatedAt),
          notes: sample.notes,
          version: sample.version,
        }
      : blank,
    fields: FIELDS,
    url: sample ? `/api/samples/${sample.id}` : '/api/samples',
    method: sample ? 'PATCH' : 'POST',
    onSaved: () => {
      if (!sample) form.reset(blank);
    },
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={sample ? 'Edit sample' : 'New sample'}
    >
      <FormMessages notice={notice} conflict={conflict} labels={LABELS} onReapply={reapply} />
      <div className="grid gap-3 sm:grid-cols-2">
        <InputField
          form={form}
          formId={formId}
          name="label"
          label="Sample label"
          hint="Like P-01"
        />
        <InputField
          form={form}
          formId={formId}
          name="treatedAt"
          label="Treated at"
          type="datetime-local"
          hint="Your local time; optional"
        />
        <InputField form={form} formId={formId} name="substrate" label="Substrate" />
        <InputField
          form={form}
          formId={formId}
          name="position"
          label="Position on the web or panel"
        />
      </div>
      <TextAreaField form={form} formId={formId} name="notes" label="Notes" rows={2} />
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {sample ? 'Save sample' : 'Add sample'}
      </button>
    </form>
  );
}

const dropColumns: ColumnDef<BatchDrop, unknown>[] = [
  {
    id: 'measuredAt',
    header: 'Measured at',
    cell: ({ row }) => fmtDateTime(row.original.measuredAt),
  },
  { id: 'sample', header: 'Sample', accessorKey: 'sampleLabel' },
  { id: 'liquid', header: 'Probe liquid', accessorKey: 'probeLiquidName' },
  {
    id: 'source',
    header: 'Source',
    cell: ({ row }) => (row.original.source === 'import' ? 'imported' : 'photo'),
  },
  { id: 'method', header: 'Method', cell: ({ row }) => row.original.method ?? '—' },
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
