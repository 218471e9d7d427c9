/**
 * The compute pool (server/compute/pool.ts): a task run in a worker thread answers exactly what
 * the same lib code answers in this thread, the core's input errors come back as the same error,
 * and one user's fifth simultaneous calculation is refused with `busy` while another user's runs.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { renderDrop } from '@/fixtures/generator/render';
import { analyseDrop } from '@/lib/analysis';
import { AppError } from '@/lib/app-error';
import { TensiometryInputError } from '@/lib/tensiometry';
import { fitPendantDrop } from '@/lib/tensiometry/pendant-drop';
import {
  PER_USER_LIMIT,
  RETRY_AFTER_SECONDS,
  closeComputePool,
  runCompute,
} from '@/server/compute/pool';
import { pendantEdgeBody } from '../../support/pendant-photo';

afterAll(async () => {
  await closeComputePool();
});

/** The result without its run time, which differs from run to run. */
const withoutTime = <T extends { timeMs: number }>({ timeMs: _timeMs, ...rest }: T) => rest;

describe('compute pool', () => {
  it('analyses a drop photo to the same numbers, bit for bit, as this thread does', async () => {
    // A drop rendered from the Young–Laplace profile (fixtures/generator/render.ts).
    const { image } = renderDrop({ contactAngleDeg: 95, bond: 0.3, seed: 11 });
    const options = { method: 'young-laplace' as const };
    const here = await analyseDrop(image, options);
    const there = await runCompute('user-a', { kind: 'analyse-drop', image, options });
    // toStrictEqual compares numbers with Object.is: every digit, and the sign of zero.
    expect(withoutTime(there)).toStrictEqual(withoutTime(here));
  });

  it('fits a pendant outline to the same result as this thread', async () => {
    const input = pendantEdgeBody(2_000);
    expect(await runCompute('user-a', { kind: 'pendant-fit', input })).toStrictEqual(
      fitPendantDrop(input),
    );
  });

  it("rethrows the core's input error as the core threw it", async () => {
    const input = { ...pendantEdgeBody(100), densityDifferenceKgPerM3: -5 };
    const refusal = await runCompute('user-a', { kind: 'pendant-fit', input }).catch((e) => e);
    expect(refusal).toBeInstanceOf(TensiometryInputError);
    expect((refusal as TensiometryInputError).code).toBe('not-positive');
  });

  it(`lets one user run ${PER_USER_LIMIT} at once; one more is busy, another user is still taken`, async () => {
    const input = pendantEdgeBody(2_000);
    const four = Array.from({ length: PER_USER_LIMIT }, () =>
      runCompute('user-b', { kind: 'pendant-fit', input }),
    );
    const fifth = await runCompute('user-b', { kind: 'pendant-fit', input }).catch((e) => e);
    expect(fifth).toBeInstanceOf(AppError);
    expect((fifth as AppError).code).toBe('busy');
    expect((fifth as AppError).retryAfterSeconds).toBe(RETRY_AFTER_SECONDS);
    const other = runCompute('user-c', { kind: 'pendant-fit', input: pendantEdgeBody(200) });
    await expect(other).resolves.toMatchObject({ pointCount: 200 });
    await Promise.all(four);
    // Done: the user's slots are free again.
    await expect(
      runCompute('user-b', { kind: 'pendant-fit', input: pendantEdgeBody(200) }),
    ).resolves.toMatchObject({ pointCount: 200 });
  });
});
