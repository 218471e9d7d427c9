import { StatsInputError } from './errors';

export type WettingClass =
  'hydrophilic' | 'neutral' | 'hydrophobic' | 'superhydrophobic' | 'superhydrophobic-unconfirmed';

export interface WettingClassResult {
  class: WettingClass;
  label: string;
  /** Where the thresholds come from. */
  basis: 'common practice, no source';
}

/**
 * Classify a water contact angle by the thresholds of common practice (no single source):
 * below 90° hydrophilic, above 90° hydrophobic, above 150° with low hysteresis
 * superhydrophobic. "Low hysteresis" is taken as below `maxHysteresisDeg` (default 10°, also
 * common practice); without a hysteresis value an angle above 150° is only a candidate.
 */
export function classifyWetting(
  waterAngleDeg: number,
  options: { hysteresisDeg?: number; maxHysteresisDeg?: number } = {},
): WettingClassResult {
  if (!Number.isFinite(waterAngleDeg) || waterAngleDeg < 0 || waterAngleDeg > 180) {
    throw new StatsInputError(
      'angle-out-of-range',
      `A contact angle lies between 0° and 180°, got ${String(waterAngleDeg)}.`,
    );
  }
  const basis = 'common practice, no source' as const;
  const maxHysteresis = options.maxHysteresisDeg ?? 10;
  if (waterAngleDeg < 90) return { class: 'hydrophilic', label: 'Hydrophilic (below 90°)', basis };
  if (waterAngleDeg === 90) return { class: 'neutral', label: 'On the 90° boundary', basis };
  if (waterAngleDeg <= 150)
    return { class: 'hydrophobic', label: 'Hydrophobic (above 90°)', basis };
  const h = options.hysteresisDeg;
  if (h === undefined) {
    return {
      class: 'superhydrophobic-unconfirmed',
      label: 'Above 150°; superhydrophobic only if the hysteresis is low (not measured)',
      basis,
    };
  }
  if (!Number.isFinite(h) || h < 0) {
    throw new StatsInputError(
      'bad-parameter',
      `Hysteresis must be a non-negative angle, got ${String(h)}.`,
    );
  }
  return h < maxHysteresis
    ? {
        class: 'superhydrophobic',
        label: `Superhydrophobic (above 150°, hysteresis below ${maxHysteresis}°)`,
        basis,
      }
    : {
        class: 'hydrophobic',
        label: `Hydrophobic (above 150° but hysteresis ${h}° is not low)`,
        basis,
      };
}
