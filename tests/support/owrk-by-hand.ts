/**
 * Independent closed-form OWRK for water + an apolar liquid (solved by hand, not by least
 * squares), with Ström, Fredriksson & Stenius, J. Colloid Interface Sci. 119 (1987) components:
 * water 72.8 = 21.8 (dispersive) + 51.0 (polar), diiodomethane 50.8 = 50.8 + 0 mN/m.
 * Diiodomethane alone gives γSd = γL(1 + cos θ)² / 4 (γL = γLd); water then gives
 * √γSp = (γW(1 + cos θW)/2 − √(γSd γWd)) / √γWp.
 */
export const STROM_WATER = { gammaTotal: 72.8, gammaDispersive: 21.8, gammaPolar: 51 } as const;
export const STROM_DIIODOMETHANE = { gammaTotal: 50.8, gammaDispersive: 50.8, gammaPolar: 0 } as const;

export function owrkByHand(waterDeg: number, diiodomethaneDeg: number) {
  const cos = (deg: number) => Math.cos((deg * Math.PI) / 180);
  const dispersive = (STROM_DIIODOMETHANE.gammaTotal * (1 + cos(diiodomethaneDeg)) ** 2) / 4;
  const rootPolar =
    ((STROM_WATER.gammaTotal * (1 + cos(waterDeg))) / 2 -
      Math.sqrt(dispersive * STROM_WATER.gammaDispersive)) /
    Math.sqrt(STROM_WATER.gammaPolar);
  return { dispersive, polar: rootPolar ** 2, total: dispersive + rootPolar ** 2 };
}
