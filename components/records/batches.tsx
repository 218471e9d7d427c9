'use client';

import { useRouter } from 'next/navigation';
import type { ColumnDef } from '@tanstack/react-table';
import { DataTable, TableLink, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { NumberField, SelectField, TextAreaField, TextField } from '@/components/ui/fields';
import {
  PROCESS_PARAMETERS,
  batchCreateSchema,
  batchReplies,
  batchUpdateSchema,
  type Batch,
  type BatchListItem,
  type ProcessParameterKey,
} from '@/lib/contracts/batches';
import { fmtDate } from './format';
import { RecordForm } from './record-form';
import type { Choice } from './specs';
import { useRecordForm } from './use-record-form';

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
      <span className="block min-w-[11rem] max-w-[16rem]">
        <TableLink href={`/coatings/${row.original.coatingId}`}>
          {row.original.coatingCode}
        </TableLink>
        <span className="block text-xs text-ink-600">{row.original.coatingName}</span>
      </span>
    ),
  },
  {
    id: 'producedOn',
    header: 'Produced on',
    cell: ({ row }) => <span className="whitespace-nowrap">{row.original.producedOn}</span>,
  },
  {
    // One column for the process: five columns of mostly empty cells do not fit a laptop screen.
    id: 'process',
    header: 'Process',
    cell: ({ row }) => {
      const recorded = PARAMETER_KEYS.filter((key) => row.original.process[key] !== undefined);
      if (recorded.length === 0) return '—';
      return (
        <ul className="min-w-[10rem] text-xs">
          {recorded.map((key) => (
            <li key={key} className="whitespace-nowrap">
              {PROCESS_PARAMETERS[key].label}: {row.original.process[key]}{' '}
              {PROCESS_PARAMETERS[key].unit}
            </li>
          ))}
        </ul>
      );
    },
  },
  {
    id: 'notes',
    header: 'Notes',
    cell: ({ row }) => (
      <span className="line-clamp-2 min-w-[10rem] max-w-[18rem]">{row.original.notes}</span>
    ),
  },
  {
    id: 'createdAt',
    header: 'Recorded',
    cell: ({ row }) => <span className="whitespace-nowrap">{fmtDate(row.original.createdAt)}</span>,
  },
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
const SCHEMAS = { create: batchCreateSchema, update: batchUpdateSchema };

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
  const { field, formProps } = useRecordForm<BatchValues, Batch>({
    noun: 'batch',
    collection: '/api/batches',
    replyKey: 'batch',
    reply: batchReplies.one,
    record: batch,
    schemas: SCHEMAS,
    blank: {
      coatingId: defaultCoatingId ?? '',
      lotCode: '',
      producedOn: '',
      process: processText({}),
      notes: '',
    },
    toValues: (saved) => ({
      coatingId: saved.coatingId,
      lotCode: saved.lotCode,
      producedOn: saved.producedOn,
      process: processText(saved.process),
      notes: saved.notes,
    }),
    labels: LABELS,
    toBody: (values) => ({
      ...values,
      // Parameters left empty are not recorded (the schema turns '' into undefined).
      process: Object.fromEntries(
        Object.entries(values.process ?? {}).filter(([, v]) => v !== undefined),
      ),
    }),
    onCreated: (saved) => router.push(`/batches/${saved.id}`),
  });
  return (
    <RecordForm {...formProps}>
      <div className="grid gap-3 sm:grid-cols-3">
        <SelectField
          label="Coating"
          options={coatings}
          placeholder="Choose a coating"
          {...field('coatingId')}
        />
        <TextField label="Lot code" hint="Like B-0412" {...field('lotCode')} />
        <TextField label="Produced on" type="date" {...field('producedOn')} />
      </div>
      <fieldset>
        <legend className="field-label">Process parameters (leave empty when not recorded)</legend>
        <div className="mt-1 grid gap-3 sm:grid-cols-3">
          {PARAMETER_KEYS.map((key) => (
            <NumberField
              key={key}
              label={`${PROCESS_PARAMETERS[key].label} (${PROCESS_PARAMETERS[key].unit})`}
              {...field(`process.${key}`)}
            />
          ))}
        </div>
      </fieldset>
      <TextAreaField label="Notes" {...field('notes')} />
    </RecordForm>
  );
}
