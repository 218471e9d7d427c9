/**
 * The browser half of an upload in a real Chromium: a page on the app's origin asks the route
 * for a presigned URL, probes it and PUTs the bytes cross-origin to the fake with the very
 * headers the SDK's browser client sends (uploadthing/client, upload-browser.ts), then draws the
 * stored file into a canvas — which only works when the fake's CORS headers are right.
 * Skipped where Debian's Chromium is not installed.
 */
import { existsSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';

import { chromium, type Browser } from 'playwright-core';
import { UTApi, createRouteHandler } from 'uploadthing/server';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

import { DROP_PHOTO_ROUTE, createDropPhotoRouter, fetchStoredFile } from '@/lib/uploads/file-router';
import { startUploadFake, type RunningUploadFake } from '@/scripts/services/upload-fake';

import { rgbCard } from '../../unit/uploads/image-fixtures';
import { serveWebHandler } from './serve-web-handler';

const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const SDK_VERSION = '7.7.4';

const PAGE = `<!doctype html><meta charset="utf-8"><title>upload check</title>
<script>
async function uploadLikeTheSdk(base64, slug, version) {
  const bytes = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
  const file = new File([bytes], 'drop.png', { type: 'image/png' });
  const trace = { b3: '0af7651916cd43dd8448eb211c80319c-b7ad6b7169203331-01',
    traceparent: '00-0af7651916cd43dd8448eb211c80319c-b7ad6b7169203331-01' };
  const presign = await fetch('/api/uploadthing?actionType=upload&slug=' + slug, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-uploadthing-version': version,
      'x-uploadthing-package': 'uploadthing/client', ...trace },
    body: JSON.stringify({ input: {}, files: [{ name: file.name, size: file.size, type: file.type,
      lastModified: file.lastModified }] }),
  });
  const [presigned] = await presign.json();
  const head = await fetch(presigned.url, { method: 'HEAD', headers: trace });
  const start = parseInt(head.headers.get('x-ut-range-start') ?? 'missing', 10);
  const put = await new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', presigned.url, true);
    xhr.setRequestHeader('Range', 'bytes=' + start + '-');
    xhr.setRequestHeader('x-uploadthing-version', version);
    xhr.setRequestHeader('b3', trace.b3);
    xhr.setRequestHeader('traceparent', trace.traceparent);
    xhr.responseType = 'json';
    xhr.addEventListener('load', () => resolve({ status: xhr.status, body: xhr.response }));
    xhr.addEventListener('error', () => reject(new Error('XHR failed (CORS?)')));
    const form = new FormData();
    form.append('file', start > 0 ? file.slice(start) : file);
    xhr.send(form);
  });
  const img = new Image();
  img.crossOrigin = 'anonymous';
  img.src = put.body.ufsUrl;
  await img.decode();
  const canvas = document.createElement('canvas');
  canvas.width = img.naturalWidth;
  canvas.height = img.naturalHeight;
  const context = canvas.getContext('2d');
  context.drawImage(img, 0, 0);
  const pixel = Array.from(context.getImageData(1, 1, 1, 1).data);
  return { start, status: put.status, serverData: put.body.serverData, width: img.naturalWidth, pixel };
}
</script>`;

describe.skipIf(!existsSync(CHROMIUM))('browser upload to the fake (Chromium)', () => {
  let fake: RunningUploadFake;
  let dataDir: string;
  let route: Awaited<ReturnType<typeof serveWebHandler>>;
  let browser: Browser;

  beforeAll(async () => {
    dataDir = await mkdtemp(path.join(tmpdir(), 'beadline-upload-browser-'));
    fake = await startUploadFake({
      port: 0,
      dataDir,
      log: process.env.UPLOAD_TEST_LOG ? undefined : false,
    });
    const handler = createRouteHandler({
      router: createDropPhotoRouter({
        authorize: async () => ({ userId: 'user-1', organizationId: 'org-1' }),
        onStored: async () => ({ photoId: 'photo-browser-1' }),
        fetchFile: (url) => fetchStoredFile(url, { env: { UPLOAD_FAKE_URL: fake.url } }),
        storage: new UTApi({ token: fake.token, apiUrl: fake.url, ingestUrl: fake.url }),
        report: () => {},
      }),
      config: { token: fake.token, ingestUrl: fake.url, isDev: false, logLevel: 'Error' },
    });
    route = await serveWebHandler('/api/uploadthing', async (request) =>
      new URL(request.url).pathname === '/'
        ? new Response(PAGE, { headers: { 'content-type': 'text/html' } })
        : handler(request),
    );
    browser = await chromium.launch({
      executablePath: CHROMIUM,
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run'],
    });
  });

  afterAll(async () => {
    await browser?.close();
    await route?.close();
    await fake?.close();
    if (dataDir) await rm(dataDir, { recursive: true, force: true });
  });

  it('uploads cross-origin with the SDK headers and reads the stored image back untainted', async () => {
    const bytes = await rgbCard(32, 24).png().toBuffer();
    const page = await browser.newPage();
    if (process.env.UPLOAD_TEST_LOG) page.on('console', (m) => console.log('[page]', m.text()));
    if (process.env.UPLOAD_TEST_LOG)
      page.on('requestfailed', (r) =>
        console.log('[page failed]', r.url(), r.failure()?.errorText),
      );
    await page.goto(new URL('/', route.url).href);
    const result = await page.evaluate(
      ([base64, slug, version]) =>
        (
          window as unknown as {
            uploadLikeTheSdk(b: string, s: string, v: string): Promise<Record<string, unknown>>;
          }
        ).uploadLikeTheSdk(base64, slug, version),
      [bytes.toString('base64'), DROP_PHOTO_ROUTE, SDK_VERSION] as const,
    );
    expect(result).toMatchObject({
      start: 0,
      status: 200,
      width: 32,
      serverData: { status: 'stored', photoId: 'photo-browser-1', width: 32, height: 24 },
      pixel: [220, 0, 0, 255],
    });
  });
});
