import 'server-only';
import { and, desc, eq, isNull, sql } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { loadComparison } from '@/db/queries/comparison';
import { analyses, batches, coatings, drops, probeLiquids, reviews, samples, specs, users } from '@/db/schema';
import { notFound } from '@/lib/api/errors';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import { buildComparison } from '@/lib/compare';
import type { FitMethod } from '@/lib/analysis/types';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { renderBatchReportPdf, type BatchReportData } from './batch-report-pdf';
import { drawAnalysedDrop } from './representative-drop';

const METHOD_SOURCES: Record<string, string> = {
  'young-laplace': 'axisymmetric Young–Laplace profile fit (Bashforth & Adams, 1883)',
  circle: 'spherical cap, algebraic circle fit refined geometrically (Kåsa, 1976)',
  polynomial: 'local polynomial tangent at each contact point (common practice)',
  ellipse: 'direct least-squares ellipse (Fitzgibbon, Pilu & Fisher, 1999)',
  'height-width': 'height–width θ/2 on a spherical cap (cap geometry)',
  manual: 'angles read by hand and imported',
};

function specText(s: {
  minDeg: number | null;
  maxDeg: number | null;
  scope: 'each-drop' | 'mean';
  minSurfaceEnergyMnM: number | null;
  maxSurfaceEnergyMnM: number | null;
  maxDaysSinceTreatment: number | null;
}): string {
  const limits = [s.minDeg !== null ? `at least ${s.minDeg}°` : null, s.maxDeg !== null ? `at most ${s.maxDeg}°` : null]
    .filter(Boolean)
    .join(' and ');
  const parts = [
    limits ? `${limits} ${s.scope === 'mean' ? 'on the batch mean' : 'for every drop'}` : null,
    s.maxDaysSinceTreatment !== null ? `within ${s.maxDaysSinceTreatment} days of treatment` : null,
    s.minSurfaceEnergyMnM !== null ? `surface free energy at least ${s.minSurfaceEnergyMnM} mN/m` : null,
    s.maxSurfaceEnergyMnM !== null ? `surface free energy at most ${s.maxSurfaceEnergyMnM} mN/m` : null,
  ].filter(Boolean);
  return parts.join('; ') || 'no limits';
}

