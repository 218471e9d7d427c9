import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertTensiometryResult } from '@/db/queries/tensiometry';
import { inTransaction } from '@/db/queries/transaction';
import { AppError, forbidden } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type {
  CalculationResponse,
  TensiometryInputs,
  TensiometryKind,
  TensiometryOutputs,
  TensiometryResult,
} from '@/lib/contracts/tensiometry';
import { TensiometryInputError } from '@/lib/tensiometry';
import { actorOf } from '../actor';

/** The request field each of lib/tensiometry's input problems is about. */
const FIELD_OF_CODE: Record<string, string> = {
  'missing-density': 'liquidDensityGPerCm3',
  'implausible-force': 'forceMilliNewton',
  'out-of-range': 'temperatureC',
  'too-few-points': 'edge',
  'angle-out-of-range': 'contactAngleDeg',
  // Pendant drop from an uploaded photo: the outline could not be found in it.
  'bad-image': 'photoId',
  'low-contrast': 'photoId',
  'no-drop': 'photoId',
};

/** lib/tensiometry's input problem as invalid_measurement naming the field; anything else as is. */
function asAppError(error: unknown): unknown {
  if (!(error instanceof TensiometryInputError)) return error;
  const field = FIELD_OF_CODE[error.code];
  return new AppError('invalid_measurement', error.message, {
    fields: field ? { [field]: error.message } : undefined,
  });
}

/** Runs a tensiometry calculation; input it cannot use becomes invalid_measurement naming the field. */
export function calculate<T>(compute: () => T): T {
  try {
    return compute();
  } catch (error) {
    throw asAppError(error);
  }
}

/** The same for a calculation run in the compute pool (server/compute/pool.ts). */
export async function calculateInPool<T>(compute: () => Promise<T>): Promise<T> {
  try {
    return await compute();
  } catch (error) {
    throw asAppError(error);
  }
}

/** Computing is open to every member; storing the result (`save: true`) needs 'records:write'. */
export function assertMaySave(ctx: OrgContext, save: boolean): void {
  if (save && !can(ctx.organization.role, 'records:write')) {
    throw forbidden('save tensiometry results');
  }
}

/**
 * A calculation's reply: the result alone, or, with `save`, also the stored row (with its inputs
 * and, for a pendant drop fitted from a photo, that photo) and its audit row, in one transaction.
 */
export async function replyAndMaybeSave<Result, Extra extends object>(
  ctx: OrgContext,
  request: {
    save: boolean;
    kind: TensiometryKind;
    inputs: TensiometryInputs;
    result: Result;
    /** What is stored: the result, and for a photo fit what was found in the photo. */
    outputs: TensiometryOutputs;
    photoId?: string;
    extra?: Extra;
  },
): Promise<CalculationResponse<Result, Extra>> {
  const reply = { ...(request.extra as Extra), result: request.result };
  if (!request.save) return reply;
  const actor = actorOf(ctx);
  const photoId = request.photoId ?? null;
  const saved: TensiometryResult = await inTransaction(async (tx) => {
    const row = await insertTensiometryResult(tx, {
      id: newId(),
      organizationId: actor.organizationId,
      kind: request.kind,
      inputs: request.inputs,
      outputs: request.outputs,
      photoId,
      createdByUserId: actor.userId,
    });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'tensiometry_result.create',
      entityType: 'tensiometry_result',
      entityId: row.id,
      after: photoId ? { kind: request.kind, photoId } : { kind: request.kind },
    });
    return row;
  });
  return { ...reply, saved };
}
