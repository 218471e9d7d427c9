/**
 * The security headers of every answer (next.config.ts) and the Content-Security-Policy of every
 * page (proxy.ts, with a fresh nonce per request that Next.js puts on its own scripts).
 *
 * What the policy lets run, and why:
 * - scripts: only those carrying the request's nonce, and what they load ('strict-dynamic');
 *   'wasm-unsafe-eval' compiles OpenCV's WebAssembly in the analysis worker (the only eval-like
 *   thing allowed); the development server also needs 'unsafe-eval' for React's debugging;
 * - workers from this site (and blob: URLs, which bundlers use to start them);
 * - connections to this site and to the upload service (uploads go from the browser straight to
 *   it, lib/uploads/config.ts), images also from blob:/data: URLs (previews of chosen photos);
 * - video from blob: URLs (a chosen video file is decoded in the page, frame by frame);
 * - styles from this site and inline style attributes (charts and the canvas set them);
 * - no plugins, no <base> elsewhere, forms only to this site, and no framing by anyone.
 */
export type PolicyInput = {
  nonce: string;
  development: boolean;
  /** Origins (or host patterns) of the upload service the browser sends files to. */
  uploadOrigins: string[];
};

export function contentSecurityPolicy({ nonce, development, uploadOrigins }: PolicyInput): string {
  const uploads = uploadOrigins.join(' ');
  const directives = [
    `default-src 'self'`,
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic' 'wasm-unsafe-eval'${development ? " 'unsafe-eval'" : ''}`,
    `style-src 'self' 'unsafe-inline'`,
    `img-src 'self' blob: data: ${uploads}`.trim(),
    `media-src 'self' blob:`,
    `font-src 'self'`,
    `connect-src 'self' ${uploads}${development ? ' ws: wss:' : ''}`.trim(),
    `worker-src 'self' blob:`,
    `object-src 'none'`,
    `base-uri 'self'`,
    `form-action 'self'`,
    `frame-ancestors 'none'`,
  ];
  return directives.join('; ');
}

/** For every answer, pages and APIs alike (next.config.ts). */
export const SECURITY_HEADERS: { key: string; value: string }[] = [
  { key: 'X-Content-Type-Options', value: 'nosniff' },
  { key: 'X-Frame-Options', value: 'DENY' },
  { key: 'Referrer-Policy', value: 'strict-origin-when-cross-origin' },
  { key: 'Permissions-Policy', value: 'geolocation=(), microphone=(), payment=(), usb=()' },
];

/** For API answers (JSON, CSV, PDF), which never need to be framed. */
export const API_CONTENT_SECURITY_POLICY = `frame-ancestors 'none'`;
