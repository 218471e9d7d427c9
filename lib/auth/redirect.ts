import { appUrl } from '@/lib/config';

/** Where a signed-in user goes when no (acceptable) target was given. */
export const DEFAULT_AFTER_SIGN_IN = '/dashboard';

/** Characters a browser strips or reads as "/" inside a URL, and so can turn "/x" into "//x". */
const SUSPICIOUS = /[\\\u0000-\u001f\u007f]/;

/** The value decoded until it stops changing (at most a few times), or null if undecodable. */
function fullyDecoded(value: string): string | null {
  let current = value;
  for (let i = 0; i < 4; i++) {
    let next: string;
    try {
      next = decodeURIComponent(current);
    } catch {
      return null;
    }
    if (next === current) return current;
    current = next;
  }
  return current;
}

/**
 * A redirect target from the request (`next=` after sign-in and the like) as a path of this
 * site, or `fallback`. Only a relative path is accepted; it is parsed with the URL API against
 * the app's origin and refused when it leaves that origin, when it (or any percent-decoding of
 * it) holds a backslash or a control character, or when it would read as protocol-relative
 * ("//host"). The answer is the normalised path, query and fragment.
 */
export function safeRedirectPath(value: unknown, fallback = DEFAULT_AFTER_SIGN_IN): string {
  if (typeof value !== 'string' || value.length === 0 || value.length > 2048) return fallback;
  if (!value.startsWith('/') || value.startsWith('//')) return fallback;
  const decoded = fullyDecoded(value);
  if (decoded === null || SUSPICIOUS.test(value) || SUSPICIOUS.test(decoded)) return fallback;
  if (decoded.startsWith('//')) return fallback;
  const origin = new URL(appUrl()).origin;
  let parsed: URL;
  try {
    parsed = new URL(value, origin);
  } catch {
    return fallback;
  }
  if (parsed.origin !== origin) return fallback;
  const path = `${parsed.pathname}${parsed.search}${parsed.hash}`;
  if (!path.startsWith('/') || path.startsWith('//')) return fallback;
  return path;
}
