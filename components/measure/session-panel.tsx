'use client';

import { NumberField, TextField, useFieldState } from '@/components/ui/fields';
import type { Point } from '@/lib/analysis/types';
import type { SessionDetails } from './types';

export type { SessionDetails };

/**
 * The sitting at the instrument: conditions, operator and camera scale (each photo has its own
 * probe liquid). A drop reopened from its page brings its session's values; they are kept on a
 * re-save unless changed here.
 */
export function SessionPanel(props: {
  value: SessionDetails;
  onChange(next: SessionDetails): void;
  onCalibrate(): void;
  picked: Point[] | null;
  onCalibrated(scalePxPerMm: number): void;
}) {
  const { value, onChange } = props;
  const [needleMm, , needleField] = useFieldState('0.51');
  const bind = (key: keyof Omit<SessionDetails, 'sessionId'>) => ({
    id: `session-${key}`,
    value: value[key],
    onChange: (event: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) =>
      onChange({ ...value, [key]: event.target.value }),
  });
  const picked = props.picked;
  const pixelDistance =
    picked && picked.length >= 2
      ? Math.hypot(picked[1][0] - picked[0][0], picked[1][1] - picked[0][1])
      : null;
  const needle = Number(needleMm);
  return (
    <section className="card space-y-3" aria-label="Session">
      <h2>Session</h2>
      {value.sessionId ? (
        <p className="text-xs text-ink-600" data-testid="session-kept">
          Saving keeps the session these drops were measured in; change a value to start a new one.
        </p>
      ) : null}
      <TextField
        label="Liquid lot"
        hint="From the bottle; printed on certificates"
        {...bind('liquidLot')}
      />
      <TextField label="Operator" {...bind('operatorName')} />
      <div className="grid grid-cols-3 gap-2">
        <NumberField label="Temp." unit="°C" {...bind('temperatureC')} />
        <NumberField label="RH" unit="%" {...bind('humidityPct')} />
        <NumberField label="Drop" unit="µL" {...bind('dropVolumeUl')} />
      </div>
      <NumberField label="Camera scale" unit="px/mm" {...bind('scalePxPerMm')} />
      <div className="rounded-md bg-ink-50 p-2 text-sm">
        <p className="mb-1 text-ink-700">Measure the scale on the needle:</p>
        <div className="flex items-end gap-2">
          <NumberField
            id="needle-mm"
            className="flex-1"
            label="Needle outer diameter"
            unit="mm"
            {...needleField}
          />
          {pixelDistance !== null && needle > 0 ? (
            <button
              type="button"
              className="btn-primary"
              onClick={() => props.onCalibrated(pixelDistance / needle)}
            >
              Use {(pixelDistance / needle).toFixed(1)} px/mm
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
