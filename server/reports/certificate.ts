import 'server-only';
import { newId } from '@/db/queries/ids';
import { findCertificate, insertCertificate } from '@/db/queries/reports';
import { database } from '@/db/queries/transaction';
import type { OrgContext } from '@/lib/auth/context';
import { ensureQueue, getBoss } from '../mail/queue';
import {
  certificateContent,
  certificateRequestOf,
  renderCertificate,
  type CertificateRequest,
} from './batch-report';

/**
 * Certificates are built by a pg-boss job (queue `certificate`, one job per batch, audience and
 * fingerprint at a time) and stored; while the batch's data is unchanged the stored PDF is
 * handed out again, and any change (a drop, a re-analysis, a review, a spec…) gives a new
 * fingerprint and so a new certificate.
 */
export const CERTIFICATE_QUEUE = 'certificate';

export type CertificateJob = { request: CertificateRequest; batchId: string };

async function certificateQueue() {
  const boss = await getBoss();
  // 'stately': a second request while one build waits is not queued twice.
  await ensureQueue(boss, CERTIFICATE_QUEUE, {
    policy: 'stately',
    retryLimit: 3,
    retryDelay: 5,
    expireInSeconds: 300,
  });
  return boss;
}

export type CertificateAnswer =
  | { status: 'ready'; pdf: Buffer; fileName: string }
  | { status: 'preparing'; fileName: string };

/** The batch's certificate for the member: the stored one when current, else a build is queued. */
export async function requestCertificate(
  ctx: OrgContext,
  batchId: string,
): Promise<CertificateAnswer> {
  const request = certificateRequestOf(ctx);
  const { fingerprint, fileName, batchId: id } = await certificateContent(request, batchId);
  const stored = await findCertificate(id, request.audience, fingerprint);
  if (stored) return { status: 'ready', pdf: stored.pdf, fileName: stored.fileName };
  const boss = await certificateQueue();
  await boss.send(
    CERTIFICATE_QUEUE,
    { request, batchId: id } satisfies CertificateJob,
    { singletonKey: `${id}:${request.audience}:${fingerprint}` },
  );
  return { status: 'preparing', fileName };
}

/** The job: builds the certificate from the batch's current data and stores it; its fingerprint. */
export async function buildCertificate(job: CertificateJob): Promise<string> {
  const { pdf, fileName, fingerprint } = await renderCertificate(job.request, job.batchId);
  await insertCertificate(database(), {
    id: newId(),
    organizationId: job.request.organizationId,
    batchId: job.batchId,
    audience: job.request.audience,
    fingerprint,
    fileName,
    pdf,
  });
  return fingerprint;
}

/** Starts building queued certificates in this process (instrumentation.ts). */
export async function startCertificateWorker(
  options: { pollingIntervalSeconds?: number } = {},
): Promise<string> {
  const boss = await certificateQueue();
  return boss.work<CertificateJob>(
    CERTIFICATE_QUEUE,
    { batchSize: 1, pollingIntervalSeconds: options.pollingIntervalSeconds ?? 1 },
    async ([job]) => {
      if (job) await buildCertificate(job.data);
    },
  );
}
