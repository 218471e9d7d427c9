/**
 * Where the upload SDK sends its requests: the hosted service (a real UPLOADTHING_TOKEN in the
 * environment) or the local fake (UPLOAD_FAKE_URL, set by `npm start` and by the tests).
 * Every variable is described in docs/uploads.md.
 *
 * Server code and scripts only (the token is a secret); it has no `server-only` guard because
 * scripts run by tsx import it too.
 */
import type { RouteHandlerConfig, UTApiOptions } from 'uploadthing/types';

import { mintUploadToken, uploadFakeCredentials, type EnvironmentSource } from './local-service';

export type UploadServiceMode = 'hosted' | 'local-fake';

export interface UploadServiceConfig {
  mode: UploadServiceMode;
  /** base64 JSON { apiKey, appId, regions }. */
  token: string;
  /** Overrides of the SDK's hosted addresses; all undefined in hosted mode. */
  apiUrl?: string;
  ingestUrl?: string;
  ufsHost?: string;
  ufsAppIdLocation?: 'subdomain' | 'path';
}

export class UploadServiceConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UploadServiceConfigError';
  }
}

/**
 * The SDK chooses http for a UFS host only when the host name contains "local", so the
 * fake's file host is named `localhost:PORT` (the fake listens on 127.0.0.1, which is
 * where localhost points).
 */
function fakeUfsHost(fakeUrl: URL): string {
  const isLoopback = fakeUrl.hostname === '127.0.0.1' || fakeUrl.hostname === 'localhost';
  return isLoopback ? `localhost:${fakeUrl.port || '80'}` : fakeUrl.host;
}

function parseFakeUrl(raw: string): URL {
  let url: URL;
  try {
    url = new URL(raw);
  } catch {
    throw new UploadServiceConfigError(
      `UPLOAD_FAKE_URL "${raw}" is not a URL; use e.g. http://127.0.0.1:3055.`,
    );
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') {
    throw new UploadServiceConfigError(`UPLOAD_FAKE_URL must be an http(s) URL, got "${raw}".`);
  }
  return url;
}

/**
 * Resolves the upload service from the environment. A real UPLOADTHING_TOKEN wins and leaves
 * every address at the SDK's hosted defaults; otherwise UPLOAD_FAKE_URL points everything at the
 * local fake. Throws when neither is set, so a misconfigured server says so on first upload
 * instead of sending photos somewhere unexpected.
 */
export function uploadServiceConfig(env: EnvironmentSource = process.env): UploadServiceConfig {
  const addresses = uploadServiceAddresses(env);
  if (addresses.mode === 'hosted') return addresses;
  return { ...addresses, token: mintUploadToken(uploadFakeCredentials(env)) };
}

/** uploadServiceConfig without the local fake's token (so without reading its key). */
function uploadServiceAddresses(
  env: EnvironmentSource,
): { mode: 'hosted'; token: string } | (Omit<UploadServiceConfig, 'token'> & { mode: 'local-fake' }) {
  const hostedToken = env.UPLOADTHING_TOKEN?.trim();
  if (hostedToken) return { mode: 'hosted', token: hostedToken };

  const rawFakeUrl = env.UPLOAD_FAKE_URL?.trim();
  if (!rawFakeUrl) {
    throw new UploadServiceConfigError(
      'No upload service configured: set UPLOADTHING_TOKEN to use the hosted service, or ' +
        'UPLOAD_FAKE_URL (npm start sets it) to use the local fake. See docs/uploads.md.',
    );
  }
  const fakeUrl = parseFakeUrl(rawFakeUrl);
  const origin = fakeUrl.origin;
  return {
    mode: 'local-fake',
    apiUrl: origin,
    ingestUrl: origin,
    ufsHost: fakeUfsHost(fakeUrl),
    ufsAppIdLocation: 'path',
  };
}

/**
 * Where the browser sends files and reads them from, for the pages' Content-Security-Policy:
 * the local fake's origin (both of its names), or the hosted service's ingest and file hosts.
 * Empty when no upload service is configured.
 */
