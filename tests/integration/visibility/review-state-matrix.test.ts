import { readdirSync } from 'node:fs';
import path from 'node:path';
import { eq, and } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, getDb } from '@/db/client';
import { newId } from '@/db/queries/ids';
import { builtInProbeLiquidId } from '@/db/probe-liquid-library';
import { analyses, batches, coatingWatchers, memberships, reviews } from '@/db/schema';
import type { OrgContext } from '@/lib/auth/context';
import { ROLES, type Role } from '@/lib/auth/permissions';
import { sampleListQuerySchema } from '@/lib/contracts/samples';
import * as batchSurfaceEnergy from '@/app/api/batches/[id]/surface-energy/route';
import * as sampleSurfaceEnergy from '@/app/api/samples/[id]/surface-energy/route';
import * as batchReport from '@/app/api/batches/[id]/report/route';
import * as compareCsv from '@/app/api/compare/drops.csv/route';
import { refreshBatchVerdict } from '@/server/alerts/refresh-verdict';
import { loadComparePage } from '@/server/compare/load';
import { loadDashboard } from '@/server/dashboard/load';
import { loadDropPage } from '@/server/drops/load';
import { loadBatchPage } from '@/server/records/detail-pages';
import { loadSurfaceEnergyPage } from '@/server/surface-energy/read';
import { createMember, createOrganization } from '../support/fixtures';
import { apiRequest } from '../support/request';
import * as seed from '../support/seed';
import { ensureLibrary } from '../records/helpers';
import { mailJobsTo } from '../team/support';

/*
 * Issue 12, failure 3: one visibility rule for review state (db/queries/visibility.ts). For every
 * role × every resource that shows results × every review state, the results are shown exactly
 * when the role may read every result (admin, analyst, reviewer) or the results are approved.
 */

const STATES = ['draft', 'submitted', 'rejected', 'approved', 'revoked'] as const;
type State = (typeof STATES)[number];
type Member = Awaited<ReturnType<typeof createMember>>;
type Fixture = {
  state: State;
  lab: { id: string; name: string };
  members: Record<Role, Member>;
  coatingCode: string;
  lotCode: string;
  batchId: string;
  sampleId: string;
  dropId: string;
};

const WATER = builtInProbeLiquidId('water');
const DIIODOMETHANE = builtInProbeLiquidId('diiodomethane');

/**
 * A lab of its own (so the dashboard's newest drops are this batch's) with one member per role
 * and one batch whose six results (water and diiodomethane, invented angles) are in `state`,
 * with a saved surface-energy result computed from them.
 */
async function labIn(state: State): Promise<Fixture> {
  const lab = await createOrganization();
  const members = {} as Record<Role, Member>;
  for (const role of ROLES) members[role] = await createMember(lab.id, role);
  const coatingCode = `VM-${newId().slice(0, 6)}`;
  const lotCode = `L-${state}`;
  const coatingId = await seed.insertCoating(lab.id, coatingCode);
  const batchId = await seed.insertBatch(lab.id, coatingId, lotCode);
  const sampleId = await seed.insertSample(lab.id, batchId, 'S1');
  const stored = state === 'revoked' ? 'draft' : state;
  const dropIds: string[] = [];
  for (const [probeLiquidId, means] of [
    [WATER, [96, 97, 98]],
    [DIIODOMETHANE, [51, 52, 53]],
  ] as const) {
    for (const meanDeg of means) {
      dropIds.push(
        await seed.insertDrop(lab.id, sampleId, {
          probeLiquidId,
          revisions: [{ meanDeg, reviewStatus: stored }],
        }),
      );
    }
  }
  const analysisIds = (
    await getDb()
      .select({ id: analyses.id })
      .from(analyses)
      .where(eq(analyses.organizationId, lab.id))
  ).map((a) => a.id);
  if (state === 'approved' || state === 'revoked') {
    await getDb()
      .insert(reviews)
      .values({
        id: newId(),
        organizationId: lab.id,
        scope: 'batch',
        batchId,
        analysisIds,
        status: state,
        submittedByUserId: members.analyst.userId,
        decidedByUserId: members.reviewer.userId,
        decidedAt: new Date(),
        signature: {
          name: 'Test reviewer',
          email: members.reviewer.email,
          signedAt: new Date().toISOString(),
          method: 'password-reconfirmed',
          digest: 'test',
        },
        ...(state === 'revoked'
          ? { revokedAt: new Date(), revokeReason: 'Stage was tilted.' }
          : {}),
      });
  }
  // Saved by the analyst, who sees every result: the saved inputs name all six analyses.
  const saved = await call(
    batchSurfaceEnergy.POST,
    `/api/batches/${batchId}/surface-energy`,
    members.analyst,
    {
      method: 'POST',
      body: { methods: ['owrk'] },
      params: { id: batchId },
    },
  );
  expect(saved.status).toBe(201);
  return { state, lab, members, coatingCode, lotCode, batchId, sampleId, dropId: dropIds[0] };
}

