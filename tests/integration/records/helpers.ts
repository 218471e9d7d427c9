import { randomBytes } from 'node:crypto';
import { and, eq, gt, max } from 'drizzle-orm';
import { getDb } from '@/db/client';
import { ensureProbeLiquidLibrary } from '@/db/probe-liquid-library';
import { auditEvents } from '@/db/schema';
import { ROLES, type Role } from '@/lib/auth/permissions';
import * as batchesRoute from '@/app/api/batches/route';
import * as batchRoute from '@/app/api/batches/[id]/route';
import * as coatingsRoute from '@/app/api/coatings/route';
import * as coatingRoute from '@/app/api/coatings/[id]/route';
import * as sessionsRoute from '@/app/api/measurement-sessions/route';
import * as sessionRoute from '@/app/api/measurement-sessions/[id]/route';
import * as liquidsRoute from '@/app/api/probe-liquids/route';
import * as liquidRoute from '@/app/api/probe-liquids/[id]/route';
import * as samplesRoute from '@/app/api/samples/route';
import * as sampleRoute from '@/app/api/samples/[id]/route';
import * as specsRoute from '@/app/api/specs/route';
import * as specRoute from '@/app/api/specs/[id]/route';
import { apiRequest } from '../support/request';
import { createMember, createOrganization } from '../support/fixtures';

/** A route handler as Next calls it; collection handlers ignore the second argument. */
type Handler = (
  request: Request,
  context: { params: Promise<{ id: string }> },
) => Promise<Response>;

export type Resource = {
  collection: { GET: Handler; POST: Handler };
  item: { GET: Handler; PATCH: Handler; DELETE: Handler };
  path: string;
  /** The key of the record in single-record responses ({ coating }, { batch }, …). */
  key: string;
  entityType: string;
};

export const resources = {
  coatings: {
    collection: coatingsRoute,
    item: coatingRoute,
    path: '/api/coatings',
    key: 'coating',
    entityType: 'coating',
  },
  specs: {
    collection: specsRoute,
    item: specRoute,
    path: '/api/specs',
    key: 'spec',
    entityType: 'spec',
  },
  batches: {
    collection: batchesRoute,
    item: batchRoute,
    path: '/api/batches',
    key: 'batch',
    entityType: 'batch',
  },
  samples: {
    collection: samplesRoute,
    item: sampleRoute,
    path: '/api/samples',
    key: 'sample',
    entityType: 'sample',
  },
  probeLiquids: {
    collection: liquidsRoute,
    item: liquidRoute,
    path: '/api/probe-liquids',
    key: 'probeLiquid',
    entityType: 'probe_liquid',
  },
  measurementSessions: {
    collection: sessionsRoute,
    item: sessionRoute,
    path: '/api/measurement-sessions',
    key: 'measurementSession',
    entityType: 'measurement_session',
  },
} satisfies Record<string, Resource>;

type CallOptions = { sessionId: string; body?: unknown; query?: string; origin?: string | null };

async function send(
  handler: Handler,
  path: string,
  method: string,
  id: string,
  options: CallOptions,
) {
  const url = options.query ? `${path}?${options.query}` : path;
  const response = await handler(
    apiRequest(url, {
      method,
      sessionId: options.sessionId,
      body: options.body,
      origin: options.origin,
    }),
    { params: Promise.resolve({ id }) },
  );
  return { status: response.status, body: await response.json() };
}

export const api = {
  list: (r: Resource, options: CallOptions) => send(r.collection.GET, r.path, 'GET', '', options),
  create: (r: Resource, options: CallOptions) =>
    send(r.collection.POST, r.path, 'POST', '', options),
  get: (r: Resource, id: string, options: CallOptions) =>
    send(r.item.GET, `${r.path}/${id}`, 'GET', id, options),
  update: (r: Resource, id: string, options: CallOptions) =>
    send(r.item.PATCH, `${r.path}/${id}`, 'PATCH', id, options),
  remove: (r: Resource, id: string, options: CallOptions) =>
    send(r.item.DELETE, `${r.path}/${id}`, 'DELETE', id, options),
};

