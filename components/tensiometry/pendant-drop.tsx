'use client';

import { useState } from 'react';
import type { SavedTensiometry } from '@/components/data/resources';
import { CalculationForm, NumberInputs, type NumberInput } from './calculation-form';
import { FitFigures, PendantPhotoInput, PendantPhotoView, type PhotoFit } from './pendant-photo';
import { toNumbers, useCalculation } from './use-calculation';
import { usePendantUpload } from './use-pendant-upload';

type Field = 'needleOuterDiameterMm' | 'densityDifferenceKgPerM3';

const INPUTS: NumberInput<Field>[] = [
  {
    key: 'needleOuterDiameterMm',
    label: 'Needle outer diameter',
    unit: 'mm',
    hint: 'Sets the scale of the photo.',
  },
  {
    key: 'densityDifferenceKgPerM3',
    label: 'Density difference Δρ',
    unit: 'kg/m³',
    hint: 'Drop minus surrounding phase; about 997 for water in air at 23 °C.',
  },
];

/**
 * Pendant drop: the photo is uploaded through the upload service like the measurement
 * workspace's, and the route handler finds its outline, fits the Young–Laplace profile and, on
 * "Fit and save", keeps the result with the photo. Shown to those who may upload photos.
 */
export function PendantDropForm({ onSaved }: { onSaved: (s: SavedTensiometry) => void }) {
  const { upload, choose } = usePendantUpload();
  const [notice, setNotice] = useState<string | null>(null);
  const calc = useCalculation<Field, PhotoFit>({
    url: '/api/tensiometry/pendant-drop',
    initial: { needleOuterDiameterMm: '', densityDifferenceKgPerM3: '' },
    idPrefix: 'pd-',
    onSaved,
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
    void calc.submit({ photoId: upload.photo.id, ...toNumbers(calc.values), save });
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
        <NumberInputs className="grid gap-4 sm:grid-cols-2" bind={calc.bind} inputs={INPUTS} />
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
