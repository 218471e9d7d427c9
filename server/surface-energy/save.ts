import 'server-only';
import { recordAudit } from '@/db/queries/audit';
import { newId } from '@/db/queries/ids';
import { insertSurfaceEnergyResult } from '@/db/queries/surface-energy';
import { inTransaction } from '@/db/queries/transaction';
import { AppError } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import type {
  SampleSurfaceEnergyOptions,
  SavedSurfaceEnergyResult,
} from '@/lib/contracts/surface-energy';
import { actorOf } from '../actor';
import { evaluateSurfaceEnergy, subjectOf, type SubjectKind } from './evaluate';

/**
 * Computes the surface energy of a sample or batch and keeps it with its inputs (the angle
 * table exactly as used, components and their sources included) and its audit row.
 */
export async function saveSurfaceEnergy(
  ctx: OrgContext,
  kind: SubjectKind,
  id: string,
  options: SampleSurfaceEnergyOptions,
): Promise<SavedSurfaceEnergyResult> {
  const { subject, angleTable, readAll, outputs } = await evaluateSurfaceEnergy(
    ctx,
    subjectOf(kind, id),
    options,
  );
  if (angleTable.length === 0) {
    throw new AppError(
      'no_angles',
      `This ${kind} has no analysed drops yet, so there is nothing to compute. Measure at least two probe liquids on ${kind === 'sample' ? 'it' : 'its samples'} first.`,
    );
  }
  if (!outputs.results.some((r) => r.status === 'ok')) {
    throw new AppError(
      'nothing_computed',
      `None of the chosen methods could be computed for this ${kind}; see each method’s reason, choose another method or measure more liquids.`,
      {
        fields: {
          methods: outputs.results
            .map((r) => r.reason)
            .filter(Boolean)
            .join(' '),
        },
      },
    );
  }
  const actor = actorOf(ctx);
  const sampleId = kind === 'sample' ? subject.id : null;
  const batchId = kind === 'batch' ? subject.id : null;
  return inTransaction(async (tx) => {
    const saved = await insertSurfaceEnergyResult(tx, {
      id: newId(),
      organizationId: actor.organizationId,
      sampleId,
      batchId,
      inputs: { subject: { kind, id: subject.id }, options, liquids: angleTable, readAll },
      outputs,
      createdByUserId: actor.userId,
    });
    await recordAudit(tx, {
      actorUserId: actor.userId,
      organizationId: actor.organizationId,
      action: 'surface_energy_result.create',
      entityType: 'surface_energy_result',
      entityId: saved.id,
      after: { sampleId, batchId, methods: options.methods },
    });
    return saved;
  });
}
