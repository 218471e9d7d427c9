import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { PROBE_LIQUID_LIBRARY } from '@/db/probe-liquid-library';
import {
  batchCreateSchema,
  batchListQuerySchema,
  batchUpdateSchema,
} from '@/lib/contracts/batches';
import {
  checkProbeLiquidComponents,
  probeLiquidCreateSchema,
  probeLiquidListQuerySchema,
  probeLiquidUpdateSchema,
} from '@/lib/contracts/probe-liquids';
import { checkSpecLimits, specCreateSchema, specUpdateSchema } from '@/lib/contracts/specs';
import {
  coatingCreateSchema,
  coatingListQuerySchema,
  coatingUpdateSchema,
} from '@/lib/contracts/coatings';
import { listQueryToSearchParams, parseSearchParams } from '@/lib/contracts/common';
import {
  measurementSessionCreateSchema,
  measurementSessionListQuerySchema,
} from '@/lib/contracts/measurement-sessions';
import { sampleCreateSchema } from '@/lib/contracts/samples';
import { fieldErrors } from '@/lib/contracts/common';

/** `{ field: message }` of a failed parse, or null when it succeeds. */
function errorsOf(schema: z.ZodType, input: unknown): Record<string, string> | null {
  const result = schema.safeParse(input);
  return result.success ? null : fieldErrors(result.error);
}

describe('coatings', () => {
  it('trims, and needs code and name', () => {
    expect(coatingCreateSchema.parse({ code: '  HT-200 ', name: ' Topcoat ' })).toEqual({
      code: 'HT-200',
      name: 'Topcoat',
    });
    expect(errorsOf(coatingCreateSchema, {})).toEqual({
      code: 'Enter a coating code, like HT-200.',
      name: expect.stringMatching(/Enter the coating name/),
    });
    expect(errorsOf(coatingCreateSchema, { code: '   ', name: 'x' })).toEqual({
      code: 'Enter a coating code, like HT-200.',
    });
  });

  it('refuses odd characters and over-long codes', () => {
    expect(errorsOf(coatingCreateSchema, { code: 'HT<200>', name: 'x' })).toHaveProperty('code');
    expect(errorsOf(coatingCreateSchema, { code: '-HT', name: 'x' })).toHaveProperty('code');
    expect(errorsOf(coatingCreateSchema, { code: 'A'.repeat(33), name: 'x' })?.code).toMatch(
      /32 characters/,
    );
    expect(errorsOf(coatingCreateSchema, { code: 'PP Print/2 v1.0_b', name: 'x' })).toBeNull();
  });

  it('an update needs a whole-number version and nothing else', () => {
    expect(coatingUpdateSchema.parse({ version: 3 })).toEqual({ version: 3 });
    expect(errorsOf(coatingUpdateSchema, { name: 'x' })?.version).toMatch(/Reload/);
    expect(errorsOf(coatingUpdateSchema, { version: 1.5 })).toHaveProperty('version');
    expect(errorsOf(coatingUpdateSchema, { version: 0 })).toHaveProperty('version');
    expect(errorsOf(coatingUpdateSchema, { version: '2' })).toHaveProperty('version');
  });

  it('a partial update leaves out what was not sent (no defaults fill it in)', () => {
    expect(coatingUpdateSchema.parse({ version: 1, name: 'New' })).toEqual({
      version: 1,
      name: 'New',
    });
  });
});

