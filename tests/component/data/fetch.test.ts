import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import { ApiError } from '@/components/data/api-error';
import { apiFetch } from '@/components/data/fetch';
import { errorBody, stubFetch } from '../support';

/** The ApiError a request fails with. */
const failure = (request: Promise<unknown>) =>
  request.then(
    () => {
      throw new Error('The request was expected to fail.');
    },
    (error: unknown) => error as ApiError,
  );

describe('apiFetch', () => {
  it('sends JSON and answers the reply', async () => {
    const calls = stubFetch(() => ({ status: 201, body: { id: 'c1' } }));
    expect(await apiFetch('/api/coatings', { method: 'POST', json: { code: 'HT-200' } })).toEqual({
      id: 'c1',
    });
    expect(calls).toEqual([{ url: '/api/coatings', method: 'POST', body: { code: 'HT-200' } }]);
  });

  it("turns Beadline's error body into an ApiError with its status, code, fields and extra keys", async () => {
    stubFetch(() => ({
      status: 409,
      body: errorBody(
        'stale_version',
        'Someone else saved first.',
        { code: 'Taken.' },
        {
          current: { version: 4 },
        },
      ),
    }));
    const error = await failure(apiFetch('/api/coatings/c1', { method: 'PATCH', json: {} }));
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 409,
      code: 'stale_version',
      message: 'Someone else saved first.',
      fields: { code: 'Taken.' },
      extra: { current: { version: 4 } },
      isNetwork: false,
    });
  });

  it('reports a request that never reached the server as a network error that says nothing was lost', async () => {
    stubFetch(() => 'offline');
    const error = await failure(apiFetch('/api/reviews', { method: 'POST', json: {} }));
    expect(error).toBeInstanceOf(ApiError);
    expect(error.code).toBe('network');
    expect(error.status).toBe(0);
    expect(error.isNetwork).toBe(true);
    expect(error.message).toMatch(/could not be reached.*nothing was lost/);
  });

  it('keeps the status of an error answer without an error body, as an internal error', async () => {
    stubFetch(() => ({ status: 502 }));
    const error = await failure(apiFetch('/api/tensiometry'));
    expect(error).toMatchObject({ status: 502, code: 'internal' });
    expect(error.message).toContain('502');
  });

  it('does not take a code outside the closed set of error codes', async () => {
    stubFetch(() => ({ status: 409, body: { error: { code: 'account_gone', message: 'Gone.' } } }));
    const error = await failure(apiFetch('/api/coatings'));
    expect(error).toMatchObject({ status: 409, code: 'internal' });
    expect(error.message).toContain('409');
  });

  it('checks the reply against its contract in development and says which field is off', async () => {
    const report = vi.spyOn(console, 'error').mockImplementation(() => {});
    const schema = z.object({ watching: z.boolean() });
    stubFetch(() => ({ body: { watching: 'yes' } }));
    await apiFetch('/api/coatings/c1/watch', { method: 'PUT', schema });
    expect(report).toHaveBeenCalledTimes(1);
    expect(String(report.mock.calls[0][0])).toMatch(/PUT \/api\/coatings\/c1\/watch .*watching/);

    report.mockClear();
    stubFetch(() => ({ body: { watching: true } }));
    expect(await apiFetch('/api/coatings/c1/watch', { method: 'PUT', schema })).toEqual({
      watching: true,
    });
    expect(report).not.toHaveBeenCalled();
  });
});
