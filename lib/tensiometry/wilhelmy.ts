import { TensiometryInputError, requireFinite, requirePositive } from './errors';

/** Standard acceleration of gravity, m/s² (CGPM 1901 conventional value). */
export const STANDARD_GRAVITY = 9.80665;

/** Plate dimensions in millimetres. */
export interface WilhelmyPlate {
  widthMm: number;
  thicknessMm: number;
}

/** One Wilhelmy reading in lab units: mN, mm, g/cm³. */
export interface WilhelmyReading {
  plate: WilhelmyPlate;
  /** Force shown by the balance, mN. Usually tared with the plate hanging in air. */
  forceMilliNewton: number;
  /** Weight of the plate in air, mN; leave at 0 (default) when the balance was tared with the plate. */
  plateWeightMilliNewton?: number;
  /** Depth of the plate's lower edge below the flat liquid surface, mm (default 0: just touching). */
  immersionDepthMm?: number;
  /** Liquid density, g/cm³; needed when the immersion depth is above 0. */
  liquidDensityGPerCm3?: number;
  /** Gravity, m/s² (default 9.80665). */
  gravityMPerS2?: number;
}

export interface WilhelmyTerms {
  /** p = 2(w + t), mm. */
  wettedPerimeterMm: number;
  /** ρ g w t d, mN (upward, so it is added back to the reading). */
  buoyancyMilliNewton: number;
  /** γ p cos θ = F − weight + buoyancy, mN. */
  wettingForceMilliNewton: number;
}

export interface WilhelmySurfaceTensionResult extends WilhelmyTerms {
  method: 'Wilhelmy plate (Wilhelmy 1863): γ = (F − W + ρ g w t d) / (2(w + t) cos θ)';
  surfaceTensionMilliNewtonPerM: number;
  contactAngleDeg: number;
}

export interface WilhelmyContactAngleResult extends WilhelmyTerms {
  method: 'Wilhelmy plate (Wilhelmy 1863): cos θ = (F − W + ρ g w t d) / (γ · 2(w + t))';
  contactAngleDeg: number;
  cosTheta: number;
}

/** Wetted perimeter of a rectangular plate, p = 2(w + t), mm. */
export function wettedPerimeterMm(plate: WilhelmyPlate): number {
  requirePositive(plate?.widthMm, 'Plate width (mm)');
  requirePositive(plate?.thicknessMm, 'Plate thickness (mm)');
  return 2 * (plate.widthMm + plate.thicknessMm);
}

/**
 * Buoyancy on the immersed part of the plate, ρ g w t d, in mN: ρ in g/cm³ (×1000 → kg/m³),
 * volume w·t·d in mm³ (×1e−9 → m³), force in N (×1000 → mN), i.e. ρ·g·V_mm³·1e−3.
 */
export function buoyancyMilliNewton(
  plate: WilhelmyPlate,
  immersionDepthMm: number,
  liquidDensityGPerCm3: number | undefined,
  gravityMPerS2 = STANDARD_GRAVITY,
): number {
  requirePositive(immersionDepthMm, 'Immersion depth (mm)', true);
  requirePositive(gravityMPerS2, 'Gravity (m/s²)');
  requirePositive(plate?.widthMm, 'Plate width (mm)');
  requirePositive(plate?.thicknessMm, 'Plate thickness (mm)');
  if (immersionDepthMm === 0) return 0;
  if (liquidDensityGPerCm3 === undefined || Number.isNaN(liquidDensityGPerCm3)) {
    throw new TensiometryInputError(
      'missing-density',
      'The plate is immersed, so the buoyancy correction needs the liquid density (g/cm³); enter it, or set the immersion depth to 0.',
    );
  }
  requirePositive(liquidDensityGPerCm3, 'Liquid density (g/cm³)');
  const volumeMm3 = plate.widthMm * plate.thicknessMm * immersionDepthMm;
  return liquidDensityGPerCm3 * gravityMPerS2 * volumeMm3 * 1e-3;
}

function terms(reading: WilhelmyReading): WilhelmyTerms {
  const force = requireFinite(reading.forceMilliNewton, 'Balance force (mN)');
  const weight = requireFinite(reading.plateWeightMilliNewton ?? 0, 'Plate weight (mN)');
  const depth = reading.immersionDepthMm ?? 0;
  const p = wettedPerimeterMm(reading.plate);
  const buoyancy = buoyancyMilliNewton(
    reading.plate,
    depth,
    reading.liquidDensityGPerCm3,
    reading.gravityMPerS2 ?? STANDARD_GRAVITY,
  );
  return {
    wettedPerimeterMm: p,
    buoyancyMilliNewton: buoyancy,
    wettingForceMilliNewton: force - weight + buoyancy,
  };
}