export function uploadServiceOrigins(env: EnvironmentSource = process.env): string[] {
  let config: ReturnType<typeof uploadServiceAddresses>;
  try {
    config = uploadServiceAddresses(env);
  } catch {
    return [];
  }
  if (config.mode === 'local-fake') {
    const fake = new URL(config.apiUrl!);
    return [...new Set([fake.origin, `${fake.protocol}//${config.ufsHost}`])];
  }
  const custom = env.UPLOADTHING_UFS_HOST?.trim();
  return [
    'https://*.ingest.uploadthing.com',
    'https://*.ufs.sh',
    'https://utfs.io',
    ...(custom ? [`https://${custom}`] : []),
  ];
}

/** Hosts of the hosted service's file URLs (`{appId}.ufs.sh`, and the older `utfs.io`). */
const HOSTED_FILE_HOST_SUFFIXES = ['.ufs.sh', '.utfs.io'];
const HOSTED_FILE_HOSTS = ['utfs.io', 'ufs.sh'];

/**
 * True when `url` names a file on the configured upload service: in local-fake mode the fake's
 * own origin (or the `localhost:PORT` name the SDK gives it), in hosted mode an https URL on the
 * service's file hosts or UPLOADTHING_UFS_HOST. The server downloads stored files from nowhere
 * else, whatever a callback or a database row says.
 */
export function isStoredFileUrl(url: string, env: EnvironmentSource = process.env): boolean {
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    return false;
  }
  if (parsed.username || parsed.password) return false;
  const config = uploadServiceAddresses(env);
  if (config.mode === 'local-fake') {
    const fake = new URL(config.apiUrl!);
    const origins = new Set([fake.origin, `${fake.protocol}//${config.ufsHost}`]);
    return origins.has(parsed.origin);
  }
  if (parsed.protocol !== 'https:') return false;
  const host = parsed.hostname.toLowerCase();
  const customHost = env.UPLOADTHING_UFS_HOST?.trim().toLowerCase();
  return (
    HOSTED_FILE_HOSTS.includes(host) ||
    HOSTED_FILE_HOST_SUFFIXES.some((suffix) => host.endsWith(suffix)) ||
    (!!customHost && (parsed.host === customHost || host.endsWith(`.${customHost}`)))
  );
}

/**
 * The same settings as the SDK's own environment variables, for processes that configure the
 * SDK through the environment (e.g. a shell that runs the app). Empty in hosted mode, where
 * UPLOADTHING_TOKEN alone is enough.
 */
export function uploadServiceEnv(env: EnvironmentSource = process.env): Record<string, string> {
  const config = uploadServiceConfig(env);
  if (config.mode === 'hosted') return {};
  const vars: Record<string, string> = { UPLOADTHING_TOKEN: config.token };
  if (config.apiUrl) vars.UPLOADTHING_API_URL = config.apiUrl;
  if (config.ingestUrl) vars.UPLOADTHING_INGEST_URL = config.ingestUrl;
  if (config.ufsHost) vars.UPLOADTHING_UFS_HOST = config.ufsHost;
  if (config.ufsAppIdLocation) vars.UPLOADTHING_UFS_APP_ID_LOCATION = config.ufsAppIdLocation;
  return vars;
}

/**
 * `config` for createRouteHandler. `isDev` and `callbackUrl` are left to the SDK
 * (NODE_ENV / UPLOADTHING_IS_DEV, and the request's own URL / UPLOADTHING_CALLBACK_URL).
 */
export function routeHandlerConfig(
  env: EnvironmentSource = process.env,
  overrides: RouteHandlerConfig = {},
): RouteHandlerConfig {
  const config = uploadServiceConfig(env);
  return {
    token: config.token,
    ...(config.ingestUrl ? { ingestUrl: config.ingestUrl } : {}),
    ...overrides,
  };
}

/** Options for `new UTApi(...)` (delete, list, server-side uploads). */
export function utapiOptions(
  env: EnvironmentSource = process.env,
  overrides: UTApiOptions = {},
): UTApiOptions {
  const config = uploadServiceConfig(env);
  const options: UTApiOptions = { token: config.token };
  if (config.apiUrl) options.apiUrl = config.apiUrl;
  if (config.ingestUrl) options.ingestUrl = config.ingestUrl;
  if (config.ufsHost) options.ufsHost = config.ufsHost;
  if (config.ufsAppIdLocation) options.ufsAppIdLocation = config.ufsAppIdLocation;
  return { ...options, ...overrides };
}
