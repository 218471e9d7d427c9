/**
 * The real uploadthing SDK (route handler, browser client, UTApi) against the local fake of the
 * hosted service: the whole upload, the completion callback, refusals and forged requests.
 */
import { createHash, createHmac } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';

import sharp from 'sharp';
import { genUploader } from 'uploadthing/client';
import { UTApi, UploadThingError, createRouteHandler } from 'uploadthing/server';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';

import { utapiOptions } from '@/lib/uploads/config';
import {
  DROP_PHOTO_ROUTE,
  createDropPhotoRouter,
  fetchStoredFile,
  type DerivedImageFiles,
  type DropPhotoRouter,
  type DropPhotoUploadMetadata,
  type UploadedDropPhotoFile,
} from '@/lib/uploads/file-router';
import type { InspectedImage } from '@/lib/uploads/inspect-image';
import { createUploadRouteHandlers } from '@/lib/uploads/route-handlers';
import { mintUploadToken } from '@/lib/uploads/local-service';
import { startUploadFake, type RunningUploadFake } from '@/scripts/services/upload-fake';

import { grey16RampTiff, rgbCard } from '../../unit/uploads/image-fixtures';
import { installFetchXhr } from './fetch-xhr';
import { serveWebHandler } from './serve-web-handler';

const API_KEY = 'sk_beadline_integration_test';
const APP_ID = 'beadlinetest';
const OWNER = { userId: 'user-analyst-1', organizationId: 'org-kestrel' };
const LOG_LEVEL = process.env.UPLOAD_TEST_LOG ? 'Debug' : 'Error';

interface StoredCall {
  file: UploadedDropPhotoFile;
  inspected: InspectedImage;
  metadata: DropPhotoUploadMetadata;
  derived: DerivedImageFiles | null;
}

let fake: RunningUploadFake;
let dataDir: string;
let restoreXhr: () => void;
const storedCalls: StoredCall[] = [];
let fetchFileCalls = 0;
/** Set by a test: onStored answers that the file is this photo, already kept. */
let keptTwin: string | null = null;

function fakeEnv(): Record<string, string> {
  return { UPLOAD_FAKE_URL: fake.url, UPLOAD_FAKE_API_KEY: API_KEY, UPLOAD_FAKE_APP_ID: APP_ID };
}

function buildRouter() {
  return createDropPhotoRouter({
    authorize: async (req) => {
      if (req.headers.get('x-test-user') === 'nobody') {
        throw new UploadThingError({
          code: 'FORBIDDEN',
          message: 'Only lab members can upload photos',
        });
      }
      return OWNER;
    },
    onStored: async (file, inspected, { metadata, derived }) => {
      storedCalls.push({ file, inspected, metadata, derived });
      if (keptTwin) return { photoId: keptTwin, reused: true };
      return { photoId: `photo-${storedCalls.length}` };
    },
    fetchFile: async (url) => {
      fetchFileCalls++;
      return fetchStoredFile(url, { env: { UPLOAD_FAKE_URL: fake.url } });
    },
    storage: new UTApi(utapiOptions(fakeEnv(), { logLevel: LOG_LEVEL })),
    storeDerivedFiles: true,
    report: () => {},
  });
}

/**
 * The route as the SDK's generic adapter serves it ('server'), or as the app's route file does
 * through createUploadRouteHandlers, which reads lib/uploads/config from the environment ('next').
 */
async function serveRoute(isDev: boolean, adapter: 'server' | 'next' = 'server') {
  if (adapter === 'next') {
    const handlers = createUploadRouteHandlers(buildRouter(), { isDev, logLevel: LOG_LEVEL });
    type NextRequestArg = Parameters<typeof handlers.POST>[0];
    return serveWebHandler('/api/uploadthing', (request) =>
      request.method === 'GET'
        ? handlers.GET(request as NextRequestArg)
        : handlers.POST(request as NextRequestArg),
    );
  }
  const handler = createRouteHandler({
    router: buildRouter(),
    config: { token: fake.token, ingestUrl: fake.url, isDev, logLevel: LOG_LEVEL },
  });
  return serveWebHandler('/api/uploadthing', handler);
}

