'use client';

import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { NumberField, SelectField, TextAreaField, type Choice } from '@/components/ui/fields';
import {
  DYNAMIC_LIMITS,
  specCreateSchema,
  specReplies,
  specUpdateSchema,
  type SpecListItem,
} from '@/lib/contracts/specs';
import { fmtNumber } from './format';
import { RecordEditor, RowActions } from './record-editor';
import { RecordForm } from './record-form';
import { useRecordForm } from './use-record-form';

export type { Choice };

/** "≥ 105°", "30–40 mN/m": the degree sign sits on its number, other units after a space. */
const limits = (min: number | null, max: number | null, unit: string, digits = 0) => {
  const u = unit === '°' ? unit : ` ${unit}`;
  return min === null && max === null
    ? '—'
    : min !== null && max !== null
      ? `${fmtNumber(min, digits)}–${fmtNumber(max, digits)}${u}`
      : min !== null
        ? `≥ ${fmtNumber(min, digits)}${u}`
        : `≤ ${fmtNumber(max, digits)}${u}`;
};

/** A coating's specs; admins edit and archive them in place. */
export function SpecsPanel({
  coatingId,
  specs,
  liquids,
  canManage,
  exportHref,
}: {
  coatingId: string;
  specs: SpecListItem[];
  liquids: Choice[];
  canManage: boolean;
  exportHref: string | null;
}) {
  const columns = (edit: (id: string) => void): ColumnDef<SpecListItem, unknown>[] => [
    {
      id: 'probeLiquid',
      header: 'Probe liquid',
      accessorKey: 'probeLiquidName',
      enableHiding: false,
    },
    {
      id: 'angle',
      header: 'Contact angle (°)',
      cell: ({ row }) => limits(row.original.minDeg, row.original.maxDeg, '°'),
    },
    {
      id: 'scope',
      header: 'Applies to',
      cell: ({ row }) => (row.original.scope === 'mean' ? 'the mean' : 'each drop'),
    },
    {
      id: 'surfaceEnergy',
      header: 'Surface energy (mN/m)',
      cell: ({ row }) =>
        limits(row.original.minSurfaceEnergyMnM, row.original.maxSurfaceEnergyMnM, 'mN/m', 1),
    },
    {
      id: 'maxDays',
      header: 'Within (days of treatment)',
      cell: ({ row }) => fmtNumber(row.original.maxDaysSinceTreatment, 0),
    },
    { id: 'note', header: 'Note', accessorKey: 'note' },
    ...(canManage
      ? [
          {
            id: 'actions',
            header: 'Actions',
            enableHiding: false,
            cell: ({ row }) => (
              <RowActions
                onEdit={() => edit(row.original.id)}
                archive={{
                  url: `/api/specs/${row.original.id}`,
                  version: row.original.version,
                  what: 'spec',
                }}
              />
            ),
          } satisfies ColumnDef<SpecListItem, unknown>,
        ]
      : []),
  ];
  return (
    <RecordEditor
      rows={specs}
      canEdit={canManage}
      noun="spec"
      editTitle={(spec) => `Edit spec: ${spec.probeLiquidName}`}
      addSummary="Add a spec"
      form={(spec) => <SpecForm coatingId={coatingId} liquids={liquids} spec={spec} />}
      table={(edit) => (
        <DataTable
          label="specs"
          columns={columns(edit)}
          rows={specs}
          total={specs.length}
          page={1}
          pageSize={Math.max(specs.length, 1)}
          sort="createdAt"
          dir="asc"
          sortable={[]}
          paramPrefix="s"
          exportHref={exportHref}
          rowId={(row) => row.id}
          empty={
            <EmptyState title="No specs yet">
              Results of this coating are not checked against limits until a spec is added.
            </EmptyState>
          }
        />
      )}
    />
  );
}