type Handler = (
  request: Request,
  context: { params: Promise<{ id: string }> },
) => Promise<Response>;

async function call(
  handler: Handler,
  url: string,
  member: Member,
  options: { method?: string; body?: unknown; params?: { id: string } } = {},
) {
  const response = await handler(
    apiRequest(url, {
      method: options.method ?? 'GET',
      sessionId: member.sessionId,
      body: options.body,
    }),
    { params: Promise.resolve(options.params ?? { id: '' }) },
  );
  return { status: response.status, response };
}

function ctxOf(f: Fixture, role: Role): OrgContext {
  const m = f.members[role];
  return {
    user: { id: m.userId, email: m.email, name: `Test ${role}` },
    sessionId: m.sessionId,
    organization: { id: f.lab.id, name: f.lab.name, role },
    memberships: [],
  };
}

type AngleRow = { n: number };
const seShows = (body: { angleTable: AngleRow[]; saved: unknown[] }) =>
  body.angleTable.some((r) => r.n > 0) || body.saved.length > 0;

/**
 * Every resource that shows results, and whether it shows this batch's results to `role`.
 * A refusal (403) shows nothing.
 */
const RESOURCES: Record<string, (f: Fixture, role: Role) => Promise<boolean>> = {
  'GET /api/batches/[id]/surface-energy': async (f, role) => {
    const r = await call(
      batchSurfaceEnergy.GET,
      `/api/batches/${f.batchId}/surface-energy`,
      f.members[role],
      {
        params: { id: f.batchId },
      },
    );
    return r.status === 200 && seShows(await r.response.json());
  },
  'GET /api/samples/[id]/surface-energy': async (f, role) => {
    const r = await call(
      sampleSurfaceEnergy.GET,
      `/api/samples/${f.sampleId}/surface-energy`,
      f.members[role],
      {
        params: { id: f.sampleId },
      },
    );
    return r.status === 200 && seShows(await r.response.json());
  },
  'GET /api/batches/[id]/report (certificate PDF)': async (f, role) => {
    const r = await call(batchReport.GET, `/api/batches/${f.batchId}/report`, f.members[role], {
      params: { id: f.batchId },
    });
    // 202: the certificate is being built for this reader (a job, server/reports/certificate.ts).
    if (r.status === 202) return true;
    if (r.status !== 200) {
      expect(r.status).toBe(403);
      return false;
    }
    return (await r.response.arrayBuffer()).byteLength > 0;
  },
  'GET /api/compare/drops.csv': async (f, role) => {
    const r = await call(
      compareCsv.GET,
      `/api/compare/drops.csv?coating=${f.coatingCode}&batches=${f.lotCode}`,
      f.members[role],
    );
    return r.status === 200 && (await r.response.text()).includes(f.lotCode);
  },
  'page /batches/[id]': async (f, role) => {
    const page = await loadBatchPage(
      ctxOf(f, role),
      f.batchId,
      sampleListQuerySchema.parse({ batchId: f.batchId }),
    );
    return (
      (page?.drops.length ?? 0) > 0 ||
      (page?.samples.items ?? []).some((s) => s.meanWaterDeg !== null)
    );
  },
  'page /compare': async (f, role) => {
    const page = await loadComparePage(ctxOf(f, role), {
      coating: f.coatingCode,
      batches: [f.lotCode],
    } as never);
    return (page.data?.drops.length ?? 0) > 0;
  },
  'page /surface-energy': async (f, role) => {
    const page = await loadSurfaceEnergyPage(ctxOf(f, role), { batchId: f.batchId });
    return (
      page.evaluation !== null &&
      (page.evaluation.angleTable.some((r) => r.n > 0) || page.saved.length > 0)
    );
  },
  'page /drops/[id]': async (f, role) => {
    const page = await loadDropPage(ctxOf(f, role), f.dropId);
    return (page?.revisions.length ?? 0) > 0;
  },
  'page /dashboard': async (f, role) => {
    const page = await loadDashboard(ctxOf(f, role));
    return page.drops.some((d) => d.lotCode === f.lotCode);
  },
};

