/**
 * Surface-tension components of a probe liquid, all in mN/m (= mJ/m²).
 * The dispersive/polar split is used by OWRK, Wu and Fowkes; the Lifshitz–van der Waals,
 * acid (γ+) and base (γ−) components by van Oss–Chaudhury–Good.
 */
export interface LiquidComponents {
  name: string;
  /** Total surface tension γL, mN/m. */
  gammaTotal: number;
  /** Dispersive component γLd, mN/m. */
  gammaDispersive: number;
  /** Polar component γLp, mN/m. */
  gammaPolar: number;
  /** Lifshitz–van der Waals component γLW, mN/m (acid–base method only). */
  gammaLW?: number;
  /** Electron-acceptor (acid) component γ+, mN/m (acid–base method only). */
  gammaPlus?: number;
  /** Electron-donor (base) component γ−, mN/m (acid–base method only). */
  gammaMinus?: number;
}

/** One probe liquid's contact angle on the solid (usually the mean of several drops). */
export interface AngleMeasurement {
  liquid: LiquidComponents;
  /** Contact angle, degrees (0–180). */
  angleDeg: number;
  /**
   * Spread of the angle, degrees, used for uncertainty propagation. Pass the SD of the drops
   * for the spread of single results, or the standard error for the uncertainty of the mean.
   */
  angleSdDeg?: number;
}

/** Dispersive and polar components of a solid, mN/m. */
export interface SolidComponents {
  gammaDispersive: number;
  gammaPolar: number;
}
