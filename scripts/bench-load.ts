/**
 * Load on the main list, detail, compare and page routes of a running Beadline (prints figures;
 * no pass/fail).
 *
 *   npm start                      # in one shell (or npm test's server, or npm run dev)
 *   npm run bench:load             # in another: BENCH_URL defaults to APP_URL or 127.0.0.1:$PORT
 *   BENCH_URL=http://127.0.0.1:3100 BENCH_SECONDS=30 npm run bench:load
 *
 * It signs in itself as the demo admin and the demo viewer (db/demo.ts; the seeded demo must be
 * there), then drives each route with autocannon for BENCH_SECONDS (default 30, as in issue 12) over
 * BENCH_CONNECTIONS (default 50) keep-alive connections, one route after the other, after a few
 * warm-up requests. It prints p50 / p95 / p99 of the response times, requests per second and the
 * errors (connection errors, timeouts and any answer that is not 2xx, a redirect to the sign-in
 * page included). Loopback only: it refuses any other host, so it can never load someone else's
 * server. The load generator shares the machine's cores with the server, as in issue 12.
 *
 * Latency on a shared machine moves with everyone else's load; the CPU time the server spends per
 * request hardly does. On Linux it also prints, per route, the CPU ms per request of the web
 * server process (the one listening on the port) and of the PostgreSQL backends (the postmaster
 * listening on BENCH_PG_PORT, default PG_PORT or the port of DATABASE_URL), from /proc.
 *
 *   BENCH_REQUESTS=400      a fixed number of requests per route instead of BENCH_SECONDS
 *   BENCH_ONLY=compare      only the routes whose name contains one of these comma-separated words
 */
import { cpus, loadavg } from 'node:os';
import autocannon from 'autocannon';
import { benchOrigin, ms, percentile, signInDemo } from './bench-target';
import { cpuMeter } from './process-cpu';

const origin = benchOrigin();
const seconds = Number(process.env.BENCH_SECONDS ?? 30);
const connections = Number(process.env.BENCH_CONNECTIONS ?? 50);
const requests = process.env.BENCH_REQUESTS ? Number(process.env.BENCH_REQUESTS) : null;
const only = (process.env.BENCH_ONLY ?? '')
  .split(',')
  .map((word) => word.trim())
  .filter(Boolean);
const COATING = process.env.BENCH_COATING ?? 'HT-200';

if (
  !(seconds > 0 && seconds <= 300) ||
  !(connections > 0 && connections <= 500) ||
  (requests !== null && !(requests > 0 && requests <= 100_000))
) {
  console.error('BENCH_SECONDS must be 1–300, BENCH_CONNECTIONS 1–500 and BENCH_REQUESTS 1–100000.');
  process.exit(2);
}

function databasePort(): number | null {
  const explicit = process.env.BENCH_PG_PORT ?? process.env.PG_PORT;
  if (explicit) return Number(explicit);
  // The private cluster of `npm start` (scripts/lib.sh) when nothing says otherwise.
  if (!process.env.DATABASE_URL) return 54329;
  return Number(new URL(process.env.DATABASE_URL).port || 5432);
}

const webPort = Number(new URL(origin).port || 80);
const webCpu = cpuMeter(webPort);
const dbPort = databasePort();
const dbCpu = dbPort === null ? null : cpuMeter(dbPort, { children: true });

type Target = { name: string; path: string; cookie: string };

type Row = {
  route: string;
  requests: number;
  perSecond: number;
  p50: number;
  p95: number;
  p99: number;
  errors: number;
  /** CPU ms per request of the web server and of PostgreSQL; null where /proc cannot say. */
  webCpuMs: number | null;
  dbCpuMs: number | null;
};

async function warmUp(target: Target): Promise<void> {
  for (let i = 0; i < 3; i++) {
    const response = await fetch(`${origin}${target.path}`, {
      headers: { cookie: target.cookie },
      redirect: 'manual',
    });
    await response.arrayBuffer();
    if (response.status !== 200) {
      throw new Error(
        `${target.name}: GET ${target.path} answered ${response.status} before the run.`,
      );
    }
  }
}

