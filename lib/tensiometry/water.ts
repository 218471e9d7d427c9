import { TensiometryInputError, requireFinite, requirePositive } from './errors';

/** Constants of IAPWS R1-76(2014), Revised Release on Surface Tension of Ordinary Water Substance. */
export const IAPWS_R1_76 = {
  criticalTemperatureK: 647.096,
  /** B, mN/m */
  B: 235.8,
  b: -0.625,
  mu: 1.256,
  /** Lower end of validity: the triple point, 0.01 °C. */
  minTemperatureC: 0.01,
} as const;

const KELVIN_OFFSET = 273.15;

/**
 * Surface tension of water against its vapour (≈ air) by IAPWS R1-76(2014):
 * γ = B τ^μ (1 + b τ), τ = 1 − T/Tc, with Tc = 647.096 K, B = 235.8 mN/m, b = −0.625,
 * μ = 1.256. Valid from the triple point (0.01 °C) to the critical point. Returns mN/m.
 */
export function waterSurfaceTension(temperatureC: number): number {
  requireFinite(temperatureC, 'Temperature (°C)');
  const { criticalTemperatureK: Tc, B, b, mu, minTemperatureC } = IAPWS_R1_76;
  const T = temperatureC + KELVIN_OFFSET;
  if (temperatureC < minTemperatureC || T > Tc) {
    throw new TensiometryInputError(
      'out-of-range',
      `Water surface tension by IAPWS R1-76 is defined from 0.01 °C to ${(Tc - KELVIN_OFFSET).toFixed(3)} °C; ${temperatureC} °C is outside. Check the temperature reading.`,
    );
  }
  const tau = 1 - T / Tc;
  return B * Math.pow(tau, mu) * (1 + b * tau);
}

export type ProbeLiquidCheckFlag =
  'within-tolerance' | 'low-likely-contamination' | 'high-check-instrument';

export interface ProbeLiquidCheck {
  /** IAPWS R1-76(2014) value at the measured temperature, mN/m. */
  referenceMilliNewtonPerM: number;
  measuredMilliNewtonPerM: number;
  /** measured − reference, mN/m. */
  deviationMilliNewtonPerM: number;
  toleranceMilliNewtonPerM: number;
  flag: ProbeLiquidCheckFlag;
  message: string;
}

/**
 * Check a measured water surface tension against IAPWS R1-76(2014) at the measured
 * temperature. A value lower than the reference by more than the lab's tolerance (default
 * 1.0 mN/m) most likely means surface-active contamination of the water or the vessel; a
 * higher one points at the instrument (calibration, plate wetting, tare).
 */
export function checkWaterProbe(
  measuredMilliNewtonPerM: number,
  temperatureC: number,
  options: { toleranceMilliNewtonPerM?: number } = {},
): ProbeLiquidCheck {
  requirePositive(measuredMilliNewtonPerM, 'Measured surface tension (mN/m)');
  const tolerance = options.toleranceMilliNewtonPerM ?? 1.0;
  requirePositive(tolerance, 'Tolerance (mN/m)');
  const reference = waterSurfaceTension(temperatureC);
  const deviation = measuredMilliNewtonPerM - reference;
  const ref = reference.toFixed(2);
  let flag: ProbeLiquidCheckFlag;
  let message: string;
  if (Math.abs(deviation) <= tolerance) {
    flag = 'within-tolerance';
    message = `Water reads ${measuredMilliNewtonPerM.toFixed(2)} mN/m against ${ref} mN/m (IAPWS R1-76) at ${temperatureC} °C: within ±${tolerance} mN/m.`;
  } else if (deviation < 0) {
    flag = 'low-likely-contamination';
    message = `Water reads ${Math.abs(deviation).toFixed(2)} mN/m below ${ref} mN/m (IAPWS R1-76) at ${temperatureC} °C: likely contaminated. Replace the water, clean the vessel and plate, and measure again.`;
  } else {
    flag = 'high-check-instrument';
    message = `Water reads ${deviation.toFixed(2)} mN/m above ${ref} mN/m (IAPWS R1-76) at ${temperatureC} °C: check the balance calibration, the tare, the plate dimensions and the temperature reading.`;
  }
  return {
    referenceMilliNewtonPerM: reference,
    measuredMilliNewtonPerM,
    deviationMilliNewtonPerM: deviation,
    toleranceMilliNewtonPerM: tolerance,
    flag,
    message,
  };
}
