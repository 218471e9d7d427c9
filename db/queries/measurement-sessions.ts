import 'server-only';
import { eq, getTableColumns, gte, isNull, lt } from 'drizzle-orm';
import type { Page } from '@/lib/contracts/common';
import type {
  MeasurementSessionListItem,
  MeasurementSessionListQuery,
} from '@/lib/contracts/measurement-sessions';
import { measurementSessions, probeLiquids } from '../schema';
import { listPage, ownedBy, textSearch } from './records';

const SORT_COLUMNS = {
  measuredAt: measurementSessions.measuredAt,
  operatorName: measurementSessions.operatorName,
  createdAt: measurementSessions.createdAt,
} as const;

const DAY_MS = 86_400_000;
/** Date filters are whole UTC days: from the start of `from` to the end of `to`. */
const startOfUtcDay = (isoDate: string) => new Date(`${isoDate}T00:00:00Z`);

/** Sessions with their probe liquid's name (null when none was set). */
export async function listMeasurementSessions(
  organizationId: string,
  query: MeasurementSessionListQuery,
): Promise<Page<MeasurementSessionListItem>> {
  const t = measurementSessions;
  return listPage({
    from: t,
    columns: { ...getTableColumns(t), probeLiquidName: probeLiquids.name },
    joins: [{ kind: 'left', table: probeLiquids, on: eq(probeLiquids.id, t.probeLiquidId) }],
    where: [
      ownedBy(t, organizationId),
      query.includeArchived ? undefined : isNull(t.archivedAt),
      query.probeLiquidId ? eq(t.probeLiquidId, query.probeLiquidId) : undefined,
      query.measuredFrom ? gte(t.measuredAt, startOfUtcDay(query.measuredFrom)) : undefined,
      query.measuredTo
        ? lt(t.measuredAt, new Date(startOfUtcDay(query.measuredTo).getTime() + DAY_MS))
        : undefined,
      textSearch(query.q, [t.operatorName, t.instrumentNotes]),
    ],
    sort: SORT_COLUMNS[query.sort],
    query,
  });
}
