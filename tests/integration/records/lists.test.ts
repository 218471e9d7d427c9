/** Server-side lists: organization scope, filters, text search, sort, pages, archived records. */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb } from '@/db/client';
import { PROBE_LIQUID_LIBRARY } from '@/db/probe-liquid-library';
import { api, bodies, createLab, ensureLibrary, resources, unique, type Lab } from './helpers';

let lab: Lab;
let admin: string;
let viewer: string;
let coatingA: string;
let coatingB: string;
const lotPrefix = unique('LOT');

beforeAll(async () => {
  await ensureLibrary();
  lab = await createLab();
  admin = lab.members.admin.sessionId;
  viewer = lab.members.viewer.sessionId;
  coatingA = (
    await api.create(resources.coatings, { sessionId: admin, body: bodies.coating('AA-100') })
  ).body.coating.id;
  coatingB = (
    await api.create(resources.coatings, { sessionId: admin, body: bodies.coating('BB-200') })
  ).body.coating.id;
  // 7 batches of A (produced on March 1…7) and 3 of B.
  for (let day = 1; day <= 7; day++) {
    const body = {
      ...bodies.batch(coatingA, `${lotPrefix}-A${day}`),
      producedOn: `2026-03-0${day}`,
    };
    expect((await api.create(resources.batches, { sessionId: admin, body })).status).toBe(201);
  }
  for (let n = 1; n <= 3; n++) {
    const body = { ...bodies.batch(coatingB, `${lotPrefix}-B${n}`), producedOn: `2026-04-0${n}` };
    expect((await api.create(resources.batches, { sessionId: admin, body })).status).toBe(201);
  }
});

afterAll(async () => {
  await closeDb();
});

const lots = (items: { lotCode: string }[]) => items.map((item) => item.lotCode);

describe('GET /api/batches', () => {
  it('pages: total counts every match, page and pageSize come back', async () => {
    const first = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'pageSize=4&sort=lotCode&dir=asc',
    });
    expect(first.status).toBe(200);
    expect(first.body).toMatchObject({ total: 10, page: 1, pageSize: 4 });
    expect(lots(first.body.items)).toEqual([
      `${lotPrefix}-A1`,
      `${lotPrefix}-A2`,
      `${lotPrefix}-A3`,
      `${lotPrefix}-A4`,
    ]);
    const third = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'pageSize=4&page=3&sort=lotCode&dir=asc',
    });
    expect(third.body).toMatchObject({ total: 10, page: 3, pageSize: 4 });
    expect(lots(third.body.items)).toEqual([`${lotPrefix}-B2`, `${lotPrefix}-B3`]);
    const beyond = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'pageSize=4&page=9',
    });
    expect(beyond.body.items).toEqual([]);
    expect(beyond.body.total).toBe(10);
  });

  it('default sort is newest production date first', async () => {
    const response = await api.list(resources.batches, { sessionId: viewer });
    expect(response.body.items[0].producedOn).toBe('2026-04-03');
    expect(response.body.items.at(-1).producedOn).toBe('2026-03-01');
    expect(response.body.pageSize).toBe(50);
  });

  it('sorts by an allowed column in either direction', async () => {
    const desc = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'sort=lotCode&dir=desc&pageSize=2',
    });
    expect(lots(desc.body.items)).toEqual([`${lotPrefix}-B3`, `${lotPrefix}-B2`]);
  });

  it('filters by coating and production dates, and carries the coating code', async () => {
    const byCoating = await api.list(resources.batches, {
      sessionId: viewer,
      query: `coatingId=${coatingB}`,
    });
    expect(byCoating.body.total).toBe(3);
    expect(
      byCoating.body.items.every((item: { coatingCode: string }) => item.coatingCode === 'BB-200'),
    ).toBe(true);
    const byDate = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'producedFrom=2026-03-03&producedTo=2026-03-05',
    });
    expect(lots(byDate.body.items).sort()).toEqual([
      `${lotPrefix}-A3`,
      `${lotPrefix}-A4`,
      `${lotPrefix}-A5`,
    ]);
  });

  it('searches lot codes and coating codes, case-insensitively; % and _ match themselves', async () => {
    const byLot = await api.list(resources.batches, {
      sessionId: viewer,
      query: `q=${lotPrefix.toLowerCase()}-b`,
    });
    expect(byLot.body.total).toBe(3);
    const byCoatingCode = await api.list(resources.batches, {
      sessionId: viewer,
      query: 'q=aa-100',
    });
    expect(byCoatingCode.body.total).toBe(7);
    const wildcard = await api.list(resources.batches, { sessionId: viewer, query: 'q=%25' });
    expect(wildcard.body.total).toBe(0);
  });

  it('refuses a bad parameter with 400 naming it', async () => {
    for (const [query, field] of [
      ['pageSize=201', 'pageSize'],
      ['page=0', 'page'],
      ['sort=organizationId', 'sort'],
      ['dir=up', 'dir'],
      ['includeArchived=maybe', 'includeArchived'],
      ['producedFrom=March', 'producedFrom'],
    ]) {
      const response = await api.list(resources.batches, { sessionId: viewer, query });
      expect(response.status, query).toBe(400);
      expect(Object.keys(response.body.error.fields), query).toEqual([field]);
    }
  });

  it('an archived batch leaves the default list; includeArchived=true shows it', async () => {
    const batch = (
      await api.create(resources.batches, { sessionId: admin, body: bodies.batch(coatingB) })
    ).body.batch;
    const archived = await api.remove(resources.batches, batch.id, {
      sessionId: admin,
      query: 'mode=archive',
    });
    expect(archived.body.outcome).toBe('archived');
    const plain = await api.list(resources.batches, {
      sessionId: viewer,
      query: `coatingId=${coatingB}`,
    });
    expect(plain.body.total).toBe(3);
    expect(plain.body.items.map((item: { id: string }) => item.id)).not.toContain(batch.id);
    const all = await api.list(resources.batches, {
      sessionId: viewer,
      query: `coatingId=${coatingB}&includeArchived=true`,
    });
    expect(all.body.total).toBe(4);
    expect(
      all.body.items.find((item: { id: string }) => item.id === batch.id).archivedAt,
    ).not.toBeNull();
    expect((await api.get(resources.batches, batch.id, { sessionId: viewer })).status).toBe(200);
  });
});

