import { useSurfaceEnergyCalculation } from '@/components/data/resources';
import type { SpecWindow, SubjectSummary } from '@/lib/contracts/surface-energy';
import { fmt } from '@/components/ui/format';
import type { MethodChoice } from './use-surface-energy';
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
  windows,
  choice,
  outputs,
}: {
  coatingCode: string;
  specs: Spec[];
  /** Specs with an age window: the drops that count for them (the compare page's rule). */
  windows: SpecWindow[];
  choice: MethodChoice;
  outputs: SurfaceEnergyOutputs;
}) {
  if (specs.length === 0) return null;
  return (
    <section className="card" aria-label="Spec check">
      <h2 className="mb-2">Spec check — {coatingCode}</h2>
      {specs.map((spec) => {
        const window = windows.find((w) => w.specId === spec.id);
        return window && window.excluded > 0 ? (
          <WindowedSpecLine key={spec.id} spec={spec} window={window} choice={choice} />
        ) : (
          <SpecLine key={spec.id} spec={spec} window={window} outputs={outputs} />
        );
      })}
    </section>
  );
}

/**
 * A spec whose age window leaves drops out: its total is computed from the drops that count,
 * with the methods chosen on the page.
 */
function WindowedSpecLine({
  spec,
  window,
  choice,
}: {
  spec: Spec;
  window: SpecWindow;
  choice: MethodChoice;
}) {
  const calculation = useSurfaceEnergyCalculation(
    choice.methods.length > 0 && window.liquids.length > 0
      ? { liquids: window.liquids, methods: choice.methods, uncertaintyBasis: choice.basis }
      : null,
    window.outputs,
  );
  return <SpecLine spec={spec} window={window} outputs={calculation.outputs ?? window.outputs} />;
}

function SpecLine({
  spec,
  window,
  outputs,
}: {
  spec: Spec;
  window: SpecWindow | undefined;
  outputs: SurfaceEnergyOutputs;
}) {
  const limits = limitsText(spec);
  const headline = headlineTotal(outputs);
  const total = headline?.components.gammaTotal;
  const windowNote = window ? (
    <span className="mt-1 block text-xs" data-testid="spec-window">
      Only drops measured within {window.maxDaysSinceTreatment} days of treatment count for this
      spec, as on the compare page: {window.counted} of {window.counted + window.excluded}{' '}
      {window.counted + window.excluded === 1 ? 'drop' : 'drops'}.
    </span>
  ) : null;
  if (!headline || !total) {
    return (
      <p data-testid="spec-verdict" className="text-sm text-ink-700">
        Surface free energy {limits} mN/m: no total to compare
        {window && window.excluded > 0 ? ' from the drops within the window' : ' yet'} (choose OWRK,
        Wu or acid–base with enough liquids).
        {windowNote}
      </p>
    );
  }
  const { meets, nearLimit } = judgeTotal(spec, total);
  return (
    <p
      data-testid="spec-verdict"
      className={`rounded-md px-3 py-2 text-sm ${meets ? 'bg-leaf-50 text-leaf-900' : 'bg-coral-50 text-coral-900'}`}
    >
      <strong>{meets ? 'Meets' : 'Does not meet'}</strong> the spec surface free energy {limits}{' '}
      mN/m: {headline.label} total {fmt(total.value)} ± {fmt(total.standardUncertainty)} mN/m.
      {nearLimit
        ? ' The limit lies within two standard uncertainties of the result; confirm with more drops.'
        : ''}
      {windowNote}
    </p>
  );
}
