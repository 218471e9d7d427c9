/**
 * The web server of `npm start` (production build), `npm run dev` (--dev) and `npm test`:
 * Next.js's own request handler behind a Node HTTP server that records who is really connected
 * (lib/auth/forwarded.ts). Next.js gives route handlers and server actions no access to the
 * socket, and passes a client's X-Forwarded-* headers through; this server removes them unless
 * the peer is in TRUSTED_PROXIES and hands the app the client's address in a header that only
 * it can set.
 *
 *   tsx scripts/serve.ts [--dev]      HOST (127.0.0.1), PORT (3000), TRUSTED_PROXIES ('')
 */
import { createServer } from 'node:http';
import next from 'next';
import {
  TrustedProxiesError,
  edgeRequestHeaders,
  edgeToken,
  parseTrustedProxies,
} from '../lib/auth/forwarded';

async function main(): Promise<void> {
  const dev = process.argv.includes('--dev');
  const hostname = process.env.HOST || '127.0.0.1';
  const port = Number(process.env.PORT || 3000);
  const trusted = parseTrustedProxies(process.env.TRUSTED_PROXIES);
  const token = edgeToken();

  const app = next({ dev, hostname, port, dir: process.cwd() });
  const handle = app.getRequestHandler();
  await app.prepare();

  const server = createServer((req, res) => {
    edgeRequestHeaders(req.headers, req.socket.remoteAddress, trusted, token);
    handle(req, res).catch((error: unknown) => {
      console.error('[serve] request failed', error);
      if (!res.headersSent) res.writeHead(500, { 'content-type': 'text/plain' });
      res.end('Internal server error');
    });
  });
  // The development server's hot reload uses WebSocket upgrades; they need no client address.
  const upgrade = app.getUpgradeHandler();
  server.on('upgrade', (req, socket, head) => {
    edgeRequestHeaders(req.headers, req.socket.remoteAddress, trusted, token);
    upgrade(req, socket, head).catch(() => socket.destroy());
  });
  // As `next start`: keep-alive a little longer than common proxies' idle timeouts.
  server.keepAliveTimeout = 65_000;
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, hostname, () => resolve());
  });
  const proxies = trusted.entries.length ? trusted.entries.join(', ') : 'none';
  console.log(
    `[serve] Beadline (${dev ? 'development' : 'production'}) on http://${hostname}:${port}; trusted proxies: ${proxies}`,
  );

  const stop = () => {
    server.close();
    server.closeAllConnections();
    app.close().finally(() => process.exit(0));
  };
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((error: unknown) => {
  if (error instanceof TrustedProxiesError) console.error(`[serve] ${error.message}`);
  else if ((error as NodeJS.ErrnoException).code === 'EADDRINUSE')
    console.error(`[serve] port ${process.env.PORT || 3000} is in use: stop what holds it or set PORT.`);
  else console.error('[serve] could not start:', error);
  process.exit(1);
});
