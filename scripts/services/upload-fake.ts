/**
 * A local stand-in for the hosted upload service, speaking the protocol of the uploadthing SDK
 * (7.7.x) so the app runs the real SDK unchanged against 127.0.0.1. It implements what the SDK
 * calls, as read from node_modules/uploadthing/dist and node_modules/@uploadthing/shared/dist:
 *
 *  ingest (UPLOADTHING_INGEST_URL)
 *    POST /route-metadata     route handler registers file keys, metadata and its callback URL;
 *                             with isDev the response stays open and carries JSON lines
 *                             {payload, signature, hook} that the handler forwards to itself
 *    HEAD /:fileKey?signed    browser asks where to resume (x-ut-range-start)
 *    PUT  /:fileKey?signed    browser (or UTApi.uploadFiles) sends the bytes as multipart "file"
 *    POST /callback-result    route handler reports onUploadComplete's serverData (or an error)
 *  API (UPLOADTHING_API_URL), UTApi
 *    POST /v6/deleteFiles /v6/getFileUrl /v6/listFiles /v6/renameFiles /v6/getUsageInfo
 *         /v6/requestFileAccess /v6/updateACL
 *  files (UFS-style URLs)
 *    GET|HEAD /f/:fileKey and /a/:appId/:fileKey
 *
 * Presigned URLs and callbacks are signed and verified like the SDK does it: HMAC-SHA256 with
 * the API key, hex, prefixed "hmac-sha256=". Files live in DATA_DIR/files/<key> with a JSON
 * record beside them.
 *
 * Run: `npx tsx scripts/services/upload-fake.ts` (env UPLOAD_FAKE_PORT, UPLOAD_FAKE_DATA_DIR,
 * UPLOAD_FAKE_KEY_FILE or UPLOAD_FAKE_API_KEY, UPLOAD_FAKE_APP_ID); `--print-token` / `--print-env` print what the app
 * needs and exit. Tests use startUploadFake().
 */
import { createHash, createHmac, timingSafeEqual } from 'node:crypto';
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import {
  appendFile,
  mkdir,
  readFile,
  readdir,
  rename,
  rm,
  stat,
  writeFile,
} from 'node:fs/promises';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

import {
  DEFAULT_UPLOAD_FAKE_PORT,
  mintUploadToken,
  uploadFakeCredentials,
} from '../../lib/uploads/local-service';

export { mintUploadToken } from '../../lib/uploads/local-service';

export interface UploadFakeOptions {
  /** 0 picks a free port. Default UPLOAD_FAKE_PORT or 3055. */
  port?: number;
  /** Where files are kept. Default .data/uploads under the repository. */
  dataDir?: string;
  apiKey?: string;
  appId?: string;
  /** How long a PUT waits for the app's onUploadComplete result (ms). */
  callbackTimeoutMs?: number;
  /** How long a PUT waits for the route handler's /route-metadata (ms); it can arrive late. */
  registrationWaitMs?: number;
  /** One line per request; false silences it. Default console.log. */
  log?: ((line: string) => void) | false;
}

export interface RunningUploadFake {
  /** http://127.0.0.1:PORT — API, ingest and file host in one. */
  url: string;
  port: number;
  dataDir: string;
  apiKey: string;
  appId: string;
  /** A token for the SDK: base64 JSON { apiKey, appId, regions }. */
  token: string;
  close(): Promise<void>;
}

/** What the SDK's UploadedFileData schema expects in callbacks and PUT responses. */
interface UploadedFileData {
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  lastModified?: number;
  url: string;
  appUrl: string;
  ufsUrl: string;
  fileHash: string;
}

interface StoredFileRecord {
  key: string;
  name: string;
  size: number;
  type: string;
  customId: string | null;
  acl: 'public-read' | 'private';
  contentDisposition: 'inline' | 'attachment';
  fileHash: string;
  uploadedAt: number;
}

interface DevStream {
  res: ServerResponse;
  pendingKeys: Set<string>;
}

