import { idParamsSchema } from '@/lib/contracts/common';
import { certificatePreparingPage } from '@/lib/reports/preparing-page';
import { route } from '@/server/http/route';
import { requestCertificate } from '@/server/reports/certificate';

/**
 * The batch's certificate of analysis (PDF/A-2b; viewers: approved results only). While it is
 * being built: 202 with a page that reloads itself until the PDF is ready.
 */
export const GET = route(
  { access: 'organization:read', params: idParamsSchema },
  async ({ ctx, params }) => {
    const answer = await requestCertificate(ctx, params.id);
    if (answer.status === 'preparing') {
      return new Response(
        certificatePreparingPage({ title: answer.fileName, refreshSeconds: 3 }),
        {
          status: 202,
          headers: {
            'content-type': 'text/html; charset=utf-8',
            'cache-control': 'no-store',
            'retry-after': '3',
          },
        },
      );
    }
    return new Response(new Uint8Array(answer.pdf), {
      headers: {
        'content-type': 'application/pdf',
        'content-disposition': `attachment; filename="${answer.fileName}"`,
        'cache-control': 'private, no-store',
      },
    });
  },
);