describe('specs', () => {
  const spec = { coatingId: 'c1', probeLiquidId: 'liquid-water', scope: 'each-drop' as const };

  it('needs at least one limit', () => {
    expect(errorsOf(specCreateSchema, spec)?.minDeg).toMatch(/at least one limit/);
    expect(errorsOf(specCreateSchema, { ...spec, maxDaysSinceTreatment: 7 })?.minDeg).toMatch(
      /at least one limit/,
    );
    expect(errorsOf(specCreateSchema, { ...spec, minSurfaceEnergyMnM: 38 })).toBeNull();
    expect(
      errorsOf(specCreateSchema, { ...spec, maxDeg: 70, maxDaysSinceTreatment: 7 }),
    ).toBeNull();
  });

  it('keeps angles within 0–180 degrees, bounds included', () => {
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: 0, maxDeg: 180 })).toBeNull();
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: -0.1 })?.minDeg).toMatch(/0 to 180/);
    expect(errorsOf(specCreateSchema, { ...spec, maxDeg: 180.01 })?.maxDeg).toMatch(/0 to 180/);
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: Number.NaN })).toHaveProperty('minDeg');
    expect(
      errorsOf(specCreateSchema, { ...spec, minDeg: Number.POSITIVE_INFINITY }),
    ).toHaveProperty('minDeg');
  });

  it('min ≤ max for angles and surface energy; equal is allowed', () => {
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: 105, maxDeg: 100 })?.maxDeg).toMatch(
      /at least the minimum/,
    );
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: 100, maxDeg: 100 })).toBeNull();
    expect(
      errorsOf(specCreateSchema, { ...spec, minSurfaceEnergyMnM: 40, maxSurfaceEnergyMnM: 38 })
        ?.maxSurfaceEnergyMnM,
    ).toMatch(/at least the minimum/);
    expect(errorsOf(specCreateSchema, { ...spec, minSurfaceEnergyMnM: 0 })).toHaveProperty(
      'minSurfaceEnergyMnM',
    );
  });

  it('reads form text: numeric strings become numbers, empty boxes none', () => {
    expect(specCreateSchema.parse({ ...spec, minDeg: ' 100 ', maxDeg: '' })).toMatchObject({
      minDeg: 100,
      maxDeg: null,
    });
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: '99,5' })).toHaveProperty('minDeg');
    expect(errorsOf(specCreateSchema, { ...spec, minDeg: 'abc' })).toHaveProperty('minDeg');
  });

  it('scope is each-drop or mean', () => {
    expect(errorsOf(specCreateSchema, { ...spec, scope: 'median', minDeg: 1 })?.scope).toMatch(
      /each-drop/,
    );
  });

  it('an update checks the pairs it carries; the merged record is checked by checkSpecLimits', () => {
    expect(errorsOf(specUpdateSchema, { version: 1, minDeg: 120 })).toBeNull();
    expect(errorsOf(specUpdateSchema, { version: 1, minDeg: 120, maxDeg: 110 })).toHaveProperty(
      'maxDeg',
    );
    expect(errorsOf(specUpdateSchema, { version: 1, minDeg: null })).toBeNull();
    expect(() => checkSpecLimits({ minDeg: 120, maxDeg: 110 })).toThrow(z.ZodError);
    expect(() => checkSpecLimits({ minDeg: null, maxDeg: null })).toThrow(/at least one limit/);
    expect(() => checkSpecLimits({ minDeg: 100, maxDeg: null })).not.toThrow();
  });
});