/** Gathers the certificate of analysis of a batch, with the same statistics as the compare page. */
export async function buildBatchReport(ctx: OrgContext, batchId: string): Promise<{ pdf: Buffer; fileName: string }> {
  const db = getDb();
  const organizationId = ctx.organization.id;
  const [batch] = await db
    .select({
      id: batches.id,
      lotCode: batches.lotCode,
      producedOn: batches.producedOn,
      process: batches.process,
      notes: batches.notes,
      coatingId: coatings.id,
      coatingCode: coatings.code,
      coatingName: coatings.name,
      coatingDescription: coatings.description,
    })
    .from(batches)
    .innerJoin(coatings, eq(coatings.id, batches.coatingId))
    .where(and(eq(batches.id, batchId), eq(batches.organizationId, organizationId)));
  if (!batch) throw notFound('That batch');

  const approvedOnly = !can(ctx.organization.role, 'results:read-all');
  const loaded = await loadComparison(organizationId, batch.coatingId, { batches: [batch.id], approvedOnly });
  const comparison = buildComparison({
    batches: loaded.batches,
    liquids: loaded.liquids,
    specs: loaded.specs,
    drops: loaded.drops,
  });

  const specRows = await db
    .select({
      liquidName: probeLiquids.name,
      minDeg: specs.minDeg,
      maxDeg: specs.maxDeg,
      scope: specs.scope,
      minSurfaceEnergyMnM: specs.minSurfaceEnergyMnM,
      maxSurfaceEnergyMnM: specs.maxSurfaceEnergyMnM,
      maxDaysSinceTreatment: specs.maxDaysSinceTreatment,
    })
    .from(specs)
    .innerJoin(probeLiquids, eq(probeLiquids.id, specs.probeLiquidId))
    .where(and(eq(specs.coatingId, batch.coatingId), isNull(specs.archivedAt)));

  const sampleRows = await db
    .select({
      label: samples.label,
      substrate: samples.substrate,
      position: samples.position,
      treatedAt: samples.treatedAt,
      dropCount: sql<number>`count(${drops.id})::int`,
    })
    .from(samples)
    .leftJoin(drops, and(eq(drops.sampleId, samples.id), isNull(drops.archivedAt)))
    .where(and(eq(samples.batchId, batch.id), isNull(samples.archivedAt)))
    .groupBy(samples.id)
    .orderBy(samples.label);

  const hazards = new Map(
    (await db.select({ id: probeLiquids.id, hazardNote: probeLiquids.hazardNote }).from(probeLiquids)).map((l) => [
      l.id,
      l.hazardNote,
    ]),
  );

  // The representative drop: the first liquid's drop closest to its batch mean, with a photo.
  let representative: BatchReportData['representative'] = null;
  const first = comparison.liquids[0];
  const firstResult = first?.batches.find((b) => b.batch.id === batch.id);
  if (first && firstResult?.description) {
    const mean = firstResult.description.mean;
    const candidates = [...firstResult.drops].sort((a, b) => Math.abs(a.meanDeg - mean) - Math.abs(b.meanDeg - mean));
    for (const candidate of candidates.slice(0, 3)) {
      const [row] = await db
        .select({ photoId: drops.photoId, method: analyses.method, baseline: analyses.baseline, revision: analyses.revision })
        .from(drops)
        .innerJoin(analyses, eq(analyses.dropId, drops.id))
        .where(eq(drops.id, candidate.dropId))
        .orderBy(desc(analyses.revision))
        .limit(1);
      if (!row?.photoId || row.method === 'manual') continue;
      try {
        const drawn = await drawAnalysedDrop({
          organizationId,
          photoId: row.photoId,
          method: row.method as FitMethod,
          baseline: row.baseline,
        });
        representative = {
          png: drawn.png,
          caption: `${first.liquid.name} drop on sample ${candidate.sampleLabel} (closest to the batch mean): left ${drawn.result.leftDeg.toFixed(1)}°, right ${drawn.result.rightDeg.toFixed(1)}° by ${row.method}, revision ${row.revision}. Dots: edge points; orange: fitted profile; dashed line: baseline; red: tangents.`,
        };
        break;
      } catch {
        // A photo that cannot be read or analysed is skipped; the report stays complete without it.
      }
    }
  }

  const [review] = await db
    .select({
      reviewerName: users.name,
      signature: reviews.signature,
      comment: reviews.decisionComment,
      analysisIds: reviews.analysisIds,
    })
    .from(reviews)
    .leftJoin(users, eq(users.id, reviews.decidedByUserId))
    .where(and(eq(reviews.batchId, batch.id), eq(reviews.status, 'approved'), eq(reviews.scope, 'batch')))
    .orderBy(desc(reviews.decidedAt))
    .limit(1);

  const methodRows = await db
    .selectDistinct({ method: analyses.method })
    .from(analyses)
    .innerJoin(drops, eq(drops.id, analyses.dropId))
    .innerJoin(samples, eq(samples.id, drops.sampleId))
    .where(eq(samples.batchId, batch.id));
  const methods = methodRows.map((m) => m.method);

  const se = comparison.surfaceEnergy;
  const seResult = se?.batches.find((b) => b.batch.id === batch.id);

  const data: BatchReportData = {
    organizationName: ctx.organization.name,
    coating: { code: batch.coatingCode, name: batch.coatingName, description: batch.coatingDescription },
    batch: {
      lotCode: batch.lotCode,
      producedOn: batch.producedOn,
      process: batch.process as Record<string, number | undefined>,
      notes: batch.notes,
    },
    specs: specRows.map((s) => ({ liquidName: s.liquidName, text: specText(s) })),
    samples: sampleRows,
    liquids: comparison.liquids.flatMap((l) => {
      const result = l.batches.find((b) => b.batch.id === batch.id);
      return result ? [{ name: l.liquid.name, hazardNote: hazards.get(l.liquid.id) ?? null, result, specLines: l.specLines }] : [];
    }),
    surfaceEnergy:
      se && seResult ? { result: seResult, method: se.method, basis: se.basis, coverageFactor: se.coverageFactor } : null,
    representative,
    review:
      review?.signature
        ? {
            reviewerName: review.reviewerName ?? review.signature.name,
            signedAt: review.signature.signedAt,
            digest: review.signature.digest,
            comment: review.comment,
            analysisCount: review.analysisIds.length,
          }
        : null,
    angleBasis: comparison.angleBasis,
    methods: methods.map((m) => ({ name: m, source: METHOD_SOURCES[m] ?? 'see the analysis record' })),
    generatedAt: new Date(),
    generatedBy: ctx.user.name,
    softwareVersion: SOFTWARE_VERSION,
  };
  const pdf = await renderBatchReportPdf(data);
  return { pdf, fileName: `certificate-${batch.coatingCode}-${batch.lotCode}.pdf`.replace(/[^A-Za-z0-9._-]/g, '_') };
}
