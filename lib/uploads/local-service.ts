/**
 * Shared facts about the local stand-in for the hosted upload service
 * (scripts/services/upload-fake.ts): its default address and credentials, and how a token
 * for it is minted. Used by the fake itself, by lib/uploads/config.ts and by tests, so the
 * app and the fake always agree on the shared secret without anyone copying a token around.
 *
 * Not marked server-only because the fake (a plain tsx script) imports it; it holds no secret
 * of the hosted service, only the fixed local development key.
 */

export const DEFAULT_UPLOAD_FAKE_PORT = 3055;

/** Development-only shared secret; the SDK requires API keys to start with `sk_`. */
export const DEFAULT_UPLOAD_FAKE_API_KEY = 'sk_beadline_local_upload_fake';

export const DEFAULT_UPLOAD_FAKE_APP_ID = 'beadlinelocal';

/** The region name the fake reports in its token; the SDK only needs a non-empty list. */
export const UPLOAD_FAKE_REGION = 'local';

/** process.env or any plain map of variables (tests pass their own). */
export type EnvironmentSource = Readonly<Record<string, string | undefined>>;

export interface UploadFakeCredentials {
  apiKey: string;
  appId: string;
}

/** Credentials for the fake from the environment, with the development defaults. */
export function uploadFakeCredentials(env: EnvironmentSource = process.env): UploadFakeCredentials {
  const apiKey = env.UPLOAD_FAKE_API_KEY || DEFAULT_UPLOAD_FAKE_API_KEY;
  if (!apiKey.startsWith('sk_')) {
    throw new Error(
      'UPLOAD_FAKE_API_KEY must start with "sk_" (the upload SDK refuses other keys).',
    );
  }
  return { apiKey, appId: env.UPLOAD_FAKE_APP_ID || DEFAULT_UPLOAD_FAKE_APP_ID };
}

/**
 * A token in the SDK's format: base64 of JSON `{ apiKey, appId, regions }`.
 * The SDK reads the API key (the HMAC secret) and the app id out of it.
 */
export function mintUploadToken({ apiKey, appId }: UploadFakeCredentials): string {
  const payload = { apiKey, appId, regions: [UPLOAD_FAKE_REGION] };
  return Buffer.from(JSON.stringify(payload), 'utf8').toString('base64');
}
