/**
 * A local stand-in for an SMTP mail server: it accepts every mail on 127.0.0.1 (no TLS, no
 * authentication), keeps it in memory and shows it over HTTP, so developers and tests can read
 * what Beadline sent.
 *
 *   SMTP  127.0.0.1:MAIL_FAKE_SMTP_PORT (1025)
 *   HTTP  127.0.0.1:MAIL_FAKE_WEB_PORT (1080)
 *     GET    /                      the mailbox as a page, newest first
 *     GET    /api/messages          [{ id, from, to, subject, date, text, html }], oldest first;
 *                                   ?to=address keeps the mails to that address
 *     GET    /api/messages/:id      one mail
 *     DELETE /api/messages          empties the mailbox
 *     GET    /api/health            { ok: true }
 *
 * Run: `npx tsx scripts/services/mail-fake.ts`. Tests use startMailFake().
 */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { pathToFileURL } from 'node:url';
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export type FakeMail = {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  html: string;
};

export type MailFake = {
  smtpPort: number;
  webPort: number;
  messages: FakeMail[];
  close(): Promise<void>;
};

function addresses(value: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(value) ? value : value ? [value] : [];
  return list
    .flatMap((group) => group.value.map((a) => (a.address ?? '').toLowerCase()))
    .filter(Boolean);
}

function escapeHtml(value: string): string {
  return value
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;');
}

function mailboxPage(messages: FakeMail[]): string {
  const items = [...messages]
    .reverse()
    .map(
      (m) => `<article><h2>${escapeHtml(m.subject)}</h2>
<p class="meta">${escapeHtml(m.date)} · from ${escapeHtml(m.from)} · to ${escapeHtml(m.to.join(', '))} · <a href="/api/messages/${m.id}">JSON</a></p>
<pre>${escapeHtml(m.text)}</pre></article>`,
    )
    .join('\n');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Beadline mail stand-in</title>
<style>body{font-family:system-ui,sans-serif;max-width:760px;margin:2rem auto;padding:0 1rem;color:#1b2a2b}
article{border:1px solid #d9e2e2;border-radius:8px;padding:1rem;margin:1rem 0}h2{margin:0;font-size:1.1rem}
.meta{color:#5b6b6c;font-size:.85rem}pre{white-space:pre-wrap}</style></head><body>
<h1>Mail sent by Beadline (${messages.length})</h1>
<p>Local stand-in: nothing here left this machine. Newest first; kept until the stand-in stops.</p>
${items || '<p>No mail yet.</p>'}</body></html>`;
}

function listen(
  server: { listen(port: number, host: string, cb: () => void): unknown },
  port: number,
) {
  return new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
}

export async function startMailFake(
  options: { smtpPort?: number; webPort?: number } = {},
): Promise<MailFake> {
  const messages: FakeMail[] = [];
  let counter = 0;
  const smtp = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Beadline mail stand-in',
    logger: false,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          counter += 1;
          messages.push({
            id: String(counter),
            from: addresses(parsed.from)[0] ?? '',
            to: addresses(parsed.to),
            subject: parsed.subject ?? '',
            date: (parsed.date ?? new Date()).toISOString(),
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
          });
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  smtp.on('error', (error) => console.error('[mail-fake] smtp error', error));

  const web: Server = createServer((request, response) => {
    const url = new URL(request.url ?? '/', 'http://127.0.0.1');
    const json = (status: number, body: unknown) => {
      response.writeHead(status, { 'content-type': 'application/json' });
      response.end(JSON.stringify(body));
    };
    if (url.pathname === '/api/health') return json(200, { ok: true });
    if (url.pathname === '/api/messages' && request.method === 'DELETE') {
      messages.length = 0;
      return json(200, { ok: true });
    }
    if (url.pathname === '/api/messages') {
      const to = url.searchParams.get('to')?.toLowerCase();
      return json(200, to ? messages.filter((m) => m.to.includes(to)) : messages);
    }
    const one = /^\/api\/messages\/([^/]+)$/.exec(url.pathname);
    if (one) {
      const message = messages.find((m) => m.id === one[1]);
      return message ? json(200, message) : json(404, { error: 'no such message' });
    }
    if (url.pathname === '/') {
      response.writeHead(200, { 'content-type': 'text/html; charset=utf-8' });
      return response.end(mailboxPage(messages));
    }
    return json(404, { error: 'not found' });
  });

  await listen(smtp, options.smtpPort ?? 0);
  await listen(web, options.webPort ?? 0);
  const smtpAddress = smtp.server.address() as AddressInfo;
  const webAddress = web.address() as AddressInfo;
  return {
    smtpPort: smtpAddress.port,
    webPort: webAddress.port,
    messages,
    close: async () => {
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
      web.closeAllConnections();
      await new Promise<void>((resolve) => web.close(() => resolve()));
    },
  };
}

const isMain = process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href;
if (isMain) {
  const smtpPort = Number(process.env.MAIL_FAKE_SMTP_PORT ?? 1025);
  const webPort = Number(process.env.MAIL_FAKE_WEB_PORT ?? 1080);
  startMailFake({ smtpPort, webPort }).then(
    (fake) => {
      console.log(
        `[mail-fake] SMTP on 127.0.0.1:${fake.smtpPort}, mailbox on http://127.0.0.1:${fake.webPort}`,
      );
      const stop = () => void fake.close().then(() => process.exit(0));
      process.on('SIGTERM', stop);
      process.on('SIGINT', stop);
    },
    (error: unknown) => {
      console.error('[mail-fake] could not start', error);
      process.exit(1);
    },
  );
}
