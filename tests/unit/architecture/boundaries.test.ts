import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';
import { describe, expect, it } from 'vitest';

/*
 * The layer rules of eslint.config.mjs, run through ESLint's own API with the project's config on
 * small snippets placed at paths in each layer: an import that points up is reported, the same
 * import from a layer allowed to make it is not.
 */

const root = fileURLToPath(new URL('../../..', import.meta.url));
const eslint = new ESLint({ cwd: root });

async function restrictedImports(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: `${root}${filePath}` });
  return result.messages
    .filter((message) => message.ruleId === 'no-restricted-imports')
    .map((message) => message.message);
}

const snippet = (source: string) =>
  `import { value } from '${source}';\nexport const used = value;\n`;

describe('layer boundaries (eslint no-restricted-imports)', () => {
  it('db/ may not call services, nor build mail, comparisons or alerts', async () => {
    for (const source of [
      '@/server/records/create',
      '@/lib/email/messages',
      '@/lib/compare',
      '@/lib/alerts/out-of-spec',
      '@/lib/reports/batch-report',
    ]) {
      const messages = await restrictedImports('db/queries/violation.ts', snippet(source));
      expect(messages, source).toHaveLength(1);
    }
    expect(
      await restrictedImports('db/queries/fine.ts', snippet('@/lib/contracts/common')),
    ).toEqual([]);
  });

  it('app/ never imports db/, neither the client nor queries; it calls services', async () => {
    for (const source of ['@/db/client', '@/db/queries/batches', '@/db/schema']) {
      const messages = await restrictedImports('app/api/violation/route.ts', snippet(source));
      expect(messages, source).toEqual([expect.stringMatching(/call a service in server\//)]);
    }
    expect(
      await restrictedImports('app/api/fine/route.ts', snippet('@/server/records/kinds')),
    ).toEqual([]);
  });

  it('components import neither db/ nor server/', async () => {
    expect(
      await restrictedImports('components/violation.tsx', snippet('@/db/queries/coatings')),
    ).toHaveLength(1);
    expect(
      await restrictedImports('components/violation.tsx', snippet('@/server/http/route')),
    ).toHaveLength(1);
    expect(
      await restrictedImports('components/fine.tsx', snippet('@/lib/contracts/coatings')),
    ).toEqual([]);
  });

  it('the pure core imports no database, framework, integration or service', async () => {
    for (const source of [
      '@/db/client',
      'next/headers',
      'react',
      '@/server/http/route',
      '@/lib/auth/context',
    ]) {
      for (const file of ['lib/analysis/violation.ts', 'lib/analysis/fits/violation.ts']) {
        const messages = await restrictedImports(file, snippet(source));
        expect(messages, `${file}: ${source}`).toHaveLength(1);
      }
    }
    // The permissions table is plain data, and contracts may use it.
    expect(
      await restrictedImports('lib/contracts/fine.ts', snippet('@/lib/auth/permissions')),
    ).toEqual([]);
  });

  it('the dynamic-wetting core is core: no database, framework, service or integration', async () => {
    for (const source of ['@/db/client', 'next/server', 'react', '@/server/drops/save-analysis']) {
      for (const file of ['lib/dynamic/violation.ts', 'lib/dynamic/node/violation.ts']) {
        const messages = await restrictedImports(file, snippet(source));
        expect(messages, `${file}: ${source}`).toHaveLength(1);
      }
    }
    expect(await restrictedImports('lib/dynamic/fine.ts', snippet('@/lib/analysis/types'))).toEqual(
      [],
    );
  });

  it('Node built-ins only in the node/ folders of the core, which run outside the browser', async () => {
    for (const source of [
      'node:child_process',
      'fs',
      'sharp',
      './node/ffmpeg',
      '../analysis/node/decode',
    ]) {
      for (const file of ['lib/dynamic/violation.ts', 'lib/analysis/violation.ts']) {
        const messages = await restrictedImports(file, snippet(source));
        expect(messages, `${file}: ${source}`).toEqual([expect.stringMatching(/node\/ folder/)]);
      }
    }
    for (const file of ['lib/dynamic/node/fine.ts', 'lib/analysis/node/fine.ts']) {
      expect(await restrictedImports(file, snippet('node:child_process')), file).toEqual([]);
      expect(await restrictedImports(file, snippet('sharp')), file).toEqual([]);
    }
  });

  it('services may use db/ and the core, but not pages or components', async () => {
    expect(await restrictedImports('server/x/fine.ts', snippet('@/db/queries/records'))).toEqual(
      [],
    );
    expect(
      await restrictedImports('server/x/violation.ts', snippet('@/app/(app)/actions')),
    ).toHaveLength(1);
  });

  it('a relative import does not get round the rules', async () => {
    expect(
      await restrictedImports('lib/stats/violation.ts', snippet('../../db/client')),
    ).toHaveLength(1);
  });
});
