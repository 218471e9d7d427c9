/**
 * How the server answers while pendant-drop fits run (issue 12: four simultaneous 20 000-point
 * fits once pushed /api/health to 5.9 s). Prints figures; no pass/fail.
 *
 *   npm start                          # in one shell (or npm test's server)
 *   npm run bench:compute              # BENCH_URL defaults to APP_URL or 127.0.0.1:$PORT
 *
 * Signs in as the demo viewer, measures /api/health alone, then sends four fits of a
 * 20 000-point outline at once and asks /api/health every 100 ms until they are done, then a
 * fifth fit while four run (the per-user limit answers it 429). Loopback only.
 */
import { MAX_PENDANT_EDGE_POINTS } from '../lib/contracts/limits';
import { pendantEdgeBody } from '../tests/support/pendant-photo';
import { benchOrigin, ms, percentile, signInDemo } from './bench-target';

const origin = benchOrigin();

async function timed<T>(work: () => Promise<T>): Promise<{ ms: number; value: T }> {
  const start = performance.now();
  const value = await work();
  return { ms: performance.now() - start, value };
}

/** One /api/health: its time, and the calculations it says are in the compute pool. */
async function health(): Promise<{ ms: number; inFlight: number }> {
  const { ms: took, value } = await timed(() => fetch(`${origin}/api/health`));
  const body = (await value.json()) as { compute?: { inFlight: number } };
  if (value.status !== 200) throw new Error(`/api/health answered ${value.status}`);
  return { ms: took, inFlight: body.compute?.inFlight ?? 0 };
}

function summary(label: string, times: number[]): string {
  const sorted = [...times].sort((a, b) => a - b);
  return `${label}: n ${sorted.length}, p50 ${ms(percentile(sorted, 50))}, p95 ${ms(percentile(sorted, 95))}, max ${ms(sorted.at(-1) ?? NaN)}`;
}

async function main(): Promise<void> {
  const cookie = await signInDemo(origin, 'viewer');
  const body = JSON.stringify(pendantEdgeBody(MAX_PENDANT_EDGE_POINTS));
  const fit = () =>
    timed(async () => {
      const response = await fetch(`${origin}/api/tensiometry/pendant-drop`, {
        method: 'POST',
        headers: { cookie, origin, 'content-type': 'application/json' },
        body,
      });
      await response.arrayBuffer();
      return response.status;
    });

  const idle: number[] = [];
  for (let i = 0; i < 20; i++) idle.push((await health()).ms);
  const single = await fit();

  let running = true;
  const during: number[] = [];
  const fits = Promise.all([fit(), fit(), fit(), fit()]).finally(() => {
    running = false;
  });
  let fifth: number | undefined;
  while (running) {
    const answer = await health();
    during.push(answer.ms);
    // A fifth fit once the four are in the pool: the per-user limit answers it.
    if (answer.inFlight >= 4 && fifth === undefined) fifth = (await fit()).value;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  const four = await fits;

  console.log(`bench:compute against ${origin} (${MAX_PENDANT_EDGE_POINTS} points per fit)\n`);
  console.log(`one fit alone: ${ms(single.ms)} (status ${single.value})`);
  console.log(
    `four at once: ${four.map((f) => `${ms(f.ms)} (${f.value})`).join(', ')}; a fifth meanwhile: ${fifth ?? 'not sent, the four had finished'}`,
  );
  console.log(summary('/api/health alone', idle));
  console.log(summary('/api/health while the four fits ran', during));
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
