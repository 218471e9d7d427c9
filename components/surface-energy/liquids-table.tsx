import type { AngleTableRow } from '@/lib/contracts/surface-energy';
import { PlainTable } from '@/components/ui/plain-table';
import { fmt } from '@/components/ui/format';

/** The probe liquids measured on the sample or batch: mean angle, spread and their tensions. */
export function LiquidsTable({
  rows,
  subjectName,
  kind,
  readAll,
}: {
  rows: AngleTableRow[];
  subjectName: string;
  kind: 'sample' | 'batch';
  readAll: boolean;
}) {
  const sources = [
    ...new Set(
      rows.flatMap((row) => [row.sources.total, row.sources.lifshitzVanDerWaals]).filter(Boolean),
    ),
  ];
  const hazards = rows.filter((row) => row.hazardNote && /harmful/i.test(row.hazardNote));
  return (
    <section className="card" aria-label="Liquids measured">
      <h2 className="mb-1">Liquids measured on {subjectName}</h2>
      <p className="mb-3 text-xs text-ink-600">
        Mean of each drop’s latest analysis{readAll ? '' : ' (approved results only)'}
        {kind === 'batch' ? ', pooled over every sample of the batch' : ''}; components in mN/m.
      </p>
      <PlainTable
        head={['Liquid', 'Mean angle ± SD', 'n', 'γL', 'γd / γp', 'γLW / γ+ / γ−', 'Values from']}
      >
        {rows.map((row) => (
          <tr
            key={row.probeLiquidId}
            className="border-t border-ink-100"
            data-testid={`liquid-${row.probeLiquidId}`}
          >
            <th scope="row" className="py-2 pr-3 font-medium">
              {row.name}
            </th>
            <td className="py-2 pr-3 font-mono">
              {fmt(row.meanDeg)}° ± {row.sdDeg === null ? '— (one drop)' : `${fmt(row.sdDeg)}°`}
            </td>
            <td className="py-2 pr-3 font-mono">{row.n}</td>
            <td className="py-2 pr-3 font-mono">{fmt(row.gammaTotal)}</td>
            <td className="py-2 pr-3 font-mono">
              {row.gammaDispersive === null
                ? 'not given'
                : `${fmt(row.gammaDispersive)} / ${fmt(row.gammaPolar)}`}
            </td>
            <td className="py-2 pr-3 font-mono">
              {row.gammaLW === null
                ? 'not given'
                : `${fmt(row.gammaLW)} / ${fmt(row.gammaPlus, 2)} / ${fmt(row.gammaMinus)}`}
            </td>
            <td className="py-2 pr-3 text-xs text-ink-600">
              {row.builtIn ? 'Built-in library' : 'Lab’s own values'}
            </td>
          </tr>
        ))}
      </PlainTable>
      {sources.length > 0 ? (
        <p className="mt-2 text-xs text-ink-600">Sources: {sources.join(' · ')}</p>
      ) : null}
      {hazards.length > 0 ? (
        <div
          role="note"
          className="mt-3 rounded-md bg-amber-50 px-3 py-2 text-sm text-amber-900"
          data-testid="hazard-notes"
        >
          {hazards.map((row) => (
            <p key={row.probeLiquidId}>
              <strong>{row.name}:</strong> {row.hazardNote}
            </p>
          ))}
        </div>
      ) : null}
    </section>
  );
}