async function storedFileKeys(): Promise<string[]> {
  const names = await readdir(path.join(dataDir, 'files'));
  return names.filter((n) => !n.endsWith('.json'));
}

function sha256(bytes: Buffer | Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

beforeAll(async () => {
  dataDir = await mkdtemp(path.join(tmpdir(), 'beadline-upload-fake-'));
  fake = await startUploadFake({
    port: 0,
    dataDir,
    apiKey: API_KEY,
    appId: APP_ID,
    log: process.env.UPLOAD_TEST_LOG ? undefined : false,
  });
  restoreXhr = installFetchXhr();
});

afterAll(async () => {
  restoreXhr?.();
  await fake?.close();
  if (dataDir) await rm(dataDir, { recursive: true, force: true });
});

beforeEach(() => {
  storedCalls.length = 0;
  fetchFileCalls = 0;
  keptTwin = null;
});

describe('upload fake: token and configuration', () => {
  it('mints the token the SDK expects and config.ts derives the same one', () => {
    expect(JSON.parse(Buffer.from(fake.token, 'base64').toString('utf8'))).toEqual({
      apiKey: API_KEY,
      appId: APP_ID,
      regions: ['local'],
    });
    const options = utapiOptions(fakeEnv());
    expect(options).toMatchObject({
      token: mintUploadToken({ apiKey: API_KEY, appId: APP_ID }),
      apiUrl: fake.url,
      ingestUrl: fake.url,
      ufsAppIdLocation: 'path',
    });
  });
});

describe.each([
  { mode: 'callback to the app (isDev false)', isDev: false },
  { mode: 'dev stream (isDev true)', isDev: true },
])('upload through the SDK, $mode', ({ isDev }) => {
  let route: Awaited<ReturnType<typeof serveRoute>>;
  const client = () =>
    genUploader<DropPhotoRouter>({
      url: route.url,
      package: 'beadline-tests',
      fetch: globalThis.fetch,
    });

  beforeAll(async () => {
    route = await serveRoute(isDev);
  });
  afterAll(async () => {
    await route?.close();
  });

  it('stores a PNG, runs onUploadComplete with the inspected image and returns serverData', async () => {
    const bytes = await rgbCard(120, 90).png().toBuffer();
    const file = new File([new Uint8Array(bytes)], 'HT-200 batch 7 drop 1.png', {
      type: 'image/png',
    });

    const [result] = await client().uploadFiles(DROP_PHOTO_ROUTE, {
      files: [file],
      input: { sessionId: 'session-7' },
    });

    expect(result.serverData).toEqual({
      status: 'stored',
      photoId: 'photo-1',
      fileKey: result.key,
      format: 'png',
      width: 120,
      height: 90,
      sha256: sha256(bytes),
    });
    expect(result.fileHash).toBe(createHash('md5').update(bytes).digest('hex'));

    expect(storedCalls).toHaveLength(1);
    const [call] = storedCalls;
    expect(call.metadata).toEqual({ ...OWNER, sessionId: 'session-7', purpose: 'sessile-drop' });
    expect(call.file).toMatchObject({
      key: result.key,
      name: file.name,
      size: bytes.length,
      type: 'image/png',
    });
    expect(call.inspected).toMatchObject({
      format: 'png',
      width: 120,
      height: 90,
      sha256: sha256(bytes),
    });

    // Served back from the fake, byte for byte, at the URL the SDK reported.
    const served = await fetch(result.ufsUrl);
    expect(served.status).toBe(200);
    expect(served.headers.get('content-type')).toBe('image/png');
    expect(served.headers.get('access-control-allow-origin')).toBe('*');
    expect(Buffer.from(await served.arrayBuffer()).equals(bytes)).toBe(true);
    expect(existsSync(path.join(dataDir, 'files', result.key))).toBe(true);

    // The thumbnail was kept beside the original; an 8-bit PNG needs no worker copy.
    const thumbnail = Buffer.from(await (await fetch(call.derived!.thumbnail.url)).arrayBuffer());
    expect((await sharp(thumbnail).metadata()).format).toBe('png');
    expect(call.derived!.workerPng).toBeNull();
  });

  it('carries the photo’s purpose from the upload to onStored, and refuses an unknown one', async () => {
    const bytes = await rgbCard(60, 80).png().toBuffer();
    const file = new File([new Uint8Array(bytes)], 'hanging drop.png', { type: 'image/png' });
    const [result] = await client().uploadFiles(DROP_PHOTO_ROUTE, {
      files: [file],
      input: { purpose: 'pendant-drop' },
    });
    expect(result.serverData).toMatchObject({ status: 'stored' });
    expect(storedCalls[0].metadata).toEqual({ ...OWNER, sessionId: null, purpose: 'pendant-drop' });

    await expect(
      client().uploadFiles(DROP_PHOTO_ROUTE, {
        files: [file],
        // Not a purpose the route knows: the SDK's input parser refuses it before any upload.
        input: { purpose: 'wilhelmy-plate' } as unknown as { purpose: 'pendant-drop' },
      }),
    ).rejects.toThrow();
    expect(storedCalls).toHaveLength(1);
  });

  it('keeps an upright 16-bit PNG for the worker when the original is a 16-bit TIFF', async () => {
    const bytes = grey16RampTiff(40, 30);
    const file = new File([new Uint8Array(bytes)], 'PP-Print film 2.tif', { type: 'image/tiff' });

    const [result] = await client().uploadFiles(DROP_PHOTO_ROUTE, { files: [file], input: {} });

    expect(result.serverData).toMatchObject({
      status: 'stored',
      format: 'tiff',
      width: 40,
      height: 30,
    });
    const [call] = storedCalls;
    expect(call.inspected.bitDepth).toBe(16);
    expect(call.derived!.workerPng).not.toBeNull();
    const worker = Buffer.from(await (await fetch(call.derived!.workerPng!.url)).arrayBuffer());
    expect(await sharp(worker).metadata()).toMatchObject({
      format: 'png',
      depth: 'ushort',
      width: 40,
    });
  });

  it('refuses a text file named .png: the client hears why, nothing is recorded or kept', async () => {
    const before = await storedFileKeys();
    const file = new File(['drop 3, left side: 104 degrees\n'], 'drop-3.png', {
      type: 'image/png',
    });

    const [result] = await client().uploadFiles(DROP_PHOTO_ROUTE, { files: [file], input: {} });

    expect(result.serverData).toMatchObject({
      status: 'refused',
      code: 'not-an-image',
      fileKey: result.key,
    });
    expect(storedCalls).toHaveLength(0);
    expect(await storedFileKeys()).toEqual(before);
    expect(existsSync(path.join(dataDir, 'files', `${result.key}.json`))).toBe(false);
    expect((await fetch(result.ufsUrl)).status).toBe(404);
  });

  it('removes the stored copy and thumbnail of a file that is already a kept photo: no orphan files', async () => {
    const before = await storedFileKeys();
    keptTwin = 'photo-kept-earlier';
    const bytes = await rgbCard(50, 40).png().toBuffer();
    const [result] = await client().uploadFiles(DROP_PHOTO_ROUTE, {
      files: [new File([new Uint8Array(bytes)], 'drop again.png', { type: 'image/png' })],
      input: {},
    });
    expect(result.serverData).toMatchObject({
      status: 'stored',
      photoId: 'photo-kept-earlier',
      reused: true,
    });
    // The thumbnail was stored before onStored answered; both are gone again.
    expect(storedCalls[0].derived).not.toBeNull();
    expect(await storedFileKeys()).toEqual(before);
    expect((await fetch(result.ufsUrl)).status).toBe(404);
  });

  it('lets authorize refuse the upload before anything is stored', async () => {
    const before = await storedFileKeys();
    const bytes = await rgbCard(20, 20).png().toBuffer();
    const upload = client().uploadFiles(DROP_PHOTO_ROUTE, {
      files: [new File([new Uint8Array(bytes)], 'drop.png', { type: 'image/png' })],
      input: {},
      headers: { 'x-test-user': 'nobody' },
    });
    await expect(upload).rejects.toMatchObject({ code: 'FORBIDDEN' });
    expect(await storedFileKeys()).toEqual(before);
  });
});

describe('a server that cannot finish the upload', () => {
  // Before the fix the PUT hung until the fake's 60 s callback timeout, past the test's limit.
  it('still answers the browser with a failure instead of leaving it waiting', async () => {
    const saved = { token: process.env.UPLOADTHING_TOKEN, fakeUrl: process.env.UPLOAD_FAKE_URL };
    delete process.env.UPLOADTHING_TOKEN;
    delete process.env.UPLOAD_FAKE_URL;
    // No storage given and none configured: building the default UTApi throws on completion.
    const handler = createRouteHandler({
      router: createDropPhotoRouter({
        authorize: async () => OWNER,
        onStored: async () => ({ photoId: 'never' }),
        report: () => {},
      }),
      config: { token: fake.token, ingestUrl: fake.url, isDev: false, logLevel: LOG_LEVEL },
    });
    const route = await serveWebHandler('/api/uploadthing', handler);
    try {
      const bytes = await rgbCard(12, 12).png().toBuffer();
      const [result] = await genUploader<DropPhotoRouter>({ url: route.url, fetch }).uploadFiles(
        DROP_PHOTO_ROUTE,
        {
          files: [new File([new Uint8Array(bytes)], 'drop.png', { type: 'image/png' })],
          input: {},
        },
      );
      expect(result.serverData).toMatchObject({ status: 'failed', fileKey: result.key });
    } finally {
      await route.close();
      if (saved.token !== undefined) process.env.UPLOADTHING_TOKEN = saved.token;
      if (saved.fakeUrl !== undefined) process.env.UPLOAD_FAKE_URL = saved.fakeUrl;
    }
  });
});

describe('forged and tampered requests (route served like app/api/uploadthing/route.ts)', () => {
  let route: Awaited<ReturnType<typeof serveRoute>>;
  const savedEnv = { ...process.env };

  beforeAll(async () => {
    delete process.env.UPLOADTHING_TOKEN;
    Object.assign(process.env, fakeEnv());
    route = await serveRoute(false, 'next');
  });
  afterAll(async () => {
    await route?.close();
    for (const name of Object.keys(fakeEnv())) delete process.env[name];
    Object.assign(process.env, savedEnv);
  });

  it('serves the route config to the client picker', async () => {
    const response = await fetch(route.url);
    expect(response.status).toBe(200);
    const [entry] = (await response.json()) as Array<{
      slug: string;
      config: Record<string, unknown>;
    }>;
    expect(entry.slug).toBe(DROP_PHOTO_ROUTE);
    expect(Object.keys(entry.config).sort()).toEqual(
      ['image/bmp', 'image/jpeg', 'image/png', 'image/tiff', 'image/x-ms-bmp'].sort(),
    );
    expect(entry.config['image/png']).toMatchObject({ maxFileSize: '25MB', maxFileCount: 50 });
  });

  async function presign(name: string, size: number) {
    const url = new URL(route.url);
    url.searchParams.set('actionType', 'upload');
    url.searchParams.set('slug', DROP_PHOTO_ROUTE);
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ files: [{ name, size, type: 'image/png' }], input: {} }),
    });
    expect(response.status).toBe(200);
    const [presigned] = (await response.json()) as Array<{ url: string; key: string }>;
    return presigned;
  }

  function putForm(url: string, bytes: Buffer) {
    const form = new FormData();
    form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), 'drop.png');
    return fetch(url, { method: 'PUT', headers: { range: 'bytes=0-' }, body: form });
  }

  it('refuses a completion callback with a bad signature and does not run onUploadComplete', async () => {
    const payload = JSON.stringify({
      status: 'uploaded',
      origin: fake.url,
      metadata: { ...OWNER, sessionId: null, purpose: 'sessile-drop' },
      file: {
        key: 'forgedKey123',
        name: 'forged.png',
        size: 10,
        type: 'image/png',
        customId: null,
        url: `${fake.url}/f/forgedKey123`,
        appUrl: `${fake.url}/a/${APP_ID}/forgedKey123`,
        ufsUrl: `${fake.url}/a/${APP_ID}/forgedKey123`,
        fileHash: '0'.repeat(32),
      },
    });
    const forgedSignature = `hmac-sha256=${createHmac('sha256', 'sk_not_the_key').update(payload).digest('hex')}`;
    const response = await fetch(`${route.url}?slug=${DROP_PHOTO_ROUTE}`, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        'uploadthing-hook': 'callback',
        'x-uploadthing-signature': forgedSignature,
      },
      body: payload,
    });
    expect(response.status).toBe(400);
    expect(await response.json()).toMatchObject({ message: 'Invalid signature' });
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(fetchFileCalls).toBe(0);
    expect(storedCalls).toHaveLength(0);
  });

  it('rejects a PUT whose presigned signature was altered, or whose signed fields were', async () => {
    const bytes = await rgbCard(16, 16).png().toBuffer();
    const presigned = await presign('drop.png', bytes.length);

    const badSignature = new URL(presigned.url);
    const signature = badSignature.searchParams.get('signature')!;
    const flipped = signature.slice(0, -1) + (signature.endsWith('0') ? '1' : '0');
    badSignature.searchParams.set('signature', flipped);
    const first = await putForm(badSignature.href, bytes);
    expect(first.status).toBe(403);
    expect(await first.json()).toMatchObject({ error: expect.stringMatching(/invalid signature/) });

    const biggerFile = new URL(presigned.url);
    biggerFile.searchParams.set('x-ut-file-size', String(bytes.length * 100));
    expect((await putForm(biggerFile.href, bytes)).status).toBe(403);

    const unsigned = new URL(presigned.url);
    unsigned.searchParams.delete('signature');
    expect((await putForm(unsigned.href, bytes)).status).toBe(403);

    expect(existsSync(path.join(dataDir, 'files', presigned.key))).toBe(false);
    expect(fetchFileCalls).toBe(0);
  });

  it('answers the resume probe and refuses more bytes than were presigned', async () => {
    const bytes = await rgbCard(16, 16).png().toBuffer();
    const presigned = await presign('drop.png', bytes.length);

    const probe = await fetch(presigned.url, { method: 'HEAD' });
    expect(probe.status).toBe(200);
    expect(probe.headers.get('x-ut-range-start')).toBe('0');

    const oversized = await putForm(presigned.url, Buffer.concat([bytes, Buffer.alloc(1024)]));
    expect(oversized.status).toBe(413);
    expect(existsSync(path.join(dataDir, 'files', presigned.key))).toBe(false);
    expect(storedCalls).toHaveLength(0);
  });

  it('rejects API calls without the API key', async () => {
    const response = await fetch(`${fake.url}/v6/listFiles`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: '{}',
    });
    expect(response.status).toBe(401);
  });
});

describe('UTApi against the fake', () => {
  it('uploads, lists, resolves URLs for and deletes files', async () => {
    const utapi = new UTApi(utapiOptions(fakeEnv(), { logLevel: LOG_LEVEL }));
    const bytes = await rgbCard(10, 10).png().toBuffer();
    const uploaded = await utapi.uploadFiles(
      new File([new Uint8Array(bytes)], 'note.png', { type: 'image/png' }),
    );
    expect(uploaded.error).toBeNull();
    const key = uploaded.data!.key;

    const listed = await utapi.listFiles();
    expect(listed.files.map((f) => f.key)).toContain(key);
    const urls = await utapi.getFileUrls(key);
    expect(urls.data[0].key).toBe(key);
    expect(Buffer.from(await (await fetch(urls.data[0].url)).arrayBuffer()).equals(bytes)).toBe(
      true,
    );

    const signed = await utapi.generateSignedURL(key, { expiresIn: 60 });
    expect((await fetch(signed.ufsUrl)).status).toBe(200);

    expect(await utapi.deleteFiles(key)).toEqual({ success: true, deletedCount: 1 });
    expect(existsSync(path.join(dataDir, 'files', key))).toBe(false);
  });
});
