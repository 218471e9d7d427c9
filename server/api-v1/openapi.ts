import 'server-only';
import { buildOpenApiDocument } from '@/lib/contracts/api-v1-openapi';
import { SOFTWARE_VERSION } from '@/lib/measure/version';

let document: ReturnType<typeof buildOpenApiDocument> | null = null;

/** The OpenAPI document of /api/v1 (built once per process: it only changes with the code). */
export function openApiDocument() {
  document ??= buildOpenApiDocument(SOFTWARE_VERSION);
  return document;
}
