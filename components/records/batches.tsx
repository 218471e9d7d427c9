'use client';

import { useRouter } from 'next/navigation';
import type { ColumnDef } from '@tanstack/react-table';
import type { Batch, BatchListItem } from '@/lib/contracts/batches';
import { DataTable, TableLink, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { InputField, SelectField, TextAreaField } from '@/components/ui/form-field';
import { PROCESS_PARAMETERS, batchCreateSchema, batchUpdateSchema, type ProcessParameterKey } from '@/lib/contracts/batches';
import { fmtDate } from './format';
import type { Choice } from './specs';
import { FormMessages, useRecordForm } from './use-record-form';

const PARAMETER_KEYS = Object.keys(PROCESS_PARAMETERS) as ProcessParameterKey[];

const columns: ColumnDef<BatchListItem, unknown>[] = [
  {
    id: 'lotCode',
    header: 'Lot code',
    enableHiding: false,
    cell: ({ row }) => (
      <TableLink href={`/batches/${row.original.id}`}>{row.original.lotCode}</TableLink>
    ),
  },
  {
    id: 'coating',
    header: 'Coating',
    cell: ({ row }) => (
      <TableLink href={`/coatings/${row.original.coatingId}`}>
        {row.original.coatingCode} · {row.original.coatingName}
      </TableLink>
    ),
  },
  { id: 'producedOn', header: 'Produced on', accessorKey: 'producedOn' },
  ...PARAMETER_KEYS.map((key): ColumnDef<BatchListItem, unknown> => ({
    id: key,
    header: `${PROCESS_PARAMETERS[key].label} (${PROCESS_PARAMETERS[key].unit})`,
    cell: ({ row }) => row.original.process[key] ?? '—',
  })),
  {
    id: 'notes',
    header: 'Notes',
    cell: ({ row }) => <span className="line-clamp-2">{row.original.notes}</span>,
  },
  { id: 'createdAt', header: 'Recorded', cell: ({ row }) => fmtDate(row.original.createdAt) },
  {
    id: 'status',
    header: 'Status',
    cell: ({ row }) => (row.original.archivedAt ? 'Archived' : 'Current'),
  },
];

export function BatchesTable(
  props: Omit<
    DataTableProps<BatchListItem>,
    'columns' | 'label' | 'rowId' | 'empty' | 'sortable'
  > & {
    emptyText?: string;
  },
) {
  const { emptyText, ...rest } = props;
  return (
    <DataTable
      {...rest}
      label="batches"
      columns={columns}
      sortable={['lotCode', 'producedOn', 'createdAt', 'updatedAt']}
      rowId={(row) => row.id}
      empty={
        <EmptyState title="No batches match">
          {emptyText ??
            'Clear the filters, or record a batch with its production date and process parameters.'}
        </EmptyState>
      }
    />
  );
}

const LABELS: Record<string, string> = {
  coatingId: 'Coating',
  lotCode: 'Lot code',
  producedOn: 'Produced on',
  process: 'Process parameters',
  notes: 'Notes',
  ...Object.fromEntries(
    PARAMETER_KEYS.map((key) => [`process.${key}`, PROCESS_PARAMETERS[key].label]),
  ),
};
const FIELDS = ['coatingId', 'lotCode', 'producedOn', 'process', 'notes'];

type BatchValues = {
  coatingId: string;
  lotCode: string;
  producedOn: string;
  process: Record<string, string>;
  notes: string;
  version?: number;
};

const processText = (process: Batch['process']) =>
  Object.fromEntries(
    PARAMETER_KEYS.map((key) => [key, process[key] === undefined ? '' : String(process[key])]),
  );

/** New batch (POST) or edit (PATCH with version). */
export function BatchForm({
  batch,
  coatings,
  defaultCoatingId,
}: {
  batch?: Batch;
  coatings: Choice[];
  defaultCoatingId?: string;
}) {
  const router = useRouter();
  const formId = batch ? `batch-${batch.id}` : 'batch-new';
  const blank: BatchValues = {
    coatingId: defaultCoatingId ?? '',
    lotCode: '',
    producedOn: '',
    process: processText({}),
    notes: '',
  };
  const { form, onSubmit, notice, conflict, reapply } = useRecordForm<BatchValues>({
    schema: batch ? batchUpdateSchema : batchCreateSchema,
    defaultValues: batch
      ? {
          coatingId: batch.coatingId,
          lotCode: batch.lotCode,
          producedOn: batch.producedOn,
          process: processText(batch.process),
          notes: batch.notes,
          version: batch.version,
        }
      : blank,
    fields: FIELDS,
    url: batch ? `/api/batches/${batch.id}` : '/api/batches',
    method: batch ? 'PATCH' : 'POST',
    toBody: (values) => ({
      ...values,
      // Parameters left empty are not recorded (the schema turns '' into undefined).
      process: Object.fromEntries(
        Object.entries(values.process ?? {}).filter(([, v]) => v !== undefined),
      ),
    }),
    onSaved: (body) => {
      const saved = body.batch as Batch;
      if (!batch) router.push(`/batches/${saved.id}`);
      else
        form.reset({
          coatingId: saved.coatingId,
          lotCode: saved.lotCode,
          producedOn: saved.producedOn,
          process: processText(saved.process),
          notes: saved.notes,
          version: saved.version,
        });
    },
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={batch ? 'Edit batch' : 'New batch'}
    >
      <FormMessages notice={notice} conflict={conflict} labels={LABELS} onReapply={reapply} />
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField
          form={form}
          formId={formId}
          name="coatingId"
          label="Coating"
          options={coatings}
          placeholder="Choose a coating"
        />
        <InputField
          form={form}
          formId={formId}
          name="lotCode"
          label="Lot code"
          hint="Like B-0412"
        />
        <InputField form={form} formId={formId} name="producedOn" label="Produced on" type="date" />
      </div>
      <fieldset>
        <legend className="field-label">Process parameters (leave empty when not recorded)</legend>
        <div className="mt-1 grid gap-3 sm:grid-cols-3">
          {PARAMETER_KEYS.map((key) => (
            <InputField
              key={key}
              form={form}
              formId={formId}
              name={`process.${key}`}
              label={`${PROCESS_PARAMETERS[key].label} (${PROCESS_PARAMETERS[key].unit})`}
              inputMode="decimal"
            />
          ))}
        </div>
      </fieldset>
      <TextAreaField form={form} formId={formId} name="notes" label="Notes" />
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {batch ? 'Save batch' : 'Add batch'}
      </button>
    </form>
  );
}
