'use client';

import { useTensiometryResults, type SavedTensiometry } from '@/components/data/resources';
import { PendantDropForm } from './pendant-drop';
import { SavedResults } from './saved-results';
import { WaterCheckForm } from './water-check-form';
import { WilhelmyForm } from './wilhelmy-form';

export type { SavedTensiometry };

/** Wilhelmy plate, the probe water check and the pendant drop, with the results saved so far. */
export function TensiometryWorkspace({
  canSave,
  canReadPhotos,
  initialSaved,
}: {
  /** May save results and upload photos ('records:write'). */
  canSave: boolean;
  /** May see drop photos ('results:read-all'). */
  canReadPhotos: boolean;
  initialSaved: SavedTensiometry[];
}) {
  const saved = useTensiometryResults(initialSaved);
  return (
    <div className="grid gap-6">
      <div className="grid gap-6 xl:grid-cols-2">
        <WilhelmyForm canSave={canSave} onSaved={saved.add} />
        <WaterCheckForm canSave={canSave} onSaved={saved.add} />
      </div>
      {canSave ? (
        <PendantDropForm onSaved={saved.add} />
      ) : (
        <section className="card" aria-label="Pendant drop">
          <h2 className="mb-1">Pendant drop</h2>
          <p className="text-sm text-ink-600">
            Pendant-drop fits are run by analysts, who upload the photo of the hanging drop; the
            results they save are listed below.
          </p>
        </section>
      )}
      <SavedResults results={saved.results} canReadPhotos={canReadPhotos} />
    </div>
  );
}
