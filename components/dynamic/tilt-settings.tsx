'use client';

import { NumberField, TextField } from '@/components/ui/fields';
import { useDynamicEditor, type TiltSource } from './store';

type FieldSpec<T> = { id: string; label: string; unit: string; key: keyof T & string };

const RATE_FIELDS: FieldSpec<Extract<TiltSource, { type: 'rate' }>>[] = [
  { id: 'tilt-rate', label: 'Tilt rate', unit: '°/s', key: 'rateDegPerSec' },
  { id: 'tilt-start', label: 'Tilt at the first frame', unit: '°', key: 'startDeg' },
];
const CSV_FIELDS: FieldSpec<Extract<TiltSource, { type: 'csv' }>>[] = [
  { id: 'tilt-column', label: 'Tilt column', unit: '°', key: 'column' },
  { id: 'tilt-time-column', label: 'Time column', unit: 's, optional', key: 'timeColumn' },
];

/** Where each frame's tilt comes from (a typed rate or a stage log's CSV column), and the downhill side. */
export function TiltSettings() {
  const { tilt, setTilt, downhillSide, setDownhillSide } = useDynamicEditor();
  /** The typed values of a tilt source, each in its field. */
  const fieldsOf = <T extends TiltSource>(
    source: T,
    specs: readonly FieldSpec<T>[],
    Field: typeof NumberField,
  ) =>
    specs.map(({ key, ...spec }) => (
      <Field
        key={spec.id}
        {...spec}
        className="w-40"
        value={String(source[key])}
        onChange={(e) => setTilt({ ...source, [key]: e.target.value })}
      />
    ));
  return (
    <section className="card space-y-3" aria-labelledby="tilt-heading">
      <h2 id="tilt-heading">Stage tilt</h2>
      <div role="radiogroup" aria-label="Where the tilt comes from" className="flex flex-wrap gap-4 text-sm">
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="tilt-source"
            checked={tilt.type === 'rate'}
            onChange={() => setTilt({ type: 'rate', rateDegPerSec: '1', startDeg: '0' })}
          />
          A constant rate
        </label>
        <label className="flex items-center gap-2">
          <input
            type="radio"
            name="tilt-source"
            checked={tilt.type === 'csv'}
            onChange={() => setTilt({ type: 'csv', fileName: '', text: '', column: 'tilt_deg', timeColumn: '' })}
          />
          A column of the stage&apos;s CSV log
        </label>
      </div>
      {tilt.type === 'rate' ? (
        <div className="flex flex-wrap gap-3">
          {fieldsOf(tilt, RATE_FIELDS, NumberField)}
        </div>
      ) : (
        <div className="flex flex-wrap items-end gap-3">
          <label className="flex flex-col text-sm text-ink-800" htmlFor="tilt-csv">
            Stage log (CSV)
            <input
              id="tilt-csv"
              type="file"
              accept=".csv,text/csv,text/plain"
              className="mt-1 text-sm"
              onChange={async (e) => {
                const file = e.target.files?.[0];
                if (file) setTilt({ ...tilt, fileName: file.name, text: await file.text() });
              }}
            />
          </label>
          {fieldsOf(tilt, CSV_FIELDS, TextField)}
        </div>
      )}
      <label className="flex flex-col text-sm text-ink-800" htmlFor="downhill-side">
        Downhill side
        <select
          id="downhill-side"
          className="field-input mt-1 w-48"
          value={downhillSide}
          onChange={(e) => setDownhillSide(e.target.value as 'auto' | 'left' | 'right')}
        >
          <option value="auto">Found from the drop</option>
          <option value="left">Left in the image</option>
          <option value="right">Right in the image</option>
        </select>
      </label>
    </section>
  );
}