describe('batches', () => {
  const batch = { coatingId: 'c1', lotCode: 'B-0412', producedOn: '2026-03-14' };

  it('asks for a lot code by example', () => {
    expect(errorsOf(batchCreateSchema, { ...batch, lotCode: '' })?.lotCode).toBe(
      'Enter a lot code, like B-0412.',
    );
    expect(
      errorsOf(batchCreateSchema, { coatingId: 'c1', producedOn: '2026-03-14' })?.lotCode,
    ).toBe('Enter a lot code, like B-0412.');
  });

  it('needs a real calendar date as YYYY-MM-DD', () => {
    expect(errorsOf(batchCreateSchema, batch)).toBeNull();
    for (const producedOn of ['2026-02-30', '14/03/2026', '2026-3-14', '2026-03-14T00:00:00Z']) {
      expect(errorsOf(batchCreateSchema, { ...batch, producedOn }), producedOn).toHaveProperty(
        'producedOn',
      );
    }
    expect(errorsOf(batchCreateSchema, { ...batch, producedOn: '2028-02-29' })).toBeNull();
  });

  it('types the process parameters with their ranges and refuses unknown ones', () => {
    const parsed = batchCreateSchema.parse({
      ...batch,
      process: {
        cureTemperatureC: '180',
        cureTimeMin: 20,
        lineSpeedMPerMin: '',
        plasmaDoseWMinPerM2: 45,
      },
    });
    expect(parsed.process).toEqual({
      cureTemperatureC: 180,
      cureTimeMin: 20,
      plasmaDoseWMinPerM2: 45,
    });
    expect(
      errorsOf(batchCreateSchema, { ...batch, process: { cureTemperatureC: 451 } })?.[
        'process.cureTemperatureC'
      ],
    ).toMatch(/°C, from -40 to 450/);
    expect(
      errorsOf(batchCreateSchema, { ...batch, process: { lineSpeedMPerMin: -1 } }),
    ).toHaveProperty('process.lineSpeedMPerMin');
    expect(errorsOf(batchCreateSchema, { ...batch, process: { humidity: 40 } })?.process).toMatch(
      /Use only these/,
    );
    expect(errorsOf(batchCreateSchema, { ...batch, process: 'hot' })).toHaveProperty('process');
  });

  it('an update may carry only notes', () => {
    expect(batchUpdateSchema.parse({ version: 2, notes: ' ok ' })).toEqual({
      version: 2,
      notes: 'ok',
    });
  });
});

describe('samples', () => {
  const sample = { batchId: 'b1', label: 'P-01' };

  it('treatedAt is an ISO date-time with a zone, or empty', () => {
    expect(
      sampleCreateSchema.parse({ ...sample, treatedAt: '2026-03-14T09:30:00+01:00' }).treatedAt,
    ).toBe('2026-03-14T09:30:00+01:00');
    expect(sampleCreateSchema.parse({ ...sample, treatedAt: '' }).treatedAt).toBeNull();
    expect(sampleCreateSchema.parse(sample).treatedAt).toBeUndefined();
    expect(
      errorsOf(sampleCreateSchema, { ...sample, treatedAt: '2026-03-14T09:30' }),
    ).toHaveProperty('treatedAt');
    expect(errorsOf(sampleCreateSchema, { ...sample, treatedAt: 'yesterday' })).toHaveProperty(
      'treatedAt',
    );
  });

  it('needs the batch and a label', () => {
    expect(Object.keys(errorsOf(sampleCreateSchema, {}) ?? {}).sort()).toEqual([
      'batchId',
      'label',
    ]);
  });
});

