/**
 * Runs once when a Next.js server process starts. The Node.js server also runs the job workers:
 * mail (server/mail/queue.ts: takes queued mails from PostgreSQL and hands them to SMTP_URL),
 * certificates (server/reports/certificate.ts: builds and stores queued certificates of analysis)
 * and webhooks (server/webhooks/queue.ts: sends queued webhook deliveries). Not during
 * `next build`, not in the edge runtime; MAIL_WORKER=off leaves out mail and certificates,
 * WEBHOOK_WORKER=off the webhooks (pg-boss hands each job to one worker of one process either way).
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  if (process.env.NEXT_PHASE === 'phase-production-build') return;
  if (process.env.MAIL_WORKER !== 'off') {
    const { startMailWorker } = await import('./server/mail/queue');
    startMailWorker().then(
      (id) => {
        if (id) console.log('[mail] worker started');
      },
      (error: unknown) => console.error('[mail] worker did not start; mails stay queued', error),
    );
    const { startCertificateWorker } = await import('./server/reports/certificate');
    startCertificateWorker().then(
      () => console.log('[certificate] worker started'),
      (error: unknown) =>
        console.error('[certificate] worker did not start; certificates stay queued', error),
    );
  }
  if (process.env.WEBHOOK_WORKER !== 'off') {
    const { startWebhookWorker } = await import('./server/webhooks/queue');
    startWebhookWorker().then(
      () => console.log('[webhooks] worker started'),
      (error: unknown) =>
        console.error('[webhooks] worker did not start; deliveries stay queued', error),
    );
  }
}
