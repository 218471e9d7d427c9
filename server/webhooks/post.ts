import 'server-only';
import http from 'node:http';
import https from 'node:https';
import { isIP } from 'node:net';
import { checkedLookup, hostOf, resolvePublic } from './address-guard';

/** How long one attempt may take, connection to the end of the response. */
export const DELIVERY_TIMEOUT_MS = 10_000;

export type PostOutcome =
  | { ok: true; statusCode: number }
  | { ok: false; statusCode: number | null; error: string };

/**
 * POSTs `body` to `url` once, through the address guard (checkedLookup, or the same check for an
 * IP address in the URL), without following
 * redirects. A 2xx answer is a delivery; anything else, or no answer, is a failure to retry.
 */
export async function postOnce(
  url: string,
  body: string,
  headers: Record<string, string>,
): Promise<PostOutcome> {
  const target = new URL(url);
  // Node connects to an IP address written in the URL without a lookup: check it here.
  if (isIP(hostOf(target))) {
    try {
      await resolvePublic(hostOf(target));
    } catch (error) {
      return { ok: false, statusCode: null, error: (error as Error).message };
    }
  }
  const client = target.protocol === 'https:' ? https : http;
  return new Promise((resolve) => {
    const request = client.request(
      target,
      {
        method: 'POST',
        lookup: checkedLookup,
        timeout: DELIVERY_TIMEOUT_MS,
        headers: {
          'content-type': 'application/json',
          'content-length': String(Buffer.byteLength(body)),
          'user-agent': 'Beadline-Webhooks/1',
          ...headers,
        },
      },
      (response) => {
        const statusCode = response.statusCode ?? 0;
        // The answer's body is not kept: read and drop it so the socket is freed.
        response.resume();
        response.on('end', () => {
          if (statusCode >= 200 && statusCode < 300) resolve({ ok: true, statusCode });
          else
            resolve({
              ok: false,
              statusCode,
              error:
                statusCode >= 300 && statusCode < 400
                  ? `The receiver answered ${statusCode} (a redirect); redirects are not followed: register the final address.`
                  : `The receiver answered ${statusCode}.`,
            });
        });
      },
    );
    const timer = setTimeout(
      () => request.destroy(new Error(`No answer within ${DELIVERY_TIMEOUT_MS / 1000} s.`)),
      DELIVERY_TIMEOUT_MS,
    );
    request.on('timeout', () =>
      request.destroy(new Error(`No answer within ${DELIVERY_TIMEOUT_MS / 1000} s.`)),
    );
    request.on('error', (error: NodeJS.ErrnoException) => {
      clearTimeout(timer);
      resolve({ ok: false, statusCode: null, error: describeNetworkError(error) });
    });
    request.on('close', () => clearTimeout(timer));
    request.end(body);
  });
}

function describeNetworkError(error: NodeJS.ErrnoException): string {
  if (error.code === 'EWEBHOOKADDRESS') return error.message;
  if (error.code === 'ECONNREFUSED') return 'The receiver refused the connection (is it running?).';
  if (error.code === 'ECONNRESET') return 'The receiver closed the connection.';
  return error.message || String(error);
}
