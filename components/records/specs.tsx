'use client';

import { useState } from 'react';
import type { ColumnDef } from '@tanstack/react-table';
import type { SpecListItem } from '@/lib/contracts/specs';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { InputField, SelectField, TextAreaField } from '@/components/ui/form-field';
import { specCreateSchema, specUpdateSchema } from '@/lib/contracts/specs';
import { ArchiveButton } from './archive-button';
import { fmtNumber } from './format';
import { FormMessages, useRecordForm } from './use-record-form';

export type Choice = { value: string; label: string };

const limits = (min: number | null, max: number | null, unit: string, digits = 0) =>
  min === null && max === null
    ? '—'
    : min !== null && max !== null
      ? `${fmtNumber(min, digits)}–${fmtNumber(max, digits)} ${unit}`
      : min !== null
        ? `≥ ${fmtNumber(min, digits)} ${unit}`
        : `≤ ${fmtNumber(max, digits)} ${unit}`;

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
  const [editing, setEditing] = useState<string | null>(null);
  const columns: ColumnDef<SpecListItem, unknown>[] = [
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
              <span className="flex gap-2">
                <button
                  type="button"
                  className="btn-quiet py-1"
                  onClick={() => setEditing(row.original.id)}
                >
                  Edit
                </button>
                <ArchiveButton
                  url={`/api/specs/${row.original.id}`}
                  version={row.original.version}
                  what="spec"
                />
              </span>
            ),
          } satisfies ColumnDef<SpecListItem, unknown>,
        ]
      : []),
  ];
  const current = specs.find((spec) => spec.id === editing);
  return (
    <div className="space-y-4">
      <DataTable
        label="specs"
        columns={columns}
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
      {canManage && current ? (
        <section className="card" aria-label="Edit spec">
          <div className="mb-3 flex items-center justify-between">
            <h3 className="font-semibold">Edit spec: {current.probeLiquidName}</h3>
            <button type="button" className="btn-quiet py-1" onClick={() => setEditing(null)}>
              Close
            </button>
          </div>
          <SpecForm key={current.id} coatingId={coatingId} liquids={liquids} spec={current} />
        </section>
      ) : null}
      {canManage ? (
        <details className="card">
          <summary className="cursor-pointer font-semibold">Add a spec</summary>
          <div className="mt-3">
            <SpecForm coatingId={coatingId} liquids={liquids} />
          </div>
        </details>
      ) : null}
    </div>
  );
}

const LABELS = {
  probeLiquidId: 'Probe liquid',
  scope: 'Applies to',
  minDeg: 'Min angle (°)',
  maxDeg: 'Max angle (°)',
  minSurfaceEnergyMnM: 'Min surface energy (mN/m)',
  maxSurfaceEnergyMnM: 'Max surface energy (mN/m)',
  maxDaysSinceTreatment: 'Within days of treatment',
  note: 'Note',
};
const FIELDS = ['coatingId', ...Object.keys(LABELS)];

const text = (value: number | null | undefined) =>
  value === null || value === undefined ? '' : String(value);

type SpecValues = Record<string, string | number | undefined>;

export function SpecForm({
  coatingId,
  liquids,
  spec,
}: {
  coatingId: string;
  liquids: Choice[];
  spec?: SpecListItem;
}) {
  const formId = spec ? `spec-${spec.id}` : 'spec-new';
  const blank: SpecValues = {
    coatingId,
    probeLiquidId: liquids.find((l) => l.value === 'liquid-water')?.value ?? '',
    scope: 'each-drop',
    minDeg: '',
    maxDeg: '',
    minSurfaceEnergyMnM: '',
    maxSurfaceEnergyMnM: '',
    maxDaysSinceTreatment: '',
    note: '',
  };
  const { form, onSubmit, notice, conflict, reapply } = useRecordForm<SpecValues>({
    schema: spec ? specUpdateSchema : specCreateSchema,
    defaultValues: spec
      ? {
          coatingId,
          probeLiquidId: spec.probeLiquidId,
          scope: spec.scope,
          minDeg: text(spec.minDeg),
          maxDeg: text(spec.maxDeg),
          minSurfaceEnergyMnM: text(spec.minSurfaceEnergyMnM),
          maxSurfaceEnergyMnM: text(spec.maxSurfaceEnergyMnM),
          maxDaysSinceTreatment: text(spec.maxDaysSinceTreatment),
          note: spec.note,
          version: spec.version,
        }
      : blank,
    fields: FIELDS,
    url: spec ? `/api/specs/${spec.id}` : '/api/specs',
    method: spec ? 'PATCH' : 'POST',
    onSaved: () => {
      if (!spec) form.reset(blank);
    },
  });
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="space-y-3"
      aria-label={spec ? 'Edit spec' : 'New spec'}
    >
      <FormMessages notice={notice} conflict={conflict} labels={LABELS} onReapply={reapply} />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          form={form}
          formId={formId}
          name="probeLiquidId"
          label="Probe liquid"
          options={liquids}
          placeholder="Choose a liquid"
        />
        <SelectField
          form={form}
          formId={formId}
          name="scope"
          label="Applies to"
          options={[
            { value: 'each-drop', label: 'Each drop' },
            { value: 'mean', label: 'The mean of the drops' },
          ]}
        />
        <InputField
          form={form}
          formId={formId}
          name="minDeg"
          label="Min angle (°)"
          inputMode="decimal"
        />
        <InputField
          form={form}
          formId={formId}
          name="maxDeg"
          label="Max angle (°)"
          inputMode="decimal"
        />
        <InputField
          form={form}
          formId={formId}
          name="minSurfaceEnergyMnM"
          label="Min surface energy (mN/m)"
          inputMode="decimal"
          hint="Optional"
        />
        <InputField
          form={form}
          formId={formId}
          name="maxSurfaceEnergyMnM"
          label="Max surface energy (mN/m)"
          inputMode="decimal"
          hint="Optional"
        />
        <InputField
          form={form}
          formId={formId}
          name="maxDaysSinceTreatment"
          label="Within days of treatment"
          inputMode="decimal"
          hint="Optional: results count only this long after treatment"
        />
      </div>
      <TextAreaField form={form} formId={formId} name="note" label="Note" rows={2} />
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {spec ? 'Save spec' : 'Add spec'}
      </button>
    </form>
  );
}
