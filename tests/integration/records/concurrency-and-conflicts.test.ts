/**
 * Optimistic concurrency (409 stale_version with the current record), unique conflicts (409
 * duplicate naming the field) and references to another organization's records (404 naming
 * the field). None of the refused changes writes an audit row.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import {
  api,
  auditOf,
  auditSince,
  bodies,
  created,
  labWithBatch,
  lastAuditId,
  resources,
  type Lab,
} from './helpers';

let lab: Lab;
let otherLab: Lab;
let admin: string;
let coatingId: string;
let batchId: string;
let foreignCoatingId: string;
let foreignBatchId: string;
let foreignLiquidId: string;

beforeAll(async () => {
  ({ lab, admin, coatingId, batchId } = await labWithBatch());
  const other = await labWithBatch();
  otherLab = other.lab;
  foreignCoatingId = other.coatingId;
  foreignBatchId = other.batchId;
  foreignLiquidId = await created(resources.probeLiquids, other.admin, bodies.probeLiquid());
});

afterAll(async () => {
  await closeDb();
});

describe('optimistic concurrency', () => {
  it('a stale update gets 409 stale_version with the current record, and changes nothing', async () => {
    const created = await api.create(resources.coatings, {
      sessionId: admin,
      body: bodies.coating(),
    });
    const id = created.body.coating.id;
    const first = await api.update(resources.coatings, id, {
      sessionId: admin,
      body: { version: 1, name: 'First edit' },
    });
    expect(first.status).toBe(200);
    expect(first.body.coating.version).toBe(2);

    const mark = await lastAuditId();
    const second = await api.update(resources.coatings, id, {
      sessionId: admin,
      body: { version: 1, name: 'Second edit from an old page' },
    });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('stale_version');
    expect(second.body.error.message).toMatch(/changed/);
    expect(second.body.current).toMatchObject({ id, name: 'First edit', version: 2 });
    expect(await auditSince(lab.id, mark)).toEqual([]);

    const retried = await api.update(resources.coatings, id, {
      sessionId: admin,
      body: { version: second.body.current.version, name: 'Second edit' },
    });
    expect(retried.status).toBe(200);
    expect(retried.body.coating).toMatchObject({ name: 'Second edit', version: 3 });
  });

  it('the same holds for batches, samples and sessions (analyst)', async () => {
    const analyst = lab.members.analyst.sessionId;
    const sample = (
      await api.create(resources.samples, { sessionId: analyst, body: bodies.sample(batchId) })
    ).body.sample;
    await api.update(resources.samples, sample.id, {
      sessionId: analyst,
      body: { version: 1, notes: 'a' },
    });
    const stale = await api.update(resources.samples, sample.id, {
      sessionId: analyst,
      body: { version: 1, notes: 'b' },
    });
    expect(stale.status).toBe(409);
    expect(stale.body.current).toMatchObject({ id: sample.id, notes: 'a', version: 2 });

    const session = (
      await api.create(resources.measurementSessions, {
        sessionId: analyst,
        body: bodies.measurementSession(),
      })
    ).body.measurementSession;
    await api.update(resources.measurementSessions, session.id, {
      sessionId: analyst,
      body: { version: 1, temperatureC: 23 },
    });
    const staleSession = await api.update(resources.measurementSessions, session.id, {
      sessionId: analyst,
      body: { version: 1, temperatureC: 24 },
    });
    expect(staleSession.status).toBe(409);
    expect(staleSession.body.current.temperatureC).toBe(23);
  });

  it('an update without a version is refused (400 naming version)', async () => {
    const response = await api.update(resources.batches, batchId, {
      sessionId: admin,
      body: { notes: 'x' },
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields.version).toMatch(/version/);
  });

  it('a DELETE with a stale ?version= gets 409 with the current record', async () => {
    const id = (await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() }))
      .body.coating.id;
    await api.update(resources.coatings, id, {
      sessionId: admin,
      body: { version: 1, description: 'changed' },
    });
    const response = await api.remove(resources.coatings, id, {
      sessionId: admin,
      query: 'version=1',
    });
    expect(response.status).toBe(409);
    expect(response.body.current).toMatchObject({ id, version: 2 });
    expect((await api.get(resources.coatings, id, { sessionId: admin })).status).toBe(200);
  });

  it('an archived record can no longer be changed (409 archived)', async () => {
    const id = (await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() }))
      .body.coating.id;
    const archived = await api.remove(resources.coatings, id, {
      sessionId: admin,
      query: 'mode=archive',
    });
    const response = await api.update(resources.coatings, id, {
      sessionId: admin,
      body: { version: archived.body.coating.version, name: 'Too late' },
    });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('archived');
  });
});

describe('unique conflicts', () => {
  it('a second coating with the same code gets 409 duplicate naming code', async () => {
    const body = bodies.coating();
    expect((await api.create(resources.coatings, { sessionId: admin, body })).status).toBe(201);
    const mark = await lastAuditId();
    const again = await api.create(resources.coatings, {
      sessionId: admin,
      body: { ...body, name: 'Other' },
    });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('duplicate');
    expect(again.body.error.fields.code).toMatch(/already has this code/);
    expect(await auditSince(lab.id, mark)).toEqual([]);
  });

  it('renaming a coating onto another’s code gets 409 duplicate', async () => {
    const taken = bodies.coating();
    await api.create(resources.coatings, { sessionId: admin, body: taken });
    const other = (
      await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() })
    ).body.coating;
    const response = await api.update(resources.coatings, other.id, {
      sessionId: admin,
      body: { version: 1, code: taken.code },
    });
    expect(response.status).toBe(409);
    expect(response.body.error.fields).toHaveProperty('code');
    expect(
      (await api.get(resources.coatings, other.id, { sessionId: admin })).body.coating.version,
    ).toBe(1);
  });

  it('the same code in another organization is fine', async () => {
    const body = bodies.coating();
    expect((await api.create(resources.coatings, { sessionId: admin, body })).status).toBe(201);
    expect(
      (await api.create(resources.coatings, { sessionId: otherLab.members.admin.sessionId, body }))
        .status,
    ).toBe(201);
  });

  it('lot codes are unique in the organization (409 naming lotCode)', async () => {
    const body = bodies.batch(coatingId);
    expect((await api.create(resources.batches, { sessionId: admin, body })).status).toBe(201);
    const again = await api.create(resources.batches, { sessionId: admin, body });
    expect(again.status).toBe(409);
    expect(again.body.error.fields.lotCode).toMatch(/lot code/);
  });

  it('sample labels are unique within a batch, not across batches', async () => {
    const body = bodies.sample(batchId);
    expect((await api.create(resources.samples, { sessionId: admin, body })).status).toBe(201);
    const again = await api.create(resources.samples, { sessionId: admin, body });
    expect(again.status).toBe(409);
    expect(again.body.error.fields.label).toMatch(/label/);
    const otherBatch = (
      await api.create(resources.batches, { sessionId: admin, body: bodies.batch(coatingId) })
    ).body.batch;
    const elsewhere = await api.create(resources.samples, {
      sessionId: admin,
      body: { ...body, batchId: otherBatch.id },
    });
    expect(elsewhere.status).toBe(201);
  });
});

describe('references to another organization’s records', () => {
  const expectRefused = (
    response: { status: number; body: { error: { code: string; fields: Record<string, string> } } },
    field: string,
  ) => {
    expect(response.status).toBe(404);
    expect(response.body.error.code).toBe('not_found');
    expect(Object.keys(response.body.error.fields)).toEqual([field]);
  };
  /** An admin's new record whose `field` names a record this organization may not use. */
  const expectCreateRefused = async (
    resource: (typeof resources)[keyof typeof resources],
    body: unknown,
    field: string,
  ) => expectRefused(await api.create(resource, { sessionId: admin, body }), field);

  it('a batch cannot point at another organization’s coating', async () => {
    const mark = await lastAuditId();
    await expectCreateRefused(resources.batches, bodies.batch(foreignCoatingId), 'coatingId');
    expect(await auditSince(lab.id, mark)).toEqual([]);
  });

  it('nor be moved onto one by an update', async () => {
    const batch = (
      await api.create(resources.batches, { sessionId: admin, body: bodies.batch(coatingId) })
    ).body.batch;
    expectRefused(
      await api.update(resources.batches, batch.id, {
        sessionId: admin,
        body: { version: 1, coatingId: foreignCoatingId },
      }),
      'coatingId',
    );
  });

  it('a sample cannot point at another organization’s batch', async () => {
    await expectCreateRefused(resources.samples, bodies.sample(foreignBatchId), 'batchId');
  });

  it('a spec cannot point at another organization’s coating or probe liquid', async () => {
    await expectCreateRefused(resources.specs, bodies.spec(foreignCoatingId), 'coatingId');
    await expectCreateRefused(
      resources.specs,
      bodies.spec(coatingId, foreignLiquidId),
      'probeLiquidId',
    );
  });

  it('a session cannot use another organization’s probe liquid, but may use a built-in one', async () => {
    await expectCreateRefused(
      resources.measurementSessions,
      bodies.measurementSession(foreignLiquidId),
      'probeLiquidId',
    );
    const ok = await api.create(resources.measurementSessions, {
      sessionId: admin,
      body: bodies.measurementSession('liquid-diiodomethane'),
    });
    expect(ok.status).toBe(201);
    const none = await api.create(resources.measurementSessions, {
      sessionId: admin,
      body: bodies.measurementSession(null),
    });
    expect(none.status).toBe(201);
    expect(none.body.measurementSession.probeLiquidId).toBeNull();
  });

  it('an unknown id is refused the same way', async () => {
    await expectCreateRefused(resources.batches, bodies.batch('no-such-coating'), 'coatingId');
  });

  it('a batch cannot be added under an archived coating (409 naming coatingId)', async () => {
    const coating = (
      await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() })
    ).body.coating;
    await api.remove(resources.coatings, coating.id, { sessionId: admin, query: 'mode=archive' });
    const response = await api.create(resources.batches, {
      sessionId: admin,
      body: bodies.batch(coating.id),
    });
    expect(response.status).toBe(409);
    expect(response.body.error.code).toBe('archived');
    expect(response.body.error.fields).toHaveProperty('coatingId');
    expect((await auditOf('coating', coating.id)).map((row) => row.action)).toEqual([
      'coating.create',
      'coating.archive',
    ]);
  });
});
