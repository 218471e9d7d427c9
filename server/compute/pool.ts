import 'server-only';
import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { AppError } from '@/lib/app-error';
import { COMPUTE_JOBS_PER_USER } from '@/lib/contracts/limits';
import {
  computeError,
  type ComputeReply,
  type ComputeTask,
  type ComputeValue,
} from '@/lib/compute/node/tasks';

/*
 * The CPU-heavy work of a request (pendant-drop fits, the re-analysis of a drop photo on save)
 * runs in a pool of worker threads (piscina), so the request thread keeps answering everyone else
 * while a fit runs. Each user may have PER_USER_LIMIT computations in flight; one more is 429
 * `busy` with Retry-After. The pool has one thread fewer than the machine has cores (at least
 * one; COMPUTE_THREADS overrides it), and at most MAX_QUEUED tasks wait for a thread.
 */

/** Computations one user may have running or waiting at once. */
export const PER_USER_LIMIT = COMPUTE_JOBS_PER_USER;
/** Tasks that may wait for a thread, all users together. */
const MAX_QUEUED = 64;
/** What Retry-After says: about the time a queued fit takes on a busy machine. */
export const RETRY_AFTER_SECONDS = 5;

/**
 * The worker's source file. Next.js bundles this module into .next/server, so the path is taken
 * from the project folder (every script serves from there), not from this file's location. The
 * worker is TypeScript: its threads load tsx, as the server itself is started with tsx.
 */
const WORKER_FILE = join(process.cwd(), 'workers', 'compute.worker.ts');

function threads(): number {
  const fromEnv = Number(process.env.COMPUTE_THREADS);
  if (Number.isInteger(fromEnv) && fromEnv > 0) return fromEnv;
  return Math.max(1, availableParallelism() - 1);
}

function createPool(): Piscina {
  const execArgv = process.execArgv.some((arg) => arg.includes('tsx'))
    ? process.execArgv
    : [...process.execArgv, '--import', 'tsx'];
  const maxThreads = threads();
  return new Piscina({
    filename: WORKER_FILE,
    minThreads: 0,
    maxThreads,
    maxQueue: MAX_QUEUED,
    idleTimeout: 60_000,
    execArgv,
  });
}

// One pool per process; Next's dev server reloads modules, so keep it (and the counts) on globalThis.
const shared = globalThis as typeof globalThis & {
  beadlineCompute?: { pool: Piscina; inFlight: Map<string, number> };
};

function state() {
  shared.beadlineCompute ??= { pool: createPool(), inFlight: new Map() };
  return shared.beadlineCompute;
}

const busy = (message: string) =>
  new AppError('busy', message, { retryAfterSeconds: RETRY_AFTER_SECONDS });

/**
 * Task kinds that may take minutes (a series of hundreds of frames): at most one of each kind is
 * in the pool at a time, the others wait in line here, so a long series never holds every thread
 * and the short fits of other users keep flowing between them.
 */
const ONE_AT_A_TIME: ReadonlySet<ComputeTask['kind']> = new Set(['reanalyse-series']);
const lanes = new Map<ComputeTask['kind'], Promise<unknown>>();

function inLane<R>(kind: ComputeTask['kind'], run: () => Promise<R>): Promise<R> {
  if (!ONE_AT_A_TIME.has(kind)) return run();
  const next = (lanes.get(kind) ?? Promise.resolve()).then(run);
  lanes.set(
    kind,
    next.catch(() => undefined),
  );
  return next;
}

/**
 * Runs a task of lib/compute in the pool for `userId`. The core's input errors are rethrown as the
 * core threw them (TensiometryInputError, AnalysisError, SeriesSourceFailure); too many at once is
 * 429 `busy`. A task waiting in its kind's line (ONE_AT_A_TIME) counts towards the user's limit.
 */
export async function runCompute<T extends ComputeTask>(
  userId: string,
  task: T,
): Promise<ComputeValue<T>> {
  const { pool, inFlight } = state();
  const mine = inFlight.get(userId) ?? 0;
  if (mine >= PER_USER_LIMIT) {
    throw busy(
      `You already have ${PER_USER_LIMIT} calculations running. Wait for one to finish, then try again.`,
    );
  }
  if (pool.queueSize >= MAX_QUEUED) {
    throw busy('The server is busy with other calculations. Try again in a few seconds.');
  }
  inFlight.set(userId, mine + 1);
  try {
    const reply = (await inLane(task.kind, () => pool.run(task))) as ComputeReply<T>;
    if (!reply.ok) throw computeError(reply.error);
    return reply.value;
  } finally {
    const left = (inFlight.get(userId) ?? 1) - 1;
    if (left > 0) inFlight.set(userId, left);
    else inFlight.delete(userId);
  }
}

/** Calculations running or waiting in the pool, all users together (for /api/health). */
export function computeInFlight(): number {
  let total = 0;
  for (const count of shared.beadlineCompute?.inFlight.values() ?? []) total += count;
  return total;
}

/** Stops the pool's threads (tests and scripts); the next task starts a new pool. */
export async function closeComputePool(): Promise<void> {
  const current = shared.beadlineCompute;
  shared.beadlineCompute = undefined;
  await current?.pool.destroy();
}
