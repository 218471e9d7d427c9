import { DYNAMIC_LIMITS, type DynamicLimitValues } from '@/lib/contracts/specs';

/*
 * The words of the certificate of analysis that do not depend on the database: how each analysis
 * method is cited and how a spec reads. The service that gathers the data is
 * server/reports/batch-report.ts; the PDF layout is batch-report-pdf.ts.
 */

export const METHOD_SOURCES: Record<string, string> = {
  'young-laplace': 'axisymmetric Young–Laplace profile fit (Bashforth & Adams, 1883)',
  circle: 'spherical cap, algebraic circle fit refined geometrically (Kåsa, 1976)',
  polynomial: 'local polynomial tangent at each contact point (common practice)',
  ellipse: 'direct least-squares ellipse (Fitzgibbon, Pilu & Fisher, 1999)',
  'height-width': 'height–width θ/2 on a spherical cap (cap geometry)',
  manual: 'angles read by hand and imported',
};

/** A spec in words: "at least 100° for every drop; within 7 days of treatment; …". */
export function specText(
  s: {
    minDeg: number | null;
    maxDeg: number | null;
    scope: 'each-drop' | 'mean';
    minSurfaceEnergyMnM: number | null;
    maxSurfaceEnergyMnM: number | null;
    maxDaysSinceTreatment: number | null;
  } & DynamicLimitValues,
): string {
  const limits = [
    s.minDeg !== null ? `at least ${s.minDeg}°` : null,
    s.maxDeg !== null ? `at most ${s.maxDeg}°` : null,
  ]
    .filter(Boolean)
    .join(' and ');
  const parts = [
    limits ? `${limits} ${s.scope === 'mean' ? 'on the batch mean' : 'for every drop'}` : null,
    s.maxDaysSinceTreatment !== null ? `within ${s.maxDaysSinceTreatment} days of treatment` : null,
    s.minSurfaceEnergyMnM !== null
      ? `surface free energy at least ${s.minSurfaceEnergyMnM} mN/m`
      : null,
    s.maxSurfaceEnergyMnM !== null
      ? `surface free energy at most ${s.maxSurfaceEnergyMnM} mN/m`
      : null,
    ...dynamicLimitTexts(s),
  ].filter(Boolean);
  return parts.join('; ') || 'no limits';
}

/** certificate-HT-200-B-0412.pdf, safe in a Content-Disposition header. */
export function reportFileName(coatingCode: string, lotCode: string): string {
  return `certificate-${coatingCode}-${lotCode}.pdf`.replace(/[^A-Za-z0-9._-]/g, '_');
}

/** "advancing angle at least 110°", one per dynamic limit a spec sets. */
function dynamicLimitTexts(s: DynamicLimitValues): string[] {
  return DYNAMIC_LIMITS.flatMap(([name, minKey, maxKey]) => {
    const min = s[minKey];
    const max = s[maxKey];
    return [
      ...(min !== null && min !== undefined ? [`${name} at least ${min}°`] : []),
      ...(max !== null && max !== undefined ? [`${name} at most ${max}°`] : []),
    ];
  });
}
