import { createServer, type IncomingMessage } from 'node:http';
import type { AddressInfo } from 'node:net';

/** Serves a fetch-style handler (Request → Response) on 127.0.0.1, as Next would for a route. */
export async function serveWebHandler(
  pathname: string,
  handler: (request: Request) => Promise<Response>,
): Promise<{ url: string; close(): Promise<void> }> {
  let origin = '';
  const server = createServer((req, res) => {
    toRequest(req, origin)
      .then(handler)
      .then(async (response) => {
        res.writeHead(response.status, Object.fromEntries(response.headers));
        res.end(Buffer.from(await response.arrayBuffer()));
      })
      .catch((error: unknown) => {
        res.writeHead(500, { 'content-type': 'text/plain' });
        res.end(String(error));
      });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  return {
    url: `${origin}${pathname}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

async function toRequest(req: IncomingMessage, origin: string): Promise<Request> {
  const headers = new Headers();
  for (const [name, value] of Object.entries(req.headers)) {
    if (Array.isArray(value)) value.forEach((v) => headers.append(name, v));
    else if (value !== undefined) headers.set(name, value);
  }
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  const hasBody = req.method !== 'GET' && req.method !== 'HEAD';
  return new Request(`${origin}${req.url ?? '/'}`, {
    method: req.method,
    headers,
    body: hasBody ? Buffer.concat(chunks) : undefined,
  });
}
