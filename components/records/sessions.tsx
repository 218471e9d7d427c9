'use client';

import type { ColumnDef } from '@tanstack/react-table';
import type { MeasurementSessionListItem } from '@/lib/contracts/measurement-sessions';
import { DataTable, type DataTableProps } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { fmtDateTime, fmtNumber } from './format';

const columns: ColumnDef<MeasurementSessionListItem, unknown>[] = [
  {
    id: 'measuredAt',
    header: 'Measured at',
    enableHiding: false,
    cell: ({ row }) => fmtDateTime(row.original.measuredAt),
  },
  { id: 'operatorName', header: 'Operator', accessorKey: 'operatorName' },
  {
    id: 'probeLiquid',
    header: 'Probe liquid',
    cell: ({ row }) => row.original.probeLiquidName ?? '—',
  },
  {
    id: 'temperature',
    header: 'Temperature (°C)',
    cell: ({ row }) => fmtNumber(row.original.temperatureC, 1),
  },
  {
    id: 'humidity',
    header: 'Humidity (%)',
    cell: ({ row }) => fmtNumber(row.original.humidityPct, 0),
  },
  {
    id: 'dropVolume',
    header: 'Drop volume (µL)',
    cell: ({ row }) => fmtNumber(row.original.dropVolumeUl, 1),
  },
  {
    id: 'scale',
    header: 'Scale (px/mm)',
    cell: ({ row }) => fmtNumber(row.original.scalePxPerMm, 1),
  },
  {
    id: 'liquidLot',
    header: 'Liquid lot',
    cell: ({ row }) => <span className="whitespace-nowrap">{row.original.liquidLot || '—'}</span>,
  },
  { id: 'notes', header: 'Instrument notes', accessorKey: 'instrumentNotes' },
];

export function SessionsTable(
  props: Omit<
    DataTableProps<MeasurementSessionListItem>,
    'columns' | 'label' | 'rowId' | 'empty' | 'sortable'
  >,
) {
  return (
    <DataTable
      {...props}
      label="sessions"
      columns={columns}
      sortable={['measuredAt', 'operatorName', 'createdAt']}
      rowId={(row) => row.id}
      empty={
        <EmptyState title="No sessions match">
          A session records one sitting at the instrument: operator, room conditions, drop volume
          and camera scale.
        </EmptyState>
      }
    />
  );
}
