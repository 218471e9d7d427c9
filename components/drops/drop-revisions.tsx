import { PlainTable } from '@/components/ui/plain-table';
import { fmt, fmtUtc } from '@/components/ui/format';

const METHOD: Record<string, string> = {
  'young-laplace': 'Young–Laplace',
  circle: 'Circle',
  polynomial: 'Polynomial',
  ellipse: 'Ellipse',
  'height-width': 'Height–width (θ/2)',
  manual: 'Read by hand',
};

export type DropRevisionRow = {
  id: string;
  revision: number;
  createdAt: Date;
  createdBy: string | null;
  method: string;
  baselineSource: string;
  reason: string | null;
  leftDeg: number;
  rightDeg: number;
  meanDeg: number;
  operatorName: string | null;
  temperatureC: number | null;
  humidityPct: number | null;
  dropVolumeUl: number | null;
  scalePxPerMm: number | null;
};

const conditions = (r: DropRevisionRow) =>
  [
    r.temperatureC !== null ? `${fmt(r.temperatureC, 1)} °C` : null,
    r.humidityPct !== null ? `${fmt(r.humidityPct, 0)} % RH` : null,
    r.dropVolumeUl !== null ? `${fmt(r.dropVolumeUl, 1)} µL` : null,
    r.scalePxPerMm !== null ? `${fmt(r.scalePxPerMm, 1)} px/mm` : 'no scale',
    r.operatorName ? `operator ${r.operatorName}` : null,
  ]
    .filter(Boolean)
    .join(', ');

/** Every revision of a drop, newest first: when, who, how, under which conditions, and why. */
export function DropRevisions({ revisions }: { revisions: DropRevisionRow[] }) {
  return (
    <section className="card mt-6" aria-label="Revisions">
      <h2 className="mb-3">Revisions</h2>
      <PlainTable
        label="Revisions"
        bodyTestId="drop-revisions"
        head={[
          'Rev.',
          'When',
          'Who',
          'Method',
          'Baseline',
          'Conditions',
          { label: 'Left', align: 'right' },
          { label: 'Right', align: 'right' },
          'Reason',
        ]}
      >
        {revisions.map((r) => (
          <tr key={r.id} className="border-t border-ink-100 align-top">
            <td className="py-1.5 pr-3">r{r.revision}</td>
            <td className="py-1.5 pr-3 whitespace-nowrap">{fmtUtc(r.createdAt)}</td>
            <td className="py-1.5 pr-3">{r.createdBy ?? 'Former member'}</td>
            <td className="py-1.5 pr-3">{METHOD[r.method] ?? r.method}</td>
            <td className="py-1.5 pr-3">
              {r.baselineSource === 'given' ? 'set by hand' : 'found automatically'}
            </td>
            <td className="py-1.5 pr-3 text-xs" data-cell="conditions">
              {conditions(r) || '—'}
            </td>
            <td className="py-1.5 pr-3 text-right tabular-nums">{fmt(r.leftDeg, 1)}°</td>
            <td className="py-1.5 pr-3 text-right tabular-nums">{fmt(r.rightDeg, 1)}°</td>
            <td className="py-1.5" data-cell="reason">
              {r.reason ?? (r.revision === 1 ? 'first analysis' : '—')}
            </td>
          </tr>
        ))}
      </PlainTable>
    </section>
  );
}
