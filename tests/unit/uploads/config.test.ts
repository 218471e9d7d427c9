import { mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

import {
  UploadServiceConfigError,
  isStoredFileUrl,
  routeHandlerConfig,
  uploadServiceConfig,
  uploadServiceEnv,
  utapiOptions,
} from '@/lib/uploads/config';
import {
  DEFAULT_UPLOAD_FAKE_APP_ID,
  RETIRED_UPLOAD_FAKE_API_KEY,
  uploadFakeCredentials,
} from '@/lib/uploads/local-service';

/** A key file of its own for each test, in a fresh temporary folder. */
function keyFile(): string {
  return path.join(mkdtempSync(path.join(tmpdir(), 'beadline-upload-key-')), 'upload-fake.key');
}

function decodeToken(token: string): unknown {
  return JSON.parse(Buffer.from(token, 'base64').toString('utf8'));
}

describe('upload service configuration', () => {
  it('points every SDK address at the local fake from UPLOAD_FAKE_URL', () => {
    const file = keyFile();
    const env = { UPLOAD_FAKE_URL: 'http://127.0.0.1:3055', UPLOAD_FAKE_KEY_FILE: file };
    const config = uploadServiceConfig(env);
    expect(config).toMatchObject({
      mode: 'local-fake',
      apiUrl: 'http://127.0.0.1:3055',
      ingestUrl: 'http://127.0.0.1:3055',
      // "localhost" makes the SDK build http:// (not https://) file URLs for the fake.
      ufsHost: 'localhost:3055',
      ufsAppIdLocation: 'path',
    });
    expect(decodeToken(config.token)).toEqual({
      apiKey: readFileSync(file, 'utf8').trim(),
      appId: DEFAULT_UPLOAD_FAKE_APP_ID,
      regions: ['local'],
    });
    expect(uploadServiceEnv(env)).toEqual({
      UPLOADTHING_TOKEN: config.token,
      UPLOADTHING_API_URL: 'http://127.0.0.1:3055',
      UPLOADTHING_INGEST_URL: 'http://127.0.0.1:3055',
      UPLOADTHING_UFS_HOST: 'localhost:3055',
      UPLOADTHING_UFS_APP_ID_LOCATION: 'path',
    });
    expect(routeHandlerConfig(env)).toEqual({
      token: config.token,
      ingestUrl: 'http://127.0.0.1:3055',
    });
  });

  it('makes a random key per installation, kept in its key file for its owner only', () => {
    const first = keyFile();
    const second = keyFile();
    const key = uploadFakeCredentials({ UPLOAD_FAKE_KEY_FILE: first }).apiKey;
    expect(key).toMatch(/^sk_[0-9a-f]{64}$/);
    expect(key).not.toBe(RETIRED_UPLOAD_FAKE_API_KEY);
    expect(uploadFakeCredentials({ UPLOAD_FAKE_KEY_FILE: first }).apiKey).toBe(key);
    expect(readFileSync(first, 'utf8').trim()).toBe(key);
    expect(statSync(first).mode & 0o077).toBe(0);
    expect(uploadFakeCredentials({ UPLOAD_FAKE_KEY_FILE: second }).apiKey).not.toBe(key);
  });

  it('refuses the key that earlier releases published in their source', () => {
    const file = keyFile();
    writeFileSync(file, `${RETIRED_UPLOAD_FAKE_API_KEY}\n`);
    expect(() => uploadFakeCredentials({ UPLOAD_FAKE_KEY_FILE: file })).toThrow(/Delete the file/);
    expect(() =>
      uploadFakeCredentials({ UPLOAD_FAKE_API_KEY: RETIRED_UPLOAD_FAKE_API_KEY }),
    ).toThrow(/published/);
  });

  it('takes stored files only from the configured upload host', () => {
    const fake = { UPLOAD_FAKE_URL: 'http://127.0.0.1:3055', UPLOAD_FAKE_KEY_FILE: keyFile() };
    expect(isStoredFileUrl('http://127.0.0.1:3055/a/beadlinelocal/abc', fake)).toBe(true);
    expect(isStoredFileUrl('http://localhost:3055/a/beadlinelocal/abc', fake)).toBe(true);
    for (const url of [
      'http://127.0.0.1:3056/a/beadlinelocal/abc',
      'http://127.0.0.1:5432/',
      'https://127.0.0.1:3055/a/x',
      'http://user:pw@127.0.0.1:3055/a/x',
      'file:///etc/passwd',
      'not a url',
    ]) {
      expect(isStoredFileUrl(url, fake), url).toBe(false);
    }
    const hosted = { UPLOADTHING_TOKEN: 'aG9zdGVk' };
    expect(isStoredFileUrl('https://app123.ufs.sh/f/abc', hosted)).toBe(true);
    expect(isStoredFileUrl('https://utfs.io/f/abc', hosted)).toBe(true);
    expect(isStoredFileUrl('http://app123.ufs.sh/f/abc', hosted)).toBe(false);
    expect(isStoredFileUrl('https://ufs.sh.evil.example/f/abc', hosted)).toBe(false);
    expect(isStoredFileUrl('https://evilufs.sh/f/abc', hosted)).toBe(false);
    expect(isStoredFileUrl('http://127.0.0.1:9/f/abc', hosted)).toBe(false);
  });

  it('uses the fake credentials from the environment when given', () => {
    const config = uploadServiceConfig({
      UPLOAD_FAKE_URL: 'http://127.0.0.1:4000',
      UPLOAD_FAKE_API_KEY: 'sk_other',
      UPLOAD_FAKE_APP_ID: 'otherapp',
    });
    expect(decodeToken(config.token)).toMatchObject({ apiKey: 'sk_other', appId: 'otherapp' });
  });

  it('leaves everything to the SDK defaults when a real UPLOADTHING_TOKEN is set', () => {
    const env = { UPLOADTHING_TOKEN: 'aG9zdGVk', UPLOAD_FAKE_URL: 'http://127.0.0.1:3055' };
    expect(uploadServiceConfig(env)).toEqual({ mode: 'hosted', token: 'aG9zdGVk' });
    expect(uploadServiceEnv(env)).toEqual({});
    expect(routeHandlerConfig(env)).toEqual({ token: 'aG9zdGVk' });
    expect(utapiOptions(env)).toEqual({ token: 'aG9zdGVk' });
  });

  it('says what to set when neither is configured', () => {
    expect(() => uploadServiceConfig({})).toThrow(UploadServiceConfigError);
    expect(() => uploadServiceConfig({})).toThrow(/UPLOADTHING_TOKEN.*UPLOAD_FAKE_URL/);
    expect(() => uploadServiceConfig({ UPLOAD_FAKE_URL: 'not a url' })).toThrow(/not a URL/);
  });
});
