/**
 * Shared facts about the local stand-in for the hosted upload service
 * (scripts/services/upload-fake.ts): its default address and credentials, and how a token
 * for it is minted. Used by the fake itself, by lib/uploads/config.ts and by tests, so the
 * app and the fake always agree on the shared secret without anyone copying a token around.
 *
 * The shared secret is made per installation: a random key written once to
 * `.data/upload-fake.key` (UPLOAD_FAKE_KEY_FILE; readable by its owner only) that the fake and
 * the app both read. No key is written in the source, so nobody can sign a completion callback
 * for somebody else's installation. Not marked server-only because the fake (a plain tsx
 * script) imports it.
 */
import { randomBytes } from 'node:crypto';
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

export const DEFAULT_UPLOAD_FAKE_PORT = 3055;

/**
 * The fixed key that earlier releases wrote in this file. It is public, so it is refused as a
 * key; tests use it to forge a callback as an outsider would.
 */
export const RETIRED_UPLOAD_FAKE_API_KEY = 'sk_beadline_local_upload_fake';

export const DEFAULT_UPLOAD_FAKE_APP_ID = 'beadlinelocal';

/** The region name the fake reports in its token; the SDK only needs a non-empty list. */
export const UPLOAD_FAKE_REGION = 'local';

/** process.env or any plain map of variables (tests pass their own). */
export type EnvironmentSource = Readonly<Record<string, string | undefined>>;

export interface UploadFakeCredentials {
  apiKey: string;
  appId: string;
}

/** Where the installation's key is kept: UPLOAD_FAKE_KEY_FILE, else .data/upload-fake.key. */
export function uploadFakeKeyFile(env: EnvironmentSource = process.env): string {
  return path.resolve(env.UPLOAD_FAKE_KEY_FILE || path.join(process.cwd(), '.data', 'upload-fake.key'));
}

const keysByFile = new Map<string, string>();

function isUsableKey(key: string): boolean {
  return /^sk_[A-Za-z0-9_-]{32,}$/.test(key) && key !== RETIRED_UPLOAD_FAKE_API_KEY;
}

/**
 * The installation's key in `file`, made on first use: "sk_" and 32 random bytes in hex, written
 * with mode 0600. Whoever comes first (the fake or the app) writes it; the other reads it.
 */
export function installationUploadKey(file: string): string {
  const known = keysByFile.get(file);
  if (known) return known;
  const read = () => readFileSync(file, 'utf8').trim();
  let key: string;
  try {
    key = read();
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
    mkdirSync(path.dirname(file), { recursive: true, mode: 0o700 });
    try {
      writeFileSync(file, `sk_${randomBytes(32).toString('hex')}\n`, { flag: 'wx', mode: 0o600 });
    } catch (writeError) {
      if ((writeError as NodeJS.ErrnoException).code !== 'EEXIST') throw writeError;
    }
    key = read();
  }
  if (!isUsableKey(key)) {
    throw new Error(
      `${file} does not hold a usable upload key ("sk_" and at least 32 letters or digits). ` +
        'Delete the file; the next start makes a new one.',
    );
  }
  keysByFile.set(file, key);
  return key;
}

/**
 * Credentials for the fake: UPLOAD_FAKE_API_KEY when set, else the installation's key file
 * (made on first use); UPLOAD_FAKE_APP_ID or the default app id.
 */
export function uploadFakeCredentials(env: EnvironmentSource = process.env): UploadFakeCredentials {
  const apiKey = env.UPLOAD_FAKE_API_KEY || installationUploadKey(uploadFakeKeyFile(env));
  if (!apiKey.startsWith('sk_')) {
    throw new Error(
      'UPLOAD_FAKE_API_KEY must start with "sk_" (the upload SDK refuses other keys).',
    );
  }
  if (apiKey === RETIRED_UPLOAD_FAKE_API_KEY) {
    throw new Error(
      'UPLOAD_FAKE_API_KEY is the key earlier releases published in their source; unset it so ' +
        'the installation uses its own key in .data/upload-fake.key.',
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
