import { describe, expect, it } from 'vitest';

import {
  UploadServiceConfigError,
  routeHandlerConfig,
  uploadServiceConfig,
  uploadServiceEnv,
  utapiOptions,
} from '@/lib/uploads/config';
import {
  DEFAULT_UPLOAD_FAKE_API_KEY,
  DEFAULT_UPLOAD_FAKE_APP_ID,
} from '@/lib/uploads/local-service';

function decodeToken(token: string): unknown {
  return JSON.parse(Buffer.from(token, 'base64').toString('utf8'));
}

describe('upload service configuration', () => {
  it('points every SDK address at the local fake from UPLOAD_FAKE_URL', () => {
    const env = { UPLOAD_FAKE_URL: 'http://127.0.0.1:3055' };
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
      apiKey: DEFAULT_UPLOAD_FAKE_API_KEY,
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