describe('probe liquids', () => {
  const water = { name: 'House water', totalMnM: 72.8, dispersiveMnM: 21.8, polarMnM: 51.0 };

  it('dispersive + polar must add up to the total within 0.5 mN/m', () => {
    expect(errorsOf(probeLiquidCreateSchema, water)).toBeNull();
    expect(errorsOf(probeLiquidCreateSchema, { ...water, polarMnM: 50.5 })).toBeNull();
    expect(errorsOf(probeLiquidCreateSchema, { ...water, polarMnM: 50.4 })?.polarMnM).toMatch(
      /add up to the total/,
    );
    expect(errorsOf(probeLiquidCreateSchema, { ...water, polarMnM: null })).toBeNull();
    expect(
      errorsOf(probeLiquidCreateSchema, { ...water, dispersiveMnM: 80, polarMnM: null })
        ?.dispersiveMnM,
    ).toMatch(/at most the total/);
  });

  it('LW + 2√(γ+γ−) must add up to the total when all three are given (van Oss–Chaudhury–Good)', () => {
    // Water as commonly cited from van Oss et al.: 21.8 + 2√(25.5 × 25.5) = 72.8.
    const acidBase = { lifshitzVanDerWaalsMnM: 21.8, acidMnM: 25.5, baseMnM: 25.5 };
    expect(errorsOf(probeLiquidCreateSchema, { ...water, ...acidBase })).toBeNull();
    expect(
      errorsOf(probeLiquidCreateSchema, { ...water, ...acidBase, baseMnM: 20 })
        ?.lifshitzVanDerWaalsMnM,
    ).toMatch(/add up to the total/);
    expect(
      errorsOf(probeLiquidCreateSchema, { ...water, lifshitzVanDerWaalsMnM: 21.8 }),
    ).toBeNull();
  });

  it('needs a total above 0 and a density above 0', () => {
    expect(errorsOf(probeLiquidCreateSchema, { name: 'x', totalMnM: 0 })).toHaveProperty(
      'totalMnM',
    );
    expect(errorsOf(probeLiquidCreateSchema, { name: 'x' })?.totalMnM).toMatch(/water: 72.8/);
    expect(errorsOf(probeLiquidCreateSchema, { ...water, densityGPerCm3: 0 })).toHaveProperty(
      'densityGPerCm3',
    );
  });

  it('names sources only for known values', () => {
    expect(
      errorsOf(probeLiquidCreateSchema, { ...water, sources: { total: 'Data sheet, lot 7' } }),
    ).toBeNull();
    expect(
      errorsOf(probeLiquidCreateSchema, { ...water, sources: { colour: 'x' } })?.sources,
    ).toMatch(/Name sources only/);
    expect(errorsOf(probeLiquidCreateSchema, { ...water, sources: { total: '' } })).toHaveProperty(
      'sources.total',
    );
  });

  it('an update is checked when it carries the total; checkProbeLiquidComponents checks the merged record', () => {
    expect(errorsOf(probeLiquidUpdateSchema, { version: 1, polarMnM: 10 })).toBeNull();
    expect(
      errorsOf(probeLiquidUpdateSchema, { version: 1, ...water, polarMnM: 10 }),
    ).toHaveProperty('polarMnM');
    expect(() => checkProbeLiquidComponents({ ...water, polarMnM: 10 })).toThrow(z.ZodError);
  });

  it('every built-in library liquid passes the same rules a lab’s own liquid must', () => {
    for (const row of PROBE_LIQUID_LIBRARY) {
      const input = {
        name: row.name,
        totalMnM: row.totalMnM,
        dispersiveMnM: row.dispersiveMnM,
        polarMnM: row.polarMnM,
        lifshitzVanDerWaalsMnM: row.lifshitzVanDerWaalsMnM,
        acidMnM: row.acidMnM,
        baseMnM: row.baseMnM,
        densityGPerCm3: row.densityGPerCm3,
        sources: row.sources,
        hazardNote: row.hazardNote,
      };
      expect(errorsOf(probeLiquidCreateSchema, input), row.id).toBeNull();
    }
  });
});

describe('measurement sessions', () => {
  const session = {
    operatorName: 'Operator',
    measuredAt: '2026-03-15T09:30:00Z',
    temperatureC: 22,
    humidityPct: 45,
    dropVolumeUl: 3,
    scalePxPerMm: 200,
  };

  it('accepts the range bounds and refuses just outside them', () => {
    const inside = [
      { temperatureC: 5 },
      { temperatureC: 60 },
      { humidityPct: 0 },
      { humidityPct: 100 },
      { dropVolumeUl: 0.1 },
      { dropVolumeUl: 50 },
      { scalePxPerMm: 0.001 },
    ];
    for (const change of inside)
      expect(errorsOf(measurementSessionCreateSchema, { ...session, ...change })).toBeNull();
    const outside: [Record<string, number>, string][] = [
      [{ temperatureC: 4.9 }, 'temperatureC'],
      [{ temperatureC: 60.1 }, 'temperatureC'],
      [{ humidityPct: -0.1 }, 'humidityPct'],
      [{ humidityPct: 100.1 }, 'humidityPct'],
      [{ dropVolumeUl: 0.09 }, 'dropVolumeUl'],
      [{ dropVolumeUl: 50.1 }, 'dropVolumeUl'],
      [{ scalePxPerMm: 0 }, 'scalePxPerMm'],
    ];
    for (const [change, field] of outside) {
      expect(
        Object.keys(errorsOf(measurementSessionCreateSchema, { ...session, ...change }) ?? {}),
      ).toEqual([field]);
    }
  });

  it('the probe liquid is optional; an empty choice means none', () => {
    expect(measurementSessionCreateSchema.parse(session).probeLiquidId).toBeUndefined();
    expect(
      measurementSessionCreateSchema.parse({ ...session, probeLiquidId: '' }).probeLiquidId,
    ).toBeNull();
    expect(
      measurementSessionCreateSchema.parse({ ...session, probeLiquidId: 'liquid-water' })
        .probeLiquidId,
    ).toBe('liquid-water');
  });

  it('measuredAt must be an ISO date-time; conditions must be given', () => {
    expect(
      errorsOf(measurementSessionCreateSchema, { ...session, measuredAt: '15.03.2026' }),
    ).toHaveProperty('measuredAt');
    const { temperatureC: _omitted, ...withoutTemperature } = session;
    void _omitted;
    expect(errorsOf(measurementSessionCreateSchema, withoutTemperature)?.temperatureC).toMatch(
      /5 to 60/,
    );
  });
});

