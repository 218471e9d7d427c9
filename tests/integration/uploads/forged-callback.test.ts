/**
 * The app's own upload route (app/api/uploadthing/route.ts) against a completion callback sent by
 * someone who is not the upload service: signed with the key earlier releases published in their
 * source, or correctly signed but pointing the server at a file somewhere else.
 */
import { createHmac } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { photos } from '@/db/schema';
import {
  RETIRED_UPLOAD_FAKE_API_KEY,
  uploadFakeCredentials,
} from '@/lib/uploads/local-service';
import { startUploadFake, type RunningUploadFake } from '@/scripts/services/upload-fake';
import { createMember, createOrganization } from '../support/fixtures';

type RouteModule = typeof import('@/app/api/uploadthing/route');

const savedEnv = { ...process.env };
let dataDir: string;
let fake: RunningUploadFake;
let listener: Server;
let listenerUrl: string;
let listenerHits = 0;
let route: RouteModule;
let owner: { userId: string; organizationId: string };

beforeAll(async () => {
  // An installation of its own: a fresh key file and upload stand-in for this file's tests.
  dataDir = await mkdtemp(path.join(tmpdir(), 'beadline-forged-'));
  delete process.env.UPLOADTHING_TOKEN;
  delete process.env.UPLOAD_FAKE_API_KEY;
  process.env.UPLOAD_FAKE_KEY_FILE = path.join(dataDir, 'upload-fake.key');
  fake = await startUploadFake({ port: 0, dataDir, log: false });
  process.env.UPLOAD_FAKE_URL = fake.url;
  const png = await sharp({
    create: { width: 64, height: 48, channels: 3, background: { r: 200, g: 200, b: 200 } },
  })
    .png()
    .toBuffer();
  // Stands for any address the server can reach that is not the upload service.
  listener = createServer((_req, res) => {
    listenerHits++;
    res.writeHead(200, { 'content-type': 'image/png', 'content-length': String(png.length) });
    res.end(png);
  });
  await new Promise<void>((resolve) => listener.listen(0, '127.0.0.1', resolve));
  listenerUrl = `http://127.0.0.1:${(listener.address() as AddressInfo).port}`;
  route = await import('@/app/api/uploadthing/route');
  const lab = await createOrganization();
  const member = await createMember(lab.id, 'analyst');
  owner = { userId: member.userId, organizationId: lab.id };
});

afterAll(async () => {
  await fake?.close();
  await new Promise<void>((resolve) => (listener ? listener.close(() => resolve()) : resolve()));
  if (dataDir) await rm(dataDir, { recursive: true, force: true });
  for (const name of Object.keys(process.env)) if (!(name in savedEnv)) delete process.env[name];
  Object.assign(process.env, savedEnv);
  await closeDb();
});

function callbackPayload(fileKey: string, fileUrl: string): string {
  return JSON.stringify({
    status: 'uploaded',
    origin: fake.url,
    metadata: { ...owner, sessionId: null, purpose: 'sessile-drop' },
    file: {
      key: fileKey,
      name: 'forged.png',
      size: 10,
      type: 'image/png',
      customId: null,
      url: fileUrl,
      appUrl: fileUrl,
      ufsUrl: fileUrl,
      fileHash: '0'.repeat(32),
    },
  });
}

async function sendCallback(payload: string, apiKey: string): Promise<Response> {
  const signature = `hmac-sha256=${createHmac('sha256', apiKey).update(payload).digest('hex')}`;
  const request = new Request('http://127.0.0.1:3000/api/uploadthing?slug=dropPhoto', {
    method: 'POST',
    headers: {
      'content-type': 'application/json',
      'uploadthing-hook': 'callback',
      'x-uploadthing-signature': signature,
    },
    body: payload,
  });
  return route.POST(request as Parameters<RouteModule['POST']>[0]);
}

async function photosWithKey(fileKey: string) {
  return getDb().select({ id: photos.id }).from(photos).where(eq(photos.fileKey, fileKey));
}

describe('completion callbacks that did not come from the upload service', () => {
  it('uses a key of its own, not the one earlier releases published', () => {
    expect(uploadFakeCredentials().apiKey).not.toBe(RETIRED_UPLOAD_FAKE_API_KEY);
    expect(fake.apiKey).toBe(uploadFakeCredentials().apiKey);
  });

  it('refuses an anonymous callback signed with the published key: no photo, no audit row', async () => {
    const fileKey = `forgedOld${Date.now()}`;
    const response = await sendCallback(
      callbackPayload(fileKey, `${listenerUrl}/drop.png`),
      RETIRED_UPLOAD_FAKE_API_KEY,
    );
    expect(response.status).toBe(400);
    expect(await response.json()).toMatchObject({ message: 'Invalid signature' });
    expect(await photosWithKey(fileKey)).toHaveLength(0);
    expect(listenerHits).toBe(0);
  });

  it('never downloads a file from anywhere but the upload service, even when the callback is signed', async () => {
    const fileKey = `forgedUrl${Date.now()}`;
    const response = await sendCallback(
      callbackPayload(fileKey, `${listenerUrl}/drop.png`),
      uploadFakeCredentials().apiKey,
    );
    await response.arrayBuffer();
    expect(listenerHits).toBe(0);
    expect(await photosWithKey(fileKey)).toHaveLength(0);
  });
});
