import 'server-only';
import { AppError } from '@/lib/app-error';

/** Largest JSON body a route takes unless it says otherwise (the CSV import takes more). */
export const DEFAULT_MAX_BODY_BYTES = 1024 * 1024;

const tooLarge = (maxBytes: number) =>
  new AppError(
    'payload_too_large',
    `The request body is larger than ${formatBytes(maxBytes)}. Send less at once (split a file into parts).`,
  );

const invalidJson = (why: string) =>
  new AppError('invalid_json', `${why} Send the fields as a JSON object.`);

function formatBytes(bytes: number): string {
  return bytes >= 1024 * 1024
    ? `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`
    : `${Math.round(bytes / 1024)} kB`;
}

/**
 * Reads a request body as a JSON object, refusing more than `maxBytes`: early from
 * Content-Length, and while streaming for a body that does not say (or says less than it sends).
 * An empty body, text that is not JSON, or JSON that is not an object is a 400 invalid_json that
 * says which.
 */
export async function readJsonObject(
  request: Request,
  maxBytes = DEFAULT_MAX_BODY_BYTES,
): Promise<Record<string, unknown>> {
  return parseJsonObject(await readBodyBytes(request, maxBytes));
}

/** The raw body, refusing more than `maxBytes` (from Content-Length, and while streaming). */
export async function readBodyBytes(request: Request, maxBytes: number): Promise<Uint8Array> {
  const declared = Number(request.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  return readAtMost(request, maxBytes);
}

/** Body bytes → a JSON object, or the 400 invalid_json saying what is wrong. */
export function parseJsonObject(bytes: Uint8Array): Record<string, unknown> {
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw invalidJson('The request body is not UTF-8 text.');
  }
  if (text.trim() === '') throw invalidJson('The request body is empty.');
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw invalidJson('The request body is not valid JSON.');
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw invalidJson('The request body is JSON, but not an object.');
  }
  return body as Record<string, unknown>;
}

/**
 * Body bytes of a multipart/form-data request → its text fields and its files. Anything else is
 * a 400 that says to send multipart.
 */
export async function parseMultipart(
  bytes: Uint8Array,
  contentType: string | null,
): Promise<{ fields: Record<string, string>; files: Record<string, File> }> {
  const notMultipart = new AppError(
    'invalid_input',
    'Send this request as multipart/form-data: the photo as a file part and the other fields as text parts.',
  );
  if (!contentType?.toLowerCase().startsWith('multipart/form-data')) throw notMultipart;
  let form: FormData;
  try {
    form = await new Response(bytes as BodyInit, {
      headers: { 'content-type': contentType },
    }).formData();
  } catch {
    throw notMultipart;
  }
  const fields: Record<string, string> = {};
  const files: Record<string, File> = {};
  for (const [name, value] of form.entries()) {
    if (typeof value === 'string') fields[name] = value;
    else files[name] = value;
  }
  return { fields, files };
}

async function readAtMost(request: Request, maxBytes: number): Promise<Uint8Array> {
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let offset = 0;
  for (const chunk of chunks) {
    out.set(chunk, offset);
    offset += chunk.byteLength;
  }
  return out;
}
