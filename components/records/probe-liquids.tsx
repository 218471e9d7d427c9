'use client';

import type { ColumnDef } from '@tanstack/react-table';
import { z } from 'zod';
import { DataTable, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { NumberField, TextAreaField, TextField } from '@/components/ui/fields';
import {
  PROBE_LIQUID_VALUES,
  probeLiquidCreateSchema,
  probeLiquidReplies,
  probeLiquidUpdateSchema,
  type ProbeLiquid,
} from '@/lib/contracts/probe-liquids';
import { fmtNumber } from './format';
import { RecordEditor, RowActions } from './record-editor';
import { RecordForm } from './record-form';
import { useRecordForm } from './use-record-form';

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

/** A value; its source is in the liquid's Sources cell. */
function Value({ liquid, value }: { liquid: ProbeLiquid; value: (typeof VALUES)[number] }) {
  const number = liquid[value.field] as number | null;
  return (
    <span className="whitespace-nowrap tabular-nums">
      {number === null ? '—' : fmtNumber(number, value.digits)}
    </span>
  );
}

/** Each distinct source of a liquid's values once, with the values it gives. */
function Sources({ liquid }: { liquid: ProbeLiquid }) {
  const groups = new Map<string, string[]>();
  for (const value of VALUES) {
    if (liquid[value.field] === null) continue;
    const source = liquid.sources[value.key] || 'No source given';
    groups.set(source, [...(groups.get(source) ?? []), value.label]);
  }
  return (
    <ul className="min-w-[16rem] max-w-[26rem] space-y-1 text-xs text-ink-700">
      {[...groups].map(([source, labels]) => (
        <li key={source}>
          <span className="font-medium">{labels.join(', ')}:</span> {source}
        </li>
      ))}
    </ul>
  );
}

export function ProbeLiquidsPanel({
  canManage,
  ...table
}: Omit<DataTableProps<ProbeLiquid>, 'columns' | 'label' | 'rowId' | 'empty' | 'sortable'> & {
  canManage: boolean;
}) {
  const columns = (edit: (id: string) => void): ColumnDef<ProbeLiquid, unknown>[] => [
    {
      id: 'name',
      header: 'Name',
      enableHiding: false,
      cell: ({ row }) => (
        <span>
          <span className="font-medium">{row.original.name}</span>
          <span className="block whitespace-nowrap text-xs text-ink-700">
            {row.original.builtIn ? 'Built-in library' : 'Your organization'}
          </span>
        </span>
      ),
    },
    {
      id: 'hazard',
      header: 'Hazard',
      cell: ({ row }) =>
        row.original.hazardNote ? (
          <strong
            className="block w-52 rounded border border-amber-500 bg-amber-50 px-2 py-1 text-xs font-medium text-amber-900"
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
      header: () => (
        <span className="whitespace-normal">
          {value.label} <span className="whitespace-nowrap">({value.unit})</span>
        </span>
      ),
      cell: ({ row }) => <Value liquid={row.original} value={value} />,
    })),
    { id: 'sources', header: 'Sources', cell: ({ row }) => <Sources liquid={row.original} /> },
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
                <RowActions
                  onEdit={() => edit(row.original.id)}
                  archive={{
                    url: `/api/probe-liquids/${row.original.id}`,
                    version: row.original.version,
                    what: 'probe liquid',
                  }}
                />
              ),
          } satisfies ColumnDef<ProbeLiquid, unknown>,
        ]
      : []),
  ];
  return (
    <RecordEditor
      rows={table.rows}
      canEdit={canManage}
      isEditable={(liquid) => !liquid.builtIn}
      noun="probe liquid"
      editTitle={(liquid) => `Edit ${liquid.name}`}
      addSummary="Add your own probe liquid"
      form={(liquid) => <ProbeLiquidForm liquid={liquid} />}
      table={(edit) => (
        <DataTable
          {...table}
          label="probe-liquids"
          columns={columns(edit)}
          sortable={['name', 'totalMnM', 'createdAt']}
          rowId={(row) => row.id}
          empty={
            <EmptyState title="No probe liquids match">
              Clear the filters to see the built-in library.
            </EmptyState>
          }
        />
      )}
    />
  );
}

const LABELS: Record<string, string> = {
  name: 'Name',
  ...Object.fromEntries(VALUES.map((v) => [v.field, `${v.label} (${v.unit})`])),
  hazardNote: 'Hazard note',
};

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
const SCHEMAS = {
  create: withoutEmptySources(probeLiquidCreateSchema),
  update: withoutEmptySources(probeLiquidUpdateSchema),
};

type LiquidValues = Record<string, unknown>;

const toText = (value: unknown) => (value === null || value === undefined ? '' : String(value));

const BLANK: LiquidValues = {
  name: '',
  hazardNote: '',
  sources: Object.fromEntries(VALUES.map((v) => [v.key, ''])),
  ...Object.fromEntries(VALUES.map((v) => [v.field, ''])),
};

export function ProbeLiquidForm({ liquid }: { liquid?: ProbeLiquid }) {
  const { field, formProps } = useRecordForm<LiquidValues, ProbeLiquid>({
    noun: 'probe liquid',
    collection: '/api/probe-liquids',
    replyKey: 'probeLiquid',
    reply: probeLiquidReplies.one,
    record: liquid,
    schemas: SCHEMAS,
    blank: BLANK,
    toValues: (saved) => ({
      name: saved.name,
      hazardNote: saved.hazardNote ?? '',
      sources: Object.fromEntries(VALUES.map((v) => [v.key, saved.sources[v.key] ?? ''])),
      ...Object.fromEntries(VALUES.map((v) => [v.field, toText(saved[v.field])])),
    }),
    labels: LABELS,
  });
  return (
    <RecordForm {...formProps}>
      <TextField label="Name" hint='Like "Water (lab supply)"' {...field('name')} />
      <div className="grid gap-3 sm:grid-cols-2">
        {VALUES.map((value) => (
          <div key={value.key} className="grid grid-cols-[8rem_1fr] gap-2">
            <NumberField label={`${value.label} (${value.unit})`} {...field(value.field)} />
            <TextField
              label="Source"
              hint="Paper, data sheet or in-house"
              {...field(`sources.${value.key}`)}
            />
          </div>
        ))}
      </div>
      <TextAreaField label="Hazard note" rows={2} {...field('hazardNote')} />
    </RecordForm>
  );
}
