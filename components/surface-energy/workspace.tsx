'use client';

import type { AngleTableRow, SpecWindow, SubjectSummary } from '@/lib/contracts/surface-energy';
import type { SavedSurfaceEnergy } from '@/components/data/resources';
import type {
  LiquidAngle,
  MethodAvailability,
  SurfaceEnergyOutputs,
} from '@/lib/surface-energy/compute';
import { EnvelopeChart, OwrkChart } from './charts';
import { LiquidsTable } from './liquids-table';
import { MethodPicker } from './method-picker';
import { ResultCard } from './result-card';
import { SavedResults } from './saved-results';
import { SpecVerdict } from './spec-verdict';
import { useSurfaceEnergy } from './use-surface-energy';

type Serialized<T> = Omit<T, 'createdAt' | 'treatedAt'> & {
  createdAt?: string;
  treatedAt?: string | null;
};
export type SavedResult = SavedSurfaceEnergy;

/**
 * Surface free energy of one sample or batch: the liquids measured on it, the methods to run,
 * their results with the spec check and plots, and the results saved with it.
 */
export function SurfaceEnergyWorkspace({
  subject,
  angleTable,
  liquids,
  specWindows,
  availability,
  initialOutputs,
  initialSaved,
  canSave,
  readAll,
}: {
  subject: Serialized<SubjectSummary>;
  angleTable: AngleTableRow[];
  liquids: LiquidAngle[];
  specWindows: SpecWindow[];
  availability: MethodAvailability[];
  initialOutputs: SurfaceEnergyOutputs | null;
  initialSaved: SavedResult[];
  canSave: boolean;
  readAll: boolean;
}) {
  const kind = subject.kind;
  const data = useSurfaceEnergy({
    subject: { kind, id: subject.id },
    liquids,
    initialOutputs,
    initialSaved,
  });
  const subjectName =
    kind === 'batch'
      ? `${subject.coatingCode} / ${subject.lotCode} (all samples)`
      : `${subject.coatingCode} / ${subject.lotCode} / ${subject.sampleLabel ?? ''}`;

  if (angleTable.length === 0) {
    return (
      <section className="card border-dashed text-center" aria-label="No angles">
        <h2 className="text-base">No contact angles on {subjectName} yet</h2>
        <p className="mx-auto mt-1 max-w-prose text-sm text-ink-600">
          {readAll
            ? `Measure at least two probe liquids on this ${kind} (for example water and diiodomethane) to compute its surface free energy.`
            : `No approved results on this ${kind} yet. Surface free energy is shown once its results are approved.`}
        </p>
      </section>
    );
  }

  const { outputs } = data;
  return (
    <div className="grid gap-6">
      <LiquidsTable rows={angleTable} subjectName={subjectName} kind={kind} readAll={readAll} />
      <MethodPicker
        kind={kind}
        availability={availability}
        choice={data.choice}
        onChoose={data.choose}
        computing={data.computing}
        error={data.error}
      />
      {outputs ? (
        <>
          <section className="card" aria-label="Results" data-testid="surface-energy-results">
            <h2 className="mb-1">Results</h2>
            <p className="mb-3 text-xs text-ink-600">
              ± is one standard uncertainty. {outputs.uncertainty.note}
            </p>
            <div className="grid gap-3">
              {outputs.results.map((outcome, i) => (
                <ResultCard key={`${outcome.method}-${i}`} outcome={outcome} />
              ))}
            </div>
            {canSave ? (
              <div className="mt-4 flex flex-wrap items-center gap-3">
                <button
                  type="button"
                  className="btn-primary"
                  onClick={() => void data.save()}
                  disabled={data.saving || data.computing}
                >
                  {data.saving ? 'Saving…' : `Save with the ${kind}`}
                </button>
                {data.saveMessage ? (
                  <p
                    role={data.saveMessage.ok ? 'status' : 'alert'}
                    className={`text-sm ${data.saveMessage.ok ? 'text-leaf-700' : 'text-coral-700'}`}
                  >
                    {data.saveMessage.text}
                  </p>
                ) : null}
              </div>
            ) : null}
          </section>

          <SpecVerdict
            coatingCode={subject.coatingCode}
            specs={subject.surfaceEnergySpecs}
            windows={specWindows}
            choice={data.choice}
            outputs={outputs}
          />

          <div className="grid gap-6 lg:grid-cols-2">
            <section className="card" aria-label="OWRK regression">
              <h2 className="mb-2">OWRK regression</h2>
              {outputs.owrkPlot ? (
                <OwrkChart plot={outputs.owrkPlot} />
              ) : (
                <p className="text-sm text-ink-600">
                  No regression: OWRK needs two liquids of different polarity on this {kind}.
                </p>
              )}
            </section>
            <section className="card" aria-label="Wetting envelope">
              <h2 className="mb-2">Wetting envelope</h2>
              {outputs.envelope ? (
                <EnvelopeChart envelope={outputs.envelope} />
              ) : (
                <p className="text-sm text-ink-600">
                  No envelope: it is drawn from the OWRK components, which are not available here.
                </p>
              )}
            </section>
          </div>
        </>
      ) : null}

      <SavedResults saved={data.saved} kind={kind} />
    </div>
  );
}