/** "Min advancing angle (°)", … for each dynamic-wetting limit. */
const DYNAMIC_LABELS: Record<string, string> = Object.fromEntries(
  DYNAMIC_LIMITS.flatMap(([name, min, max]) => [
    [min, `Min ${name} (°)`],
    [max, `Max ${name} (°)`],
  ]),
);
const DYNAMIC_KEYS = Object.keys(DYNAMIC_LABELS);

const LABELS = {
  probeLiquidId: 'Probe liquid',
  scope: 'Applies to',
  minDeg: 'Min angle (°)',
  maxDeg: 'Max angle (°)',
  minSurfaceEnergyMnM: 'Min surface energy (mN/m)',
  maxSurfaceEnergyMnM: 'Max surface energy (mN/m)',
  ...DYNAMIC_LABELS,
  maxDaysSinceTreatment: 'Within days of treatment',
  note: 'Note',
};
const SCHEMAS = { create: specCreateSchema, update: specUpdateSchema };
const SCOPES: Choice[] = [
  { value: 'each-drop', label: 'Each drop' },
  { value: 'mean', label: 'The mean of the drops' },
];

const text = (value: number | null | undefined) =>
  value === null || value === undefined ? '' : String(value);

type SpecValues = Record<string, string | number | undefined>;
type Spec = Omit<SpecListItem, 'probeLiquidName'>;

export function SpecForm({
  coatingId,
  liquids,
  spec,
}: {
  coatingId: string;
  liquids: Choice[];
  spec?: Spec;
}) {
  const { field, formProps } = useRecordForm<SpecValues, Spec>({
    noun: 'spec',
    collection: '/api/specs',
    replyKey: 'spec',
    reply: specReplies.one,
    record: spec,
    schemas: SCHEMAS,
    blank: {
      coatingId,
      probeLiquidId: liquids.find((l) => l.value === 'liquid-water')?.value ?? '',
      scope: 'each-drop',
      minDeg: '',
      maxDeg: '',
      minSurfaceEnergyMnM: '',
      maxSurfaceEnergyMnM: '',
      ...Object.fromEntries(DYNAMIC_KEYS.map((k) => [k, ''])),
      maxDaysSinceTreatment: '',
      note: '',
    },
    toValues: (saved) => ({
      coatingId,
      probeLiquidId: saved.probeLiquidId,
      scope: saved.scope,
      minDeg: text(saved.minDeg),
      maxDeg: text(saved.maxDeg),
      minSurfaceEnergyMnM: text(saved.minSurfaceEnergyMnM),
      maxSurfaceEnergyMnM: text(saved.maxSurfaceEnergyMnM),
      ...Object.fromEntries(
        DYNAMIC_KEYS.map((k) => [k, text(saved[k as keyof Spec] as number | null)]),
      ),
      maxDaysSinceTreatment: text(saved.maxDaysSinceTreatment),
      note: saved.note,
    }),
    labels: LABELS,
  });
  return (
    <RecordForm {...formProps}>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Probe liquid"
          options={liquids}
          placeholder="Choose a liquid"
          {...field('probeLiquidId')}
        />
        <SelectField label="Applies to" options={SCOPES} {...field('scope')} />
        <NumberField label="Min angle (°)" {...field('minDeg')} />
        <NumberField label="Max angle (°)" {...field('maxDeg')} />
        <NumberField
          label="Min surface energy (mN/m)"
          hint="Optional"
          {...field('minSurfaceEnergyMnM')}
        />
        <NumberField
          label="Max surface energy (mN/m)"
          hint="Optional"
          {...field('maxSurfaceEnergyMnM')}
        />
        {DYNAMIC_KEYS.map((key) => (
          <NumberField
            key={key}
            label={DYNAMIC_LABELS[key]}
            hint="Optional: dynamic wetting"
            {...field(key)}
          />
        ))}
        <NumberField
          label="Within days of treatment"
          hint="Optional: results count only this long after treatment"
          {...field('maxDaysSinceTreatment')}
        />
      </div>
      <TextAreaField label="Note" rows={2} {...field('note')} />
    </RecordForm>
  );
}
