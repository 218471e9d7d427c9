import 'server-only';
import { listSurfaceEnergyChoices, listSurfaceEnergyResults } from '@/db/queries/surface-energy';
import { AppError } from '@/lib/app-error';
import type { OrgContext } from '@/lib/auth/context';
import { can } from '@/lib/auth/permissions';
import type {
  SampleSurfaceEnergyOptions,
  SurfaceEnergyReply,
  SurfaceEnergySubject,
} from '@/lib/contracts/surface-energy';
import { resultVisibility } from '../visibility';
import { evaluateSurfaceEnergy, subjectOf, type SubjectKind } from './evaluate';

/** GET of a sample's or batch's surface energy: the evaluation with its options and saved results. */
export async function surfaceEnergyOf(
  ctx: OrgContext,
  kind: SubjectKind,
  id: string,
  options: SampleSurfaceEnergyOptions,
): Promise<SurfaceEnergyReply> {
  const { liquids: _liquids, ...evaluated } = await evaluateSurfaceEnergy(
    ctx,
    subjectOf(kind, id),
    options,
  );
  const saved = await listSurfaceEnergyResults(
    ctx.organization.id,
    subjectOf(kind, evaluated.subject.id),
    resultVisibility(ctx.organization.role),
  );
  return { ...evaluated, options, saved };
}

/** The page's first view: OWRK with the uncertainty of the mean, envelope at 0°. */
const PAGE_OPTIONS: SampleSurfaceEnergyOptions = {
  methods: ['owrk'],
  uncertaintyBasis: 'mean',
  envelopeAngleDeg: 0,
};

/**
 * The surface-energy page: the picker's choices and, when a sample (or batch) of the
 * organization is asked for, its evaluation and saved results. A sample wins over a batch when a
 * link carries both; one that is not here leaves `evaluation` null.
 */
export async function loadSurfaceEnergyPage(
  ctx: OrgContext,
  wanted: { sampleId?: string; batchId?: string },
) {
  const subject: SurfaceEnergySubject | null = wanted.sampleId
    ? { sampleId: wanted.sampleId }
    : wanted.batchId
      ? { batchId: wanted.batchId }
      : null;
  const choices = await listSurfaceEnergyChoices(ctx.organization.id);
  const evaluation = subject
    ? await evaluateSurfaceEnergy(ctx, subject, PAGE_OPTIONS).catch((error: unknown) => {
        if (error instanceof AppError && error.code === 'not_found') return null;
        throw error;
      })
    : null;
  const saved = evaluation
    ? await listSurfaceEnergyResults(
        ctx.organization.id,
        subjectOf(evaluation.subject.kind, evaluation.subject.id),
        resultVisibility(ctx.organization.role),
      )
    : [];
  return {
    choices,
    asked: subject ? ('sampleId' in subject ? 'sample' : 'batch') : null,
    evaluation,
    saved,
    canSave: can(ctx.organization.role, 'records:write'),
  };
}
