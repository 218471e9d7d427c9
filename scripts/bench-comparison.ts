/**
 * Speed of a batch comparison over 100 000 seeded drops (prints figures; no pass/fail).
 *
 *   DATABASE_URL=postgres://…/any_db npm run bench:comparison [-- --runs 15]
 *
 * Creates a scratch database beadline_bench_<random> on the server of DATABASE_URL (or of
 * DATABASE_ADMIN_URL when set), applies the migrations, seeds 5 coatings × 40 batches × 5
 * samples × 100 drops (60 water, 40 diiodomethane) with one analysis each and a second revision
 * for about one drop in ten, all by bulk SQL (generate_series, no photos). Then it times the
 * comparison of one coating — the query (db/queries/comparison.ts) plus lib/compare — for an
 * analyst (every latest analysis) and a viewer (approved only), and prints median, min and max.
 * With the surface-energy limit each compared batch also gets its OWRK value (Monte Carlo,
 * 2000 draws). The scratch database is dropped at the end. Target: under 300 ms.
 */
import { randomBytes } from 'node:crypto';
import postgres from 'postgres';
import { runMigrations } from '../db/migrate';

const runs = (() => {
  const i = process.argv.indexOf('--runs');
  return i >= 0 ? Math.max(1, Number(process.argv[i + 1])) : 15;
})();

const serverUrl = process.env.DATABASE_ADMIN_URL ?? process.env.DATABASE_URL;
if (!serverUrl) {
  console.error('Set DATABASE_URL (any database on the PostgreSQL server to use).');
  process.exit(2);
}

const median = (values: number[]) => {
  const s = [...values].sort((a, b) => a - b);
  return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};
const ms = (v: number) => `${v.toFixed(1)} ms`;

const ORG = 'bench-org';

async function seed(sql: postgres.Sql): Promise<void> {
  await sql.begin(async (tx) => {
    await tx`insert into organizations (id, name, slug) values (${ORG}, 'Bench lab', 'bench-lab')`;
    await tx.unsafe(`
      insert into coatings (id, organization_id, code, name)
      select 'c' || c, '${ORG}', 'BC-' || c, 'Bench coating ' || c from generate_series(1, 5) c;

      insert into specs (id, organization_id, coating_id, probe_liquid_id, min_deg, scope, note)
      select 'spec-each-' || c, '${ORG}', 'c' || c, 'liquid-water', 100, 'each-drop'::spec_scope, ''
      from generate_series(1, 5) c
      union all
      select 'spec-mean-' || c, '${ORG}', 'c' || c, 'liquid-water', 105, 'mean'::spec_scope, ''
      from generate_series(1, 5) c;
      -- A surface-energy limit too, so every batch also gets its OWRK value and verdict.
      update specs set min_surface_energy_mn_m = 20 where id like 'spec-mean-%';

      insert into batches (id, organization_id, coating_id, lot_code, produced_on)
      select 'b' || c || '-' || b, '${ORG}', 'c' || c, 'L' || c || '-' || lpad(b::text, 3, '0'),
             date '2025-01-06' + 7 * b
      from generate_series(1, 5) c, generate_series(1, 40) b;

      insert into samples (id, organization_id, batch_id, label, treated_at)
      select 's' || c || '-' || b || '-' || s, '${ORG}', 'b' || c || '-' || b, 'P' || s,
             timestamptz '2025-01-06 08:00+00' + make_interval(days => 7 * b)
      from generate_series(1, 5) c, generate_series(1, 40) b, generate_series(1, 5) s;

      insert into drops (id, organization_id, sample_id, probe_liquid_id, source, measured_at)
      select 'd' || c || '-' || b || '-' || s || '-' || k, '${ORG}', 's' || c || '-' || b || '-' || s,
             case when k <= 60 then 'liquid-water' else 'liquid-diiodomethane' end, 'import',
             timestamptz '2025-01-08 08:00+00' + make_interval(days => 7 * b, mins => k)
      from generate_series(1, 5) c, generate_series(1, 40) b, generate_series(1, 5) s,
           generate_series(1, 100) k;
    `);
    // Water around 108° drifting down over the batches, diiodomethane around 42°.
    await tx.unsafe(`
      with base as (
        select d.id, d.probe_liquid_id,
               case when d.probe_liquid_id = 'liquid-water'
                    then 110 - 0.1 * split_part(d.id, '-', 2)::int
                    else 42 end
               + (random() - 0.5) * 6 as angle
        from drops d
      )
      insert into analyses (id, organization_id, drop_id, revision, method, result, left_deg,
                            right_deg, mean_deg, software_version, review_status)
      select 'a1-' || id, '${ORG}', id, 1, 'young-laplace', '{}'::jsonb, angle - 0.4, angle + 0.4,
             angle, 'bench',
             (array['draft', 'submitted', 'approved', 'approved']::review_status[])[1 + abs(hashtext(id)) % 4]
      from base;

      insert into analyses (id, organization_id, drop_id, revision, method, result, left_deg,
                            right_deg, mean_deg, software_version, review_status)
      select 'a2-' || drop_id, organization_id, drop_id, 2, method, result, left_deg + 0.3,
             right_deg + 0.3, mean_deg + 0.3, software_version, 'approved'
      from analyses where abs(hashtext(drop_id)) % 10 = 0;
    `);
  });
  await sql`analyze`;
}