export type Member = Awaited<ReturnType<typeof createMember>>;
export type Lab = { id: string; members: Record<Role, Member> };

/** An organization with one member per role. */
export async function createLab(): Promise<Lab> {
  const organization = await createOrganization();
  const members = {} as Record<Role, Member>;
  for (const role of ROLES) members[role] = await createMember(organization.id, role);
  return { id: organization.id, members };
}

export async function ensureLibrary(): Promise<void> {
  await ensureProbeLiquidLibrary(getDb());
}

export const unique = (prefix: string) =>
  `${prefix}-${randomBytes(3).toString('hex').toUpperCase()}`;

/** Audit rows of one record, oldest first. */
export async function auditOf(entityType: string, entityId: string) {
  return getDb()
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.entityType, entityType), eq(auditEvents.entityId, entityId)))
    .orderBy(auditEvents.id);
}

/** The id of the newest audit row so far; pass it to auditSince to see what a step wrote. */
export async function lastAuditId(): Promise<number> {
  const [row] = await getDb()
    .select({ id: max(auditEvents.id) })
    .from(auditEvents);
  return row?.id ?? 0;
}

export async function auditSince(organizationId: string, afterId: number) {
  return getDb()
    .select()
    .from(auditEvents)
    .where(and(eq(auditEvents.organizationId, organizationId), gt(auditEvents.id, afterId)))
    .orderBy(auditEvents.id);
}

// Bodies of valid records (invented data).
export const bodies = {
  coating: (code = unique('HT')) => ({
    code,
    name: `Test topcoat ${code}`,
    description: 'Fluorine-free topcoat',
  }),
  spec: (coatingId: string, probeLiquidId = 'liquid-water') => ({
    coatingId,
    probeLiquidId,
    scope: 'each-drop',
    minDeg: 100,
    note: 'Water, per drop',
  }),
  batch: (coatingId: string, lotCode = unique('B')) => ({
    coatingId,
    lotCode,
    producedOn: '2026-03-14',
    process: { cureTemperatureC: 180, cureTimeMin: 20 },
    notes: 'Trial lot',
  }),
  sample: (batchId: string, label = unique('P')) => ({
    batchId,
    label,
    substrate: 'Aluminium panel',
    position: 'edge',
    treatedAt: '2026-03-14T08:00:00Z',
  }),
  probeLiquid: (name = unique('Water lab supply')) => ({
    name,
    totalMnM: 72.1,
    dispersiveMnM: 21.8,
    polarMnM: 50.3,
    densityGPerCm3: 0.997,
    sources: { total: 'Measured in house by Wilhelmy plate, 23 °C' },
  }),
  measurementSession: (probeLiquidId: string | null = 'liquid-water') => ({
    operatorName: 'Test operator',
    measuredAt: '2026-03-15T09:30:00Z',
    probeLiquidId,
    temperatureC: 22.5,
    humidityPct: 45,
    dropVolumeUl: 3,
    scalePxPerMm: 210.5,
    instrumentNotes: 'Backlight at 80 %',
  }),
};

/** Creates a record through the API as `sessionId` and returns its id (throws unless 201). */
export async function created(r: Resource, sessionId: string, body: unknown): Promise<string> {
  const response = await api.create(r, { sessionId, body });
  if (response.status !== 201) {
    throw new Error(
      `creating a ${r.key} answered ${response.status}: ${JSON.stringify(response.body)}`,
    );
  }
  return response.body[r.key].id;
}

/** The probe-liquid library, a lab with one member per role, and a coating with one batch. */
export async function labWithBatch() {
  await ensureLibrary();
  const lab = await createLab();
  const admin = lab.members.admin.sessionId;
  const coatingId = await created(resources.coatings, admin, bodies.coating());
  const batchId = await created(resources.batches, admin, bodies.batch(coatingId));
  return { lab, admin, analyst: lab.members.analyst.sessionId, coatingId, batchId };
}
