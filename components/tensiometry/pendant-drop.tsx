'use client';

import { useState } from 'react';
import type { SavedTensiometry } from '@/components/data/resources';
import { NumberField } from '@/components/ui/fields';
import { CalculationForm } from './calculation-form';
import { FitFigures, PendantPhotoInput, PendantPhotoView, type PhotoFit } from './pendant-photo';
import { toNumbers, useCalculation } from './use-calculation';
import { usePendantUpload } from './use-pendant-upload';

const FIELDS = ['photoId', 'needleOuterDiameterMm', 'densityDifferenceKgPerM3'] as const;

/**
 * Pendant drop: the photo is uploaded through the upload service like the measurement
 * workspace's, and the route handler finds its outline, fits the Young–Laplace profile and, on
 * "Fit and save", keeps the result with the photo. Shown to those who may upload photos.
 */
export function PendantDropForm({ onSaved }: { onSaved: (s: SavedTensiometry) => void }) {
  const { upload, choose } = usePendantUpload();
  const [values, setValues] = useState({ needleOuterDiameterMm: '', densityDifferenceKgPerM3: '' });
  const [notice, setNotice] = useState<string | null>(null);
  const calc = useCalculation<PhotoFit>({
    url: '/api/tensiometry/pendant-drop',
    fields: FIELDS,
    onSaved,
  });
  const bind = (key: keyof typeof values) => ({
    id: `pd-${key}`,
    value: values[key],
    onChange: (event: React.ChangeEvent<HTMLInputElement>) =>
      setValues((s) => ({ ...s, [key]: event.target.value })),
    error: calc.errors[key],
  });

  function send(save: boolean) {
    if (upload.kind !== 'stored') {
      setNotice(
        upload.kind === 'uploading'
          ? 'The photo is still uploading; wait until it is done.'
          : 'Choose a photo of the hanging drop first.',
      );
      return;
    }
    setNotice(null);
    void calc.submit({ photoId: upload.photo.id, ...toNumbers(values), save });
  }

  const fit = calc.reply;
  return (
    <section className="card" aria-label="Pendant drop">
      <h2 className="mb-1">Pendant drop</h2>
      <p className="mb-3 text-xs text-ink-600">
        Surface tension of a liquid from a backlit photo of a drop hanging from a needle:
        Young–Laplace fit of the outline, scale from the needle’s outer diameter, γ = Δρ g b² / β.
        The photo is uploaded and kept with a saved result.
      </p>
      <CalculationForm
        onSend={send}
        busy={calc.busy}
        disabled={upload.kind === 'uploading'}
        canSave
        labels={{ run: 'Fit', running: 'Fitting…', save: 'Fit and save' }}
        message={notice ?? calc.message}
      >
        <PendantPhotoInput
          upload={upload}
          error={calc.errors.photoId}
          onChoose={(file) => {
            calc.clear();
            setNotice(null);
            void choose(file);
          }}
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <NumberField
            label="Needle outer diameter"
            unit="mm"
            hint="Sets the scale of the photo."
            {...bind('needleOuterDiameterMm')}
          />
          <NumberField
            label="Density difference Δρ"
            unit="kg/m³"
            hint="Drop minus surrounding phase; about 997 for water in air at 23 °C."
            {...bind('densityDifferenceKgPerM3')}
          />
        </div>
      </CalculationForm>
      {upload.kind === 'stored' ? (
        <div className="mt-4 grid gap-4 md:grid-cols-2">
          <PendantPhotoView
            photoId={upload.photo.id}
            width={upload.photo.width}
            height={upload.photo.height}
            name={upload.photo.name}
            profile={fit?.photo.id === upload.photo.id ? fit.profile : undefined}
          />
          {fit ? <FitFigures fit={fit} /> : null}
        </div>
      ) : null}
    </section>
  );
}
