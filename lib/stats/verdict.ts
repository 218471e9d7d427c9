import { StatsInputError, assertFiniteValues } from './errors';
import { mean } from './describe';

/** Acceptance limits on the contact angle of one probe liquid. */
export interface AngleSpec {
  minDeg?: number;
  maxDeg?: number;
  /** Whether every drop must meet the limits, or the mean of the drops. */
  appliesTo: 'each-drop' | 'mean';
}

export type VerdictOutcome = 'pass' | 'fail' | 'not-enough-data';

export interface Verdict {
  outcome: VerdictOutcome;
  /** The rule applied, in words, e.g. "each drop ≥ 100°". */
  rule: string;
  /** Plain explanation of the outcome. */
  reason: string;
  n: number;
  mean: number | null;
  /** Indices (0-based) of drops outside the limits (each-drop specs only). */
  failingDrops: number[];
}

function limitWords(spec: AngleSpec): string {
  const parts: string[] = [];
  if (spec.minDeg !== undefined) parts.push(`≥ ${spec.minDeg}°`);
  if (spec.maxDeg !== undefined) parts.push(`≤ ${spec.maxDeg}°`);
  return parts.join(' and ');
}

/**
 * Judge a set of drop angles against a spec. Fewer than `minDrops` (default 3) drops gives
 * `not-enough-data` rather than a pass or fail.
 */
export function judgeAngles(
  anglesDeg: readonly number[],
  spec: AngleSpec,
  options: { minDrops?: number } = {},
): Verdict {
  assertFiniteValues(anglesDeg, 'Drop angles');
  anglesDeg.forEach((a, i) => {
    if (a < 0 || a > 180) {
      throw new StatsInputError(
        'angle-out-of-range',
        `Drop #${i + 1} has angle ${a}°; a contact angle lies between 0° and 180°.`,
      );
    }
  });
  const { minDeg, maxDeg, appliesTo } = spec;
  if (minDeg === undefined && maxDeg === undefined) {
    throw new StatsInputError(
      'no-limits',
      'The spec has neither a minimum nor a maximum angle; set at least one.',
    );
  }
  for (const v of [minDeg, maxDeg]) {
    if (v !== undefined && (!Number.isFinite(v) || v < 0 || v > 180)) {
      throw new StatsInputError(
        'bad-limits',
        `Spec limit ${String(v)} is not an angle between 0° and 180°.`,
      );
    }
  }
  if (minDeg !== undefined && maxDeg !== undefined && minDeg > maxDeg) {
    throw new StatsInputError(
      'bad-limits',
      `Spec minimum ${minDeg}° is above its maximum ${maxDeg}°; swap or correct them.`,
    );
  }
  if (appliesTo !== 'each-drop' && appliesTo !== 'mean') {
    throw new StatsInputError('bad-spec', "A spec applies to 'each-drop' or to the 'mean'.");
  }
  const minDrops = options.minDrops ?? 3;
  if (!Number.isInteger(minDrops) || minDrops < 1) {
    throw new StatsInputError(
      'bad-parameter',
      `Minimum number of drops must be a whole number ≥ 1, got ${String(minDrops)}.`,
    );
  }
  const inside = (a: number) =>
    (minDeg === undefined || a >= minDeg) && (maxDeg === undefined || a <= maxDeg);
  const rule = `${appliesTo === 'each-drop' ? 'each drop' : 'mean of the drops'} ${limitWords(spec)}, at least ${minDrops} drops`;
  const n = anglesDeg.length;
  const m = n > 0 ? mean(anglesDeg) : null;
  if (n < minDrops) {
    return {
      outcome: 'not-enough-data',
      rule,
      reason: `Only ${n} drop${n === 1 ? '' : 's'}; the rule needs at least ${minDrops}. Measure more drops.`,
      n,
      mean: m,
      failingDrops: [],
    };
  }
  if (appliesTo === 'each-drop') {
    const failingDrops = anglesDeg.flatMap((a, i) => (inside(a) ? [] : [i]));
    return {
      outcome: failingDrops.length === 0 ? 'pass' : 'fail',
      rule,
      reason:
        failingDrops.length === 0
          ? `All ${n} drops are ${limitWords(spec)}.`
          : `${failingDrops.length} of ${n} drops are outside ${limitWords(spec)} (drop ${failingDrops.map((i) => `#${i + 1}`).join(', ')}).`,
      n,
      mean: m,
      failingDrops,
    };
  }
  const ok = inside(m as number);
  return {
    outcome: ok ? 'pass' : 'fail',
    rule,
    reason: `Mean of ${n} drops is ${(m as number).toFixed(1)}°, ${ok ? 'within' : 'outside'} ${limitWords(spec)}.`,
    n,
    mean: m,
    failingDrops: [],
  };
}
