/**
 * DELETE archives a record that has results under it (drops under a sample, samples under a
 * batch, batches or specs under a coating, drops under a session, anything referring to a
 * probe liquid) and deletes one with nothing under it. Each writes its audit row.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { insertDrop } from '../support/seed';
import { api, auditOf, bodies, labWithBatch, resources, type Lab } from './helpers';

let lab: Lab;
let admin: string;
let analyst: string;
let coatingId: string;
let batchId: string;

beforeAll(async () => {
  ({ lab, admin, analyst, coatingId, batchId } = await labWithBatch());
});

afterAll(async () => {
  await closeDb();
});

/** A drop read by hand (no photo), as an import would make it. */
const addDrop = (sampleId: string, sessionId: string | null = null) =>
  insertDrop(lab.id, sampleId, { sessionId });

describe('DELETE', () => {
  it('deletes a sample with no drops; it is gone, and the audit row keeps what it was', async () => {
    const sample = (
      await api.create(resources.samples, { sessionId: analyst, body: bodies.sample(batchId) })
    ).body.sample;
    const response = await api.remove(resources.samples, sample.id, { sessionId: analyst });
    expect(response.status).toBe(200);
    expect(response.body).toMatchObject({ outcome: 'deleted', sample: { id: sample.id } });
    expect((await api.get(resources.samples, sample.id, { sessionId: analyst })).status).toBe(404);
    const audit = await auditOf('sample', sample.id);
    expect(audit.map((row) => row.action)).toEqual(['sample.create', 'sample.delete']);
    expect(audit[1].before).toMatchObject({ label: sample.label });
    expect(audit[1].after).toBeNull();
  });

  it('archives a sample that has drops', async () => {
    const sample = (
      await api.create(resources.samples, { sessionId: analyst, body: bodies.sample(batchId) })
    ).body.sample;
    await addDrop(sample.id);
    const response = await api.remove(resources.samples, sample.id, { sessionId: analyst });
    expect(response.body.outcome).toBe('archived');
    expect(response.body.sample.archivedAt).not.toBeNull();
    expect(response.body.sample.version).toBe(2);
    expect(
      (await api.get(resources.samples, sample.id, { sessionId: analyst })).body.sample.archivedAt,
    ).not.toBeNull();
    expect((await auditOf('sample', sample.id)).map((row) => row.action)).toEqual([
      'sample.create',
      'sample.archive',
    ]);

    const again = await api.remove(resources.samples, sample.id, { sessionId: analyst });
    expect(again.body.outcome).toBe('archived');
    expect(await auditOf('sample', sample.id)).toHaveLength(2);
  });

  it('archives a batch that has samples, deletes one that has none', async () => {
    const full = (
      await api.create(resources.batches, { sessionId: analyst, body: bodies.batch(coatingId) })
    ).body.batch;
    await api.create(resources.samples, { sessionId: analyst, body: bodies.sample(full.id) });
    expect(
      (await api.remove(resources.batches, full.id, { sessionId: analyst })).body.outcome,
    ).toBe('archived');
    const empty = (
      await api.create(resources.batches, { sessionId: analyst, body: bodies.batch(coatingId) })
    ).body.batch;
    expect(
      (await api.remove(resources.batches, empty.id, { sessionId: analyst })).body.outcome,
    ).toBe('deleted');
  });

  it('archives a coating that has batches or specs, deletes one that has neither', async () => {
    const withBatch = (
      await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() })
    ).body.coating;
    await api.create(resources.batches, { sessionId: admin, body: bodies.batch(withBatch.id) });
    expect(
      (await api.remove(resources.coatings, withBatch.id, { sessionId: admin })).body.outcome,
    ).toBe('archived');

    const withSpec = (
      await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() })
    ).body.coating;
    await api.create(resources.specs, { sessionId: admin, body: bodies.spec(withSpec.id) });
    expect(
      (await api.remove(resources.coatings, withSpec.id, { sessionId: admin })).body.outcome,
    ).toBe('archived');

    const bare = (
      await api.create(resources.coatings, { sessionId: admin, body: bodies.coating() })
    ).body.coating;
    expect((await api.remove(resources.coatings, bare.id, { sessionId: admin })).body.outcome).toBe(
      'deleted',
    );
    expect((await auditOf('coating', bare.id)).map((row) => row.action)).toEqual([
      'coating.create',
      'coating.delete',
    ]);
  });

  it('deletes a spec (nothing refers to one); ?mode=archive keeps it archived instead', async () => {
    const a = (
      await api.create(resources.specs, { sessionId: admin, body: bodies.spec(coatingId) })
    ).body.spec;
    expect((await api.remove(resources.specs, a.id, { sessionId: admin })).body.outcome).toBe(
      'deleted',
    );
    const b = (
      await api.create(resources.specs, { sessionId: admin, body: bodies.spec(coatingId) })
    ).body.spec;
    expect(
      (await api.remove(resources.specs, b.id, { sessionId: admin, query: 'mode=archive' })).body
        .outcome,
    ).toBe('archived');
  });

  it('archives a session that has drops, deletes one that has none', async () => {
    const used = (
      await api.create(resources.measurementSessions, {
        sessionId: analyst,
        body: bodies.measurementSession(),
      })
    ).body.measurementSession;
    const sample = (
      await api.create(resources.samples, { sessionId: analyst, body: bodies.sample(batchId) })
    ).body.sample;
    await addDrop(sample.id, used.id);
    expect(
      (await api.remove(resources.measurementSessions, used.id, { sessionId: analyst })).body
        .outcome,
    ).toBe('archived');
    const unused = (
      await api.create(resources.measurementSessions, {
        sessionId: analyst,
        body: bodies.measurementSession(),
      })
    ).body.measurementSession;
    expect(
      (await api.remove(resources.measurementSessions, unused.id, { sessionId: analyst })).body
        .outcome,
    ).toBe('deleted');
  });

  it('archives an own probe liquid that a spec uses, deletes an unused one', async () => {
    const used = (
      await api.create(resources.probeLiquids, { sessionId: admin, body: bodies.probeLiquid() })
    ).body.probeLiquid;
    await api.create(resources.specs, { sessionId: admin, body: bodies.spec(coatingId, used.id) });
    expect(
      (await api.remove(resources.probeLiquids, used.id, { sessionId: admin })).body.outcome,
    ).toBe('archived');
    const unused = (
      await api.create(resources.probeLiquids, { sessionId: admin, body: bodies.probeLiquid() })
    ).body.probeLiquid;
    expect(
      (await api.remove(resources.probeLiquids, unused.id, { sessionId: admin })).body.outcome,
    ).toBe('deleted');
  });

  it('an unknown id answers 404', async () => {
    const response = await api.remove(resources.batches, 'no-such-batch', { sessionId: analyst });
    expect(response.status).toBe(404);
    expect(response.body.error.message).toMatch(/batch was not found/);
  });

  it('a bad mode answers 400 naming mode', async () => {
    const response = await api.remove(resources.batches, batchId, {
      sessionId: analyst,
      query: 'mode=purge',
    });
    expect(response.status).toBe(400);
    expect(response.body.error.fields).toHaveProperty('mode');
  });
});
