import 'server-only';
import type { OrgContext } from '@/lib/auth/context';
import type { WilhelmyInput, WilhelmyResponse } from '@/lib/contracts/tensiometry';
import { wilhelmyContactAngle, wilhelmySurfaceTension } from '@/lib/tensiometry';
import { assertMaySave, calculate, replyAndMaybeSave } from './calculate';

/** A Wilhelmy-plate reading → surface tension (θ known) or contact angle (γ known); saved on request. */
export async function wilhelmy(ctx: OrgContext, input: WilhelmyInput): Promise<WilhelmyResponse> {
  assertMaySave(ctx, input.save);
  const reading = {
    plate: { widthMm: input.plateWidthMm, thicknessMm: input.plateThicknessMm },
    forceMilliNewton: input.forceMilliNewton,
    plateWeightMilliNewton: input.plateWeightMilliNewton,
    immersionDepthMm: input.immersionDepthMm,
    liquidDensityGPerCm3: input.liquidDensityGPerCm3,
  };
  const result = calculate(() =>
    input.mode === 'tension'
      ? wilhelmySurfaceTension(reading, { contactAngleDeg: input.contactAngleDeg })
      : wilhelmyContactAngle(reading, input.liquidSurfaceTensionMilliNewtonPerM),
  );
  const { save, ...inputs } = input;
  return replyAndMaybeSave(ctx, {
    save,
    kind: input.mode === 'tension' ? 'wilhelmy-tension' : 'wilhelmy-angle',
    inputs,
    result,
    outputs: result,
  });
}
