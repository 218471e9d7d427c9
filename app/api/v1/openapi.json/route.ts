import { openApiDocument } from '@/server/api-v1/openapi';

/** The OpenAPI 3.1 document of /api/v1: public, it holds no data, only the API's shape. */
export function GET() {
  return Response.json(openApiDocument());
}
