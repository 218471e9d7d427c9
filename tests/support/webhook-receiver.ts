import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';

export type ReceivedWebhook = { headers: IncomingHttpHeaders; body: string; at: Date };

/**
 * A webhook receiver on 127.0.0.1 for tests: keeps every request it gets and answers `status`
 * (200 unless changed). `port` reopens it on the port of an earlier one (a receiver back up).
 */
export async function startReceiver(options: { port?: number; status?: number } = {}) {
  const received: ReceivedWebhook[] = [];
  const state = { status: options.status ?? 200 };
  const server: Server = createServer((request, response) => {
    const chunks: Buffer[] = [];
    request.on('data', (chunk: Buffer) => chunks.push(chunk));
    request.on('end', () => {
      received.push({
        headers: request.headers,
        body: Buffer.concat(chunks).toString('utf8'),
        at: new Date(),
      });
      response.writeHead(state.status, { 'content-type': 'text/plain' }).end('ok');
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, '127.0.0.1', () => resolve());
  });
  const { port } = server.address() as AddressInfo;
  return {
    port,
    url: (path = '/hooks/beadline') => `http://127.0.0.1:${port}${path}`,
    received,
    answer(status: number) {
      state.status = status;
    },
    close: () =>
      new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
export type Receiver = Awaited<ReturnType<typeof startReceiver>>;
