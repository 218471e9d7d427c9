import { NextResponse, type NextRequest } from 'next/server';
import { contentSecurityPolicy } from '@/lib/auth/security-headers';
import { uploadServiceOrigins } from '@/lib/uploads/config';

/**
 * Every page gets a Content-Security-Policy with a fresh nonce (lib/auth/security-headers.ts).
 * Next.js reads the policy from the request to put the nonce on its own scripts, so it is set on
 * the request and on the answer. API routes, static files and prefetches are left out.
 */
export function proxy(request: NextRequest) {
  const nonce = Buffer.from(crypto.getRandomValues(new Uint8Array(16))).toString('base64');
  const policy = contentSecurityPolicy({
    nonce,
    development: process.env.NODE_ENV === 'development',
    uploadOrigins: uploadServiceOrigins(),
  });
  const headers = new Headers(request.headers);
  headers.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('Content-Security-Policy', policy);
  return response;
}

export const config = {
  matcher: [
    {
      source: '/((?!api/|_next/static|_next/image|favicon.ico).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
