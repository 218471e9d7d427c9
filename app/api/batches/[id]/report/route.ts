import { route } from '@/lib/auth/guard';
import { buildBatchReport } from '@/lib/reports/batch-report';

type Params = { params: Promise<{ id: string }> };

/** The batch's certificate of analysis as a PDF (viewers: approved results only). */
export const GET = route<Params>('organization:read', async (_request, ctx, { params }) => {
  const { id } = await params;
  const { pdf, fileName } = await buildBatchReport(ctx, id);
  return new Response(new Uint8Array(pdf), {
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="${fileName}"`,
      'cache-control': 'private, no-store',
    },
  });
});
