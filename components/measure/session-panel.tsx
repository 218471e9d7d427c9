'use client';

import { useState } from 'react';
import type { Point } from '@/lib/analysis/types';
import type { LiquidChoice } from './workspace';

export type SessionDetails = {
  probeLiquidId: string;
  operatorName: string;
  temperatureC: string;
  humidityPct: string;
  dropVolumeUl: string;
  scalePxPerMm: string;
  /** Created on the first save with these details; cleared when they change. */
  sessionId: string | null;
};

/** The sitting at the instrument: liquid, conditions, operator and camera scale. */
export function SessionPanel(props: {
  liquids: LiquidChoice[];
  value: SessionDetails;
  onChange(next: SessionDetails): void;
  onCalibrate(): void;
  picked: Point[] | null;
  onCalibrated(scalePxPerMm: number): void;
}) {
  const { value, onChange } = props;
  const [needleMm, setNeedleMm] = useState('0.51');
  const field = (key: keyof SessionDetails, label: string, unit: string, inputMode: 'decimal' | 'text' = 'decimal') => (
    <div>
      <label htmlFor={`session-${key}`} className="field-label">
        {label} <span className="font-normal text-ink-500">{unit}</span>
      </label>
      <input
        id={`session-${key}`}
        className="field-input"
        inputMode={inputMode}
        value={value[key] ?? ''}
        onChange={(e) => onChange({ ...value, [key]: e.target.value })}
      />
    </div>
  );
  const picked = props.picked;
  const pixelDistance = picked && picked.length >= 2 ? Math.hypot(picked[1][0] - picked[0][0], picked[1][1] - picked[0][1]) : null;
  return (
    <section className="card space-y-3" aria-label="Session">
      <h2>Session</h2>
      <div>
        <label htmlFor="session-liquid" className="field-label">
          Probe liquid
        </label>
        <select
          id="session-liquid"
          className="field-input"
          value={value.probeLiquidId}
          onChange={(e) => onChange({ ...value, probeLiquidId: e.target.value })}
        >
          {props.liquids.map((l) => (
            <option key={l.id} value={l.id}>
              {l.name}
            </option>
          ))}
        </select>
      </div>
      {field('operatorName', 'Operator', '', 'text')}
      <div className="grid grid-cols-3 gap-2">
        {field('temperatureC', 'Temp.', '°C')}
        {field('humidityPct', 'RH', '%')}
        {field('dropVolumeUl', 'Drop', 'µL')}
      </div>
      {field('scalePxPerMm', 'Camera scale', 'px/mm')}
      <div className="rounded-md bg-ink-50 p-2 text-sm">
        <p className="mb-1 text-ink-700">Measure the scale on the needle:</p>
        <div className="flex items-end gap-2">
          <div className="flex-1">
            <label htmlFor="needle-mm" className="text-xs text-ink-600">
              Needle outer diameter (mm)
            </label>
            <input id="needle-mm" className="field-input" inputMode="decimal" value={needleMm} onChange={(e) => setNeedleMm(e.target.value)} />
          </div>
          {pixelDistance !== null && Number(needleMm) > 0 ? (
            <button type="button" className="btn-primary" onClick={() => props.onCalibrated(pixelDistance / Number(needleMm))}>
              Use {(pixelDistance / Number(needleMm)).toFixed(1)} px/mm
            </button>
          ) : (
            <button type="button" className="btn-quiet" onClick={props.onCalibrate}>
              Pick edges
            </button>
          )}
        </div>
      </div>
    </section>
  );
}
