import { idParamsSchema } from '@/lib/contracts/common';
import { route } from '@/server/http/route';
import { buildBatchReport } from '@/server/reports/batch-report';

/** The batch's certificate of analysis as a PDF (viewers: approved results only). */
export const GET = route(
  { access: 'organization:read', params: idParamsSchema },
  async ({ ctx, params }) => {
    const { pdf, fileName } = await buildBatchReport(ctx, params.id);
    return new Response(new Uint8Array(pdf), {
      headers: {
        'content-type': 'application/pdf',
        'content-disposition': `attachment; filename="${fileName}"`,
        'cache-control': 'private, no-store',
      },
    });
  },
);