describe('GET /api/coatings, /api/samples, /api/specs, /api/measurement-sessions', () => {
  it('coatings sort by code and search by name', async () => {
    const response = await api.list(resources.coatings, {
      sessionId: viewer,
      query: 'sort=code&dir=desc',
    });
    expect(response.body.items.map((item: { code: string }) => item.code)).toEqual([
      'BB-200',
      'AA-100',
    ]);
    const search = await api.list(resources.coatings, {
      sessionId: viewer,
      query: 'q=topcoat%20BB',
    });
    expect(search.body.total).toBe(1);
  });

  it('samples filter by batch and by coating', async () => {
    const batchList = await api.list(resources.batches, {
      sessionId: viewer,
      query: `coatingId=${coatingA}&pageSize=2`,
    });
    const [first, second] = batchList.body.items;
    for (const label of ['P-01', 'P-02', 'P-03']) {
      await api.create(resources.samples, {
        sessionId: admin,
        body: bodies.sample(first.id, label),
      });
    }
    await api.create(resources.samples, {
      sessionId: admin,
      body: bodies.sample(second.id, 'P-01'),
    });
    const byBatch = await api.list(resources.samples, {
      sessionId: viewer,
      query: `batchId=${first.id}&sort=label&dir=desc`,
    });
    expect(byBatch.body.items.map((item: { label: string }) => item.label)).toEqual([
      'P-03',
      'P-02',
      'P-01',
    ]);
    expect(byBatch.body.items[0].batchLotCode).toBe(first.lotCode);
    const byCoating = await api.list(resources.samples, {
      sessionId: viewer,
      query: `coatingId=${coatingA}`,
    });
    expect(byCoating.body.total).toBe(4);
    const byOtherCoating = await api.list(resources.samples, {
      sessionId: viewer,
      query: `coatingId=${coatingB}`,
    });
    expect(byOtherCoating.body.total).toBe(0);
  });

  it('specs filter by coating and probe liquid and carry their names', async () => {
    await api.create(resources.specs, { sessionId: admin, body: bodies.spec(coatingA) });
    await api.create(resources.specs, {
      sessionId: admin,
      body: { ...bodies.spec(coatingA, 'liquid-diiodomethane'), minDeg: 60 },
    });
    const all = await api.list(resources.specs, {
      sessionId: viewer,
      query: `coatingId=${coatingA}`,
    });
    expect(all.body.total).toBe(2);
    const water = await api.list(resources.specs, {
      sessionId: viewer,
      query: `coatingId=${coatingA}&probeLiquidId=liquid-water`,
    });
    expect(water.body.items).toHaveLength(1);
    expect(water.body.items[0]).toMatchObject({ coatingCode: 'AA-100', probeLiquidName: 'Water' });
  });

  it('measurement sessions filter by date (whole UTC days) and sort by time', async () => {
    for (const measuredAt of [
      '2026-05-01T23:30:00Z',
      '2026-05-02T00:10:00Z',
      '2026-05-03T12:00:00Z',
    ]) {
      await api.create(resources.measurementSessions, {
        sessionId: admin,
        body: { ...bodies.measurementSession(), measuredAt },
      });
    }
    const day = await api.list(resources.measurementSessions, {
      sessionId: viewer,
      query: 'measuredFrom=2026-05-02&measuredTo=2026-05-02',
    });
    expect(day.body.total).toBe(1);
    expect(day.body.items[0].probeLiquidName).toBe('Water');
    const asc = await api.list(resources.measurementSessions, {
      sessionId: viewer,
      query: 'sort=measuredAt&dir=asc',
    });
    expect(asc.body.items.map((item: { measuredAt: string }) => item.measuredAt)).toEqual([
      '2026-05-01T23:30:00.000Z',
      '2026-05-02T00:10:00.000Z',
      '2026-05-03T12:00:00.000Z',
    ]);
  });
});