describe('list queries from the URL', () => {
  it('fills in defaults', () => {
    expect(parseSearchParams(batchListQuerySchema, new URLSearchParams())).toEqual({
      includeArchived: false,
      sort: 'producedOn',
      dir: 'desc',
      page: 1,
      pageSize: 50,
    });
    expect(parseSearchParams(probeLiquidListQuerySchema, new URLSearchParams()).origin).toBe('all');
  });

  it('reads numbers, booleans and filters; empty values count as absent', () => {
    const query = parseSearchParams(
      batchListQuerySchema,
      new URLSearchParams(
        'page=3&pageSize=200&includeArchived=1&coatingId=c1&q=%20B-04%20&sort=&producedTo=',
      ),
    );
    expect(query).toMatchObject({
      page: 3,
      pageSize: 200,
      includeArchived: true,
      coatingId: 'c1',
      q: 'B-04',
      sort: 'producedOn',
    });
    expect(query.producedTo).toBeUndefined();
  });

  it('takes the first of a repeated parameter, from URLSearchParams or Next’s searchParams object', () => {
    expect(
      parseSearchParams(coatingListQuerySchema, new URLSearchParams('page=2&page=5')).page,
    ).toBe(2);
    expect(
      parseSearchParams(coatingListQuerySchema, { page: ['4', '9'], dir: 'desc', q: undefined }),
    ).toMatchObject({
      page: 4,
      dir: 'desc',
    });
  });

  it('refuses out-of-range pages, page sizes above 200 and columns off the allow-list', () => {
    const bad: [string, string][] = [
      ['page=0', 'page'],
      ['page=1.5', 'page'],
      ['page=two', 'page'],
      ['pageSize=201', 'pageSize'],
      ['pageSize=0', 'pageSize'],
      ['sort=organizationId', 'sort'],
      ['dir=sideways', 'dir'],
      ['includeArchived=yes please', 'includeArchived'],
      ['measuredFrom=2026-13-01', 'measuredFrom'],
    ];
    for (const [search, field] of bad) {
      const result = measurementSessionListQuerySchema.safeParse(
        Object.fromEntries(new URLSearchParams(search).entries()),
      );
      expect(result.success, search).toBe(false);
      if (!result.success) expect(Object.keys(fieldErrors(result.error)), search).toEqual([field]);
    }
  });

  it('writes a query back to a short URL, leaving out the defaults; it reads back the same', () => {
    const params = listQueryToSearchParams(batchListQuerySchema, {
      page: 2,
      sort: 'producedOn',
      dir: 'asc',
      coatingId: 'c1',
      includeArchived: false,
    });
    expect(params.toString()).toBe('page=2&dir=asc&coatingId=c1');
    expect(parseSearchParams(batchListQuerySchema, params)).toMatchObject({
      page: 2,
      dir: 'asc',
      coatingId: 'c1',
    });
  });
});
