/** The choices the measure page hands to the workspace. */
export type SampleChoice = {
  id: string;
  label: string;
  lotCode: string;
  coatingCode: string;
  coatingName: string;
};
export type LiquidChoice = { id: string; name: string; hazardNote: string | null };

/** The sitting at the instrument, as typed. */
export type SessionDetails = {
  probeLiquidId: string;
  operatorName: string;
  temperatureC: string;
  humidityPct: string;
  dropVolumeUl: string;
  scalePxPerMm: string;
  /** The lot of the probe liquid's bottle, printed on certificates; empty when not recorded. */
  liquidLot: string;
  /** Created on the first save with these details; cleared when they change. */
  sessionId: string | null;
};

/** Water when the library has it, room conditions, a 3 µL drop, no scale yet. */
export function initialSession(liquids: LiquidChoice[], operatorName: string): SessionDetails {
  return {
    probeLiquidId: liquids.find((l) => /water/i.test(l.name))?.id ?? liquids[0]?.id ?? '',
    operatorName,
    temperatureC: '23',
    humidityPct: '50',
    dropVolumeUl: '3',
    scalePxPerMm: '',
    liquidLot: '',
    sessionId: null,
  };
}

/** The camera scale when one is set, else null. */
export function scaleOf(session: SessionDetails): number | null {
  const scale = Number(session.scalePxPerMm);
  return scale > 0 ? scale : null;
}
