import { appUrl } from '@/lib/config';

/**
 * CSRF defence for cookie-authenticated mutations: the Origin header must name this site, either
 * the configured APP_URL or the host the request was sent to.
 */
export function isSameOrigin(headers: Headers): boolean {
  const origin = headers.get('origin');
  if (!origin) return false;
  let originHost: string;
  try {
    originHost = new URL(origin).host;
  } catch {
    return false;
  }
  const allowed = new Set<string>([new URL(appUrl()).host]);
  const host = headers.get('x-forwarded-host') ?? headers.get('host');
  if (host) allowed.add(host.split(',')[0]!.trim());
  return allowed.has(originHost);
}

/** The caller's network address as the server saw it (first hop of x-forwarded-for). */
export function clientAddress(headers: Headers): string {
  const forwarded = headers.get('x-forwarded-for');
  if (forwarded) return forwarded.split(',')[0]!.trim() || 'unknown';
  return headers.get('x-real-ip') ?? 'unknown';
}