const fixtures = new Map<State, Fixture>();

beforeAll(async () => {
  await ensureLibrary();
  for (const state of STATES) fixtures.set(state, await labIn(state));
}, 120_000);

afterAll(async () => {
  await closeDb();
});

describe('role × resource × review state', () => {
  for (const [resource, shows] of Object.entries(RESOURCES)) {
    it(`${resource}: every result for admin, analyst and reviewer; approved results only for viewers`, async () => {
      const seen: string[] = [];
      const expected: string[] = [];
      for (const state of STATES) {
        const f = fixtures.get(state)!;
        for (const role of ROLES) {
          // Exports need results:export, which viewers do not have.
          const mayExport = role !== 'viewer' || !resource.includes('.csv');
          const expectShown = mayExport && (role !== 'viewer' || state === 'approved');
          if (expectShown) expected.push(`${role}/${state}`);
          if (await shows(f, role)) seen.push(`${role}/${state}`);
        }
      }
      expect(seen).toEqual(expected);
    }, 120_000);
  }
});

describe('e-mails', () => {
  it('an out-of-spec alert (computed from every latest result) goes only to watchers who may see them all', async () => {
    const f = fixtures.get('draft')!;
    const coatingId = await coatingOf(f);
    await seed.insertWaterSpec(f.lab.id, coatingId, 110);
    for (const role of ['reviewer', 'analyst'] as const) {
      await getDb()
        .insert(coatingWatchers)
        .values({ organizationId: f.lab.id, userId: f.members[role].userId, coatingId });
    }
    // The analyst watched, then became a viewer: draft results are no longer theirs to see.
    await getDb()
      .update(memberships)
      .set({ role: 'viewer' })
      .where(
        and(
          eq(memberships.userId, f.members.analyst.userId),
          eq(memberships.organizationId, f.lab.id),
        ),
      );
    expect(await refreshBatchVerdict(f.lab.id, f.batchId)).toBe('fail');
    const kinds = async (email: string) =>
      (await mailJobsTo(email)).filter((m) => m.data.kind === 'out-of-spec');
    expect(await kinds(f.members.reviewer.email)).toHaveLength(1);
    expect(await kinds(f.members.analyst.email)).toHaveLength(0);
  });
});

async function coatingOf(f: Fixture): Promise<string> {
  const [row] = await getDb()
    .select({ coatingId: batches.coatingId })
    .from(batches)
    .where(eq(batches.id, f.batchId));
  return row.coatingId;
}

/*
 * Every route and page, classified. A new one fails this test until it is placed: in RESOURCES
 * above when it shows results, or here with the reason it does not need to be there.
 */