describe('GET /api/probe-liquids', () => {
  it('lists the built-in library with the organization’s own liquids, marked builtIn', async () => {
    const own = (
      await api.create(resources.probeLiquids, {
        sessionId: admin,
        body: bodies.probeLiquid('Zz house water'),
      })
    ).body.probeLiquid;
    expect(own.builtIn).toBe(false);
    const all = await api.list(resources.probeLiquids, {
      sessionId: viewer,
      query: 'pageSize=200',
    });
    const ids = all.body.items.map((item: { id: string }) => item.id);
    for (const liquid of PROBE_LIQUID_LIBRARY) expect(ids).toContain(liquid.id);
    expect(ids).toContain(own.id);
    expect(all.body.items.find((item: { id: string }) => item.id === 'liquid-water').builtIn).toBe(
      true,
    );

    const ownOnly = await api.list(resources.probeLiquids, {
      sessionId: viewer,
      query: 'origin=own',
    });
    expect(ownOnly.body.items.map((item: { id: string }) => item.id)).toEqual([own.id]);
    const builtIn = await api.list(resources.probeLiquids, {
      sessionId: viewer,
      query: 'origin=built-in',
    });
    expect(builtIn.body.items.every((item: { builtIn: boolean }) => item.builtIn)).toBe(true);
  });

  it('another organization does not see this organization’s own liquids', async () => {
    const stranger = await createLab();
    const list = await api.list(resources.probeLiquids, {
      sessionId: stranger.members.viewer.sessionId,
      query: 'origin=own',
    });
    expect(list.body.total).toBe(0);
  });

  it('built-in liquids are read-only, even for admins (403 read_only)', async () => {
    const water = await api.get(resources.probeLiquids, 'liquid-water', { sessionId: admin });
    expect(water.status).toBe(200);
    const update = await api.update(resources.probeLiquids, 'liquid-water', {
      sessionId: admin,
      body: { version: water.body.probeLiquid.version, totalMnM: 70 },
    });
    expect(update.status).toBe(403);
    expect(update.body.error.code).toBe('read_only');
    expect(update.body.error.message).toMatch(/Add your own/);
    const remove = await api.remove(resources.probeLiquids, 'liquid-water', { sessionId: admin });
    expect(remove.status).toBe(403);
    expect(
      (await api.get(resources.probeLiquids, 'liquid-water', { sessionId: admin })).body.probeLiquid
        .totalMnM,
    ).toBe(72.8);
  });
});
