import type { SubjectSummary } from '@/lib/contracts/surface-energy';
import { fmt } from '@/components/ui/format';
import { headlineTotal, type SurfaceEnergyOutputs } from '@/lib/surface-energy/compute';

type Spec = SubjectSummary['surfaceEnergySpecs'][number];
type Total = { value: number; standardUncertainty: number };

/**
 * A total surface free energy against a spec's limits: whether it meets them, and whether a
 * limit lies within two standard uncertainties of it (then more drops should confirm it).
 */
export function judgeTotal(spec: Pick<Spec, 'min' | 'max'>, total: Total) {
  const meets =
    (spec.min === null || total.value >= spec.min) &&
    (spec.max === null || total.value <= spec.max);
  const nearLimit =
    meets &&
    [spec.min, spec.max].some(
      (limit) => limit !== null && Math.abs(total.value - limit) < 2 * total.standardUncertainty,
    );
  return { meets, nearLimit };
}

const limitsText = (spec: Pick<Spec, 'min' | 'max'>) =>
  [spec.min !== null ? `≥ ${spec.min}` : null, spec.max !== null ? `≤ ${spec.max}` : null]
    .filter(Boolean)
    .join(' and ');

/** The coating's surface-energy specs checked against the headline total. */
export function SpecVerdict({
  coatingCode,
  specs,
  outputs,
}: {
  coatingCode: string;
  specs: Spec[];
  outputs: SurfaceEnergyOutputs;
}) {
  if (specs.length === 0) return null;
  const headline = headlineTotal(outputs);
  const total = headline?.components.gammaTotal;
  return (
    <section className="card" aria-label="Spec check">
      <h2 className="mb-2">Spec check — {coatingCode}</h2>
      {specs.map((spec) => {
        const limits = limitsText(spec);
        if (!headline || !total) {
          return (
            <p key={spec.id} className="text-sm text-ink-700">
              Surface free energy {limits} mN/m: no total to compare yet (choose OWRK, Wu or
              acid–base with enough liquids).
            </p>
          );
        }
        const { meets, nearLimit } = judgeTotal(spec, total);
        return (
          <p
            key={spec.id}
            data-testid="spec-verdict"
            className={`rounded-md px-3 py-2 text-sm ${meets ? 'bg-leaf-50 text-leaf-900' : 'bg-coral-50 text-coral-900'}`}
          >
            <strong>{meets ? 'Meets' : 'Does not meet'}</strong> the spec surface free energy{' '}
            {limits} mN/m: {headline.label} total {fmt(total.value)} ±{' '}
            {fmt(total.standardUncertainty)} mN/m.
            {nearLimit
              ? ' The limit lies within two standard uncertainties of the result; confirm with more drops.'
              : ''}
            {spec.maxDaysSinceTreatment !== null ? (
              <span className="mt-1 block text-xs" data-testid="spec-window">
                The spec counts only drops measured within {spec.maxDaysSinceTreatment} days of
                treatment; this page uses every drop shown above, the compare page applies the
                window.
              </span>
            ) : null}
          </p>
        );
      })}
    </section>
  );
}
