import 'server-only';
import { createHash } from 'node:crypto';
import {
  latestAnalysisOfDrop,
  latestApprovedBatchReview,
  latestBatchReview,
  listSamplesWithDropCounts,
  listSpecsOfCoating,
  methodsUsedInBatch,
  sessionsOfBatch,
} from '@/db/queries/reports';
import { latestAnalysesUnder } from '@/db/queries/reviews';
import { AppError, notFound } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type { Comparison } from '@/lib/compare';
import { SOFTWARE_VERSION } from '@/lib/measure/version';
import { analysisMethodName } from '@/lib/contracts/drops';
import { METHOD_SOURCES, reportFileName, specText } from '@/lib/reports/batch-report';
import {
  renderBatchReportPdf,
  type BatchReportData,
  type CertificateStatus,
} from '@/lib/reports/batch-report-pdf';
import { drawAnalysedDrop } from '@/lib/reports/representative-drop';
import { compareOneBatch } from '../compare/batch';
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
        caption: `${first.liquid.name} drop on sample ${candidate.sampleLabel} (closest to the batch mean): left ${drawn.result.leftDeg.toFixed(1)}°, right ${drawn.result.rightDeg.toFixed(1)}° by ${analysisMethodName(row.method)}, revision ${row.revision}. Dots: edge points; orange: fitted profile; dashed line: baseline; red: tangents.`,
      };
    } catch {
      // Skipped, see above.
    }
  }
  return null;
}

/** Who a certificate is built for: every result ('all') or approved results only (viewers). */
export type CertificateAudience = 'all' | 'approved';

/** What a certificate is built from, besides the batch: the organization and its reader. */
export type CertificateRequest = {
  organizationId: string;
  organizationName: string;
  audience: CertificateAudience;
  requestedBy: string;
};

export function certificateRequestOf(ctx: OrgContext): CertificateRequest {
  return {
    organizationId: ctx.organization.id,
    organizationName: ctx.organization.name,
    audience: can(ctx.organization.role, 'results:read-all') ? 'all' : 'approved',
    requestedBy: ctx.user.name,
  };
}

/**
 * Final only when every latest result of the batch is approved and a whole-batch approval is
 * signed; rejected when the newest whole-batch review was rejected; a draft otherwise.
 */
function certificateStatus(
  latest: Awaited<ReturnType<typeof latestBatchReview>>,
  approved: Awaited<ReturnType<typeof latestApprovedBatchReview>>,
  statuses: string[],
): CertificateStatus {
  const unapproved = statuses.filter((s) => s !== 'approved').length;
  if (statuses.length > 0 && unapproved === 0 && approved?.signature) return { kind: 'approved' };
  if (latest?.status === 'rejected') {
    return {
      kind: 'rejected',
      reviewerName: latest.reviewerName ?? 'a reviewer',
      decidedAt: latest.decidedAt,
      comment: latest.comment,
    };
  }
  const reason =
    statuses.length === 0
      ? 'The batch has no results yet.'
      : latest?.status === 'submitted'
        ? `Submitted for review and not yet approved; ${unapproved} of ${statuses.length} results are not approved.`
        : `${unapproved} of ${statuses.length} results are not approved by a reviewer.`;
  return { kind: 'draft', reason };
}

/**
 * Everything the certificate shows except the drawn drop and the time it is made, and the
 * SHA-256 fingerprint of it: the same fingerprint means the same certificate.
 */
export async function certificateContent(request: CertificateRequest, batchId: string) {
  const { organizationId } = request;
  const compared = await compareOneBatch(organizationId, batchId, {
    visibility: request.audience,
  });
  if (!compared) throw notFound('That batch');
  const { batch, comparison } = compared;
  const [specRows, sampleRows, approved, latest, latestRows, methods, sessions] =
    await Promise.all([
      listSpecsOfCoating(batch.coatingId),
      listSamplesWithDropCounts(batch.id),
      latestApprovedBatchReview(batch.id),
      latestBatchReview(batch.id),
      latestAnalysesUnder(organizationId, batch.id, null),
      methodsUsedInBatch(batch.id),
      sessionsOfBatch(batch.id),
    ]);
  // Viewers see approved results only (db/queries/visibility.ts): no certificate without them.
  const visibleDrops = comparison.liquids.some((l) =>
    l.batches.some((b) => b.batch.id === batch.id && b.drops.length > 0),
  );
  if (request.audience === 'approved' && (!approved || !visibleDrops)) {
    throw new AppError(
      'forbidden',
      'This batch has no approved results yet, so its certificate of analysis is not available to your role. It can be downloaded once a reviewer approves the batch.',
    );
  }
  const se = comparison.surfaceEnergy;
  const seResult = se?.batches.find((b) => b.batch.id === batch.id);
  const status = certificateStatus(
    latest,
    approved,
    latestRows.map((r) => r.reviewStatus),
  );

  const content: Omit<BatchReportData, 'representative' | 'generatedAt' | 'generatedBy'> = {
    organizationName: request.organizationName,
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
    review:
      status.kind === 'approved' && approved?.signature
        ? {
            reviewerName: approved.reviewerName ?? approved.signature.name,
            signedAt: approved.signature.signedAt,
            digest: approved.signature.digest,
            comment: approved.comment,
            analysisCount: approved.analysisIds.length,
          }
        : null,
    status,
    sessions,
    angleBasis: comparison.angleBasis,
    methods: methods.map((m) => ({
      name: analysisMethodName(m),
      source: METHOD_SOURCES[m] ?? 'see the analysis record',
    })),
    softwareVersion: SOFTWARE_VERSION,
  };
  // The analyses behind each drop (their ids change on re-analysis) and the rest of the content.
  const fingerprint = createHash('sha256')
    .update(JSON.stringify({ content, analyses: latestRows.map((r) => r.analysisId).sort() }))
    .digest('hex');
  return {
    batchId: batch.id,
    content,
    comparison,
    fingerprint,
    fileName: reportFileName(batch.coatingCode, batch.lotCode),
  };
}

/** Builds the certificate of analysis of a batch (PDF/A-2b) with the compare page's statistics. */
export async function renderCertificate(
  request: CertificateRequest,
  batchId: string,
): Promise<{ pdf: Buffer; fileName: string; fingerprint: string }> {
  const gathered = await certificateContent(request, batchId);
  const representative = await representativeDrop(
    request.organizationId,
    gathered.batchId,
    gathered.comparison,
  );
  const pdf = await renderBatchReportPdf({
    ...gathered.content,
    representative,
    generatedAt: new Date(),
    generatedBy: request.requestedBy,
  });
  return { pdf, fileName: gathered.fileName, fingerprint: gathered.fingerprint };
}

/** The certificate of analysis of a batch as the signed-in member may read it (PDF). */
export async function buildBatchReport(
  ctx: OrgContext,
  batchId: string,
): Promise<{ pdf: Buffer; fileName: string }> {
  const { pdf, fileName } = await renderCertificate(certificateRequestOf(ctx), batchId);
  return { pdf, fileName };
}