/**
 * Force a Wilhelmy plate would show: F = γ p cos θ + W − ρ g w t d (Wilhelmy, Ann. Phys. 195,
 * 1863), in mN. The forward model, for planning and for checks.
 */
export function wilhelmyForceMilliNewton(
  surfaceTensionMilliNewtonPerM: number,
  options: Omit<WilhelmyReading, 'forceMilliNewton'> & { contactAngleDeg?: number },
): number {
  requirePositive(surfaceTensionMilliNewtonPerM, 'Surface tension (mN/m)');
  const theta = options.contactAngleDeg ?? 0;
  requireFinite(theta, 'Contact angle (°)');
  if (theta < 0 || theta > 180) {
    throw new TensiometryInputError(
      'angle-out-of-range',
      `Contact angle ${theta}° is outside 0–180°.`,
    );
  }
  const t = terms({ ...options, forceMilliNewton: 0 });
  const wetting =
    surfaceTensionMilliNewtonPerM * t.wettedPerimeterMm * 1e-3 * Math.cos((theta * Math.PI) / 180);
  return wetting - t.wettingForceMilliNewton;
}

/**
 * Surface tension of a liquid from a Wilhelmy plate reading (Wilhelmy 1863; ASTM D1331 for the
 * procedure): γ = (F − W + ρ g w t d) / (p cos θ), p = 2(w + t). A roughened platinum plate is
 * taken as fully wetted, θ = 0 (common practice) — the default.
 */
export function wilhelmySurfaceTension(
  reading: WilhelmyReading,
  options: { contactAngleDeg?: number } = {},
): WilhelmySurfaceTensionResult {
  const theta = options.contactAngleDeg ?? 0;
  requireFinite(theta, 'Contact angle (°)');
  if (theta < 0 || theta >= 90) {
    throw new TensiometryInputError(
      'angle-out-of-range',
      `A surface tension can only be read with a plate that the liquid wets (0° ≤ θ < 90°), got ${theta}°. Use a roughened platinum plate (θ = 0).`,
    );
  }
  const t = terms(reading);
  const gamma =
    t.wettingForceMilliNewton / (t.wettedPerimeterMm * 1e-3 * Math.cos((theta * Math.PI) / 180));
  if (!(gamma > 0)) {
    throw new TensiometryInputError(
      'implausible-force',
      `The corrected force (${t.wettingForceMilliNewton.toFixed(4)} mN) is not positive, so no surface tension follows. Check the tare, the plate weight and that the plate touches the liquid.`,
    );
  }
  return {
    method: 'Wilhelmy plate (Wilhelmy 1863): γ = (F − W + ρ g w t d) / (2(w + t) cos θ)',
    surfaceTensionMilliNewtonPerM: gamma,
    contactAngleDeg: theta,
    ...t,
  };
}

/**
 * Contact angle of a liquid of known surface tension on a plate of the material under test
 * (Wilhelmy 1863): cos θ = (F − W + ρ g w t d) / (γ p). Advancing or receding depending on
 * whether the plate was moving in or out.
 */
export function wilhelmyContactAngle(
  reading: WilhelmyReading,
  liquidSurfaceTensionMilliNewtonPerM: number,
): WilhelmyContactAngleResult {
  requirePositive(liquidSurfaceTensionMilliNewtonPerM, 'Liquid surface tension (mN/m)');
  const t = terms(reading);
  const cosTheta =
    t.wettingForceMilliNewton / (liquidSurfaceTensionMilliNewtonPerM * t.wettedPerimeterMm * 1e-3);
  if (cosTheta > 1 + 1e-9 || cosTheta < -1 - 1e-9) {
    throw new TensiometryInputError(
      'implausible-force',
      `The corrected force gives cos θ = ${cosTheta.toFixed(3)}, outside −1…1. Check the liquid's surface tension, the plate dimensions, the tare and the immersion depth.`,
    );
  }
  const c = Math.min(1, Math.max(-1, cosTheta));
  return {
    method: 'Wilhelmy plate (Wilhelmy 1863): cos θ = (F − W + ρ g w t d) / (γ · 2(w + t))',
    contactAngleDeg: (Math.acos(c) * 180) / Math.PI,
    cosTheta: c,
    ...t,
  };
}