async function main() {
  const name = `beadline_bench_${randomBytes(4).toString('hex')}`;
  const admin = postgres(serverUrl as string, { max: 1, onnotice: () => undefined });
  const url = new URL(serverUrl as string);
  url.pathname = `/${name}`;
  await admin.unsafe(`create database "${name}"`);
  console.log(`[bench] scratch database ${name}`);
  let closeDb: (() => Promise<void>) | null = null;
  try {
    await runMigrations(url.toString());
    process.env.DATABASE_URL = url.toString();
    const { ensureProbeLiquidLibrary } = await import('../db/probe-liquid-library');
    const client = await import('../db/client');
    closeDb = client.closeDb;
    await ensureProbeLiquidLibrary(client.getDb());

    let started = performance.now();
    await seed(client.getSql());
    const [{ drops, analyses }] = await client.getSql()<{ drops: string; analyses: string }[]>`
      select (select count(*) from drops) as drops, (select count(*) from analyses) as analyses`;
    console.log(
      `[bench] seeded ${drops} drops, ${analyses} analyses in ${ms(performance.now() - started)}`,
    );

    const { loadComparison } = await import('../db/queries/comparison');
    const { buildComparison } = await import('../lib/compare/build');
    for (const [label, visibility] of [
      ['analyst (every latest analysis)', 'all'],
      ['viewer (approved only)', 'approved'],
    ] as const) {
      const total: number[] = [];
      const query: number[] = [];
      let dropCount = 0;
      for (let i = 0; i < runs + 2; i++) {
        started = performance.now();
        const data = await loadComparison(ORG, 'c3', { visibility });
        const afterQuery = performance.now();
        const comparison = buildComparison(data);
        const end = performance.now();
        dropCount = data.drops.length;
        if (comparison.liquids.length === 0) throw new Error('empty comparison');
        if (i >= 2) {
          // The first two runs warm the connection pool and the JIT.
          query.push(afterQuery - started);
          total.push(end - started);
        }
      }
      console.log(
        `[bench] ${label}: coating BC-3, newest 12 batches, ${dropCount} drops, ${runs} runs\n` +
          `        query + lib/compare: median ${ms(median(total))}, min ${ms(Math.min(...total))}, max ${ms(Math.max(...total))}\n` +
          `        query alone:         median ${ms(median(query))}, min ${ms(Math.min(...query))}, max ${ms(Math.max(...query))}`,
      );
    }
    console.log('[bench] target: < 300 ms per comparison');
  } finally {
    if (closeDb) await closeDb();
    await admin.unsafe(`drop database if exists "${name}" with (force)`);
    await admin.end({ timeout: 5 });
    console.log(`[bench] dropped ${name}`);
  }
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
