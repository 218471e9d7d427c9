import type { VerdictOutcome } from '@/lib/stats';
import type { BatchVerdict, SpecVerdict } from './types';

/** One outcome from several specs' verdicts: fail beats not-enough-data beats pass. */
export function overall(verdicts: readonly Pick<SpecVerdict, 'outcome'>[]): BatchVerdict['outcome'] {
  if (verdicts.length === 0) return 'no-spec';
  const outcomes = new Set<VerdictOutcome>(verdicts.map((v) => v.outcome));
  if (outcomes.has('fail')) return 'fail';
  if (outcomes.has('not-enough-data')) return 'not-enough-data';
  return 'pass';
}