const NOT_IN_MATRIX: Record<string, string> = {
  // Refused to viewers by their access (results:read-all, results:export, records:write, …).
  'api/photos/[id]/drop': 'results:read-all',
  'api/photos/[id]/image': 'results:read-all',
  'api/photos/[id]/thumbnail': 'results:read-all',
  'api/photos/[id]/pixels': 'results:read-all',
  'api/reviews': 'results:read-all',
  'api/reviews/[id]/decision': 'review:decide',
  'api/reviews/[id]/revocation': 'review:decide',
  'api/batches/export.csv': 'results:export (records, no results)',
  'api/samples/export.csv': 'results:export',
  'api/coatings/export.csv': 'results:export (records, no results)',
  'api/specs/export.csv': 'results:export (records, no results)',
  'api/probe-liquids/export.csv': 'results:export (records, no results)',
  'api/measurement-sessions/export.csv': 'results:export (records, no results)',
  'api/batches/[id]/import': 'records:write',
  'api/coatings/[id]/watch': 'results:read-all',
  'api/uploadthing': 'records:write (uploads)',
  'api/photos/remove': 'records:write',
  // Records, team, account and service routes: no analysis results in them.
  'api/batches': 'records',
  'api/batches/[id]': 'records',
  'api/coatings': 'records',
  'api/coatings/[id]': 'records',
  'api/samples': 'records',
  'api/samples/[id]': 'records',
  'api/specs': 'records',
  'api/specs/[id]': 'records',
  'api/probe-liquids': 'records',
  'api/probe-liquids/[id]': 'records',
  'api/measurement-sessions': 'records',
  'api/measurement-sessions/[id]': 'records',
  'api/invitations': 'team',
  'api/invitations/[id]': 'team',
  'api/team/members': 'team',
  'api/team/members/[userId]': 'team',
  'api/organization': 'account',
  'api/me': 'account',
  'api/health': 'service',
  'api/opencv-wasm': 'service',
  // Computations from numbers the user sends, and tensiometry (not under review).
  'api/surface-energy/calculate': 'computes what is sent',
  'api/tensiometry': 'tensiometry, not under review',
  'api/tensiometry/pendant-drop': 'tensiometry, not under review',
  'api/tensiometry/water-check': 'tensiometry, not under review',
  'api/tensiometry/wilhelmy': 'tensiometry, not under review',
  // Dynamic wetting: reading a measurement needs results:read-all, saving records:write.
  'api/dynamic-measurements': 'records:write',
  'api/dynamic-measurements/[id]': 'results:read-all',
  // The versioned API answers API tokens only (never a session); a token's read scope is
  // results:read-all and its measure scope records:write (lib/auth/permissions.ts).
  'api/v1/openapi.json': 'service (the API description, no results)',
  'api/v1/batches': 'API token scope',
  'api/v1/batches/[id]': 'API token scope',
  'api/v1/batches/[id]/verdict': 'API token scope',
  'api/v1/coatings': 'API token scope',
  'api/v1/coatings/[id]': 'API token scope',
  'api/v1/drops': 'API token scope',
  'api/v1/drops/[id]': 'API token scope',
  'api/v1/photos': 'API token scope',
  'api/v1/probe-liquids': 'API token scope',
  'api/v1/probe-liquids/[id]': 'API token scope',
  'api/v1/reviews': 'API token scope',
  'api/v1/reviews/[id]': 'API token scope',
  'api/v1/samples': 'API token scope',
  'api/v1/samples/[id]': 'API token scope',
  'api/v1/sessions': 'API token scope',
  'api/v1/sessions/[id]': 'API token scope',
  '(app)/api-reference': 'service (the API description, no results)',
  '(app)/team/api': 'team (admins: API tokens)',
  '(app)/team/webhooks': 'team (admins: webhooks, team:manage)',
  '(app)/team/webhooks/[id]': 'team (admins: a webhook’s delivery log, team:manage)',
  // Pages: through the services in RESOURCES, or without results.
  '(app)/reviews': 'results:read-all',
  '(app)/reviews/[id]': 'results:read-all',
  '(app)/measure': 'records:write',
  '(app)/dynamic-wetting': 'records:write (analyses in the browser; saved results via api/dynamic-measurements)',
  '(app)/batches/[id]/import': 'records:write',
  '(app)/audit': 'audit:read',
  '(app)/batches': 'records',
  '(app)/coatings': 'records',
  '(app)/coatings/[id]': 'records',
  '(app)/probe-liquids': 'records',
  '(app)/sessions': 'records',
  '(app)/team': 'team',
  '(app)/tensiometry': 'tensiometry, not under review',
};

function routesUnder(dir: string, file: string, prefix: string): string[] {
  const out: string[] = [];
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...routesUnder(full, file, `${prefix}${entry.name}/`));
    else if (entry.name === file) out.push(prefix.replace(/\/$/, ''));
  }
  return out;
}

describe('the matrix covers every route', () => {
  it('each route handler and signed-in page is in the matrix or classified', () => {
    const app = path.resolve(__dirname, '../../../app');
    const found = [
      ...routesUnder(path.join(app, 'api'), 'route.ts', 'api/'),
      ...routesUnder(path.join(app, '(app)'), 'page.tsx', '(app)/'),
    ];
    const inMatrix = Object.keys(RESOURCES).map((r) =>
      r.replace(/^(GET|page) \//, '').replace(/ .*$/, ''),
    );
    const placed = (route: string) =>
      route in NOT_IN_MATRIX ||
      inMatrix.includes(route) ||
      inMatrix.includes(route.replace(/^\(app\)\//, ''));
    expect(found.filter((route) => !placed(route))).toEqual([]);
  });
});
