import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * Webhook signatures. Each delivery carries two headers:
 *
 *   Beadline-Webhook-Timestamp: 1764683400          (Unix seconds when this attempt was sent)
 *   Beadline-Webhook-Signature: v1=<hex>            (HMAC-SHA256 with the subscription's secret)
 *
 * The signed text is `${timestamp}.${body}` (the raw body bytes, before any JSON parsing), so a
 * receiver that checks the signature and refuses a timestamp older than a few minutes refuses a
 * replayed delivery as well as a forged one.
 */
export const SIGNATURE_HEADER = 'beadline-webhook-signature';
export const TIMESTAMP_HEADER = 'beadline-webhook-timestamp';
export const EVENT_ID_HEADER = 'beadline-webhook-id';
export const EVENT_TYPE_HEADER = 'beadline-webhook-event';
const VERSION = 'v1';

/** How far a receiver should let the timestamp be from its own clock (5 minutes). */
export const DEFAULT_TOLERANCE_SECONDS = 300;

/** Every secret starts with this, so a leaked one is easy to recognise. */
export const WEBHOOK_SECRET_PREFIX = 'whsec_';

/** A new signing secret: 32 random bytes, base64url, with the prefix. */
export function newWebhookSecret(): string {
  return `${WEBHOOK_SECRET_PREFIX}${randomBytes(32).toString('base64url')}`;
}

/** HMAC-SHA256 of `message` under `key`, hex (the primitive; RFC 2104 / FIPS 198-1). */
export function hmacSha256Hex(key: string | Buffer, message: string | Buffer): string {
  return createHmac('sha256', key).update(message).digest('hex');
}

/** The Signature header's value for `body` sent at `timestamp` (Unix seconds). */
export function signWebhook(secret: string, timestamp: number, body: string): string {
  return `${VERSION}=${hmacSha256Hex(secret, `${timestamp}.${body}`)}`;
}

export type VerifyResult =
  | { ok: true }
  | { ok: false; reason: 'missing' | 'bad_timestamp' | 'too_old' | 'mismatch' };

/**
 * What a receiver does: recompute the signature over the timestamp and the raw body, compare in
 * constant time, and refuse timestamps further than `toleranceSeconds` from now (replays).
 */
export function verifyWebhook(
  secret: string,
  headers: { signature: string | null | undefined; timestamp: string | null | undefined },
  body: string,
  options: { toleranceSeconds?: number; now?: Date } = {},
): VerifyResult {
  if (!headers.signature || !headers.timestamp) return { ok: false, reason: 'missing' };
  if (!/^\d{1,12}$/.test(headers.timestamp)) return { ok: false, reason: 'bad_timestamp' };
  const timestamp = Number(headers.timestamp);
  const nowSeconds = Math.floor((options.now ?? new Date()).getTime() / 1000);
  const tolerance = options.toleranceSeconds ?? DEFAULT_TOLERANCE_SECONDS;
  if (Math.abs(nowSeconds - timestamp) > tolerance) return { ok: false, reason: 'too_old' };
  const expected = Buffer.from(signWebhook(secret, timestamp, body));
  // The header may list several signatures (during a secret change); any one may match.
  const matches = headers.signature
    .split(',')
    .map((part) => Buffer.from(part.trim()))
    .some((given) => given.length === expected.length && timingSafeEqual(given, expected));
  return matches ? { ok: true } : { ok: false, reason: 'mismatch' };
}
