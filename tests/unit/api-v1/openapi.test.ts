import { readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from '@/lib/contracts/api-v1-openapi';

const V1_DIR = path.resolve(__dirname, '../../../app/api/v1');

/** Every route.ts under app/api/v1 as its OpenAPI path and the methods it exports. */
async function routeFiles(dir = V1_DIR): Promise<{ path: string; methods: string[] }[]> {
  const found: { path: string; methods: string[] }[] = [];
  for (const entry of await readdir(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) found.push(...(await routeFiles(full)));
    else if (entry.name === 'route.ts') {
      const source = await readFile(full, 'utf8');
      const methods = [
        ...source.matchAll(
          /export (?:const|function|async function) (GET|POST|PUT|PATCH|DELETE)\b/g,
        ),
      ].map((m) => m[1].toLowerCase());
      const route = path
        .relative(V1_DIR, path.dirname(full))
        .split(path.sep)
        .map((part) => part.replace(/^\[(.+)\]$/, '{$1}'))
        .join('/');
      found.push({ path: `/${route}`, methods });
    }
  }
  return found;
}

describe('the OpenAPI document of /api/v1', () => {
  const document = buildOpenApiDocument('test');

  it('is a valid OpenAPI 3.1 document (checked by @seriousme/openapi-schema-validator)', async () => {
    const validator = new Validator();
    const result = await validator.validate(document as never);
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('lists every route file of app/api/v1 with each method it exports', async () => {
    const files = await routeFiles();
    expect(files.length).toBeGreaterThan(10);
    for (const file of files) {
      expect(file.methods.length, `${file.path} exports no method`).toBeGreaterThan(0);
      const listed = document.paths[file.path];
      expect(listed, `${file.path} is missing from the document`).toBeDefined();
      for (const method of file.methods) expect(Object.keys(listed)).toContain(method);
    }
    expect(Object.keys(document.paths).sort()).toEqual(files.map((f) => f.path).sort());
  });

  it('documents the photo upload as multipart with the photo file and its fields', () => {
    const post = document.paths['/photos'].post as {
      requestBody: { content: Record<string, { schema: { required: string[] } }> };
    };
    const form = post.requestBody.content['multipart/form-data'].schema;
    expect(form.required).toEqual(
      expect.arrayContaining(['photo', 'sampleId', 'probeLiquidId', 'method']),
    );
  });
});
