import 'server-only';
import { findLiveMeasurement, listDynamicRevisions } from '@/db/queries/dynamic';
import { database } from '@/db/queries/transaction';
import { notFound } from '@/lib/app-error';

/** A measurement of the organization, its revisions and the newest revision's result and series. */
export async function loadDynamicMeasurement(organizationId: string, id: string) {
  const db = database();
  const measurement = await findLiveMeasurement(db, organizationId, id);
  if (!measurement) throw notFound('That dynamic measurement');
  const revisions = await listDynamicRevisions(db, id);
  const [latest] = revisions;
  return {
    id: measurement.id,
    sampleId: measurement.sampleId,
    probeLiquidId: measurement.probeLiquidId,
    kind: measurement.kind,
    sourceType: measurement.sourceType,
    fps: measurement.fps,
    createdAt: measurement.createdAt,
    revisions: revisions.map(({ result: _r, series: _s, ...rest }) => rest),
    result: latest.result,
    series: latest.series,
  };
}
