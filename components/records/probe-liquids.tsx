'use client';

import { useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import { z } from 'zod';
import type { ProbeLiquid } from '@/lib/contracts/probe-liquids';
import { DataTable, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { InputField, TextAreaField } from '@/components/ui/form-field';
import { PROBE_LIQUID_VALUES, probeLiquidCreateSchema, probeLiquidUpdateSchema } from '@/lib/contracts/probe-liquids';
import { ArchiveButton } from './archive-button';
import { fmtNumber } from './format';
import { FormMessages, useRecordForm } from './use-record-form';

type ValueKey = (typeof PROBE_LIQUID_VALUES)[number];

const VALUES: {
  key: ValueKey;
  field: keyof ProbeLiquid;
  label: string;
  unit: string;
  digits: number;
}[] = [
  { key: 'total', field: 'totalMnM', label: 'Total', unit: 'mN/m', digits: 1 },
  { key: 'dispersive', field: 'dispersiveMnM', label: 'Dispersive', unit: 'mN/m', digits: 1 },
  { key: 'polar', field: 'polarMnM', label: 'Polar', unit: 'mN/m', digits: 1 },
  {
    key: 'lifshitzVanDerWaals',
    field: 'lifshitzVanDerWaalsMnM',
    label: 'Lifshitz–van der Waals',
    unit: 'mN/m',
    digits: 1,
  },
  { key: 'acid', field: 'acidMnM', label: 'Acid γ+', unit: 'mN/m', digits: 2 },
  { key: 'base', field: 'baseMnM', label: 'Base γ−', unit: 'mN/m', digits: 2 },
  { key: 'density', field: 'densityGPerCm3', label: 'Density', unit: 'g/cm³', digits: 3 },
];

/** A value with its source under it, so every number says where it comes from. */
function Sourced({ liquid, value }: { liquid: ProbeLiquid; value: (typeof VALUES)[number] }) {
  const number = liquid[value.field] as number | null;
  if (number === null) return <>—</>;
  const source = liquid.sources[value.key];
  return (
    <span>
      {fmtNumber(number, value.digits)}
      <span className="block text-xs text-ink-500">
        {source ? `Source: ${source}` : 'No source given'}
      </span>
    </span>
  );
}

export function ProbeLiquidsPanel({
  canManage,
  ...table
}: Omit<DataTableProps<ProbeLiquid>, 'columns' | 'label' | 'rowId' | 'empty' | 'sortable'> & {
  canManage: boolean;
}) {
  const [editing, setEditing] = useState<string | null>(null);
  const columns: ColumnDef<ProbeLiquid, unknown>[] = [
    {
      id: 'name',
      header: 'Name',
      enableHiding: false,
      cell: ({ row }) => (
        <span>
          <span className="font-medium">{row.original.name}</span>
          <span className="block text-xs text-ink-500">
            {row.original.builtIn ? 'Built-in library' : 'Your organization'}
          </span>
          <span className="block font-mono text-xs text-ink-400">{row.original.id}</span>
        </span>
      ),
    },
    {
      id: 'hazard',
      header: 'Hazard',
      cell: ({ row }) =>
        row.original.hazardNote ? (
          <strong
            className="block w-56 rounded border border-amber-500 bg-amber-50 px-2 py-1 text-amber-900"
            role="note"
          >
            ⚠ {row.original.hazardNote}
          </strong>
        ) : (
          '—'
        ),
    },
    ...VALUES.map((value): ColumnDef<ProbeLiquid, unknown> => ({
      id: value.key === 'total' ? 'totalMnM' : value.key,
      header: `${value.label} (${value.unit})`,
      cell: ({ row }) => <Sourced liquid={row.original} value={value} />,
    })),
    ...(canManage
      ? [
          {
            id: 'actions',
            header: 'Actions',
            enableHiding: false,
            cell: ({ row }) =>
              row.original.builtIn ? (
                <span className="text-xs text-ink-500">Read-only</span>
              ) : (
                <span className="flex gap-2">
                  <button
                    type="button"
                    className="btn-quiet py-1"
                    onClick={() => setEditing(row.original.id)}
                  >
                    Edit
                  </button>
                  <ArchiveButton
                    url={`/api/probe-liquids/${row.original.id}`}
                    version={row.original.version}
                    what="probe liquid"
                  />
                </span>
              ),
          } satisfies ColumnDef<ProbeLiquid, unknown>,
        ]
      : []),
  ];
  const current = table.rows.find((row) => row.id === editing && !row.builtIn);
  return (
    <div className="space-y-4">
      <DataTable
        {...table}
        label="probe-liquids"
        columns={columns}
        sortable={['name', 'totalMnM', 'createdAt']}
        rowId={(row) => row.id}
        empty={
          <EmptyState title="No probe liquids match">
            Clear the filters to see the built-in library.
          </EmptyState>
        }
      />
      {canManage && current ? (
        <section className="card" aria-label="Edit probe liquid">
          <div className="mb-3 flex items-center justify-between">
            <h3 className="font-semibold">Edit {current.name}</h3>
            <button type="button" className="btn-quiet py-1" onClick={() => setEditing(null)}>
              Close
            </button>
          </div>
          <ProbeLiquidForm key={current.id} liquid={current} />
        </section>
      ) : null}
      {canManage ? (
        <details className="card">
          <summary className="cursor-pointer font-semibold">Add your own probe liquid</summary>
          <div className="mt-3">
            <ProbeLiquidForm />
          </div>
        </details>
      ) : null}
    </div>
  );
}

const LABELS: Record<string, string> = {
  name: 'Name',
  ...Object.fromEntries(VALUES.map((v) => [v.field, `${v.label} (${v.unit})`])),
  hazardNote: 'Hazard note',
};
const FIELDS = ['name', 'hazardNote', 'sources', ...VALUES.map((v) => v.field as string)];

// The same schemas, with empty source boxes left out (a source is optional per value).
const withoutEmptySources = (schema: z.ZodType) =>
  z.preprocess((value) => {
    if (!value || typeof value !== 'object') return value;
    const record = value as Record<string, unknown>;
    const sources = Object.fromEntries(
      Object.entries((record.sources ?? {}) as Record<string, unknown>).filter(
        ([, source]) => typeof source === 'string' && source.trim() !== '',
      ),
    );
    return { ...record, sources };
  }, schema);
const createSchema = withoutEmptySources(probeLiquidCreateSchema);
const updateSchema = withoutEmptySources(probeLiquidUpdateSchema);

type LiquidValues = Record<string, unknown>;

const toText = (value: unknown) => (value === null || value === undefined ? '' : String(value));

export function ProbeLiquidForm({ liquid }: { liquid?: ProbeLiquid }) {
  const formId = liquid ? `liquid-${liquid.id}` : 'liquid-new';
  const blank: LiquidValues = {
    name: '',
    hazardNote: '',
    sources: Object.fromEntries(VALUES.map((v) => [v.key, ''])),
    ...Object.fromEntries(VALUES.map((v) => [v.field, ''])),
  };
  const { form, onSubmit, notice, conflict, reapply } = useRecordForm<LiquidValues>({
    schema: liquid ? updateSchema : createSchema,
    defaultValues: liquid
      ? {
          name: liquid.name,
          hazardNote: liquid.hazardNote ?? '',
          sources: Object.fromEntries(VALUES.map((v) => [v.key, liquid.sources[v.key] ?? ''])),
          ...Object.fromEntries(VALUES.map((v) => [v.field, toText(liquid[v.field])])),
          version: liquid.version,
        }
      : blank,
    fields: FIELDS,
    url: liquid ? `/api/probe-liquids/${liquid.id}` : '/api/probe-liquids',
    method: liquid ? 'PATCH' : 'POST',
    onSaved: () => {
      if (!liquid) form.reset(blank);
    },
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={liquid ? 'Edit probe liquid' : 'New probe liquid'}
    >
      <FormMessages notice={notice} conflict={conflict} labels={LABELS} onReapply={reapply} />
      <InputField
        form={form}
        formId={formId}
        name="name"
        label="Name"
        hint='Like "Water (lab supply)"'
      />
      <div className="grid gap-3 sm:grid-cols-2">
        {VALUES.map((value) => (
          <div key={value.key} className="grid grid-cols-[8rem_1fr] gap-2">
            <InputField
              form={form}
              formId={formId}
              name={value.field}
              label={`${value.label} (${value.unit})`}
              inputMode="decimal"
            />
            <InputField
              form={form}
              formId={formId}
              name={`sources.${value.key}`}
              label="Source"
              hint="Paper, data sheet or in-house"
            />
          </div>
        ))}
      </div>
      <TextAreaField form={form} formId={formId} name="hazardNote" label="Hazard note" rows={2} />
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {liquid ? 'Save probe liquid' : 'Add probe liquid'}
      </button>
    </form>
  );
}
