import type { Metadata } from 'next';
import { PageHeader } from '@/components/ui/empty-state';
import { requirePage } from '@/lib/auth/guard';
import { openApiDocument } from '@/server/api-v1/openapi';

export const metadata: Metadata = { title: 'API reference' };

type Operation = {
  summary: string;
  description?: string;
  parameters?: { name: string; in: string; required: boolean; description?: string }[];
  requestBody?: { content: Record<string, { schema: unknown }> };
  responses: Record<
    string,
    { description?: string; content?: Record<string, { schema: unknown }> } | { $ref: string }
  >;
};

/** The OpenAPI document of /api/v1 in readable form, for signed-in members. */
export default async function ApiReferencePage() {
  await requirePage('organization:read');
  const document = openApiDocument();
  const operations = Object.entries(document.paths).flatMap(([path, methods]) =>
    Object.entries(methods as Record<string, Operation>).map(([method, operation]) => ({
      path,
      method: method.toUpperCase(),
      operation,
    })),
  );
  return (
    <>
      <PageHeader title="API reference" lead={document.info.description} />
      <p className="mb-6 text-sm">
        Base address <code>/api/v1</code>. The machine-readable document:{' '}
        <a href="/api/v1/openapi.json">/api/v1/openapi.json</a> (OpenAPI 3.1).
      </p>
      {operations.map(({ path, method, operation }) => {
        const success = Object.entries(operation.responses).find(([status]) =>
          status.startsWith('2'),
        );
        const reply =
          success && 'content' in success[1]
            ? success[1].content?.['application/json']?.schema
            : null;
        const body = operation.requestBody
          ? Object.entries(operation.requestBody.content)[0]
          : null;
        return (
          <section key={`${method} ${path}`} className="card mb-4" id={`${method}-${path}`}>
            <h2 className="mb-1 font-mono text-base">
              {method} /api/v1{path}
            </h2>
            <p className="mb-2 text-sm text-ink-700">
              {operation.summary}. {operation.description}
            </p>
            {operation.parameters?.length ? (
              <ul className="mb-2 text-sm">
                {operation.parameters.map((p) => (
                  <li key={`${p.in}-${p.name}`}>
                    <code>{p.name}</code> ({p.in}
                    {p.required ? ', required' : ''}){p.description ? `: ${p.description}` : ''}
                  </li>
                ))}
              </ul>
            ) : null}
            {body ? (
              <details className="mb-2 text-sm">
                <summary>Request body ({body[0]})</summary>
                <pre className="overflow-x-auto text-xs">
                  {JSON.stringify(body[1].schema, null, 2)}
                </pre>
              </details>
            ) : null}
            {reply ? (
              <details className="text-sm">
                <summary>Reply {success?.[0]}</summary>
                <pre className="overflow-x-auto text-xs">{JSON.stringify(reply, null, 2)}</pre>
              </details>
            ) : null}
          </section>
        );
      })}
    </>
  );
}