interface Registration {
  metadata: unknown;
  callbackUrl: string;
  callbackSlug: string;
  isDev: boolean;
  awaitServerData: boolean;
  devStream?: DevStream;
}

type CallbackOutcome = { ok: true; callbackData: unknown } | { ok: false; error: string };

class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }
}

const FILE_KEY = /^[A-Za-z0-9_-]{1,200}$/;
const SIGNATURE_PREFIX = 'hmac-sha256=';
const MULTIPART_OVERHEAD = 64 * 1024;
const JSON_BODY_LIMIT = 1024 * 1024;
const USAGE_LIMIT_BYTES = 2 * 1024 * 1024 * 1024;

export function signPayload(payload: string, apiKey: string): string {
  return SIGNATURE_PREFIX + createHmac('sha256', apiKey).update(payload).digest('hex');
}

export function verifyPayloadSignature(payload: string, signature: string | null, apiKey: string) {
  if (!signature?.startsWith(SIGNATURE_PREFIX)) return false;
  const expected = Buffer.from(signPayload(payload, apiKey));
  const given = Buffer.from(signature);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

/**
 * Checks a URL signed by the SDK's generateSignedURL: the signature is the HMAC of the URL as
 * it was before `signature` was appended (the SDK builds the query with URLSearchParams, so
 * removing the parameter and serialising again yields the same string) and `expires` is a
 * millisecond timestamp.
 */
export function verifySignedUrl(
  url: URL,
  apiKey: string,
): { ok: true } | { ok: false; reason: string } {
  const signature = url.searchParams.get('signature');
  if (!signature) return { ok: false, reason: 'missing signature' };
  const unsigned = new URL(url.href);
  unsigned.searchParams.delete('signature');
  if (!verifyPayloadSignature(unsigned.toString(), signature, apiKey)) {
    return { ok: false, reason: 'invalid signature' };
  }
  const expires = Number(url.searchParams.get('expires'));
  if (!Number.isFinite(expires) || expires < Date.now())
    return { ok: false, reason: 'URL expired' };
  return { ok: true };
}

function signUrl(base: string, apiKey: string, ttlSeconds: number): string {
  const url = new URL(base);
  url.searchParams.append('expires', String(Date.now() + ttlSeconds * 1000));
  url.searchParams.append('signature', signPayload(url.toString(), apiKey));
  return url.href;
}

function defaultDataDir(): string {
  return fileURLToPath(new URL('../../.data/uploads', import.meta.url));
}

async function readBody(req: IncomingMessage, limit: number): Promise<Buffer> {
  const declared = Number(req.headers['content-length']);
  if (Number.isFinite(declared) && declared > limit) {
    req.resume();
    throw new HttpError(413, `Request body of ${declared} bytes exceeds ${limit} bytes`);
  }
  const chunks: Buffer[] = [];
  let total = 0;
  for await (const chunk of req) {
    const buf = chunk as Buffer;
    total += buf.length;
    if (total > limit) throw new HttpError(413, `Request body exceeds ${limit} bytes`);
    chunks.push(buf);
  }
  return Buffer.concat(chunks);
}

async function readJson(req: IncomingMessage): Promise<Record<string, unknown>> {
  const body = await readBody(req, JSON_BODY_LIMIT);
  try {
    const parsed: unknown = JSON.parse(body.toString('utf8') || '{}');
    if (parsed && typeof parsed === 'object' && !Array.isArray(parsed)) {
      return parsed as Record<string, unknown>;
    }
  } catch {
    // fall through to the error below
  }
  throw new HttpError(400, 'Expected a JSON object body');
}

function stringList(value: unknown): string[] {
  return Array.isArray(value) ? value.filter((v): v is string => typeof v === 'string') : [];
}

function decodeSignedParam(params: URLSearchParams, name: string): string | undefined {
  const raw = params.get(name);
  if (raw === null) return undefined;
  // The SDK encodeURIComponent()s each value before URLSearchParams encodes it again.
  try {
    return decodeURIComponent(raw);
  } catch {
    return raw;
  }
}

function contentDispositionHeader(kind: string, name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}

export async function startUploadFake(options: UploadFakeOptions = {}): Promise<RunningUploadFake> {
  const apiKey = options.apiKey ?? uploadFakeCredentials().apiKey;
  const appId = options.appId ?? uploadFakeCredentials().appId;
  if (!apiKey.startsWith('sk_')) throw new Error('The API key must start with "sk_"');
  const dataDir = path.resolve(options.dataDir ?? defaultDataDir());
  const filesDir = path.join(dataDir, 'files');
  const partialDir = path.join(dataDir, 'partial');
  const callbackTimeoutMs = options.callbackTimeoutMs ?? 60_000;
  const registrationWaitMs = options.registrationWaitMs ?? 15_000;
  const log =
    options.log === false ? () => {} : (options.log ?? ((line: string) => console.log(line)));
  await mkdir(filesDir, { recursive: true });
  await mkdir(partialDir, { recursive: true });

  const registrations = new Map<string, Registration>();
  const registrationWaiters = new Map<string, Array<(registration: Registration) => void>>();
  const resultWaiters = new Map<string, (outcome: CallbackOutcome) => void>();
  const devStreams = new Set<DevStream>();
  let baseUrl = '';

  const filePath = (key: string) => path.join(filesDir, key);
  const recordPath = (key: string) => path.join(filesDir, `${key}.json`);
  const partialPath = (key: string) => path.join(partialDir, key);

  const fileUrls = (key: string) => ({
    url: `${baseUrl}/f/${key}`,
    appUrl: `${baseUrl}/a/${appId}/${key}`,
    ufsUrl: `${baseUrl}/a/${appId}/${key}`,
  });

  async function readRecord(key: string): Promise<StoredFileRecord | null> {
    if (!FILE_KEY.test(key)) return null;
    try {
      return JSON.parse(await readFile(recordPath(key), 'utf8')) as StoredFileRecord;
    } catch {
      return null;
    }
  }

  async function allRecords(): Promise<StoredFileRecord[]> {
    const names = await readdir(filesDir);
    const records = await Promise.all(
      names.filter((n) => n.endsWith('.json')).map((n) => readRecord(n.slice(0, -'.json'.length))),
    );
    return records
      .filter((r): r is StoredFileRecord => r !== null)
      .sort((a, b) => a.uploadedAt - b.uploadedAt);
  }

  async function findKeys(body: Record<string, unknown>): Promise<string[]> {
    const keys = stringList(body.fileKeys);
    const customIds = stringList(body.customIds);
    if (customIds.length === 0) return keys.filter((k) => FILE_KEY.test(k));
    const records = await allRecords();
    return records
      .filter((r) => r.customId !== null && customIds.includes(r.customId))
      .map((r) => r.key);
  }

  async function keyFor(update: Record<string, unknown>): Promise<string | null> {
    if (typeof update.fileKey === 'string')
      return FILE_KEY.test(update.fileKey) ? update.fileKey : null;
    if (typeof update.customId === 'string') {
      const match = (await allRecords()).find((r) => r.customId === update.customId);
      return match?.key ?? null;
    }
    return null;
  }

  async function deleteStored(key: string): Promise<boolean> {
    const existed = (await readRecord(key)) !== null;
    await rm(filePath(key), { force: true });
    await rm(recordPath(key), { force: true });
    await rm(partialPath(key), { force: true });
    return existed;
  }

  function requireApiKey(req: IncomingMessage) {
    const given = req.headers['x-uploadthing-api-key'];
    const ok =
      typeof given === 'string' &&
      given.length === apiKey.length &&
      timingSafeEqual(Buffer.from(given), Buffer.from(apiKey));
    if (!ok) throw new HttpError(401, 'Invalid or missing x-uploadthing-api-key');
  }

  function waitForRegistration(key: string): Promise<Registration | null> {
    const existing = registrations.get(key);
    if (existing) return Promise.resolve(existing);
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        const list = registrationWaiters.get(key) ?? [];
        registrationWaiters.set(
          key,
          list.filter((w) => w !== waiter),
        );
        resolve(null);
      }, registrationWaitMs);
      const waiter = (registration: Registration) => {
        clearTimeout(timer);
        resolve(registration);
      };
      registrationWaiters.set(key, [...(registrationWaiters.get(key) ?? []), waiter]);
    });
  }

  function waitForResult(key: string): Promise<CallbackOutcome> {
    return new Promise((resolve) => {
      const timer = setTimeout(() => {
        resultWaiters.delete(key);
        resolve({
          ok: false,
          error: `The app did not report a result within ${callbackTimeoutMs} ms`,
        });
      }, callbackTimeoutMs);
      resultWaiters.set(key, (outcome) => {
        clearTimeout(timer);
        resultWaiters.delete(key);
        resolve(outcome);
      });
    });
  }

  function finishDevKey(registration: Registration, key: string) {
    const stream = registration.devStream;
    registrations.delete(key);
    if (!stream) return;
    stream.pendingKeys.delete(key);
    if (stream.pendingKeys.size === 0) {
      stream.res.end();
      devStreams.delete(stream);
    }
  }

  /** Delivers a signed hook the way the SDK expects for the registration's mode. */
  async function sendHook(
    registration: Registration,
    hook: 'callback' | 'error',
    body: unknown,
  ): Promise<{ delivered: boolean; detail?: string }> {
    const payload = JSON.stringify(body);
    const signature = signPayload(payload, apiKey);
    if (registration.isDev) {
      const stream = registration.devStream;
      if (!stream || stream.res.writableEnded) {
        return { delivered: false, detail: 'the route handler closed its metadata stream' };
      }
      stream.res.write(`${JSON.stringify({ payload, signature, hook })}\n`);
      return { delivered: true };
    }
    const target = new URL(registration.callbackUrl);
    target.searchParams.set('slug', registration.callbackSlug);
    try {
      const response = await fetch(target, {
        method: 'POST',
        headers: {
          'content-type': 'application/json',
          'uploadthing-hook': hook,
          'x-uploadthing-signature': signature,
        },
        body: payload,
      });
      await response.arrayBuffer();
      if (!response.ok) return { delivered: false, detail: `the app answered ${response.status}` };
      return { delivered: true };
    } catch (error) {
      return { delivered: false, detail: `the app could not be reached (${String(error)})` };
    }
  }

  async function handleRouteMetadata(req: IncomingMessage, res: ServerResponse) {
    requireApiKey(req);
    const body = await readJson(req);
    const fileKeys = stringList(body.fileKeys);
    if (fileKeys.length === 0 || !fileKeys.every((k) => FILE_KEY.test(k))) {
      throw new HttpError(400, 'fileKeys must be a non-empty list of file keys');
    }
    if (typeof body.callbackUrl !== 'string' || typeof body.callbackSlug !== 'string') {
      throw new HttpError(400, 'callbackUrl and callbackSlug are required');
    }
    try {
      new URL(body.callbackUrl);
    } catch {
      throw new HttpError(400, 'callbackUrl must be an absolute URL');
    }
    const isDev = body.isDev === true;
    const devStream: DevStream | undefined = isDev
      ? { res, pendingKeys: new Set(fileKeys) }
      : undefined;
    for (const key of fileKeys) {
      const registration: Registration = {
        metadata: body.metadata ?? null,
        callbackUrl: body.callbackUrl,
        callbackSlug: body.callbackSlug,
        isDev,
        awaitServerData: body.awaitServerData !== false,
        devStream,
      };
      registrations.set(key, registration);
      for (const waiter of registrationWaiters.get(key) ?? []) waiter(registration);
      registrationWaiters.delete(key);
    }
    if (devStream) {
      devStreams.add(devStream);
      res.writeHead(200, { 'content-type': 'application/x-ndjson', 'cache-control': 'no-store' });
      res.flushHeaders();
      res.on('close', () => {
        devStreams.delete(devStream);
        for (const key of devStream.pendingKeys) registrations.delete(key);
      });
      return;
    }
    sendJson(res, 200, { ok: true });
  }

  async function handleCallbackResult(req: IncomingMessage, res: ServerResponse) {
    requireApiKey(req);
    const body = await readJson(req);
    const fileKey = body.fileKey;
    if (typeof fileKey !== 'string') throw new HttpError(400, 'fileKey is required');
    const waiter = resultWaiters.get(fileKey);
    if (typeof body.error === 'string') waiter?.({ ok: false, error: body.error });
    else waiter?.({ ok: true, callbackData: body.callbackData ?? null });
    sendJson(res, 200, { ok: true });
  }

  function signedUploadParams(req: IncomingMessage, key: string) {
    const url = new URL(req.url ?? '/', `http://${req.headers.host ?? '127.0.0.1'}`);
    const check = verifySignedUrl(url, apiKey);
    if (!check.ok) throw new HttpError(403, `Presigned URL rejected: ${check.reason}`);
    const params = url.searchParams;
    if (decodeSignedParam(params, 'x-ut-identifier') !== appId) {
      throw new HttpError(403, 'Presigned URL is for another app');
    }
    const size = Number(decodeSignedParam(params, 'x-ut-file-size'));
    if (!Number.isInteger(size) || size < 0)
      throw new HttpError(400, 'Presigned URL has no valid file size');
    const acl = decodeSignedParam(params, 'x-ut-acl') === 'private' ? 'private' : 'public-read';
    const disposition =
      decodeSignedParam(params, 'x-ut-content-disposition') === 'attachment'
        ? 'attachment'
        : 'inline';
    return {
      key,
      name: decodeSignedParam(params, 'x-ut-file-name') ?? key,
      size,
      type: decodeSignedParam(params, 'x-ut-file-type') || 'application/octet-stream',
      slug: decodeSignedParam(params, 'x-ut-slug'),
      customId: decodeSignedParam(params, 'x-ut-custom-id') ?? null,
      acl,
      contentDisposition: disposition,
    } as const;
  }

  async function partialSize(key: string): Promise<number> {
    try {
      return (await stat(partialPath(key))).size;
    } catch {
      return 0;
    }
  }

  async function handleUploadHead(req: IncomingMessage, res: ServerResponse, key: string) {
    signedUploadParams(req, key);
    const start = (await readRecord(key)) ? 0 : await partialSize(key);
    res.writeHead(200, { 'x-ut-range-start': String(start), 'content-length': '0' });
    res.end();
  }

  async function extractFileBytes(req: IncomingMessage, body: Buffer): Promise<Buffer> {
    const contentType = req.headers['content-type'] ?? '';
    if (!contentType.startsWith('multipart/form-data')) return body;
    let form: FormData;
    try {
      form = await new Response(new Uint8Array(body), {
        headers: { 'content-type': contentType },
      }).formData();
    } catch {
      throw new HttpError(400, 'Malformed multipart body');
    }
    const file = form.get('file');
    if (!file || typeof file === 'string')
      throw new HttpError(400, 'Multipart body has no "file" part');
    return Buffer.from(await file.arrayBuffer());
  }

  async function handleUploadPut(req: IncomingMessage, res: ServerResponse, key: string) {
    const upload = signedUploadParams(req, key);
    if (await readRecord(key)) throw new HttpError(409, 'This file key has already been uploaded');

    const range = /^bytes=(\d+)-$/.exec(String(req.headers.range ?? 'bytes=0-'));
    if (!range) throw new HttpError(416, 'Range must look like "bytes=N-"');
    const start = Number(range[1]);
    const have = await partialSize(key);
    if (start === 0 && have > 0) await rm(partialPath(key), { force: true });
    else if (start !== have) {
      throw new HttpError(416, `Resume from byte ${have}, not ${start}`, {
        'x-ut-range-start': String(have),
      });
    }

    const remaining = upload.size - start;
    const chunk = await extractFileBytes(req, await readBody(req, remaining + MULTIPART_OVERHEAD));
    if (chunk.length > remaining) {
      await rm(partialPath(key), { force: true });
      const registration = upload.slug ? registrations.get(key) : undefined;
      if (registration) {
        await sendHook(registration, 'error', {
          fileKey: key,
          error: 'File is larger than declared',
        });
        finishDevKey(registration, key);
      }
      throw new HttpError(413, `File is larger than the ${upload.size} bytes it was presigned for`);
    }
    await appendFile(partialPath(key), chunk);
    const total = start + chunk.length;
    if (total < upload.size) {
      throw new HttpError(
        400,
        `Received ${total} of ${upload.size} bytes; resume from byte ${total}`,
        {
          'x-ut-range-start': String(total),
        },
      );
    }

    const bytes = await readFile(partialPath(key));
    const fileHash = createHash('md5').update(bytes).digest('hex');
    await rename(partialPath(key), filePath(key));
    const record: StoredFileRecord = {
      key,
      name: upload.name,
      size: upload.size,
      type: upload.type,
      customId: upload.customId,
      acl: upload.acl,
      contentDisposition: upload.contentDisposition,
      fileHash,
      uploadedAt: Date.now(),
    };
    await writeFile(recordPath(key), JSON.stringify(record, null, 2));
    const fileData: UploadedFileData = {
      key,
      name: record.name,
      size: record.size,
      type: record.type,
      customId: record.customId,
      lastModified: record.uploadedAt,
      ...fileUrls(key),
      fileHash,
    };

    // Uploads presigned by a file route (x-ut-slug) complete through the app's callback;
    // UTApi.uploadFiles uploads (no slug) complete here.
    let serverData: unknown = null;
    if (upload.slug) {
      const registration = await waitForRegistration(key);
      if (!registration) {
        await deleteStored(key);
        throw new HttpError(
          400,
          'The route handler never registered this upload (/route-metadata)',
        );
      }
      const result = registration.awaitServerData ? waitForResult(key) : null;
      const sent = await sendHook(registration, 'callback', {
        status: 'uploaded',
        metadata: registration.metadata,
        file: fileData,
        origin: baseUrl,
      });
      let outcome: CallbackOutcome | null = null;
      if (!sent.delivered) {
        resultWaiters.get(key)?.({ ok: false, error: 'undelivered' });
        outcome = { ok: false, error: `Upload completion could not be delivered: ${sent.detail}` };
      } else if (result) {
        outcome = await result;
      }
      finishDevKey(registration, key);
      if (outcome && !outcome.ok) throw new HttpError(502, outcome.error);
      if (outcome?.ok) serverData = outcome.callbackData;
    }
    sendJson(res, 200, { ...fileData, serverData });
  }

  async function serveFile(req: IncomingMessage, res: ServerResponse, key: string) {
    const record = await readRecord(key);
    if (!record) throw new HttpError(404, 'File not found');
    const url = new URL(req.url ?? '/', `http://${req.headers.host ?? '127.0.0.1'}`);
    if (url.searchParams.has('signature')) {
      const check = verifySignedUrl(url, apiKey);
      if (!check.ok) throw new HttpError(403, `File URL rejected: ${check.reason}`);
    } else if (record.acl === 'private') {
      throw new HttpError(403, 'This file is private; request a signed URL');
    }
    const bytes = await readFile(filePath(key));
    res.writeHead(200, {
      'content-type': record.type,
      'content-length': String(bytes.length),
      'content-disposition': contentDispositionHeader(record.contentDisposition, record.name),
      etag: `"${record.fileHash}"`,
      'cache-control':
        record.acl === 'private' ? 'private, no-store' : 'public, max-age=31536000, immutable',
    });
    res.end(req.method === 'HEAD' ? undefined : bytes);
  }

  async function handleApi(req: IncomingMessage, res: ServerResponse, endpoint: string) {
    requireApiKey(req);
    const body = await readJson(req);
    switch (endpoint) {
      case 'deleteFiles': {
        const keys = await findKeys(body);
        let deletedCount = 0;
        for (const key of keys) if (await deleteStored(key)) deletedCount++;
        return sendJson(res, 200, { success: true, deletedCount });
      }
      case 'getFileUrl': {
        const keys = await findKeys(body);
        const data = [];
        for (const key of keys)
          if (await readRecord(key)) data.push({ key, url: fileUrls(key).ufsUrl });
        return sendJson(res, 200, { data });
      }
      case 'listFiles': {
        const limit = typeof body.limit === 'number' ? body.limit : 500;
        const offset = typeof body.offset === 'number' ? body.offset : 0;
        const records = await allRecords();
        const files = records.slice(offset, offset + limit).map((r) => ({
          id: r.key,
          customId: r.customId,
          key: r.key,
          name: r.name,
          size: r.size,
          status: 'Uploaded' as const,
          uploadedAt: r.uploadedAt,
        }));
        return sendJson(res, 200, { hasMore: offset + limit < records.length, files });
      }
      case 'renameFiles':
      case 'updateACL': {
        const updates = Array.isArray(body.updates)
          ? (body.updates as Record<string, unknown>[])
          : [];
        for (const update of updates) {
          const key = await keyFor(update);
          const record = key ? await readRecord(key) : null;
          if (!key || !record) continue;
          if (endpoint === 'renameFiles' && typeof update.newName === 'string')
            record.name = update.newName;
          if (endpoint === 'updateACL')
            record.acl = update.acl === 'private' ? 'private' : 'public-read';
          await writeFile(recordPath(key), JSON.stringify(record, null, 2));
        }
        return sendJson(res, 200, { success: true });
      }
      case 'getUsageInfo': {
        const records = await allRecords();
        const totalBytes = records.reduce((sum, r) => sum + r.size, 0);
        return sendJson(res, 200, {
          totalBytes,
          appTotalBytes: totalBytes,
          filesUploaded: records.length,
          limitBytes: USAGE_LIMIT_BYTES,
        });
      }
      case 'requestFileAccess': {
        const key = await keyFor(body);
        if (!key || !(await readRecord(key))) throw new HttpError(404, 'File not found');
        const ttl = typeof body.expiresIn === 'number' ? body.expiresIn : 3600;
        const ufsUrl = signUrl(fileUrls(key).ufsUrl, apiKey, ttl);
        return sendJson(res, 200, { url: ufsUrl, ufsUrl });
      }
      default:
        throw new HttpError(404, `Unknown API endpoint /v6/${endpoint}`);
    }
  }

  async function route(req: IncomingMessage, res: ServerResponse) {
    const method = req.method ?? 'GET';
    const pathname = new URL(req.url ?? '/', 'http://fake').pathname;
    const parts = pathname.split('/').filter(Boolean);

    if (method === 'OPTIONS') {
      res.writeHead(204, {
        'access-control-allow-methods': 'GET, HEAD, PUT, POST, OPTIONS',
        'access-control-allow-headers': String(
          req.headers['access-control-request-headers'] ?? '*',
        ),
        'access-control-max-age': '600',
      });
      return res.end();
    }
    if (method === 'GET' && pathname === '/health') return sendJson(res, 200, { ok: true });
    if (method === 'POST' && pathname === '/route-metadata') return handleRouteMetadata(req, res);
    if (method === 'POST' && pathname === '/callback-result') return handleCallbackResult(req, res);
    if (method === 'POST' && parts.length === 2 && parts[0] === 'v6')
      return handleApi(req, res, parts[1]);
    if ((method === 'GET' || method === 'HEAD') && parts.length === 2 && parts[0] === 'f') {
      return serveFile(req, res, parts[1]);
    }
    if ((method === 'GET' || method === 'HEAD') && parts.length === 3 && parts[0] === 'a') {
      if (parts[1] !== appId) throw new HttpError(404, 'Unknown app');
      return serveFile(req, res, parts[2]);
    }
    if (parts.length === 1 && FILE_KEY.test(parts[0])) {
      if (method === 'PUT') return handleUploadPut(req, res, parts[0]);
      if (method === 'HEAD') return handleUploadHead(req, res, parts[0]);
    }
    throw new HttpError(404, `No route for ${method} ${pathname}`);
  }

  const server = createServer((req, res) => {
    const started = Date.now();
    // Browsers PUT from the app's origin; expose the resume header to them.
    res.setHeader('access-control-allow-origin', req.headers.origin ?? '*');
    res.setHeader('vary', 'Origin');
    res.setHeader('access-control-expose-headers', 'x-ut-range-start, content-length, etag');
    res.on('close', () => {
      const pathname = new URL(req.url ?? '/', 'http://fake').pathname;
      log(`[upload-fake] ${req.method} ${pathname} ${res.statusCode} ${Date.now() - started}ms`);
    });
    route(req, res).catch((error: unknown) => {
      const httpError =
        error instanceof HttpError
          ? error
          : new HttpError(500, error instanceof Error ? error.message : 'Error');
      if (!(error instanceof HttpError)) console.error('[upload-fake] unexpected error', error);
      if (res.headersSent) {
        res.end();
        return;
      }
      for (const [name, value] of Object.entries(httpError.headers)) res.setHeader(name, value);
      sendJson(res, httpError.status, { error: httpError.message });
    });
  });

  const port = options.port ?? DEFAULT_UPLOAD_FAKE_PORT;
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => {
      server.off('error', reject);
      resolve();
    });
  });
  const actualPort = (server.address() as AddressInfo).port;
  baseUrl = `http://127.0.0.1:${actualPort}`;

  return {
    url: baseUrl,
    port: actualPort,
    dataDir,
    apiKey,
    appId,
    token: mintUploadToken({ apiKey, appId }),
    close: () =>
      new Promise<void>((resolve) => {
        for (const stream of devStreams) stream.res.end();
        devStreams.clear();
        for (const waiter of resultWaiters.values())
          waiter({ ok: false, error: 'upload fake stopped' });
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

function sendJson(res: ServerResponse, status: number, body: unknown) {
  const text = JSON.stringify(body);
  res.writeHead(status, {
    'content-type': 'application/json',
    'content-length': Buffer.byteLength(text),
  });
  res.end(text);
}

async function main() {
  const credentials = uploadFakeCredentials();
  const port = Number(process.env.UPLOAD_FAKE_PORT || DEFAULT_UPLOAD_FAKE_PORT);
  if (process.argv.includes('--print-token')) {
    console.log(mintUploadToken(credentials));
    return;
  }
  if (process.argv.includes('--print-env')) {
    const { uploadServiceEnv } = await import('../../lib/uploads/config');
    const env = uploadServiceEnv({
      ...process.env,
      UPLOADTHING_TOKEN: '',
      UPLOAD_FAKE_URL: process.env.UPLOAD_FAKE_URL || `http://127.0.0.1:${port}`,
    });
    for (const [name, value] of Object.entries(env)) console.log(`${name}=${value}`);
    return;
  }
  const fake = await startUploadFake({
    port,
    dataDir: process.env.UPLOAD_FAKE_DATA_DIR || undefined,
    ...credentials,
  });
  console.log(`[upload-fake] listening on ${fake.url}, files in ${fake.dataDir}`);
  const stop = () => {
    fake.close().then(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((error: unknown) => {
    if ((error as NodeJS.ErrnoException).code === 'EADDRINUSE') {
      console.error(
        `[upload-fake] port ${process.env.UPLOAD_FAKE_PORT || DEFAULT_UPLOAD_FAKE_PORT} is in use: ` +
          'stop the process holding it (an earlier upload fake?) or set UPLOAD_FAKE_PORT.',
      );
    } else {
      console.error('[upload-fake] failed to start:', error);
    }
    process.exit(1);
  });
}