async function measure(target: Target): Promise<Row> {
  await warmUp(target);
  const times: number[] = [];
  const webBefore = webCpu?.read() ?? null;
  const dbBefore = dbCpu?.read() ?? null;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      {
        url: `${origin}${target.path}`,
        connections,
        ...(requests === null ? { duration: seconds } : { amount: requests }),
        headers: { cookie: target.cookie },
        timeout: 30,
      },
      (error, finished) => (error ? reject(error) : resolve(finished)),
    );
    instance.on('response', (_client, _status, _bytes, ms) => times.push(ms));
  });
  const perRequest = (before: number | null, meter: { read(): number } | null) =>
    before === null || meter === null || times.length === 0
      ? null
      : (meter.read() - before) / times.length;
  const webCpuMs = perRequest(webBefore, webCpu);
  const dbCpuMs = perRequest(dbBefore, dbCpu);
  times.sort((a, b) => a - b);
  return {
    webCpuMs,
    dbCpuMs,
    route: target.name,
    requests: result.requests.total,
    perSecond: result.requests.average,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    errors: result.errors + result.timeouts + result.non2xx,
  };
}

async function main(): Promise<void> {
  const admin = await signInDemo(origin, 'admin');
  const viewer = await signInDemo(origin, 'viewer');
  const list = await fetch(`${origin}/api/batches?pageSize=50`, { headers: { cookie: admin } });
  const batches = (await list.json()) as { items?: { id: string }[] };
  const batchId = batches.items?.[0]?.id;
  if (!batchId) throw new Error('GET /api/batches returned no batch; is the demo seeded?');

  const targets: Target[] = [
    { name: 'GET /api/batches?pageSize=50', path: '/api/batches?pageSize=50', cookie: admin },
    { name: 'GET /api/batches/{id}', path: `/api/batches/${batchId}`, cookie: admin },
    {
      name: `GET /api/compare/drops.csv`,
      path: `/api/compare/drops.csv?coating=${COATING}`,
      cookie: admin,
    },
    { name: `page /compare`, path: `/compare?coating=${COATING}`, cookie: admin },
    { name: 'page /batches (viewer)', path: '/batches', cookie: viewer },
    { name: 'page /dashboard', path: '/dashboard', cookie: admin },
  ];
  const chosen = only.length
    ? targets.filter((t) => only.some((word) => t.name.includes(word)))
    : targets;
  const amount = requests === null ? `${seconds} s` : `${requests} requests`;
  console.log(
    `bench:load against ${origin}: ${connections} connections, ${amount} per route, coating ${COATING}`,
  );
  console.log(
    `CPU from /proc: web server ${webCpu ? `pid ${webCpu.pid}` : 'not found'}, PostgreSQL ${dbCpu ? `pid ${dbCpu.pid} and its backends` : 'not found'}; load average ${loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')}\n`,
  );
  const rows: Row[] = [];
  for (const target of chosen) {
    rows.push(await measure(target));
    const row = rows.at(-1)!;
    console.log(`  measured ${row.route}`);
  }
  const header = ['route', 'requests', 'req/s', 'p50', 'p95', 'p99', 'errors', 'web CPU/req', 'db CPU/req'];
  const cpu = (v: number | null) => (v === null ? '—' : `${v.toFixed(1)} ms`);
  const table = rows.map((r) => [
    r.route,
    String(r.requests),
    r.perSecond.toFixed(1),
    ms(r.p50),
    ms(r.p95),
    ms(r.p99),
    String(r.errors),
    cpu(r.webCpuMs),
    cpu(r.dbCpuMs),
  ]);
  const widths = header.map((h, i) => Math.max(h.length, ...table.map((row) => row[i]!.length)));
  const line = (cells: string[]) =>
    `| ${cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join(' | ')} |`;
  console.log('');
  console.log(line(header));
  console.log(
    `|${widths.map((w, i) => (i === 0 ? '-'.repeat(w + 2) : `${'-'.repeat(w + 1)}:`)).join('|')}|`,
  );
  for (const row of table) console.log(line(row));
  console.log(
    `\nload average afterwards ${loadavg()
      .map((l) => l.toFixed(2))
      .join(' ')} on ${cpus().length} cores`,
  );
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
