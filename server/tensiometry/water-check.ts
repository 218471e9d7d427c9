import 'server-only';
import type { OrgContext } from '@/lib/auth/context';
import type { WaterCheckInput, WaterCheckResponse } from '@/lib/contracts/tensiometry';
import { checkWaterProbe } from '@/lib/tensiometry';
import { assertMaySave, calculate, replyAndMaybeSave } from './calculate';

/** A measured water surface tension against IAPWS R1-76(2014) at its temperature; saved on request. */
export async function checkWater(
  ctx: OrgContext,
  input: WaterCheckInput,
): Promise<WaterCheckResponse> {
  assertMaySave(ctx, input.save);
  const result = calculate(() =>
    checkWaterProbe(input.measuredMilliNewtonPerM, input.temperatureC, {
      toleranceMilliNewtonPerM: input.toleranceMilliNewtonPerM,
    }),
  );
  const { save, ...inputs } = input;
  return replyAndMaybeSave(ctx, {
    save,
    kind: 'water-check',
    inputs,
    result,
    outputs: { ...result, reference: 'IAPWS R1-76(2014)' },
  });
}
