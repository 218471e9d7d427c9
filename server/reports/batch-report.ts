import 'server-only';
import { findBatchWithCoating } from '@/db/queries/batches';
import { loadComparison } from '@/db/queries/comparison';
import {
  latestAnalysisOfDrop,
  latestApprovedBatchReview,
  listSamplesWithDropCounts,
  listSpecsOfCoating,
  methodsUsedInBatch,
  probeLiquidHazards,
} from '@/db/queries/reports';
import { AppError, notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { resultVisibility } from '../visibility';
import { buildComparison, type Comparison } from '@/lib/compare';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { METHOD_SOURCES, reportFileName, specText } from '@/lib/reports/batch-report';
import { renderBatchReportPdf, type BatchReportData } from '@/lib/reports/batch-report-pdf';
import { drawAnalysedDrop } from '@/lib/reports/representative-drop';
import { loadPhotoBytes } from '../photos/pixels';

/**
 * The representative drop: the first liquid's drop closest to its batch mean that has a photo,
 * re-analysed from the stored photo and drawn. A photo that cannot be read or analysed is
 * skipped; the report stays complete without it.
 */
async function representativeDrop(
  organizationId: string,
  batchId: string,
  comparison: Comparison,
): Promise<BatchReportData['representative']> {
  const first = comparison.liquids[0];
  const result = first?.batches.find((b) => b.batch.id === batchId);
  if (!first || !result?.description) return null;
  const mean = result.description.mean;
  const candidates = [...result.drops].sort(
    (a, b) => Math.abs(a.meanDeg - mean) - Math.abs(b.meanDeg - mean),
  );
  for (const candidate of candidates.slice(0, 3)) {
    const row = await latestAnalysisOfDrop(candidate.dropId);
    if (!row?.photoId || row.method === 'manual') continue;
    try {
      const { bytes } = await loadPhotoBytes(organizationId, row.photoId);
      const drawn = await drawAnalysedDrop({ bytes, method: row.method, baseline: row.baseline });
      return {
        png: drawn.png,
        caption: `${first.liquid.name} drop on sample ${candidate.sampleLabel} (closest to the batch mean): left ${drawn.result.leftDeg.toFixed(1)}°, right ${drawn.result.rightDeg.toFixed(1)}° by ${row.method}, revision ${row.revision}. Dots: edge points; orange: fitted profile; dashed line: baseline; red: tangents.`,
      };
    } catch {
      // Skipped, see above.
    }
  }
  return null;
}

/** The certificate of analysis of a batch (PDF), with the same statistics as the compare page. */
export async function buildBatchReport(
  ctx: OrgContext,
  batchId: string,
): Promise<{ pdf: Buffer; fileName: string }> {
  const organizationId = ctx.organization.id;
  const batch = await findBatchWithCoating(organizationId, batchId);
  if (!batch) throw notFound('That batch');
  const visibility = resultVisibility(ctx.organization.role);
  const loaded = await loadComparison(organizationId, batch.coatingId, {
    batches: [batch.id],
    visibility,
  });
  const comparison = buildComparison({
    batches: loaded.batches,
    liquids: loaded.liquids,
    specs: loaded.specs,
    drops: loaded.drops,
    dynamic: loaded.dynamic,
  });
  const [specRows, sampleRows, hazards, review, methods, representative] = await Promise.all([
    listSpecsOfCoating(batch.coatingId),
    listSamplesWithDropCounts(batch.id),
    probeLiquidHazards(),
    latestApprovedBatchReview(batch.id),
    methodsUsedInBatch(batch.id),
    representativeDrop(organizationId, batch.id, comparison),
  ]);
  // Viewers see approved results only (db/queries/visibility.ts): no certificate without them.
  if (visibility === 'approved' && (!review || loaded.drops.length === 0)) {
    throw new AppError(
      'forbidden',
      'This batch has no approved results yet, so its certificate of analysis is not available to your role. It can be downloaded once a reviewer approves the batch.',
    );
  }
  const se = comparison.surfaceEnergy;
  const seResult = se?.batches.find((b) => b.batch.id === batch.id);

  const data: BatchReportData = {
    organizationName: ctx.organization.name,
    coating: {
      code: batch.coatingCode,
      name: batch.coatingName,
      description: batch.coatingDescription,
    },
    batch: {
      lotCode: batch.lotCode,
      producedOn: batch.producedOn,
      process: batch.process,
      notes: batch.notes,
    },
    specs: specRows.map((s) => ({ liquidName: s.liquidName, text: specText(s) })),
    samples: sampleRows,
    liquids: comparison.liquids.flatMap((l) => {
      const result = l.batches.find((b) => b.batch.id === batch.id);
      return result
        ? [
            {
              name: l.liquid.name,
              hazardNote: hazards.get(l.liquid.id) ?? null,
              result,
              specLines: l.specLines,
            },
          ]
        : [];
    }),
    surfaceEnergy:
      se && seResult
        ? {
            result: seResult,
            method: se.method,
            basis: se.basis,
            coverageFactor: se.coverageFactor,
          }
        : null,
    dynamic: comparison.dynamic.flatMap((q) => {
      const result = q.batches.find((b) => b.batch.id === batch.id);
      return result && result.drops.length > 0 ? [{ title: q.title, result }] : [];
    }),
    representative,
    review: review?.signature
      ? {
          reviewerName: review.reviewerName ?? review.signature.name,
          signedAt: review.signature.signedAt,
          digest: review.signature.digest,
          comment: review.comment,
          analysisCount: review.analysisIds.length,
        }
      : null,
    angleBasis: comparison.angleBasis,
    methods: methods.map((m) => ({
      name: m,
      source: METHOD_SOURCES[m] ?? 'see the analysis record',
    })),
    generatedAt: new Date(),
    generatedBy: ctx.user.name,
    softwareVersion: SOFTWARE_VERSION,
  };
  const pdf = await renderBatchReportPdf(data);
  return { pdf, fileName: reportFileName(batch.coatingCode, batch.lotCode) };
}
